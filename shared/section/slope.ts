/**
 * Isopycnal slope and gradients along isopycnals and along levels (docs/science.md §3.4).
 *
 * Grids are typed rows: data[iy·nx + ix], NaN empty, x in km (converted to metres here).
 * Derivatives are second-order finite differences: the three-point formula for unequal spacing
 * f′(x_i) ≈ [h₋² f₊ − h₊² f₋ + (h₊² − h₋²) f_i] / [h₊ h₋ (h₊ + h₋)] inside, one-sided two-point
 * differences at the ends and next to empty cells (first order there).
 *
 * The coordinate transform for a property φ (z height, positive up):
 *   (∂φ/∂x)_σ = (∂φ/∂x)_z + (∂φ/∂z)_x · (∂z/∂x)_σ.
 * With depth d = −z the product term is unchanged, (∂φ/∂d)(∂d/∂x)_σ, so grids in depth work alike.
 */

/** Derivative of samples f (stride apart in data, positions s) at every position, NaN-aware. */
function derivative1D(
  s: Float64Array,
  data: Float64Array,
  offset: number,
  stride: number,
  out: Float64Array,
  outOffset: number,
  outStride: number,
  scale: number,
): void {
  const n = s.length;
  for (let i = 0; i < n; i++) {
    const fi = data[offset + i * stride];
    let d = NaN;
    if (fi === fi) {
      const fm = i > 0 ? data[offset + (i - 1) * stride] : NaN;
      const fp = i < n - 1 ? data[offset + (i + 1) * stride] : NaN;
      const okm = fm === fm;
      const okp = fp === fp;
      if (okm && okp) {
        const hm = (s[i] - s[i - 1]) * scale;
        const hp = (s[i + 1] - s[i]) * scale;
        d = (hm * hm * fp - hp * hp * fm + (hp * hp - hm * hm) * fi) / (hp * hm * (hp + hm));
      } else if (okp) d = (fp - fi) / ((s[i + 1] - s[i]) * scale);
      else if (okm) d = (fi - fm) / ((s[i] - s[i - 1]) * scale);
    }
    out[outOffset + i * outStride] = d;
  }
}

/**
 * ∂f/∂x along rows of a grid, per metre; x km. With f the height (m) of each isopycnal this is
 * the isopycnal slope (∂z/∂x)_σ (dimensionless); with f a property on a pressure or depth
 * grid it is the along-level gradient (∂φ/∂x)_z.
 */
export function gradientAlongRows(x: Float64Array, data: Float64Array, ny: number): Float64Array {
  const nx = x.length;
  const out = new Float64Array(nx * ny);
  for (let iy = 0; iy < ny; iy++) derivative1D(x, data, iy * nx, 1, out, iy * nx, 1, 1000);
  return out;
}

/** ∂f/∂y down columns of a grid, per unit of y (e.g. per metre for a depth grid). */
export function gradientAlongColumns(y: Float64Array, data: Float64Array, nx: number): Float64Array {
  const out = new Float64Array(nx * y.length);
  for (let ix = 0; ix < nx; ix++) derivative1D(y, data, ix, nx, out, ix, nx, 1);
  return out;
}

/**
 * Isopycnal slope (∂z/∂x)_σ, m per m, from the depth (m, positive down) of each σ level on a
 * σ × distance grid (x km). z = −depth, so the slope is −∂depth/∂x: positive where the
 * isopycnal rises along the track.
 */
export function isopycnalSlope(x: Float64Array, depthOfSigma: Float64Array, ny: number): Float64Array {
  const g = gradientAlongRows(x, depthOfSigma, ny);
  for (let i = 0; i < g.length; i++) g[i] = -g[i];
  return g;
}

/** Value of a column of a level grid at vertical position yq, linear between rows; NaN outside. */
function columnAt(y: Float64Array, data: Float64Array, nx: number, ix: number, yq: number): number {
  const ny = y.length;
  if (!(yq >= y[0] && yq <= y[ny - 1])) return NaN;
  let lo = 0;
  let hi = ny - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (y[mid] <= yq) lo = mid;
    else hi = mid;
  }
  const a = data[lo * nx + ix];
  const b = data[hi * nx + ix];
  const w = (yq - y[lo]) / (y[hi] - y[lo]);
  return w === 0 ? a : w === 1 ? b : a + w * (b - a);
}

export interface AlongIsopycnalGradient {
  /** (∂z/∂x)_σ, m/m, on the σ × distance grid. */
  slope: Float64Array;
  /** (∂φ/∂x)_z at each isopycnal's position, per metre (the along-level gradient beside it). */
  alongLevel: Float64Array;
  /** (∂φ/∂z)_x at each isopycnal's position, per metre of height. */
  vertical: Float64Array;
  /** (∂φ/∂x)_σ by the coordinate transform, per metre. */
  alongIsopycnal: Float64Array;
}

/**
 * Along-isopycnal gradient of φ by the coordinate transform of docs/science.md §3.4.
 * x km (shared by both grids); levelDepth m (positive down, ascending) rows of the level grid
 * phiOnLevels; depthOfSigma the depth (m) of each of nSigma isopycnals per column. The
 * along-level and vertical gradients are taken on the level grid and read, linearly in depth, at
 * the isopycnal's depth in the same column.
 */
export function alongIsopycnalGradient(
  x: Float64Array,
  levelDepth: Float64Array,
  phiOnLevels: Float64Array,
  depthOfSigma: Float64Array,
  nSigma: number,
): AlongIsopycnalGradient {
  const nx = x.length;
  const gx = gradientAlongRows(x, phiOnLevels, levelDepth.length);
  const gd = gradientAlongColumns(levelDepth, phiOnLevels, nx);
  const slope = isopycnalSlope(x, depthOfSigma, nSigma);
  const n = nx * nSigma;
  const alongLevel = new Float64Array(n);
  const vertical = new Float64Array(n);
  const alongIsopycnal = new Float64Array(n);
  for (let j = 0; j < nSigma; j++) {
    for (let ix = 0; ix < nx; ix++) {
      const k = j * nx + ix;
      const d = depthOfSigma[k];
      const a = d === d ? columnAt(levelDepth, gx, nx, ix, d) : NaN;
      const dPhiDd = d === d ? columnAt(levelDepth, gd, nx, ix, d) : NaN;
      alongLevel[k] = a;
      vertical[k] = -dPhiDd; // ∂φ/∂z = −∂φ/∂d
      alongIsopycnal[k] = a + vertical[k] * slope[k];
    }
  }
  return { slope, alongLevel, vertical, alongIsopycnal };
}

/** Direct along-isopycnal gradient: ∂φ/∂x along the rows of the remapped σ × distance grid, per metre. */
export function alongIsopycnalGradientDirect(x: Float64Array, phiOnSigma: Float64Array, nSigma: number): Float64Array {
  return gradientAlongRows(x, phiOnSigma, nSigma);
}
