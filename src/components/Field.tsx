import {
  useId,
  type InputHTMLAttributes,
  type ReactNode,
  type SelectHTMLAttributes,
  type TextareaHTMLAttributes,
} from 'react';

const CONTROL =
  'w-full rounded border bg-paper-raised px-2.5 text-[0.95rem] text-ink-strong placeholder:text-ink-faint ' +
  'focus:outline-2 focus:outline-offset-0 focus:outline-ink/70 disabled:bg-paper-sunk disabled:text-ink-muted';

function controlClass(error: string | undefined, extra = ''): string {
  return `${CONTROL} ${error ? 'border-warn' : 'border-paper-rule hover:border-ink-faint'} ${extra}`;
}

interface FrameProps {
  id: string;
  label: string;
  hint?: ReactNode;
  error?: string;
  optional?: boolean;
  children: ReactNode;
  className?: string;
}

function FieldFrame({ id, label, hint, error, optional, children, className = '' }: FrameProps) {
  return (
    <div className={`flex flex-col gap-1 ${className}`}>
      <label htmlFor={id} className="text-sm font-semibold text-ink-soft">
        {label}
        {optional && <span className="ml-1.5 font-normal text-ink-muted">optional</span>}
      </label>
      {children}
      {error ? (
        <p id={`${id}-error`} className="text-sm text-warn-strong">
          {error}
        </p>
      ) : hint ? (
        <p id={`${id}-hint`} className="text-xs text-ink-muted">
          {hint}
        </p>
      ) : null}
    </div>
  );
}

function describedBy(id: string, error?: string, hint?: ReactNode): string | undefined {
  if (error) return `${id}-error`;
  if (hint) return `${id}-hint`;
  return undefined;
}

export interface TextFieldProps extends Omit<InputHTMLAttributes<HTMLInputElement>, 'id'> {
  label: string;
  hint?: ReactNode;
  error?: string;
  optional?: boolean;
  mono?: boolean;
  fieldClassName?: string;
}

export function TextField({
  label,
  hint,
  error,
  optional,
  mono,
  fieldClassName,
  className = '',
  ...rest
}: TextFieldProps) {
  const id = useId();
  return (
    <FieldFrame id={id} label={label} hint={hint} error={error} optional={optional} className={fieldClassName}>
      <input
        id={id}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(id, error, hint)}
        className={controlClass(error, `h-9 ${mono ? 'font-mono text-sm tabular-nums' : ''} ${className}`)}
        {...rest}
      />
    </FieldFrame>
  );
}

export interface SelectFieldProps extends Omit<SelectHTMLAttributes<HTMLSelectElement>, 'id'> {
  label: string;
  hint?: ReactNode;
  error?: string;
  fieldClassName?: string;
  children: ReactNode;
}

export function SelectField({
  label,
  hint,
  error,
  fieldClassName,
  className = '',
  children,
  ...rest
}: SelectFieldProps) {
  const id = useId();
  return (
    <FieldFrame id={id} label={label} hint={hint} error={error} className={fieldClassName}>
      <select
        id={id}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(id, error, hint)}
        className={controlClass(error, `h-9 ${className}`)}
        {...rest}
      >
        {children}
      </select>
    </FieldFrame>
  );
}

export interface TextAreaFieldProps extends Omit<TextareaHTMLAttributes<HTMLTextAreaElement>, 'id'> {
  label: string;
  hint?: ReactNode;
  error?: string;
  optional?: boolean;
  fieldClassName?: string;
}

export function TextAreaField({
  label,
  hint,
  error,
  optional,
  fieldClassName,
  className = '',
  ...rest
}: TextAreaFieldProps) {
  const id = useId();
  return (
    <FieldFrame id={id} label={label} hint={hint} error={error} optional={optional} className={fieldClassName}>
      <textarea
        id={id}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(id, error, hint)}
        className={controlClass(error, `min-h-20 py-2 ${className}`)}
        {...rest}
      />
    </FieldFrame>
  );
}
