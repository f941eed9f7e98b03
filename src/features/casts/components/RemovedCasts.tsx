import { Button } from '../../../components/Button';
import { ErrorNotice } from '../../../components/Notice';
import { formatUtc } from '../../../lib/format';
import { useCastLife, useRemovedCasts } from '../api';

/** Casts a chief scientist removed: gone from every list, section and delivery, and restorable here. */
export function RemovedCasts({ cruiseId, canRestore }: { cruiseId: string; canRestore: boolean }) {
  const removed = useRemovedCasts(cruiseId);
  const life = useCastLife(cruiseId);
  if (!removed.isSuccess || removed.data.length === 0) return null;
  return (
    <div className="border-t border-paper-rule px-4 py-3" aria-label="Removed casts">
      <h3 className="text-xs font-semibold uppercase tracking-[0.08em] text-ink-muted">Removed casts</h3>
      <ul className="mt-1 flex flex-col gap-1 text-sm">
        {removed.data.map((c) => (
          <li key={c.id} className="flex items-center gap-3">
            <span className="font-mono text-ink-strong">
              station {c.station} cast {c.cast}
            </span>
            <span className="text-xs text-ink-muted">
              {c.sourceFile} · removed {formatUtc(c.removedAt)}
            </span>
            {canRestore && (
              <Button
                size="sm"
                variant="secondary"
                busy={life.isPending}
                onClick={() => life.mutate({ castId: c.id, action: 'restore' })}
                aria-label={`Restore station ${c.station} cast ${c.cast}`}
              >
                Restore
              </Button>
            )}
          </li>
        ))}
      </ul>
      {life.isError && <ErrorNotice error={life.error} title="The cast was not restored" />}
    </div>
  );
}
