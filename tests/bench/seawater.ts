// Benchmark of the density half of the seawater core against the TEOS-10 reference library
// (source: Debian python3-gsw 3.6.16 through /usr/bin/python3, same points, same run). The
// reference time is taken inside Python around the gsw call only; each side reports the best of
// five runs after warm-up, so start-up and the transfer of the points count for neither.

import { execFileSync } from 'node:child_process';
import { GSW_PYTHON } from '../reference/python';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { sigma0_batch, sigma_batch } from '../../shared/seawater/density';

export interface SeawaterBenchRow {
  name: string;
  oursMs: number;
  refMs: number;
}

const PYTHON = String.raw`
import json, sys, time
import numpy as np
import gsw
d = sys.argv[1]
SA = np.fromfile(d + '/SA.f64'); CT = np.fromfile(d + '/CT.f64')
def best(fn):
    fn(); fn(); fn()
    times = []
    for _ in range(5):
        t0 = time.perf_counter(); fn(); times.append(time.perf_counter() - t0)
    return 1000 * min(times)
print(json.dumps({'sigma0': best(lambda: gsw.sigma0(SA, CT)), 'sigma2': best(lambda: gsw.sigma2(SA, CT))}))
`;

/** Ocean (SA, CT) pairs from a fixed seed: SA = SR of SP 2–42, CT −2…35 °C. */
export function randomSACT(n: number, seed = 424242): { SA: Float64Array; CT: Float64Array } {
  let s = seed >>> 0;
  const next = () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 4294967296;
  };
  const SA = new Float64Array(n),
    CT = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    SA[i] = (2 + 40 * next()) * (35.16504 / 35);
    CT[i] = -2 + 37 * next();
  }
  return { SA, CT };
}

/** Best of five after three warm-up runs (the JIT needs a few passes to settle). */
function bestOf5(fn: () => void): number {
  for (let w = 0; w < 3; w++) fn();
  let best = Infinity;
  for (let r = 0; r < 5; r++) {
    const t0 = performance.now();
    fn();
    best = Math.min(best, performance.now() - t0);
  }
  return best;
}

/** Time sigma0_batch (and sigma_batch at 2000 dbar) over n points, ours and python3-gsw's. */
export function benchSeawater(n: number): SeawaterBenchRow[] {
  const { SA, CT } = randomSACT(n);
  const out = new Float64Array(n);
  const ours0 = bestOf5(() => sigma0_batch(SA, CT, out));
  const ours2 = bestOf5(() => sigma_batch(SA, CT, 2000, out));
  const dir = mkdtempSync(join(tmpdir(), 'sigmaline-bench-density-'));
  try {
    writeFileSync(join(dir, 'SA.f64'), new Uint8Array(SA.buffer));
    writeFileSync(join(dir, 'CT.f64'), new Uint8Array(CT.buffer));
    const ref = JSON.parse(execFileSync(GSW_PYTHON, ['-c', PYTHON, dir], { encoding: 'utf8' })) as {
      sigma0: number;
      sigma2: number;
    };
    return [
      { name: 'sigma0', oursMs: ours0, refMs: ref.sigma0 },
      { name: 'sigma2', oursMs: ours2, refMs: ref.sigma2 },
    ];
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
