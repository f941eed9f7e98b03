import type { ButtonHTMLAttributes } from 'react';

type Variant = 'primary' | 'secondary' | 'quiet' | 'danger';

const VARIANTS: Record<Variant, string> = {
  primary:
    'bg-ink text-paper-raised border border-ink hover:bg-ink-strong disabled:bg-ink-faint disabled:border-ink-faint',
  secondary:
    'bg-paper-raised text-ink border border-ink/40 hover:border-ink hover:bg-ink-wash disabled:text-ink-faint disabled:border-paper-rule',
  quiet: 'bg-transparent text-ink border border-transparent hover:bg-ink-wash disabled:text-ink-faint',
  danger:
    'bg-paper-raised text-warn-strong border border-warn/50 hover:border-warn hover:bg-warn-wash disabled:text-ink-faint disabled:border-paper-rule',
};

export interface ButtonProps extends ButtonHTMLAttributes<HTMLButtonElement> {
  variant?: Variant;
  size?: 'sm' | 'md';
  busy?: boolean;
}

export function Button({
  variant = 'secondary',
  size = 'md',
  busy = false,
  className = '',
  children,
  disabled,
  type = 'button',
  ...rest
}: ButtonProps) {
  const sizing = size === 'sm' ? 'h-7 px-2.5 text-sm' : 'h-9 px-3.5 text-[0.95rem]';
  return (
    <button
      type={type}
      disabled={disabled || busy}
      aria-busy={busy || undefined}
      className={`inline-flex items-center justify-center gap-2 rounded font-medium tracking-[0.01em] transition-colors focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-ink disabled:cursor-not-allowed ${sizing} ${VARIANTS[variant]} ${className}`}
      {...rest}
    >
      {busy && <Spinner />}
      {children}
    </button>
  );
}

export function Spinner({ label }: { label?: string }) {
  return (
    <span
      role={label ? 'status' : undefined}
      aria-label={label}
      className="inline-block size-3.5 animate-spin rounded-full border-[1.5px] border-current border-r-transparent"
    />
  );
}
