import { useState } from 'react';
import type { FitnessEntry } from '../types';

/** The candidates, in the order a hydrographer weighs them. */
const CANDIDATES: { key: string; label: string }[] = [
  { key: 'sigma0', label: 'σ₀' },
  { key: 'sigma1', label: 'σ₁' },
  { key: 'sigma2', label: 'σ₂' },
  { key: 'sigma3', label: 'σ₃' },
  { key: 'sigma4', label: 'σ₄' },
  { key: 'CT', label: 'CT' },
  { key: 'SA', label: 'SA' },
  { key: 'pressure', label: 'pressure' },
];

const pct = (v: number) => `${(v * 100).toFixed(1)}%`;

function ShareBar({ value, tone, label }: { value: number; tone: 'ink' | 'warn'; label: string }) {
  const v = Math.max(0, Math.min(1, value));
  return (
    <div className="flex items-center gap-1.5">
      <div
        className="h-2 w-12 shrink-0 overflow-hidden bg-ink-wash"
        role="meter"
        aria-label={label}
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={Math.round(v * 1000) / 10}
      >
        <div className={`h-full ${tone === 'warn' ? 'bg-warn' : 'bg-ink'}`} style={{ width: `${v * 100}%` }} />
      </div>
      <span className={`w-12 shrink-0 text-right ${tone === 'warn' && v > 0 ? 'text-warn-strong' : ''}`}>{pct(v)}</span>
    </div>
  );
}

/**
 * How well each candidate vertical coordinate orders this cast: the share of the profile over which
 * it changes monotonically with pressure, and the share where one value occurs at several pressures
 * (a coordinate cannot be used there without sorting or dropping).
 */
export function FitnessTable({ fitness }: { fitness: Record<string, FitnessEntry> }) {
  const rows = CANDIDATES.filter((c) => fitness[c.key]);
  const hasResolved = rows.some((r) => fitness[r.key].resolved);
  const [strict, setStrict] = useState(false);
  if (rows.length === 0)
    return <p className="px-4 py-3 text-sm text-ink-muted">No fitness figures were stored for this cast.</p>;
  const pick = (f: FitnessEntry) => (!strict && f.resolved ? f.resolved : f);
  return (
    <>
      {hasResolved && (
        <div className="flex items-center justify-between gap-2 border-b border-paper-rule px-3 py-1.5 text-2xs text-ink-muted">
          <span>
            {strict
              ? 'Strict: every reversal counts, however small.'
              : 'At analysis resolution: reversals under 0.01 kg/m³ (σ), 0.01 °C (CT), 0.005 g/kg (SA) ignored.'}
          </span>
          <button
            type="button"
            className="underline decoration-dotted hover:text-ink"
            onClick={() => setStrict((v) => !v)}
            aria-pressed={strict}
          >
            {strict ? 'Show at resolution' : 'Show strict'}
          </button>
        </div>
      )}
      <table className="w-full border-collapse text-sm" aria-label="Fitness of vertical coordinates">
        <thead>
          <tr className="border-b border-paper-rule text-2xs uppercase tracking-[0.08em] text-ink-muted">
            <th scope="col" className="px-3 py-1.5 text-left font-semibold">
              Coord.
            </th>
            <th
              scope="col"
              className="px-2 py-1.5 text-left font-semibold"
              title="Share of the cast's pressure span over which the coordinate moves in its main direction"
            >
              Monotonic¹
            </th>
            <th
              scope="col"
              className="px-2 py-1.5 text-left font-semibold"
              title="Share of the cast's pressure span whose value the coordinate also takes at another pressure"
            >
              Multi-valued²
            </th>
            <th scope="col" className="px-3 py-1.5 text-right font-semibold" title="Monotonic runs">
              Runs
            </th>
          </tr>
        </thead>
        <tbody className="font-mono text-[0.78rem] tabular-nums">
          {rows.map(({ key, label }) => {
            const f = pick(fitness[key]);
            return (
              <tr key={key} className="border-b border-paper-rule/60 last:border-0">
                <th scope="row" className="px-3 py-1 text-left font-sans font-semibold text-ink-strong">
                  {label}
                </th>
                <td className="px-1.5 py-1">
                  <ShareBar value={f.monotonicShare} tone="ink" label={`${label} monotonic share`} />
                </td>
                <td className="px-1.5 py-1">
                  <ShareBar value={f.multiValuedShare} tone="warn" label={`${label} multi-valued share`} />
                </td>
                <td
                  className="px-3 py-1 text-right text-ink-soft"
                  title={f.segments.map((s) => `${s.pTop}–${s.pBottom} dbar`).join(', ')}
                >
                  {f.segments.length || '—'}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      <p className="border-t border-paper-rule px-3 py-1.5 text-2xs leading-snug text-ink-muted" data-fitness-note>
        Both figures are shares of the cast’s pressure span, measured separately, so they need not add up to 100 %. ¹
        Monotonic: the part of the span over which the coordinate moves in its main direction (a part of the span where
        it turns back is not). ² Multi-valued: the part of the span whose value the coordinate also takes at some other
        pressure of the cast; a single reversal makes every layer it spans repeat, including layers that are themselves
        monotonic, so a coordinate can be mostly monotonic and mostly multi-valued at once.
      </p>
    </>
  );
}
