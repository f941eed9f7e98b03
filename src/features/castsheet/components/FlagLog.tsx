import { Button } from '../../../components/Button';
import { ErrorNotice } from '../../../components/Notice';
import { formatUtc } from '../../../lib/format';
import type { FlagLogEntry } from '../types';

const fromText = (from: Record<string, number[]>) => {
  const all = [...new Set(Object.values(from).flat())].sort();
  return all.length ? all.join('/') : '—';
};

/**
 * Every flag change of the cast, newest first: who, when, variable, range, from → to and why; each change still
 * in force can be undone (the levels get back the flags they had), latest first where changes overlap.
 */
export function FlagLog({
  entries,
  mayUndo,
  busy,
  error,
  onUndo,
  onPick,
}: {
  entries: readonly FlagLogEntry[];
  mayUndo: boolean;
  busy: boolean;
  error: unknown;
  onUndo: (id: string) => void;
  onPick: (e: FlagLogEntry) => void;
}) {
  if (entries.length === 0)
    return <p className="px-4 py-3 text-sm text-ink-muted">No flag has been changed on this cast.</p>;
  return (
    <div className="max-h-80 overflow-auto">
      <table className="w-full border-collapse text-xs" aria-label="Flag log">
        <thead className="sticky top-0 bg-paper-raised">
          <tr className="border-b border-paper-rule text-2xs uppercase tracking-[0.08em] text-ink-muted">
            <th scope="col" className="px-2 py-1 text-left font-semibold">
              #
            </th>
            <th scope="col" className="px-2 py-1 text-left font-semibold">
              When · who
            </th>
            <th scope="col" className="px-2 py-1 text-left font-semibold">
              Variable · range
            </th>
            <th scope="col" className="px-2 py-1 text-left font-semibold">
              From → to
            </th>
            <th scope="col" className="px-2 py-1 text-left font-semibold">
              Why
            </th>
            <th scope="col" className="px-2 py-1" />
          </tr>
        </thead>
        <tbody>
          {entries.map((e) => (
            <tr
              key={e.id}
              data-change={e.id}
              className={`border-b border-paper-rule/60 align-top last:border-0 ${e.undoneBy ? 'text-ink-muted line-through decoration-ink-faint' : ''}`}
            >
              <td className="px-2 py-1 font-mono tabular-nums">{e.id}</td>
              <td className="px-2 py-1">
                <span className="font-mono">{formatUtc(e.at)}</span>
                <br />
                {e.who ?? '—'}
              </td>
              <td className="px-2 py-1">
                <button
                  type="button"
                  className="text-left hover:underline"
                  onClick={() => onPick(e)}
                  title="Fill the flag form with this range"
                >
                  {e.variable}{' '}
                  <span className="font-mono tabular-nums">
                    {e.pFrom}–{e.pTo}
                  </span>{' '}
                  dbar
                </button>
                <br />
                <span className="text-ink-muted">
                  {e.levels} {e.levels === 1 ? 'level' : 'levels'}
                </span>
              </td>
              <td className="px-2 py-1 font-mono">
                {Array.isArray(e.to)
                  ? `${fromText(e.from)} → ${e.to.join('/') || '—'} (restored)`
                  : `${fromText(e.from)} → ${e.to}`}
              </td>
              <td className="px-2 py-1">
                {e.reason ?? '—'}
                {e.source === 'proposal' && <span className="block text-2xs text-ink-muted">accepted proposal</span>}
                {e.undoneBy && (
                  <span className="block text-2xs text-ink-muted no-underline">undone by #{e.undoneBy}</span>
                )}
              </td>
              <td className="px-2 py-1 text-right">
                {mayUndo && e.undoable && (
                  <Button
                    size="sm"
                    variant="secondary"
                    disabled={busy}
                    onClick={() => onUndo(e.id)}
                    aria-label={`Undo change ${e.id}`}
                  >
                    Undo
                  </Button>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      {error != null && <ErrorNotice error={error} title="The change was not undone" />}
    </div>
  );
}
