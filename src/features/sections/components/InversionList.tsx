import { Link } from 'react-router-dom';
import { Num } from '../../../components/Num';
import type { SectionInversion } from '../types';

/** The section's inversion warnings, counted and listed; each opens its cast's sheet. */
export function InversionList({ cruiseId, inversions, sigma }: { cruiseId: string; inversions: readonly SectionInversion[]; sigma: string }) {
  const casts = new Set(inversions.map((v) => v.castId)).size;
  return (
    <section aria-labelledby="inversion-list" className="border border-paper-rule bg-paper-raised">
      <h3 id="inversion-list" className="flex items-baseline justify-between border-b border-paper-rule px-3 py-1.5 text-xs font-semibold uppercase tracking-[0.12em] text-ink-soft">
        <span>Inversions of {sigma}</span>
        <span className={`font-mono text-sm normal-case tracking-normal ${inversions.length ? 'text-warn' : 'text-ink-muted'}`}>
          {inversions.length} in {casts} {casts === 1 ? 'cast' : 'casts'}
        </span>
      </h3>
      {inversions.length === 0 ? (
        <p className="px-3 py-2 text-xs text-ink-muted">No inversion above the threshold in this section.</p>
      ) : (
        <ul className="max-h-64 overflow-y-auto text-sm">
          {inversions.map((v, i) => (
            <li key={`${v.castId}-${v.pTop}-${i}`} className="border-b border-paper-rule/60 last:border-b-0">
              <Link
                to={`/cruises/${encodeURIComponent(cruiseId)}/casts/${encodeURIComponent(v.castId)}`}
                className="flex items-baseline gap-2 px-3 py-1 no-underline hover:bg-warn-wash/50"
                aria-label={`Open cast of station ${v.station}: inversion ${v.pTop.toFixed(0)} to ${v.pBottom.toFixed(0)} dbar`}
              >
                <span aria-hidden className="text-warn">▼</span>
                <span className="w-14 font-mono text-ink-strong">{v.station}</span>
                <Num className="text-ink-soft">{v.pTop.toFixed(0)}–{v.pBottom.toFixed(0)} dbar</Num>
                <span className="text-xs text-ink-muted">{v.class}</span>
                <Num className="ml-auto text-ink-soft">Δσ {v.deficit.toFixed(3)}</Num>
              </Link>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
