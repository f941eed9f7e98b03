import { Link } from 'react-router-dom';
import { Num } from '../../../components/Num';
import type { SectionInversion } from '../types';

/** The section's inversion warnings, counted and listed; each opens its cast's sheet. */
export function InversionList({
  cruiseId,
  inversions,
  sigma,
  line = null,
}: {
  cruiseId: string;
  inversions: readonly SectionInversion[];
  sigma: string;
  /** the line the section is drawn from (the cast sheet's neighbours follow it); null: the default line */
  line?: string | null;
}) {
  const casts = new Set(inversions.map((v) => v.castId)).size;
  return (
    <section aria-labelledby="inversion-list" className="border border-paper-rule bg-paper-raised">
      <h3
        id="inversion-list"
        className="flex items-baseline justify-between border-b border-paper-rule px-3 py-1.5 text-xs font-semibold uppercase tracking-[0.12em] text-ink-soft"
      >
        <span>Inversions of {sigma}</span>
        <span
          className={`font-mono text-sm normal-case tracking-normal ${inversions.length ? 'text-warn' : 'text-ink-muted'}`}
        >
          {inversions.length} in {casts} {casts === 1 ? 'cast' : 'casts'}
        </span>
      </h3>
      {inversions.length === 0 ? (
        <p className="px-3 py-2 text-xs text-ink-muted">No inversion above the threshold in this section.</p>
      ) : (
        <>
          <table className="w-full text-sm">
            <thead className="sr-only">
              <tr>
                <th scope="col">Station</th>
                <th scope="col">Interval (dbar)</th>
                <th scope="col">Class</th>
                <th scope="col">Deficit (kg/m³)</th>
              </tr>
            </thead>
            <tbody className="block max-h-64 overflow-y-auto">
              {inversions.map((v, i) => (
                <tr
                  key={`${v.castId}-${v.pTop}-${i}`}
                  className="grid grid-cols-[4.5rem_1fr_3.8rem_3.2rem] items-baseline gap-x-1.5 border-b border-paper-rule/60 px-3 py-1 last:border-b-0 hover:bg-warn-wash/50"
                >
                  <td>
                    <Link
                      to={`/cruises/${encodeURIComponent(cruiseId)}/casts/${encodeURIComponent(v.castId)}${line ? `?line=${encodeURIComponent(line)}` : ''}`}
                      className="font-mono text-ink-strong"
                      aria-label={`Open cast of station ${v.station}: inversion ${v.pTop.toFixed(0)} to ${v.pBottom.toFixed(0)} dbar`}
                    >
                      <span aria-hidden className="mr-1 text-warn no-underline">
                        ▼
                      </span>
                      {v.station}
                    </Link>
                  </td>
                  <td>
                    <Num className="text-ink-soft">
                      {v.pTop.toFixed(0)}–{v.pBottom.toFixed(0)}
                    </Num>
                  </td>
                  <td className="text-xs text-ink-muted">{v.class}</td>
                  <td className="text-right">
                    <Num className="text-ink-soft">{v.deficit.toFixed(3)}</Num>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
          <p className="border-t border-paper-rule px-3 py-1 text-2xs text-ink-muted">
            Interval in dbar; deficit Δσ in kg/m³. Open a station for its cast sheet.
          </p>
        </>
      )}
    </section>
  );
}
