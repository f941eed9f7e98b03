import { formatUtc, plural } from '../../../lib/format';
import { ErrorNotice, Progress } from '../../../components/Notice';
import { useCastHistory } from '../api';

/**
 * The versions of this station and cast, oldest first: which file, who uploaded it and when, which is
 * live, and for each replacement how many flagged levels came over from the earlier version and which
 * could not (no level of the same pressure in the corrected file).
 */
export function CastHistoryPanel({ castId }: { castId: string }) {
  const history = useCastHistory(castId);
  if (history.isPending) return <Progress label="Loading the history…" />;
  if (history.isError)
    return (
      <div className="p-3">
        <ErrorNotice error={history.error} title="The history could not be loaded" />
      </div>
    );
  const versions = history.data.versions;
  if (versions.length <= 1)
    return (
      <p className="px-4 py-3 text-sm text-ink-muted">
        One version: {versions[0]?.uploadFile ?? versions[0]?.sourceFile ?? 'this file'}, uploaded by{' '}
        {versions[0]?.uploadedBy?.name ?? 'someone no longer on the cruise'} on {formatUtc(versions[0]?.uploadedAt)}. No
        corrected file has replaced it.
      </p>
    );
  return (
    <ol aria-label="Versions of this cast" className="flex flex-col text-sm">
      {versions.map((v, i) => {
        const r = v.replacement;
        const here = v.id === castId;
        return (
          <li
            key={v.id}
            aria-current={here ? 'true' : undefined}
            className={`border-b border-paper-rule/60 px-4 py-2 last:border-0 ${here ? 'bg-ink-wash/40' : ''}`}
          >
            <div className="flex flex-wrap items-baseline justify-between gap-x-3">
              <span className="font-mono text-[0.8rem] text-ink-strong">
                {i + 1}. {v.sourceFile}
              </span>
              <span
                className={`text-2xs uppercase tracking-[0.08em] ${v.live ? 'font-semibold text-ink-strong' : 'text-ink-muted'}`}
              >
                {v.live ? 'live' : v.removedAt ? 'removed' : 'replaced'}
              </span>
            </div>
            <p className="text-xs text-ink-muted">
              {v.uploadedBy?.name ?? 'someone no longer on the cruise'} · {formatUtc(v.uploadedAt)}
              {v.uploadFile && v.uploadFile !== v.sourceFile ? ` · in ${v.uploadFile}` : ''}
              {v.supersededAt ? ` · replaced ${formatUtc(v.supersededAt)}` : ''}
              {v.removedAt ? ` · removed ${formatUtc(v.removedAt)}${v.removedBy ? ` by ${v.removedBy.name}` : ''}` : ''}
            </p>
            {r && (
              <p className="mt-0.5 text-xs text-ink">
                Replaced {r.replacedFile ?? 'the earlier version'}: {plural(r.flagsCarried, 'flagged level')} carried
                over
                {r.notCarriedCount > 0 ? (
                  <span className="text-warn-strong">
                    ; {r.notCarriedCount} not carried (no level at{' '}
                    <span className="font-mono">
                      {[...new Set(r.notCarried.map((n) => n.pressure))].slice(0, 12).join(', ')}
                      {r.notCarriedCount > 12 ? ', …' : ''}
                    </span>{' '}
                    dbar in this file)
                  </span>
                ) : (
                  r.flagsCarried > 0 && '; every flagged level found its match'
                )}
                .
              </p>
            )}
          </li>
        );
      })}
    </ol>
  );
}
