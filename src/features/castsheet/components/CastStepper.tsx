import { useEffect } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import type { CastSummary } from '../../casts';

const typing = (el: EventTarget | null) =>
  el instanceof HTMLElement && (el.isContentEditable || ['INPUT', 'SELECT', 'TEXTAREA'].includes(el.tagName));

/**
 * Previous and next cast in track order, with `[` and `]` as keys (not while typing in a field).
 * The hint is visible beside the buttons.
 */
export function CastStepper({
  cruiseId,
  castId,
  casts,
  search = '',
}: {
  cruiseId: string;
  castId: string;
  casts: readonly CastSummary[];
  search?: string;
}) {
  const navigate = useNavigate();
  const index = casts.findIndex((c) => c.id === castId);
  const prev = index > 0 ? casts[index - 1] : null;
  const next = index >= 0 && index < casts.length - 1 ? casts[index + 1] : null;
  const href = (c: CastSummary) =>
    `/cruises/${encodeURIComponent(cruiseId)}/casts/${encodeURIComponent(c.id)}${search}`;

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (e.altKey || e.ctrlKey || e.metaKey || typing(e.target)) return;
      if (e.key === '[' && prev) {
        e.preventDefault();
        navigate(href(prev));
      } else if (e.key === ']' && next) {
        e.preventDefault();
        navigate(href(next));
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [prev?.id, next?.id, cruiseId, search, navigate]);

  const step = 'inline-flex h-8 items-center gap-1.5 rounded border px-2.5 text-sm no-underline';
  return (
    <nav aria-label="Step through casts" className="flex items-center gap-2">
      {prev ? (
        <Link
          to={href(prev)}
          className={`${step} border-ink/40 text-ink hover:bg-ink-wash`}
          aria-label={`Previous cast: station ${prev.station} cast ${prev.cast}`}
        >
          <kbd className="font-mono text-xs text-ink-muted">[</kbd> {prev.station}
        </Link>
      ) : (
        <span className={`${step} border-paper-rule text-ink-faint`} aria-disabled="true">
          first
        </span>
      )}
      <span className="font-mono text-xs tabular-nums text-ink-muted">
        {index >= 0 ? `${index + 1} / ${casts.length}` : `– / ${casts.length}`}
      </span>
      {next ? (
        <Link
          to={href(next)}
          className={`${step} border-ink/40 text-ink hover:bg-ink-wash`}
          aria-label={`Next cast: station ${next.station} cast ${next.cast}`}
        >
          {next.station} <kbd className="font-mono text-xs text-ink-muted">]</kbd>
        </Link>
      ) : (
        <span className={`${step} border-paper-rule text-ink-faint`} aria-disabled="true">
          last
        </span>
      )}
      <span className="hidden text-2xs text-ink-muted xl:inline">keys [ and ] step in track order</span>
    </nav>
  );
}
