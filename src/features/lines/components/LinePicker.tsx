import { useLines } from '../api';

/** Choose the line a section-shaped view is drawn from; null is the cruise's default line. */
export function LinePicker({
  cruiseId,
  value,
  onChange,
  label = 'Line',
}: {
  cruiseId: string;
  value: string | null;
  onChange: (id: string | null) => void;
  label?: string;
}) {
  const lines = useLines(cruiseId);
  const list = lines.data ?? [];
  const def = list.find((l) => l.isDefault);
  const current = value ?? def?.id ?? '';
  return (
    <label className="flex items-center gap-2 text-sm">
      <span className="font-semibold text-ink-soft">{label}</span>
      <select
        aria-label={label}
        data-testid="line-picker"
        className="h-8 rounded border border-ink/40 bg-paper-raised px-2 text-sm text-ink"
        value={current}
        disabled={!lines.isSuccess}
        onChange={(e) => {
          const l = list.find((x) => x.id === e.target.value);
          onChange(!l || l.isDefault ? null : l.id);
        }}
      >
        {!lines.isSuccess && <option value="">{lines.isError ? 'Lines unavailable' : 'Loading lines…'}</option>}
        {list.map((l) => (
          <option key={l.id} value={l.id}>
            {l.name} · {l.stations.length} stations{l.isDefault ? ' (default)' : ''}
          </option>
        ))}
      </select>
    </label>
  );
}
