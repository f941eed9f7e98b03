/**
 * Two occupations of one line on common positions (docs/occupations.md): both gridded on pressure
 * levels and on target isopycnals, the differences on each, the heave, the Bindoff & McDougall
 * (1994) decomposition on pressure, along-line means, the change of geostrophic transport per
 * layer and the time between the occupations. Pure: typed arrays in, typed grids out
 * (data[level·nx + position], NaN empty).
 */
import { sigma_batch, specvol_anom_standard } from '../seawater/density';
import { onLevels } from '../section/geostrophy';
import { remapToIsopycnals, type InversionHandling, type SigmaInterpolation } from '../remap/remap';
import { commonPositions, type Place, type PositionOptions, type Pair, type Excluded, type Weights } from './positions';
import { decomposeAgainst, referenceColumn, type ReferenceColumn } from './decompose';
import { alongLineMean, layerTransportOnGrids, yearsBetween, type LayerChange } from './summary';

/** One cast of an occupation: the profile, with the levels flagged bad marked. */
export interface OccupationCast extends Place {
  /** Time of the cast, ms since 1970 (null unknown). */
  time: number | null;
  /** Sea pressure, dbar, increasing. */
  p: Float64Array;
  /** Absolute Salinity, g/kg. */
  SA: Float64Array;
  /** Conservative Temperature, °C. */
  CT: Float64Array;
  /** The property compared (may be CT or SA themselves), its own unit. */
  C: Float64Array;
  /** 1 where the level is flagged in this occupation (left out of every difference). */
  bad?: Uint8Array;
}

/** The choices that grid one cast (everything but the pairing and the positions). */
export interface GridOptions {
  /** Reference pressure of σ, dbar. */
  ref: number;
  /** Target σ levels, ascending, kg/m³. */
  targets: Float64Array;
  /** Pressure levels of the pressure grid, dbar ascending. */
  pressure: Float64Array;
  handling: InversionHandling;
  interpolation?: SigmaInterpolation;
}

export interface CompareOptions extends PositionOptions, GridOptions {
  /** σ bounds of the layers for the transport change (default six layers over the targets). */
  layers?: Float64Array;
  /** Called as each stage ends (pairing, interpolation, decomposition, transport), for profiling. */
  stage?: (name: string) => void;
}

/** A grid of one field: data[level·nx + position], NaN where empty. */
export type Grid = Float64Array;

export interface Comparison {
  x: Float64Array;
  lon: Float64Array;
  lat: Float64Array;
  pairs: Pair[];
  excluded: Excluded[];
  pressure: Float64Array;
  sigma: Float64Array;
  onPressure: { A: Grid; B: Grid; diff: Grid; SA_A: Grid; CT_A: Grid; SA_B: Grid; CT_B: Grid };
  onDensity: { pA: Grid; pB: Grid; heave: Grid; A: Grid; B: Grid; diff: Grid };
  decomposition: { waterMassTerm: Grid; heaveTerm: Grid; residual: Grid; heave: Grid };
  means: {
    onPressure: { diff: Float64Array; waterMassTerm: Float64Array; heaveTerm: Float64Array; residual: Float64Array };
    onDensity: { heave: Float64Array; diff: Float64Array };
  };
  transport: LayerChange[];
  /** Years from A to B (mean cast times), null when either has no times. */
  years: number | null;
  counts: {
    /** Levels flagged in the casts used, per occupation. */
    flaggedLevels: { A: number; B: number };
    /** Grid cells left out of the differences because a level there was flagged in either occupation. */
    leftOut: { pressure: number; density: number };
    positions: number;
  };
}

/** A cast with its flagged and non-finite levels taken out, the flagged pressure spans kept. */
interface CleanCast {
  p: Float64Array;
  SA: Float64Array;
  CT: Float64Array;
  C: Float64Array;
  sigma: Float64Array;
  /** Open pressure intervals (dbar) over which a flagged level was bridged. */
  spans: [number, number][];
  flagged: number;
}

function clean(c: OccupationCast, ref: number): CleanCast {
  const n = c.p.length;
  const keep: number[] = [];
  const spans: [number, number][] = [];
  let flagged = 0;
  let runStart = -1;
  let lastGood = NaN;
  for (let i = 0; i < n; i++) {
    const bad = c.bad ? c.bad[i] === 1 : false;
    if (bad) {
      flagged++;
      if (runStart < 0) runStart = i;
      continue;
    }
    const finite = Number.isFinite(c.p[i]) && Number.isFinite(c.SA[i]) && Number.isFinite(c.CT[i]);
    if (!finite) continue;
    if (runStart >= 0) {
      spans.push([Number.isFinite(lastGood) ? lastGood : -Infinity, c.p[i]]);
      runStart = -1;
    }
    keep.push(i);
    lastGood = c.p[i];
  }
  if (runStart >= 0) spans.push([Number.isFinite(lastGood) ? lastGood : -Infinity, Infinity]);
  if (keep.length === n)
    return { p: c.p, SA: c.SA, CT: c.CT, C: c.C, sigma: sigma_batch(c.SA, c.CT, ref), spans, flagged };
  const take = (a: Float64Array) => {
    const out = new Float64Array(keep.length);
    for (let k = 0; k < keep.length; k++) out[k] = a[keep[k]];
    return out;
  };
  const SA = take(c.SA);
  const CT = take(c.CT);
  return { p: take(c.p), SA, CT, C: take(c.C), sigma: sigma_batch(SA, CT, ref), spans, flagged };
}

const inSpan = (v: number, spans: [number, number][]) => {
  if (v !== v) return false;
  for (const [a, b] of spans) if (v > a && v < b) return true;
  return false;
};

/**
 * One cast gridded on the pressure levels and on the targets, with its flagged cells: the per-cast
 * work of a comparison, independent of the pairing and the positions (a service may keep it).
 */
export interface GriddedCast {
  /** The property, SA and CT on the pressure levels (linear in pressure, NaN outside the cast). */
  C: Float64Array;
  SA: Float64Array;
  CT: Float64Array;
  /** σ (of the reference pressure) and the specific-volume anomaly (m³/kg) of SA, CT there. */
  sigmaP: Float64Array;
  specvolAnomP: Float64Array;
  /** 1 where a pressure level bridges a flagged level. */
  badP: Uint8Array;
  /** Pressure (dbar) and the property on each target σ, and the flagged targets. */
  pS: Float64Array;
  CS: Float64Array;
  badS: Uint8Array;
  /** Flagged levels of the cast. */
  flagged: number;
  /** The cast as occupation A's reference column of the decomposition (Bindoff & McDougall 1994). */
  reference: ReferenceColumn;
}

function spanMask(v: Float64Array, spans: [number, number][]): Uint8Array {
  const out = new Uint8Array(v.length);
  if (spans.length) for (let i = 0; i < v.length; i++) out[i] = inSpan(v[i], spans) ? 1 : 0;
  return out;
}

/** Grid one cast of an occupation (flagged and non-finite levels taken out first). */
export function gridOccupationCast(cast: OccupationCast, opts: GridOptions): GriddedCast {
  const c = clean(cast, opts.ref);
  const P = opts.pressure;
  const C = onLevels(c.p, c.C, P);
  const SA = onLevels(c.p, c.SA, P);
  const CT = c.C === c.CT ? C : onLevels(c.p, c.CT, P);
  const sigmaP = sigma_batch(SA, CT, opts.ref);
  const specvolAnomP = new Float64Array(P.length);
  for (let i = 0; i < P.length; i++) specvolAnomP[i] = specvol_anom_standard(SA[i], CT[i], P[i]);
  const r = remapToIsopycnals({ p: c.p, sigma: c.sigma, props: { C: c.C } }, opts.targets, {
    handling: opts.handling,
    interpolation: opts.interpolation ?? 'linear',
  });
  return {
    C,
    SA,
    CT,
    sigmaP,
    specvolAnomP,
    badP: spanMask(P, c.spans),
    pS: r.pressure,
    CS: r.props.C,
    badS: spanMask(r.pressure, c.spans),
    flagged: c.flagged,
    reference: referenceColumn(P, C, sigmaP, opts.handling, opts.interpolation ?? 'linear'),
  };
}

/** A field of the used casts at the common positions: linear in x between the bracketing casts, strict (both needed). */
function across(wts: Weights, cols: Float64Array[], ny: number, bads?: Uint8Array[], badOut?: Uint8Array): Grid {
  const nx = wts.k0.length;
  const out = new Float64Array(nx * ny).fill(NaN);
  for (let j = 0; j < nx; j++) {
    const k0 = wts.k0[j];
    const k1 = wts.k1[j];
    if (k0 < 0) continue;
    const w = wts.w[j];
    const a = cols[k0];
    const b = cols[k1];
    for (let i = 0; i < ny; i++) {
      const v = w === 0 ? a[i] : w === 1 ? b[i] : a[i] + w * (b[i] - a[i]);
      out[i * nx + j] = v;
      if (bads && badOut && ((w < 1 && bads[k0][i]) || (w > 0 && bads[k1][i]))) badOut[i * nx + j] = 1;
    }
  }
  return out;
}

/**
 * A pointwise function of SA and CT (σ, specific-volume anomaly) at the common positions: a
 * position that is exactly a cast takes the cast's own values; one between casts computes them from
 * the interpolated SA and CT.
 */
function derivedAcross(
  wts: Weights,
  own: Float64Array[],
  SA: Grid,
  CT: Grid,
  ny: number,
  fn: (sa: Float64Array, ct: Float64Array, out: Float64Array) => void,
): Grid {
  const nx = wts.k0.length;
  const out = new Float64Array(nx * ny).fill(NaN);
  const sa = new Float64Array(ny);
  const ct = new Float64Array(ny);
  const col = new Float64Array(ny);
  for (let j = 0; j < nx; j++) {
    const k0 = wts.k0[j];
    if (k0 < 0) continue;
    const w = wts.w[j];
    const exact = w === 0 ? own[k0] : w === 1 ? own[wts.k1[j]] : null;
    if (exact) {
      for (let i = 0; i < ny; i++) out[i * nx + j] = exact[i];
      continue;
    }
    for (let i = 0; i < ny; i++) {
      sa[i] = SA[i * nx + j];
      ct[i] = CT[i * nx + j];
    }
    fn(sa, ct, col);
    for (let i = 0; i < ny; i++) out[i * nx + j] = col[i];
  }
  return out;
}

function sub(b: Grid, a: Grid): Grid {
  const out = new Float64Array(a.length);
  for (let i = 0; i < a.length; i++) out[i] = b[i] - a[i];
  return out;
}

/** Cells where both occupations had a value but one was flagged: emptied, and counted. */
function leaveOut(grids: Grid[], bad: Uint8Array, probe: Grid): number {
  let n = 0;
  for (let i = 0; i < bad.length; i++) {
    if (!bad[i]) continue;
    if (probe[i] === probe[i]) n++;
    for (const g of grids) g[i] = NaN;
  }
  return n;
}

function column(g: Grid, nx: number, ny: number, j: number): Float64Array {
  const out = new Float64Array(ny);
  for (let i = 0; i < ny; i++) out[i] = g[i * nx + j];
  return out;
}

function defaultLayers(targets: Float64Array): Float64Array {
  const n = targets.length;
  if (n < 2) return Float64Array.from(targets);
  const k = Math.min(6, n - 1);
  return Float64Array.from({ length: k + 1 }, (_, i) => targets[Math.round((i * (n - 1)) / k)]);
}

/**
 * Compare occupation A (earlier; casts in line order) with B (later) of one line. See the head
 * of this file and docs/occupations.md for every rule.
 */
export function compareOccupations(
  a: OccupationCast[],
  b: OccupationCast[],
  opts: CompareOptions,
  gridded: { A?: readonly GriddedCast[]; B?: readonly GriddedCast[] } = {},
): Comparison {
  const stage = opts.stage ?? (() => undefined);
  const pos = commonPositions(a, b, opts);
  stage('pairing');
  const nx = pos.x.length;
  const P = opts.pressure;
  const T = opts.targets;
  const np = P.length;
  const ns = T.length;
  // Each used cast gridded once (or as given: gridded casts depend on no pairing choice).
  const gA = pos.usedA.map((i) => gridded.A?.[i] ?? gridOccupationCast(a[i], opts));
  const gB = pos.usedB.map((i) => gridded.B?.[i] ?? gridOccupationCast(b[i], opts));
  stage('remap each occupation');
  const badP = new Uint8Array(np * nx);
  const badS = new Uint8Array(ns * nx);
  const A = across(
    pos.weightsA,
    gA.map((g) => g.C),
    np,
    gA.map((g) => g.badP),
    badP,
  );
  const B = across(
    pos.weightsB,
    gB.map((g) => g.C),
    np,
    gB.map((g) => g.badP),
    badP,
  );
  const SA_A = across(
    pos.weightsA,
    gA.map((g) => g.SA),
    np,
  );
  const CT_A = across(
    pos.weightsA,
    gA.map((g) => g.CT),
    np,
  );
  const SA_B = across(
    pos.weightsB,
    gB.map((g) => g.SA),
    np,
  );
  const CT_B = across(
    pos.weightsB,
    gB.map((g) => g.CT),
    np,
  );
  const pA = across(
    pos.weightsA,
    gA.map((g) => g.pS),
    ns,
    gA.map((g) => g.badS),
    badS,
  );
  const pB = across(
    pos.weightsB,
    gB.map((g) => g.pS),
    ns,
    gB.map((g) => g.badS),
    badS,
  );
  const sA = across(
    pos.weightsA,
    gA.map((g) => g.CS),
    ns,
  );
  const sB = across(
    pos.weightsB,
    gB.map((g) => g.CS),
    ns,
  );
  stage('interpolation to common x');
  const diffP = sub(B, A);
  const heave = sub(pB, pA);
  const diffS = sub(sB, sA);
  const leftP = leaveOut([diffP], badP, diffP.slice());
  const leftS = leaveOut([heave, diffS], badS, heave.slice());

  const wmT = new Float64Array(np * nx).fill(NaN);
  const hvT = new Float64Array(np * nx).fill(NaN);
  const rsT = new Float64Array(np * nx).fill(NaN);
  const hv = new Float64Array(np * nx).fill(NaN);
  const sigmaOf = (sa: Float64Array, ct: Float64Array, out: Float64Array) => void sigma_batch(sa, ct, opts.ref, out);
  const specvolOf = (sa: Float64Array, ct: Float64Array, out: Float64Array) => {
    for (let i = 0; i < np; i++) out[i] = specvol_anom_standard(sa[i], ct[i], P[i]);
  };
  const sigA = derivedAcross(
    pos.weightsA,
    gA.map((g) => g.sigmaP),
    SA_A,
    CT_A,
    np,
    sigmaOf,
  );
  const sigB = derivedAcross(
    pos.weightsB,
    gB.map((g) => g.sigmaP),
    SA_B,
    CT_B,
    np,
    sigmaOf,
  );
  for (let j = 0; j < nx; j++) {
    const col = (g: Grid) => column(g, nx, np, j);
    const how = opts.interpolation ?? 'linear';
    // a position that is exactly one of A's casts uses that cast's own reference column
    const wA = pos.weightsA.w[j];
    const exact = pos.weightsA.k0[j] >= 0 && (wA === 0 || wA === 1);
    const ref = exact
      ? gA[wA === 0 ? pos.weightsA.k0[j] : pos.weightsA.k1[j]].reference
      : referenceColumn(P, col(A), col(sigA), opts.handling, how);
    const d = decomposeAgainst(P, ref, col(B), col(sigB), opts.handling, how);
    for (let i = 0; i < np; i++) {
      const o = i * nx + j;
      if (badP[o] || diffP[o] !== diffP[o]) continue;
      wmT[o] = d.waterMassTerm[i];
      hvT[o] = d.heaveTerm[i];
      rsT[o] = d.residual[i];
      hv[o] = d.heave[i];
    }
  }
  stage('decomposition');
  const mean = (g: Grid, ny: number) => alongLineMean(pos.x, g, ny);
  const layers = opts.layers ?? defaultLayers(T);
  let transport: LayerChange[] = [];
  if (nx >= 2) {
    const vA = derivedAcross(
      pos.weightsA,
      gA.map((g) => g.specvolAnomP),
      SA_A,
      CT_A,
      np,
      specvolOf,
    );
    const vB = derivedAcross(
      pos.weightsB,
      gB.map((g) => g.specvolAnomP),
      SA_B,
      CT_B,
      np,
      specvolOf,
    );
    transport = layerTransportOnGrids(
      pos.lon,
      pos.lat,
      P,
      { sigma: sigA, specvolAnom: vA },
      { sigma: sigB, specvolAnom: vB },
      layers,
    );
  }
  stage('means and transport');
  return {
    x: pos.x,
    lon: pos.lon,
    lat: pos.lat,
    pairs: pos.pairs,
    excluded: pos.excluded,
    pressure: P,
    sigma: T,
    onPressure: { A, B, diff: diffP, SA_A, CT_A, SA_B, CT_B },
    onDensity: { pA, pB, heave, A: sA, B: sB, diff: diffS },
    decomposition: { waterMassTerm: wmT, heaveTerm: hvT, residual: rsT, heave: hv },
    means: {
      onPressure: {
        diff: mean(diffP, np),
        waterMassTerm: mean(wmT, np),
        heaveTerm: mean(hvT, np),
        residual: mean(rsT, np),
      },
      onDensity: { heave: mean(heave, ns), diff: mean(diffS, ns) },
    },
    transport,
    years: yearsBetween(
      pos.usedA.map((i) => a[i].time),
      pos.usedB.map((i) => b[i].time),
    ),
    counts: {
      flaggedLevels: { A: gA.reduce((s, c) => s + c.flagged, 0), B: gB.reduce((s, c) => s + c.flagged, 0) },
      leftOut: { pressure: leftP, density: leftS },
      positions: nx,
    },
  };
}
