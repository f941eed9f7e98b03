/**
 * Benchmark of the density-coordinate engine: 60 casts × 5000 levels remapped onto 200
 * isopycnals (Thorpe sort, linear), and both section grids built (2-dbar pressure bins and the
 * σ grid). The reference is the same remap in numpy 1.24, timed inside /usr/bin/python3: per cast
 * a check that σ is sorted, the Thorpe reordering (a stable argsort of σ, parcels moving while the
 * pressure grid stays) where it is not, then numpy.interp of pressure, CT and SA at the targets and
 * the layer thickness between mid-levels. Ours does more per cast (the inversion scan, crossing
 * counts, flags), so the ratio is conservative.
 * The casts are synthetic timing data (smooth stable profiles with a few planted spikes); no
 * figure here is a correctness check.
 */
import { execFileSync } from 'node:child_process';
import { GSW_PYTHON } from '../reference/python';
import { remapToIsopycnals } from '../../shared/remap';
import { buildDensitySection, buildPressureSection, type SectionCast } from '../../shared/section';
import type { BenchResult } from './modules';

const N_CASTS = 60;
const N_LEVELS = 5000;
const N_TARGETS = 200;

function makeCasts(spikes: boolean): SectionCast[] {
  const casts: SectionCast[] = [];
  for (let c = 0; c < N_CASTS; c++) {
    const p = new Float64Array(N_LEVELS);
    const sigma = new Float64Array(N_LEVELS);
    const CT = new Float64Array(N_LEVELS);
    const SA = new Float64Array(N_LEVELS);
    const H = 700 + 5 * c;
    for (let i = 0; i < N_LEVELS; i++) {
      p[i] = i + 1;
      sigma[i] = 24 + 3.7 * (1 - Math.exp(-p[i] / H)) + 1e-5 * i;
      CT[i] = 2 + 22 * Math.exp(-p[i] / (H * 0.8));
      SA[i] = 34.9 + 0.5 * Math.exp(-p[i] / (H * 1.5));
    }
    if (spikes) sigma[400 + c] -= 0.02; // a lag spike per cast, so the sort path has work to do
    casts.push({
      id: `c${c}`,
      station: `${c}`,
      lon: -30 + 0.25 * c,
      lat: -20,
      bottomDepth: null,
      p,
      sigma,
      props: { CT, SA },
    });
  }
  return casts;
}

const median = (a: number[]) => [...a].sort((x, y) => x - y)[a.length >> 1];

function time(fn: () => void, runs: number): number {
  fn();
  fn(); // warm the JIT
  const t: number[] = [];
  for (let r = 0; r < runs; r++) {
    const t0 = performance.now();
    fn();
    t.push(performance.now() - t0);
  }
  return median(t);
}

const PY = `
import sys, json, time, numpy as np
d = json.load(sys.stdin)
tg = np.array(d['targets'])
casts = [(np.array(c['p']), np.array(c['sigma']), np.array(c['CT']), np.array(c['SA'])) for c in d['casts']]
def remap():
    out = []
    for p, s, ct, sa in casts:
        if not np.all(s[1:] >= s[:-1]):
            o = np.argsort(s, kind='stable'); s = s[o]; ct = ct[o]; sa = sa[o]
        pt = np.interp(tg, s, p, left=np.nan, right=np.nan)
        mid = np.interp(0.5 * (tg[1:] + tg[:-1]), s, p, left=np.nan, right=np.nan)
        th = np.full(tg.shape, np.nan); th[1:-1] = mid[1:] - mid[:-1]
        out.append((pt, np.interp(tg, s, ct, left=np.nan, right=np.nan), np.interp(tg, s, sa, left=np.nan, right=np.nan), th))
    return out
remap(); remap()
ts = []
for _ in range(d['runs']):
    t0 = time.perf_counter(); remap(); ts.append((time.perf_counter() - t0) * 1000)
print(json.dumps({'ms': sorted(ts)[len(ts) // 2]}))
`;

// The same outputs as ours, in numpy: besides the interpolation, the inversions (running maximum
// of σ and the levels lighter than it by more than 0.01 kg/m³), the crossings of each target by
// the measured profile (intervals passing through it, counted with searchsorted and a difference
// array with bincount: O(n log m), numpy's natural way), and the outcrop / below-bottom / multi-crossing /
// in-inversion flags.
const PY_FULL = `
import sys, json, time, numpy as np
d = json.load(sys.stdin)
tg = np.array(d['targets'])
m = tg.size
casts = [(np.array(c['p']), np.array(c['sigma']), np.array(c['CT']), np.array(c['SA'])) for c in d['casts']]
def remap():
    out = []
    for p, s0, ct0, sa0 in casts:
        runmax = np.maximum.accumulate(s0)
        light = (runmax - s0) > 0.01
        lo = np.minimum(s0[:-1], s0[1:]); hi = np.maximum(s0[:-1], s0[1:])
        diff = np.bincount(np.searchsorted(tg, lo, side='right'), minlength=m + 1) - np.bincount(np.searchsorted(tg, hi, side='left'), minlength=m + 1)
        crossings = np.cumsum(diff[:m])
        s, ct, sa = s0, ct0, sa0
        if not np.all(s0[1:] >= s0[:-1]):
            o = np.argsort(s0, kind='stable'); s = s0[o]; ct = ct0[o]; sa = sa0[o]
        pt = np.interp(tg, s, p, left=np.nan, right=np.nan)
        mid = np.interp(0.5 * (tg[1:] + tg[:-1]), s, p, left=np.nan, right=np.nan)
        th = np.full(tg.shape, np.nan); th[1:-1] = mid[1:] - mid[:-1]
        flags = (tg < s[0]) * 1 + (tg > s[-1]) * 2 + (crossings > 1) * 4
        if light.any():
            flags = flags + np.isin(np.searchsorted(p, pt), np.nonzero(light)[0]) * 8
        out.append((pt, np.interp(tg, s, ct, left=np.nan, right=np.nan), np.interp(tg, s, sa, left=np.nan, right=np.nan), th, crossings, flags))
    return out
remap(); remap()
ts = []
for _ in range(d['runs']):
    t0 = time.perf_counter(); remap(); ts.append((time.perf_counter() - t0) * 1000)
print(json.dumps({'ms': sorted(ts)[len(ts) // 2]}))
`;

function remapAll(casts: SectionCast[], targets: Float64Array): void {
  for (const c of casts) remapToIsopycnals(c, targets, { handling: 'sort', interpolation: 'linear' });
}

function numpyMs(casts: SectionCast[], targets: Float64Array, runs: number, script = PY): number {
  const input = JSON.stringify({
    targets: Array.from(targets),
    runs,
    casts: casts.map((c) => ({
      p: Array.from(c.p),
      sigma: Array.from(c.sigma),
      CT: Array.from(c.props.CT),
      SA: Array.from(c.props.SA),
    })),
  });
  return (
    JSON.parse(execFileSync(GSW_PYTHON, ['-c', script], { input, maxBuffer: 1 << 26 }).toString()) as { ms: number }
  ).ms;
}

export async function bench(): Promise<BenchResult[]> {
  const stable = makeCasts(false);
  const spiky = makeCasts(true);
  const targets = Float64Array.from({ length: N_TARGETS }, (_, j) => 24.0 + (3.7 * j) / (N_TARGETS - 1));
  const runs = 15;
  const totalMs = time(() => {
    remapAll(spiky, targets);
    buildPressureSection(spiky, { property: 'CT', binSize: 2 });
    buildDensitySection(spiky, { property: 'CT', targets, handling: 'sort', interpolation: 'linear' });
  }, runs);
  const stableMs = time(() => remapAll(stable, targets), runs);
  const spikyMs = time(() => remapAll(spiky, targets), runs);
  return [
    {
      name: `remap ${N_CASTS} casts × ${N_LEVELS} levels onto ${N_TARGETS} isopycnals (one spike per cast) + pressure (2 dbar) and density grids`,
      value: totalMs,
      unit: 'ms',
      target: '< 150 ms',
    },
    {
      name: `remap ${N_CASTS} × ${N_LEVELS} onto ${N_TARGETS}, stable casts (sort, linear) vs numpy (sort check, Thorpe argsort, interp, thickness)`,
      value: stableMs,
      unit: 'ms',
      reference: numpyMs(stable, targets, runs),
      target: 'ratio ≤ 1.0',
    },
    {
      name: `remap ${N_CASTS} × ${N_LEVELS} onto ${N_TARGETS}, one spike per cast (sort, linear) vs numpy (sort check, Thorpe argsort, interp, thickness)`,
      value: spikyMs,
      unit: 'ms',
      reference: numpyMs(spiky, targets, runs),
      target: 'ratio ≤ 1.0',
    },
    {
      name: `remap ${N_CASTS} × ${N_LEVELS} onto ${N_TARGETS}, stable casts, vs numpy with the same outputs (inversions, crossings, flags)`,
      value: stableMs,
      unit: 'ms',
      reference: numpyMs(stable, targets, runs, PY_FULL),
      target: 'ratio ≤ 1.0',
    },
    {
      name: `remap ${N_CASTS} × ${N_LEVELS} onto ${N_TARGETS}, one spike per cast, vs numpy with the same outputs (inversions, crossings, flags)`,
      value: spikyMs,
      unit: 'ms',
      reference: numpyMs(spiky, targets, runs, PY_FULL),
      target: 'ratio ≤ 1.0',
    },
  ];
}

// Run directly: npx tsx tests/bench/remap.ts
if (import.meta.url === `file://${process.argv[1]}`) {
  bench().then((rs) => {
    for (const r of rs)
      console.log(
        `${r.name}: ${r.value.toFixed(2)} ${r.unit}${r.reference !== undefined ? `  reference ${r.reference.toFixed(2)} ms  ratio ${(r.value / r.reference).toFixed(2)}` : ''}  target ${r.target}`,
      );
  });
}
