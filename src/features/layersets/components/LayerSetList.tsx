import { EmptyState } from '../../../components/Panel';
import { sigmaLabel } from '../../../components/plot/theme';
import type { LayerSet } from '../types';
import { DEFAULT_LEVELS_RULE } from '../../../../shared/api/levels';

/** The cruise's layer sets, by reference pressure. */
export function LayerSetList({
  sets,
  onEdit,
  editingId,
}: {
  sets: readonly LayerSet[];
  onEdit?: (set: LayerSet) => void;
  editingId?: string | null;
}) {
  if (sets.length === 0) {
    return (
      <EmptyState title="No layer sets yet">
        A layer set is the list of target isopycnals a section is remapped onto, in σ at one reference pressure. Without
        one, the section, the exports and the deliveries use the default levels: {DEFAULT_LEVELS_RULE}.
      </EmptyState>
    );
  }
  return (
    <table className="w-full border-collapse text-sm" aria-label="Layer sets">
      <thead>
        <tr className="border-b border-paper-rule text-xs uppercase tracking-[0.08em] text-ink-muted">
          <th scope="col" className="px-4 py-1.5 text-left font-semibold">
            Name
          </th>
          <th scope="col" className="px-3 py-1.5 text-left font-semibold">
            Reference
          </th>
          <th scope="col" className="px-3 py-1.5 text-left font-semibold">
            Levels
          </th>
          <th scope="col" className="px-3 py-1.5 text-right font-semibold">
            Count
          </th>
          {onEdit && (
            <th scope="col" className="px-3 py-1.5">
              <span className="sr-only">Edit</span>
            </th>
          )}
        </tr>
      </thead>
      <tbody>
        {sets.map((s) => (
          <tr
            key={s.id}
            className={`border-b border-paper-rule/70 last:border-0 ${editingId === s.id ? 'bg-ink-wash/50' : ''}`}
          >
            <td className="px-4 py-1.5 font-semibold text-ink-strong">{s.name}</td>
            <td className="px-3 py-1.5 font-mono text-[0.8rem]">
              {sigmaLabel(s.referencePressure)} <span className="text-ink-muted">{s.referencePressure} dbar</span>
            </td>
            <td className="max-w-[28rem] truncate px-3 py-1.5 font-mono text-[0.8rem] text-ink-soft" title={s.levels}>
              {s.levels}
            </td>
            <td className="px-3 py-1.5 text-right font-mono text-[0.8rem] tabular-nums">{s.count}</td>
            {onEdit && (
              <td className="px-3 py-1.5 text-right">
                <button
                  type="button"
                  onClick={() => onEdit(s)}
                  className="text-sm text-ink underline decoration-ink/30 hover:decoration-ink"
                  aria-label={`Edit layer set ${s.name}`}
                >
                  Edit
                </button>
              </td>
            )}
          </tr>
        ))}
      </tbody>
    </table>
  );
}
