import { Num } from '../../../components/Num';
import type { InversionHandling } from '../profiles';
import type { CastInversion } from '../types';

const fixed = (v: number | null, digits: number) => (v == null || !Number.isFinite(v) ? '—' : v.toFixed(digits));

/**
 * Every inversion of the cast: class, where it is (pressure and depth), how much lighter, how unstable, and —
 * for those the intake found — how each is handled now. A row's range fills the flag form.
 */
export function InversionTable({
  inversions,
  source,
  handling,
  onPick,
}: {
  inversions: readonly CastInversion[];
  source: string;
  handling?: readonly InversionHandling[] | null;
  onPick?: (inv: CastInversion) => void;
}) {
  return (
    <div>
      <p className="border-b border-paper-rule px-4 py-1.5 text-xs text-ink-muted">
        {inversions.length === 0
          ? 'No inversion in '
          : `${inversions.length} ${inversions.length === 1 ? 'inversion' : 'inversions'} in `}
        {source}.
      </p>
      {inversions.length > 0 && (
        <div className="max-h-72 overflow-auto">
          <table className="w-full border-collapse text-sm" aria-label="Density inversions">
            <thead className="sticky top-0 bg-paper-raised">
              <tr className="border-b border-paper-rule text-xs uppercase tracking-[0.08em] text-ink-muted">
                <th scope="col" className="px-3 py-1.5 text-left font-semibold">
                  Class
                </th>
                <th scope="col" className="px-3 py-1.5 text-right font-semibold">
                  Top (dbar)
                </th>
                <th scope="col" className="px-3 py-1.5 text-right font-semibold">
                  Bottom (dbar)
                </th>
                <th scope="col" className="px-3 py-1.5 text-right font-semibold">
                  Top (m)
                </th>
                <th scope="col" className="px-3 py-1.5 text-right font-semibold">
                  Levels
                </th>
                <th scope="col" className="px-3 py-1.5 text-right font-semibold">
                  Deficit (kg/m³)
                </th>
                <th scope="col" className="px-3 py-1.5 text-right font-semibold">
                  Min N² (s⁻²)
                </th>
                {handling && (
                  <th scope="col" className="px-3 py-1.5 text-left font-semibold">
                    Now
                  </th>
                )}
              </tr>
            </thead>
            <tbody className="font-mono text-[0.8rem] tabular-nums">
              {inversions.map((inv, k) => (
                <tr key={`${inv.iTop}-${inv.iBottom}`} className="border-b border-paper-rule/70 last:border-0">
                  <td className="px-3 py-1 text-left font-sans">
                    <button
                      type="button"
                      className="inline-flex items-center gap-1 font-semibold text-warn hover:underline"
                      onClick={() => onPick?.(inv)}
                      title="Fill the flag form with this inversion's light levels"
                    >
                      <span aria-hidden>▲</span>
                      {inv.class === 'spike' ? 'spike' : 'overturn'}
                    </button>
                  </td>
                  <td className="px-3 py-1 text-right">{fixed(inv.pTop, 1)}</td>
                  <td className="px-3 py-1 text-right">{fixed(inv.pBottom, 1)}</td>
                  <td className="px-3 py-1 text-right">{fixed(inv.depthTop, 1)}</td>
                  <td className="px-3 py-1 text-right">{inv.levels}</td>
                  <td className="px-3 py-1 text-right">{fixed(inv.deficit, 4)}</td>
                  <td className="px-3 py-1 text-right">{inv.minN2 == null ? '—' : inv.minN2.toExponential(2)}</td>
                  {handling && (
                    <td
                      className={`px-3 py-1 text-left font-sans text-xs ${handling[k]?.warned ? 'text-warn-strong' : 'text-ink-soft'}`}
                    >
                      {handling[k]?.text}
                    </td>
                  )}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      <p className="px-4 py-1.5 text-2xs text-ink-muted">
        A <Num>spike</Num> is at most two light levels or thinner than 1 dbar (sensor lag, typically); an{' '}
        <Num>overturn</Num> is thicker. Click a class to fill the flag form with its light levels.
      </p>
    </div>
  );
}
