import { Num } from '../../../components/Num';
import { formatValue } from '../frame';

export interface ReadoutValue {
  coord: 'pressure' | 'density';
  x: number;
  y: number;
  value: number | null;
  station: string | null;
}

/** What is under the pointer (or the station cursor), with units. */
export function Readout({
  readout,
  unit,
  valueName,
  sigma,
  digits,
}: {
  readout: ReadoutValue | null;
  unit: string;
  valueName: string;
  sigma: string;
  digits: number;
}) {
  return (
    <section aria-label="Readout" aria-live="polite" className="border border-paper-rule bg-paper-raised px-3 py-2">
      <h3 className="mb-1 text-xs font-semibold uppercase tracking-[0.12em] text-ink-soft">Readout</h3>
      {!readout ? (
        <p className="text-xs text-ink-muted">
          Point at a frame, or focus the section and step between stations with ← and →.
        </p>
      ) : (
        <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-0.5 text-sm">
          <dt className="text-ink-muted">Station</dt>
          <dd className="text-ink-strong">
            <Num>{readout.station ?? '—'}</Num>
          </dd>
          <dt className="text-ink-muted">Distance</dt>
          <dd>
            <Num>{readout.x.toFixed(1)} km</Num>
          </dd>
          <dt className="text-ink-muted">{readout.coord === 'pressure' ? 'Pressure' : sigma}</dt>
          <dd>
            <Num>{readout.coord === 'pressure' ? `${readout.y.toFixed(0)} dbar` : `${readout.y.toFixed(3)} kg/m³`}</Num>
          </dd>
          <dt className="text-ink-muted">{valueName}</dt>
          <dd className="text-ink-strong">
            <Num>
              {readout.value === null
                ? 'no water / no data'
                : `${formatValue(readout.value, digits)}${unit ? ` ${unit}` : ''}`}
            </Num>
          </dd>
        </dl>
      )}
    </section>
  );
}
