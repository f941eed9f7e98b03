/**
 * The standard automatic tests of a CTD profile, one pure function per test, on typed arrays.
 *
 * Source of the tests and of their thresholds: the Argo real-time quality-control tests, as described in
 * Wong, A., Keeley, R., Carval, T. and the Argo Data Management Team, "Argo Quality Control Manual for CTD
 * and Trajectory Data" (Argo Data Management, versions 3.x, 2020–2023), and for dissolved oxygen
 * Thierry, V., Bittig, H. and the Argo BGC team, "Argo quality control manual for dissolved oxygen
 * concentration" (2021). The thresholds below are written from memory of those manuals and are marked so;
 * check them against the edition you work to before relying on them. Tests that are not in the manuals (the
 * run form of the stuck-value test, the sensor-pair difference) say so and give their own basis.
 *
 * Every test returns the indices of the levels it fails, ascending. NaN values never fail a test and
 * never serve as a neighbour: a missing level is not a spike.
 */
import { detectInversions } from '../remap/inversions';

/** Variables the tests know, in the names of the stored columns' roles. */
export type QcVariable = 'pressure' | 'temperature' | 'salinity' | 'conductivity' | 'oxygen';

const finite = Number.isFinite;

// ---------------------------------------------------------------------------------------------------------------
// Pressure increasing

/**
 * Pressure increasing test (Argo real-time test 8; Wong et al., Argo QC manual): pressure must increase
 * monotonically down the profile. A level whose pressure is not greater than every finite pressure above it
 * fails (a run of equal pressures keeps its first level). Pressure in dbar.
 */
export function pressureIncreasing(p: Float64Array): number[] {
  const out: number[] = [];
  let max = -Infinity;
  for (let i = 0; i < p.length; i++) {
    const v = p[i];
    if (!finite(v)) continue;
    if (v <= max) out.push(i);
    else max = v;
  }
  return out;
}

// ---------------------------------------------------------------------------------------------------------------
// Global and regional ranges

/** A closed interval of acceptable values. */
export interface Range {
  min: number;
  max: number;
}

/**
 * Global range limits (Argo real-time test 6; Wong et al., Argo QC manual; from memory): in-situ temperature
 * −2.5 to 40.0 °C (ITS-90), practical salinity 2.0 to 41.0, pressure not below −5 dbar; dissolved oxygen
 * −5 to 600 µmol/kg (Thierry et al., Argo oxygen QC manual; from memory). Conductivity is not in the manuals:
 * 0 to 70 mS/cm is our own bound (seawater between the limits above stays inside it; common practice).
 */
export const GLOBAL_RANGE: Record<QcVariable, Range> = {
  pressure: { min: -5, max: Infinity },
  temperature: { min: -2.5, max: 40 },
  salinity: { min: 2, max: 41 },
  conductivity: { min: 0, max: 70 },
  oxygen: { min: -5, max: 600 },
};

/** Levels outside `range` (inclusive bounds pass). */
export function outsideRange(values: Float64Array, range: Range): number[] {
  const out: number[] = [];
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (finite(v) && (v < range.min || v > range.max)) out.push(i);
  }
  return out;
}

/** Global range test (Argo real-time test 6) of one variable, with the limits of {@link GLOBAL_RANGE}. */
export function globalRange(values: Float64Array, variable: QcVariable): number[] {
  return outsideRange(values, GLOBAL_RANGE[variable]);
}

/** A region of the regional range test: a polygon of [longitude °E, latitude °N] and its limits. */
export interface RangeRegion {
  name: string;
  polygon: readonly (readonly [number, number])[];
  limits: Partial<Record<QcVariable, Range>>;
}

/**
 * Regions of the regional range test (Argo real-time test 7; Wong et al., Argo QC manual; polygons and limits
 * from memory): the Red Sea, temperature 21.7 to 40.0 °C and salinity 2.0 to 41.0; the Mediterranean Sea,
 * temperature 10.0 to 40.0 °C and salinity 2.0 to 40.0.
 */
export const RANGE_REGIONS: readonly RangeRegion[] = [
  {
    name: 'Red Sea',
    polygon: [
      [40, 10],
      [50, 20],
      [30, 30],
      [40, 10],
    ],
    limits: { temperature: { min: 21.7, max: 40 }, salinity: { min: 2, max: 41 } },
  },
  {
    name: 'Mediterranean Sea',
    polygon: [
      [-6, 30],
      [40, 30],
      [35, 40],
      [20, 42],
      [15, 50],
      [5, 40],
      [-6, 30],
    ],
    limits: { temperature: { min: 10, max: 40 }, salinity: { min: 2, max: 40 } },
  },
];

/** Is the point inside the polygon (even–odd rule, plane coordinates in degrees)? */
export function insidePolygon(lon: number, lat: number, polygon: readonly (readonly [number, number])[]): boolean {
  let inside = false;
  for (let i = 0, j = polygon.length - 1; i < polygon.length; j = i++) {
    const [xi, yi] = polygon[i];
    const [xj, yj] = polygon[j];
    if (yi > lat !== yj > lat && lon < ((xj - xi) * (lat - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside;
}

/** The region of {@link RANGE_REGIONS} holding the position, or null. */
export function rangeRegionAt(lon: number, lat: number): RangeRegion | null {
  return RANGE_REGIONS.find((r) => insidePolygon(lon, lat, r.polygon)) ?? null;
}

/**
 * Regional range test (Argo real-time test 7): in a region of {@link RANGE_REGIONS}, the levels outside the
 * region's limits for the variable. Outside every region, or for a variable without regional limits, [].
 */
export function regionalRange(values: Float64Array, variable: QcVariable, lon: number, lat: number): number[] {
  const region = rangeRegionAt(lon, lat);
  const limits = region?.limits[variable];
  return limits ? outsideRange(values, limits) : [];
}

// ---------------------------------------------------------------------------------------------------------------
// Spike and gradient

/** Thresholds above and below 500 dbar, in the variable's unit. */
export interface DepthThresholds {
  shallow: number;
  deep: number;
  boundary: number;
}

/**
 * Spike test thresholds (Argo real-time test 9; Wong et al., Argo QC manual; from memory): temperature 6 °C
 * shallower than 500 dbar and 2 °C deeper; salinity 0.9 and 0.3; dissolved oxygen 50 and 25 µmol/kg
 * (Thierry et al., Argo oxygen QC manual; from memory).
 */
export const SPIKE_THRESHOLDS: Partial<Record<QcVariable, DepthThresholds>> = {
  temperature: { shallow: 6, deep: 2, boundary: 500 },
  salinity: { shallow: 0.9, deep: 0.3, boundary: 500 },
  oxygen: { shallow: 50, deep: 25, boundary: 500 },
};

/**
 * Gradient test thresholds (Argo real-time test 11; Wong et al., Argo QC manual; from memory — later editions
 * dropped this test in favour of the spike test alone): temperature 9 °C shallower than 500 dbar and 3 °C
 * deeper; salinity 1.5 and 0.5.
 */
export const GRADIENT_THRESHOLDS: Partial<Record<QcVariable, DepthThresholds>> = {
  temperature: { shallow: 9, deep: 3, boundary: 500 },
  salinity: { shallow: 1.5, deep: 0.5, boundary: 500 },
};

const thresholdAt = (t: DepthThresholds, p: number) => (p < t.boundary ? t.shallow : t.deep);

/**
 * Spike test (Argo real-time test 9): with V2 a level and V1, V3 the levels above and below,
 * test value = |V2 − (V3 + V1)/2| − |(V3 − V1)/2|; the level fails when the test value exceeds the
 * threshold at its pressure (dbar). End levels and levels next to a missing value are not tested.
 */
export function spikeTest(values: Float64Array, p: Float64Array, t: DepthThresholds): number[] {
  const out: number[] = [];
  for (let i = 1; i < values.length - 1; i++) {
    const v1 = values[i - 1];
    const v2 = values[i];
    const v3 = values[i + 1];
    if (!finite(v1) || !finite(v2) || !finite(v3) || !finite(p[i])) continue;
    const test = Math.abs(v2 - (v3 + v1) / 2) - Math.abs((v3 - v1) / 2);
    if (test > thresholdAt(t, p[i])) out.push(i);
  }
  return out;
}

/**
 * Gradient test (Argo real-time test 11): test value = |V2 − (V3 + V1)/2| with V1, V3 the levels above and
 * below; the level fails when it exceeds the threshold at its pressure (dbar).
 */
export function gradientTest(values: Float64Array, p: Float64Array, t: DepthThresholds): number[] {
  const out: number[] = [];
  for (let i = 1; i < values.length - 1; i++) {
    const v1 = values[i - 1];
    const v2 = values[i];
    const v3 = values[i + 1];
    if (!finite(v1) || !finite(v2) || !finite(v3) || !finite(p[i])) continue;
    if (Math.abs(v2 - (v3 + v1) / 2) > thresholdAt(t, p[i])) out.push(i);
  }
  return out;
}

// ---------------------------------------------------------------------------------------------------------------
// Stuck value

/**
 * Stuck value test (Argo real-time test 13; Wong et al., Argo QC manual): every finite value of the variable
 * in the profile is the same; then every level fails. Profiles of fewer than `minLevels` finite values
 * (default 3) are not tested.
 */
export function stuckProfile(values: Float64Array, minLevels = 3): number[] {
  const idx: number[] = [];
  let first = NaN;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (!finite(v)) continue;
    if (idx.length === 0) first = v;
    else if (v !== first) return [];
    idx.push(i);
  }
  return idx.length >= minLevels ? idx : [];
}

/**
 * A run form of the stuck value test (ours, not in the manual): a sensor that sticks part-way down repeats
 * its last value exactly; a run of at least `minLevels` consecutive identical finite values spanning at least
 * `minSpan` dbar fails. Defaults 25 levels and 50 dbar: a 2 dbar profile that repeats a value to the written
 * resolution for 50 dbar is rare in calibrated data (checked on the SR1B section: tests/unit/qc/sr1b.test.ts).
 */
export const STUCK_RUN = { minLevels: 25, minSpan: 50 } as const;

export function stuckRun(
  values: Float64Array,
  p: Float64Array,
  opts: { minLevels?: number; minSpan?: number } = {},
): number[] {
  const minLevels = opts.minLevels ?? STUCK_RUN.minLevels;
  const minSpan = opts.minSpan ?? STUCK_RUN.minSpan;
  const out: number[] = [];
  let start = 0;
  const flush = (end: number) => {
    // run [start, end)
    if (end - start >= minLevels && finite(values[start]) && p[end - 1] - p[start] >= minSpan) {
      for (let k = start; k < end; k++) out.push(k);
    }
  };
  for (let i = 1; i <= values.length; i++) {
    if (i < values.length && values[i] === values[start]) continue;
    flush(i);
    start = i;
  }
  return out;
}

// ---------------------------------------------------------------------------------------------------------------
// Density inversion

/**
 * Density inversion test (Argo real-time test 14 asks that σ0 not decrease down the profile; from memory the
 * manual's tolerance is 0.03 kg/m³). Sigmaline uses its own inversion detector (shared/remap/inversions:
 * the running-maximum scan, see docs/science.md) with the inversion threshold setting (default 0.01 kg/m³):
 * the levels lighter than the parcel above fail — for a spike its light levels, for an overturn the whole
 * interval from the heavy parcel down.
 */
export function densityInversion(
  p: Float64Array,
  sigma0: Float64Array,
  threshold: number,
): { indices: number[]; intervals: { iFrom: number; iTo: number; deficit: number; class: string }[] } {
  const found = detectInversions(p, sigma0, { threshold });
  const indices: number[] = [];
  const intervals: { iFrom: number; iTo: number; deficit: number; class: string }[] = [];
  for (const inv of found) {
    const iFrom = inv.class === 'spike' ? inv.iTop + 1 : inv.iTop;
    for (let k = iFrom; k <= inv.iBottom; k++) indices.push(k);
    intervals.push({ iFrom, iTo: inv.iBottom, deficit: inv.deficit, class: inv.class });
  }
  return { indices, intervals };
}

// ---------------------------------------------------------------------------------------------------------------
// Sensor pairs

/**
 * Largest difference accepted between the two sensors of a pair (ours; common practice, values from memory):
 * ship CTDs carry duplicate temperature and conductivity sensors which, calibrated, agree to about 0.002 °C
 * and 0.002 in salinity; five times that, 0.01 °C, 0.01 (PSS-78) and 0.01 mS/cm, is taken as a drift.
 */
export const PAIR_TOLERANCE: Partial<Record<QcVariable, number>> = {
  temperature: 0.01,
  salinity: 0.01,
  conductivity: 0.01,
};

/**
 * Sensor-pair difference (ours; see {@link PAIR_TOLERANCE}): the levels where the primary and secondary
 * sensors of one variable differ by more than `tolerance` (both finite). The test cannot tell which sensor
 * is wrong; it proposes the primary, which is the one the products use.
 */
export function sensorPairDifference(primary: Float64Array, secondary: Float64Array, tolerance: number): number[] {
  const out: number[] = [];
  const n = Math.min(primary.length, secondary.length);
  for (let i = 0; i < n; i++) {
    const a = primary[i];
    const b = secondary[i];
    if (finite(a) && finite(b) && Math.abs(a - b) > tolerance) out.push(i);
  }
  return out;
}
