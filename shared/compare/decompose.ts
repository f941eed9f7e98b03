/**
 * The split of a change on pressure surfaces into a water-mass term and a heave term, after
 * Bindoff & McDougall (1994, "Diagnosing climate change and ocean ventilation using hydrographic
 * data", J. Phys. Oceanogr. 24, 1137–1152):
 *
 *   ΔC|p ≈ ΔC|σ − (∂C/∂p)·Δp|σ
 *
 * evaluated at each pressure p of a column on the isopycnal σ* that occupation A (the earlier,
 * the reference state) has at p, with ∂C/∂p the vertical gradient of A's profile at p. The
 * residual ΔC|p − ΔC|σ + (∂C/∂p)·Δp|σ is the second-order remainder (for a pure heave δ it is
 * ½·(∂²C/∂p²)·δ²) and is returned, not hidden.
 */
import { remapToIsopycnals, type InversionHandling, type SigmaInterpolation } from '../remap/remap';

export interface DecompositionColumn {
  /** ΔC|σ at the σ of A at each pressure (the water-mass term), unit of C. */
  waterMassTerm: Float64Array;
  /** Δp|σ at the σ of A at each pressure, dbar, positive when the isopycnal deepened. */
  heave: Float64Array;
  /** −(∂C/∂p)·Δp|σ, unit of C. */
  heaveTerm: Float64Array;
  /** ΔC|p − waterMassTerm − heaveTerm, unit of C. */
  residual: Float64Array;
  /** ΔC|p = C_B − C_A on the pressure levels. */
  diff: Float64Array;
}

/**
 * Vertical gradient ∂C/∂p of a column on pressure levels (dbar): centred differences, one-sided
 * at the ends of each run of finite values; NaN where C is NaN or stands alone.
 */
export function verticalGradient(p: Float64Array, c: Float64Array): Float64Array {
  const n = p.length;
  const g = new Float64Array(n).fill(NaN);
  const ok = (k: number) => k >= 0 && k < n && c[k] === c[k] && p[k] === p[k];
  for (let k = 0; k < n; k++) {
    if (!ok(k)) continue;
    const lo = ok(k - 1) ? k - 1 : k;
    const hi = ok(k + 1) ? k + 1 : k;
    if (hi === lo) continue;
    g[k] = (c[hi] - c[lo]) / (p[hi] - p[lo]);
  }
  return g;
}

/**
 * The σ that occupation A has at each pressure level, as the inversion handling sees it: with
 * 'sort' the Thorpe (1977) reordered σ (the k-th lightest finite value at the k-th finite level),
 * otherwise the σ as it is.
 */
function sigmaAt(sigma: Float64Array, handling: InversionHandling): Float64Array {
  if (handling !== 'sort') return sigma;
  let m = 0;
  for (let k = 0; k < sigma.length; k++) if (sigma[k] === sigma[k]) m++;
  const sorted = new Float64Array(m);
  m = 0;
  for (let k = 0; k < sigma.length; k++) if (sigma[k] === sigma[k]) sorted[m++] = sigma[k];
  sorted.sort();
  const out = new Float64Array(sigma.length).fill(NaN);
  m = 0;
  for (let k = 0; k < sigma.length; k++) if (sigma[k] === sigma[k]) out[k] = sorted[m++];
  return out;
}

/**
 * What the decomposition needs of occupation A's column alone (it depends on no partner, so a
 * column that is exactly a cast can keep it): the σ* of each level, the sorted distinct σ* as
 * targets, A remapped onto them, and A's vertical gradient.
 */
export interface ReferenceColumn {
  cA: Float64Array;
  star: Float64Array;
  targets: Float64Array;
  pOnTargets: Float64Array;
  cOnTargets: Float64Array;
  grad: Float64Array;
}

/** The reference (occupation A) part of the decomposition of a column; see decomposeColumn. */
export function referenceColumn(
  p: Float64Array,
  cA: Float64Array,
  sigmaA: Float64Array,
  handling: InversionHandling,
  interpolation: SigmaInterpolation = 'linear',
): ReferenceColumn {
  const n = p.length;
  const star = sigmaAt(sigmaA, handling);
  let m = 0;
  for (let k = 0; k < n; k++) if (star[k] === star[k]) m++;
  const values = new Float64Array(m);
  m = 0;
  for (let k = 0; k < n; k++) if (star[k] === star[k]) values[m++] = star[k];
  values.sort(); // numeric, native for a typed array
  let nt = 0;
  for (let k = 0; k < m; k++) if (nt === 0 || values[k] > values[nt - 1]) values[nt++] = values[k];
  const targets = values.subarray(0, nt);
  const grad = verticalGradient(p, cA);
  if (nt === 0) return { cA, star, targets, pOnTargets: targets, cOnTargets: targets, grad };
  const rA = remapToIsopycnals({ p, sigma: sigmaA, props: { C: cA } }, targets, { handling, interpolation });
  return { cA, star, targets, pOnTargets: rA.pressure, cOnTargets: rA.props.C, grad };
}

/** The decomposition of a column against occupation A's reference part (referenceColumn). */
export function decomposeAgainst(
  p: Float64Array,
  ref: ReferenceColumn,
  cB: Float64Array,
  sigmaB: Float64Array,
  handling: InversionHandling,
  interpolation: SigmaInterpolation = 'linear',
): DecompositionColumn {
  const n = p.length;
  const { cA, star, targets: t, grad } = ref;
  const diff = new Float64Array(n);
  for (let k = 0; k < n; k++) diff[k] = cB[k] - cA[k];
  const waterMassTerm = new Float64Array(n).fill(NaN);
  const heave = new Float64Array(n).fill(NaN);
  const heaveTerm = new Float64Array(n).fill(NaN);
  const residual = new Float64Array(n).fill(NaN);
  if (t.length === 0) return { waterMassTerm, heave, heaveTerm, residual, diff };
  const rB = remapToIsopycnals({ p, sigma: sigmaB, props: { C: cB } }, t, { handling, interpolation });
  for (let k = 0; k < n; k++) {
    const s = star[k];
    if (s !== s) continue;
    // targets are the sorted distinct σ*: a bisection finds this level's one.
    let lo = 0;
    let hi = t.length - 1;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (t[mid] < s) lo = mid + 1;
      else hi = mid;
    }
    const wm = rB.props.C[lo] - ref.cOnTargets[lo];
    const dp = rB.pressure[lo] - ref.pOnTargets[lo];
    waterMassTerm[k] = wm;
    heave[k] = dp;
    const ht = -grad[k] * dp;
    heaveTerm[k] = ht;
    residual[k] = diff[k] - wm - ht;
  }
  return { waterMassTerm, heave, heaveTerm, residual, diff };
}

/**
 * Bindoff & McDougall (1994) decomposition of one column. p: pressure levels (dbar, ascending);
 * cA, sigmaA and cB, sigmaB: the property and σ (kg/m³, one reference pressure) of A and B on
 * those levels (NaN where absent). Each occupation's σ-profile is handled and interpolated in σ
 * as everywhere else (shared/remap).
 */
export function decomposeColumn(
  p: Float64Array,
  cA: Float64Array,
  sigmaA: Float64Array,
  cB: Float64Array,
  sigmaB: Float64Array,
  handling: InversionHandling,
  interpolation: SigmaInterpolation = 'linear',
): DecompositionColumn {
  return decomposeAgainst(
    p,
    referenceColumn(p, cA, sigmaA, handling, interpolation),
    cB,
    sigmaB,
    handling,
    interpolation,
  );
}
