/**
 * All the automatic tests on one cast, as proposals: contiguous level runs a test failed, with the test, the
 * variable, the flag the test proposes and a sentence saying why. Proposals are not flags: a technician
 * accepts or rejects each (server/services/qcProposals.ts).
 */
import {
  GLOBAL_RANGE,
  GRADIENT_THRESHOLDS,
  PAIR_TOLERANCE,
  SPIKE_THRESHOLDS,
  densityInversion,
  globalRange,
  gradientTest,
  pressureIncreasing,
  rangeRegionAt,
  regionalRange,
  sensorPairDifference,
  spikeTest,
  stuckProfile,
  stuckRun,
  type QcVariable,
} from './tests';

export const QC_TESTS = [
  'pressure_increasing',
  'global_range',
  'regional_range',
  'spike',
  'gradient',
  'density_inversion',
  'stuck_value',
  'sensor_pair',
] as const;
export type QcTestId = (typeof QC_TESTS)[number];

/** How each test is named on screen, and where it comes from. */
export const QC_TEST_INFO: Record<QcTestId, { label: string; source: string }> = {
  pressure_increasing: { label: 'Pressure increasing', source: 'Argo real-time QC test 8' },
  global_range: { label: 'Global range', source: 'Argo real-time QC test 6' },
  regional_range: { label: 'Regional range', source: 'Argo real-time QC test 7' },
  spike: { label: 'Spike', source: 'Argo real-time QC test 9' },
  gradient: { label: 'Gradient', source: 'Argo real-time QC test 11' },
  density_inversion: { label: 'Density inversion', source: 'Argo real-time QC test 14, with Sigmaline’s detector' },
  stuck_value: { label: 'Stuck value', source: 'Argo real-time QC test 13, and a run form of ours' },
  sensor_pair: { label: 'Sensor pair difference', source: 'Sigmaline (duplicate sensors; common practice)' },
};

/** Flag variables a proposal can name (those the flag route accepts, less "all"). */
export type QcFlagVariable = 'temperature' | 'salinity' | 'conductivity' | 'oxygen';

export interface QcProfile {
  /** dbar */
  pressure: Float64Array;
  /** in-situ temperature, ITS-90 °C */
  temperature?: Float64Array;
  /** practical salinity, PSS-78 (measured, or from conductivity) */
  salinity?: Float64Array;
  /** mS/cm */
  conductivity?: Float64Array;
  /** µmol/kg */
  oxygen?: Float64Array;
  /** potential density anomaly σ0, kg/m³ */
  sigma0?: Float64Array;
  latitude: number;
  longitude: number;
  /** secondary sensors, with the variable of their primary */
  pairs?: { variable: 'temperature' | 'salinity' | 'conductivity'; name: string; values: Float64Array }[];
}

export interface QcProposal {
  test: QcTestId;
  variable: QcFlagVariable;
  /** first and last level index (inclusive) */
  iFrom: number;
  iTo: number;
  pFrom: number;
  pTo: number;
  levels: number;
  /** the flag the test proposes on the 1–9 scale: 3 questionable, 4 bad */
  flag: 3 | 4;
  detail: string;
}

export interface QcOptions {
  /** the density inversion threshold, kg/m³ (the INVERSION_THRESHOLD setting) */
  inversionThreshold: number;
}

/** Consecutive indices grouped as [first, last] runs. */
export function runsOf(indices: readonly number[]): [number, number][] {
  const out: [number, number][] = [];
  for (const i of indices) {
    const last = out[out.length - 1];
    if (last && i === last[1] + 1) last[1] = i;
    else out.push([i, i]);
  }
  return out;
}

const fmt = (v: number, d = 4) => (Number.isFinite(v) ? Number(v.toFixed(d)).toString() : '—');

/** Run every automatic test on the profile; proposals in test order, then by depth. */
export function runQc(profile: QcProfile, opts: QcOptions): QcProposal[] {
  const p = profile.pressure;
  const out: QcProposal[] = [];
  const push = (
    test: QcTestId,
    variable: QcFlagVariable,
    indices: number[],
    flag: 3 | 4,
    say: (a: number, b: number) => string,
  ) => {
    for (const [a, b] of runsOf(indices)) {
      out.push({
        test,
        variable,
        iFrom: a,
        iTo: b,
        pFrom: p[a],
        pTo: p[b],
        levels: b - a + 1,
        flag,
        detail: say(a, b),
      });
    }
  };
  const measured: [QcFlagVariable, Float64Array | undefined, string][] = [
    ['temperature', profile.temperature, '°C'],
    ['salinity', profile.salinity, ''],
    ['conductivity', profile.conductivity, 'mS/cm'],
    ['oxygen', profile.oxygen, 'µmol/kg'],
  ];

  // pressure increasing: the levels are flagged on every sensor (the whole scan is misplaced)
  const pinc = pressureIncreasing(p);
  if (pinc.length)
    push('pressure_increasing', 'temperature', pinc, 4, () => 'pressure not greater than the levels above');
  const pneg = globalRange(p, 'pressure');
  if (pneg.length)
    push('global_range', 'temperature', pneg, 4, () => `pressure below ${GLOBAL_RANGE.pressure.min} dbar`);

  for (const [v, values, unit] of measured) {
    if (!values) continue;
    const r = GLOBAL_RANGE[v as QcVariable];
    push('global_range', v, globalRange(values, v), 4, (a, b) =>
      `${fmt(values[a])}${a === b ? '' : '…'} ${unit} outside ${r.min} to ${r.max}`.replace(/ {2}/g, ' '),
    );
  }
  const region = rangeRegionAt(profile.longitude, profile.latitude);
  if (region) {
    for (const [v, values] of measured) {
      if (!values) continue;
      const lim = region.limits[v];
      if (lim)
        push(
          'regional_range',
          v,
          regionalRange(values, v, profile.longitude, profile.latitude),
          4,
          () => `outside ${lim.min} to ${lim.max} (${region.name})`,
        );
    }
  }
  for (const [v, values, unit] of measured) {
    const t = SPIKE_THRESHOLDS[v];
    if (!values || !t) continue;
    push('spike', v, spikeTest(values, p, t), 4, (a) =>
      `spike at ${fmt(p[a], 1)} dbar (threshold ${p[a] < t.boundary ? t.shallow : t.deep} ${unit})`.replace(' )', ')'),
    );
  }
  for (const [v, values, unit] of measured) {
    const t = GRADIENT_THRESHOLDS[v];
    if (!values || !t) continue;
    push('gradient', v, gradientTest(values, p, t), 4, (a) =>
      `gradient at ${fmt(p[a], 1)} dbar (threshold ${p[a] < t.boundary ? t.shallow : t.deep} ${unit})`.replace(
        ' )',
        ')',
      ),
    );
  }
  if (profile.sigma0) {
    const { intervals } = densityInversion(p, profile.sigma0, opts.inversionThreshold);
    for (const inv of intervals) {
      out.push({
        test: 'density_inversion',
        variable: 'salinity',
        iFrom: inv.iFrom,
        iTo: inv.iTo,
        pFrom: p[inv.iFrom],
        pTo: p[inv.iTo],
        levels: inv.iTo - inv.iFrom + 1,
        flag: 3,
        detail: `${inv.class}, σ0 deficit ${fmt(inv.deficit)} kg/m³ (threshold ${opts.inversionThreshold})`,
      });
    }
  }
  for (const [v, values] of measured) {
    if (!values) continue;
    const whole = stuckProfile(values);
    if (whole.length) {
      push('stuck_value', v, whole, 4, (a) => `every level reads ${fmt(values[a])}`);
      continue;
    }
    push('stuck_value', v, stuckRun(values, p), 4, (a, b) => `${b - a + 1} levels read ${fmt(values[a])}`);
  }
  for (const pair of profile.pairs ?? []) {
    const primary =
      pair.variable === 'temperature'
        ? profile.temperature
        : pair.variable === 'salinity'
          ? profile.salinity
          : profile.conductivity;
    const tol = PAIR_TOLERANCE[pair.variable];
    if (!primary || tol == null) continue;
    push(
      'sensor_pair',
      pair.variable,
      sensorPairDifference(primary, pair.values, tol),
      3,
      (a, b) =>
        `${pair.variable} − ${pair.name} up to ${fmt(maxAbsDiff(primary, pair.values, a, b))} (tolerance ${tol})`,
    );
  }
  return out;
}

function maxAbsDiff(a: Float64Array, b: Float64Array, from: number, to: number): number {
  let m = 0;
  for (let i = from; i <= to; i++) m = Math.max(m, Math.abs(a[i] - b[i]));
  return m;
}

/** Secondary sensors among a cast's extras, by name: temperature2, t2, salinity_2, conductivity_secondary… */
export function secondarySensorsOf(extras: Record<string, Float64Array>): NonNullable<QcProfile['pairs']> {
  const out: NonNullable<QcProfile['pairs']> = [];
  for (const [name, values] of Object.entries(extras)) {
    const m =
      /^(temperature|temp|t|ctdtmp|salinity|sal|sp|ctdsal|conductivity|cond|c|ctdcond)_?(2|b|secondary|sec)$/i.exec(
        name,
      );
    if (!m) continue;
    const root = m[1].toLowerCase();
    const variable = ['temperature', 'temp', 't', 'ctdtmp'].includes(root)
      ? 'temperature'
      : ['salinity', 'sal', 'sp', 'ctdsal'].includes(root)
        ? 'salinity'
        : 'conductivity';
    out.push({ variable, name, values });
  }
  return out;
}

/**
 * The profile the tests read, from a cast's stored columns (names as in server/services/processCast.ts:
 * pressure, temperature, SP, conductivity, oxygen, sigma0, and extras as `x:<name>`).
 */
export function qcProfileFromColumns(
  columns: Record<string, Float64Array>,
  latitude: number,
  longitude: number,
): QcProfile {
  const extras: Record<string, Float64Array> = {};
  for (const [k, v] of Object.entries(columns)) if (k.startsWith('x:')) extras[k.slice(2)] = v;
  return {
    pressure: columns.pressure,
    temperature: columns.temperature,
    salinity: columns.SP,
    conductivity: columns.conductivity,
    oxygen: columns.oxygen,
    sigma0: columns.sigma0,
    latitude,
    longitude,
    pairs: secondarySensorsOf(extras),
  };
}

/** Number of proposals per test (every test present, zero included). */
export function countByTest(proposals: readonly Pick<QcProposal, 'test'>[]): Record<QcTestId, number> {
  const out = Object.fromEntries(QC_TESTS.map((t) => [t, 0])) as Record<QcTestId, number>;
  for (const p of proposals) out[p.test]++;
  return out;
}
