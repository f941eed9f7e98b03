import type { ReactNode } from 'react';
import { isApiError } from '../lib/http';

/** A problem the person must see. Uses the warning accent: it is one. */
export function ErrorNotice({ error, title = 'Something went wrong' }: { error: unknown; title?: string }) {
  const message = isApiError(error)
    ? error.message
    : error instanceof Error
      ? error.message
      : 'The request could not be completed.';
  return (
    <div role="alert" className="border-l-2 border-warn bg-warn-wash/60 px-3 py-2 text-sm text-warn-strong">
      <p className="font-semibold">{title}</p>
      <p className="text-ink-strong">{message}</p>
    </div>
  );
}

/** A neutral confirmation (sent, saved). */
export function InfoNotice({ children }: { children: ReactNode }) {
  return (
    <div role="status" className="border-l-2 border-ink bg-ink-wash/70 px-3 py-2 text-sm text-ink-strong">
      {children}
    </div>
  );
}

/**
 * Indeterminate progress for loading and long operations: a thin running rule, plus a
 * label for screen readers. Long operations with a known fraction pass `value` (0–1).
 */
export function Progress({ label, value }: { label: string; value?: number }) {
  const known = value !== undefined && Number.isFinite(value);
  return (
    <div className="flex flex-col gap-1.5 px-4 py-5" role="status" aria-live="polite">
      <div
        role="progressbar"
        aria-label={label}
        aria-valuemin={known ? 0 : undefined}
        aria-valuemax={known ? 100 : undefined}
        aria-valuenow={known ? Math.round((value as number) * 100) : undefined}
        className="relative h-[3px] w-48 overflow-hidden bg-ink-wash"
      >
        {known ? (
          <div className="h-full bg-ink" style={{ width: `${Math.max(0, Math.min(1, value as number)) * 100}%` }} />
        ) : (
          <div className="sl-progress-run absolute inset-y-0 w-1/3 bg-ink" />
        )}
      </div>
      <span className="text-xs text-ink-muted">{label}</span>
    </div>
  );
}
