// Each automatic test on a planted fault, on an invented analytic profile (not a reference for values: the
// thresholds are those of the Argo real-time QC manual — Wong, Keeley, Carval and the Argo Data Management
// Team, "Argo Quality Control Manual for CTD and Trajectory Data", v3.x — from memory, see shared/qc/tests.ts).
import { describe, expect, it } from 'vitest';
import {
  GLOBAL_RANGE,
  GRADIENT_THRESHOLDS,
  PAIR_TOLERANCE,
  SPIKE_THRESHOLDS,
  countByTest,
  densityInversion,
  globalRange,
  gradientTest,
  insidePolygon,
  pressureIncreasing,
  rangeRegionAt,
  regionalRange,
  runQc,
  runsOf,
  secondarySensorsOf,
  sensorPairDifference,
  spikeTest,
  stuckProfile,
  stuckRun,
  type QcProfile,
} from '../../../shared/qc';
import { sigma0 } from '../../../shared/seawater/density';

/** An invented smooth profile on 2 dbar levels: warm fresh surface over cold salty deep water. */
function profile(
  n = 1000,
): Required<Pick<QcProfile, 'pressure' | 'temperature' | 'salinity' | 'oxygen' | 'sigma0'>> & QcProfile {
  const p = new Float64Array(n);
  const t = new Float64Array(n);
  const s = new Float64Array(n);
  const o = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    p[i] = 2 + 2 * i;
    t[i] = 2 + 18 * Math.exp(-p[i] / 400);
    s[i] = 34.7 - 0.4 * Math.exp(-p[i] / 600) + 1e-4 * Math.sin(i * 1.3);
    o[i] = 220 - 60 * Math.exp(-((p[i] - 800) ** 2) / 2e5);
  }
  const sg = Float64Array.from(p, (_, i) => sigma0((s[i] * 35.16504) / 35, t[i]));
  return { pressure: p, temperature: t, salinity: s, oxygen: o, sigma0: sg, latitude: -40, longitude: -20 };
}
const resigma = (pr: ReturnType<typeof profile>) => {
  pr.sigma0 = Float64Array.from(pr.pressure, (_, i) => sigma0((pr.salinity[i] * 35.16504) / 35, pr.temperature[i]));
};
const OPTS = { inversionThreshold: 0.01 };

describe('the stable invented profile', () => {
  it('raises no proposal from any test', () => {
    const pr = profile();
    expect(runQc(pr, OPTS)).toEqual([]);
  });
});

describe('pressure increasing (Argo test 8)', () => {
  it('finds a reversed pressure and a repeated one, keeping the first of equal pressures', () => {
    const p = Float64Array.from([2, 4, 6, 5, 8, 8, 10]);
    expect(pressureIncreasing(p)).toEqual([3, 5]);
  });
  it('a reversed pressure in a whole profile becomes one proposal', () => {
    const pr = profile();
    pr.pressure[500] = pr.pressure[498];
    const props = runQc(pr, OPTS).filter((x) => x.test === 'pressure_increasing');
    expect(props).toMatchObject([{ iFrom: 500, iTo: 500, flag: 4 }]);
  });
});

describe('global range (Argo test 6)', () => {
  it('limits are those of the manual (from memory)', () => {
    expect(GLOBAL_RANGE.temperature).toEqual({ min: -2.5, max: 40 });
    expect(GLOBAL_RANGE.salinity).toEqual({ min: 2, max: 41 });
  });
  it('an out-of-range value fails and the bounds pass', () => {
    expect(globalRange(Float64Array.from([-2.5, 40, 40.01, -3, NaN]), 'temperature')).toEqual([2, 3]);
    const pr = profile();
    pr.salinity[700] = 45;
    resigma(pr);
    const props = runQc(pr, OPTS).filter((x) => x.test === 'global_range');
    expect(props).toMatchObject([{ variable: 'salinity', iFrom: 700, iTo: 700, flag: 4 }]);
  });
});

describe('regional range (Argo test 7)', () => {
  it('knows the Red Sea and the Mediterranean and nowhere else', () => {
    expect(rangeRegionAt(38, 20)?.name).toBe('Red Sea');
    expect(rangeRegionAt(18, 35)?.name).toBe('Mediterranean Sea');
    expect(rangeRegionAt(-30, -35)).toBeNull();
    expect(
      insidePolygon(0, 0, [
        [-1, -1],
        [1, -1],
        [1, 1],
        [-1, 1],
      ]),
    ).toBe(true);
  });
  it('Red Sea water colder than 21.7 °C fails there, not in the open ocean', () => {
    const t = Float64Array.from([25, 22, 21.6, 21.8]);
    expect(regionalRange(t, 'temperature', 38, 20)).toEqual([2]);
    expect(regionalRange(t, 'temperature', -30, -35)).toEqual([]);
  });
});

describe('spike (Argo test 9)', () => {
  it('finds a planted temperature spike below 500 dbar bigger than 2 °C, not a smaller one', () => {
    const pr = profile();
    pr.temperature[600] += 2.5; // 1202 dbar
    pr.temperature[800] += 1.5;
    expect(spikeTest(pr.temperature, pr.pressure, SPIKE_THRESHOLDS.temperature!)).toEqual([600]);
  });
  it('uses the shallow threshold above 500 dbar', () => {
    const pr = profile();
    pr.salinity[100] += 0.8; // 202 dbar: under 0.9
    pr.salinity[120] += 1.0;
    expect(spikeTest(pr.salinity, pr.pressure, SPIKE_THRESHOLDS.salinity!)).toEqual([120]);
  });
  it('a missing neighbour is not a spike', () => {
    const v = Float64Array.from([1, 1, NaN, 10, 1, 1]);
    expect(spikeTest(v, Float64Array.from([600, 602, 604, 606, 608, 610]), SPIKE_THRESHOLDS.temperature!)).toEqual([]);
  });
});

describe('gradient (Argo test 11)', () => {
  it('finds a planted step deeper than 500 dbar whose gradient exceeds 3 °C', () => {
    const pr = profile();
    for (let i = 700; i < pr.pressure.length; i++) pr.temperature[i] += 7; // a 7 °C step at 1402 dbar
    const hits = gradientTest(pr.temperature, pr.pressure, GRADIENT_THRESHOLDS.temperature!);
    expect(hits).toEqual([699, 700]);
    // the spike test does not see a step: |V2 − mean| equals |half the difference|
    expect(spikeTest(pr.temperature, pr.pressure, SPIKE_THRESHOLDS.temperature!)).toEqual([]);
  });
});

describe('stuck value (Argo test 13 and our run form)', () => {
  it('a sensor stuck for the whole profile fails every level', () => {
    expect(stuckProfile(new Float64Array(50).fill(34.5))).toHaveLength(50);
    expect(stuckProfile(Float64Array.from([1, 1, 2]))).toEqual([]);
  });
  it('a sensor that sticks part-way down for 60 dbar fails that run only', () => {
    const pr = profile();
    for (let i = 400; i < 430; i++) pr.oxygen[i] = pr.oxygen[400];
    const hits = stuckRun(pr.oxygen, pr.pressure);
    expect(runsOf(hits)).toEqual([[400, 429]]);
    const props = runQc(pr, OPTS).filter((x) => x.test === 'stuck_value');
    expect(props).toMatchObject([{ variable: 'oxygen', iFrom: 400, iTo: 429, levels: 30, flag: 4 }]);
  });
  it('a short run of equal values passes', () => {
    const pr = profile();
    for (let i = 400; i < 410; i++) pr.oxygen[i] = pr.oxygen[400];
    expect(stuckRun(pr.oxygen, pr.pressure)).toEqual([]);
  });
});

describe('density inversion (our detector, with the threshold setting)', () => {
  it('a planted salinity spike gives one proposal on its light level', () => {
    const pr = profile();
    pr.salinity[600] -= 0.05;
    resigma(pr);
    const { intervals } = densityInversion(pr.pressure, pr.sigma0, 0.01);
    expect(intervals).toMatchObject([{ iFrom: 600, iTo: 600, class: 'spike' }]);
    const props = runQc(pr, OPTS);
    expect(props).toMatchObject([{ test: 'density_inversion', variable: 'salinity', iFrom: 600, iTo: 600, flag: 3 }]);
  });
  it('a deficit below the threshold is not proposed', () => {
    const pr = profile();
    pr.salinity[600] -= 0.005;
    resigma(pr);
    expect(runQc(pr, OPTS)).toEqual([]);
  });
});

describe('sensor pair difference (ours)', () => {
  it('a secondary temperature sensor drifting away is found where the difference passes 0.01 °C', () => {
    const pr = profile();
    const t2 = Float64Array.from(pr.temperature, (v, i) => v + (i >= 500 ? (i - 500) * 4e-5 : 0)); // drift 0.00004 °C a level
    const hits = sensorPairDifference(pr.temperature, t2, PAIR_TOLERANCE.temperature!);
    // difference exceeds 0.01 once (i − 500)·4e-5 > 0.01, i.e. from i = 751
    expect(hits[0]).toBe(751);
    expect(hits[hits.length - 1]).toBe(999);
    const props = runQc({ ...pr, pairs: secondarySensorsOf({ temperature2: t2 }) }, OPTS);
    expect(props).toMatchObject([{ test: 'sensor_pair', variable: 'temperature', iFrom: 751, iTo: 999, flag: 3 }]);
  });
  it('recognises secondary sensors by name and leaves other extras alone', () => {
    const a = new Float64Array(3);
    expect(
      secondarySensorsOf({ temperature2: a, ctdsal_2: a, cond_secondary: a, fluorescence: a }).map((x) => [
        x.name,
        x.variable,
      ]),
    ).toEqual([
      ['temperature2', 'temperature'],
      ['ctdsal_2', 'salinity'],
      ['cond_secondary', 'conductivity'],
    ]);
  });
});

describe('proposals', () => {
  it('group consecutive levels and count per test', () => {
    expect(runsOf([1, 2, 3, 7, 9, 10])).toEqual([
      [1, 3],
      [7, 7],
      [9, 10],
    ]);
    const pr = profile();
    pr.temperature[600] += 2.5;
    pr.salinity[700] = 45;
    resigma(pr);
    const c = countByTest(runQc(pr, OPTS));
    expect(c.spike).toBeGreaterThanOrEqual(1);
    expect(c.global_range).toBe(1);
    expect(c.regional_range).toBe(0);
  });
});
