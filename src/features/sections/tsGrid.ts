import { sigma_pr } from '../../../shared/seawater/density';
import type { TsCast } from './types';

export interface TsExtent {
  saMin: number;
  saMax: number;
  ctMin: number;
  ctMax: number;
}

/**
 * The SA/CT box the T–S points occupy, padded by a share of each span (and at least a little,
 * so a single point or a well-mixed cast still gets contours around it). null when no point is finite.
 */
export function tsExtent(casts: readonly TsCast[], pad = 0.06): TsExtent | null {
  let saMin = Infinity,
    saMax = -Infinity,
    ctMin = Infinity,
    ctMax = -Infinity;
  for (const c of casts) {
    const n = Math.min(c.SA.length, c.CT.length);
    for (let i = 0; i < n; i++) {
      const sa = c.SA[i],
        ct = c.CT[i];
      if (sa == null || ct == null || !Number.isFinite(sa) || !Number.isFinite(ct)) continue;
      if (sa < saMin) saMin = sa;
      if (sa > saMax) saMax = sa;
      if (ct < ctMin) ctMin = ct;
      if (ct > ctMax) ctMax = ct;
    }
  }
  if (!Number.isFinite(saMin)) return null;
  const saPad = Math.max((saMax - saMin) * pad, 0.05);
  const ctPad = Math.max((ctMax - ctMin) * pad, 0.25);
  return { saMin: saMin - saPad, saMax: saMax + saPad, ctMin: ctMin - ctPad, ctMax: ctMax + ctPad };
}

export interface SigmaGrid {
  /** Absolute Salinity of each column, g/kg. */
  SA: number[];
  /** Conservative Temperature of each row, °C. */
  CT: number[];
  /** σ at the reference pressure, kg/m³, `sigma[iCT][iSA]` (Plotly's z[y][x]); null outside the equation's range. */
  sigma: (number | null)[][];
  ref: number;
}

/**
 * σ(SA, CT, p_ref) on a regular SA × CT grid over the extent, from the seawater core's 75-term
 * density (`sigma_pr`, Roquet et al. 2015), for drawing isopycnals behind the T–S points.
 */
export function sigmaGrid(extent: TsExtent, ref: number, columns = 60, rows = 60): SigmaGrid {
  const SA = Array.from(
    { length: columns },
    (_, i) => extent.saMin + ((extent.saMax - extent.saMin) * i) / (columns - 1),
  );
  const CT = Array.from({ length: rows }, (_, j) => extent.ctMin + ((extent.ctMax - extent.ctMin) * j) / (rows - 1));
  const sigma = CT.map((ct) =>
    SA.map((sa) => {
      const s = sigma_pr(sa, ct, ref);
      return Number.isFinite(s) ? s : null;
    }),
  );
  return { SA, CT, sigma, ref };
}

/** A round contour spacing giving about `target` lines over the grid's σ span. */
export function contourStep(grid: SigmaGrid, target = 10): { start: number; end: number; size: number } | null {
  let lo = Infinity,
    hi = -Infinity;
  for (const row of grid.sigma)
    for (const v of row)
      if (v !== null) {
        if (v < lo) lo = v;
        if (v > hi) hi = v;
      }
  if (!Number.isFinite(lo) || hi <= lo) return null;
  const raw = (hi - lo) / target;
  const magnitude = 10 ** Math.floor(Math.log10(raw));
  const size = [1, 2, 2.5, 5, 10].map((m) => m * magnitude).find((s) => s >= raw) ?? 10 * magnitude;
  return { start: Math.ceil(lo / size) * size, end: Math.floor(hi / size) * size, size };
}
