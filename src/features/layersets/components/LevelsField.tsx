import { useId } from 'react';
import { levelDigits, levelsFeedback } from '../types';

/**
 * The levels of a set, typed as `start:step:end` or a comma list, with live feedback from the
 * server's own parser: count, first and last level (and the step), or what is wrong.
 * A server error (after submit) replaces the live feedback until the text changes.
 */
export function LevelsField({
  value,
  onChange,
  serverError,
  unit = 'kg/m³',
}: {
  value: string;
  onChange: (v: string) => void;
  serverError?: string;
  unit?: string;
}) {
  const id = useId();
  const fb = levelsFeedback(value);
  const digits = levelDigits(value);
  const error = serverError ?? (fb.state === 'error' ? fb.messages.join('; ') : undefined);
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-semibold text-ink-soft">
        Levels
      </label>
      <input
        id={id}
        value={value}
        onChange={(e) => onChange(e.target.value)}
        spellCheck={false}
        autoComplete="off"
        placeholder="26.0:0.05:27.9  or  26.5, 26.8, 27.0"
        aria-invalid={error ? true : undefined}
        aria-describedby={`${id}-feedback`}
        className={`h-9 w-full rounded border bg-paper-raised px-2.5 font-mono text-sm tabular-nums text-ink-strong placeholder:text-ink-faint focus:outline-2 focus:outline-ink/70 ${error ? 'border-warn' : 'border-paper-rule'}`}
      />
      <p
        id={`${id}-feedback`}
        aria-live="polite"
        data-testid="levels-feedback"
        className={`text-xs ${error ? 'text-warn-strong' : 'text-ink-muted'}`}
      >
        {error ? (
          error
        ) : fb.state === 'ok' ? (
          <>
            <span className="font-mono tabular-nums text-ink-strong">{fb.count}</span>{' '}
            {fb.count === 1 ? 'level' : 'levels'}, from{' '}
            <span className="font-mono tabular-nums text-ink-strong">{fb.first.toFixed(digits)}</span> to{' '}
            <span className="font-mono tabular-nums text-ink-strong">{fb.last.toFixed(digits)}</span> {unit}
            {fb.step != null && fb.count > 2 && (
              <>
                , every <span className="font-mono tabular-nums">{fb.step.toFixed(digits)}</span>
              </>
            )}
          </>
        ) : (
          'start:step:end (end included when it falls on a step), or a comma list in increasing order.'
        )}
      </p>
    </div>
  );
}
