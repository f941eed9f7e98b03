// Benchmark of the thermodynamic seawater batch functions against the TEOS-10 reference library
// (source: Debian python3-gsw 3.6.16, run by /usr/bin/python3 in the same run, on the same points).
// The reference time is measured inside Python around the gsw call alone, so neither process
// start-up nor the transfer of the points counts for either side. Each side's time is the best
// of three runs after a warm-up, and the two sides take turns for three rounds (the best round
// counts), so that load from other work on the machine falls on both alike.

import { execFileSync } from 'node:child_process';
import { GSW_PYTHON } from '../reference/python';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { CT_from_t_batch } from '../../shared/seawater/conversions';
import { SA_from_SP_batch } from '../../shared/seawater/saar';
import { randomOceanPoints, type OceanBox } from '../reference/oceanPoints';

export interface BenchRow {
  name: string;
  oursMs: number;
  refMs: number;
}

const PYTHON = `
import json, sys, time
import numpy as np
import gsw
d = sys.argv[1]
SP, t, p, lon, lat = (np.fromfile(f"{d}/{k}.f64") for k in ("SP", "t", "p", "lon", "lat"))
SA = np.fromfile(f"{d}/SA.f64")
def best(fn):
    fn()
    times = []
    for _ in range(3):
        t0 = time.perf_counter(); fn(); times.append(time.perf_counter() - t0)
    return 1000 * min(times)
print(json.dumps({
    "SA_from_SP": best(lambda: gsw.SA_from_SP(SP, p, lon, lat)),
    "CT_from_t": best(lambda: gsw.CT_from_t(SA, t, p)),
}))
`;

/** The benchmark's points: the open North Atlantic and South Pacific, from a fixed seed. */
const BENCH_BOXES: OceanBox[] = [
  [-50, -25, 20, 45],
  [-150, -100, -50, -10],
];
export const benchOceanPoints = (n: number, seed = 20261201) => randomOceanPoints(n, seed, BENCH_BOXES);

function bestOf3(fn: () => void): number {
  fn();
  let best = Infinity;
  for (let r = 0; r < 3; r++) {
    const t0 = performance.now();
    fn();
    best = Math.min(best, performance.now() - t0);
  }
  return best;
}

/** Time SA_from_SP_batch and CT_from_t_batch over n random ocean points, ours and python3-gsw's. */
export function benchThermo(n: number, rounds = 3): BenchRow[] {
  const { SP, t, p, lon, lat } = benchOceanPoints(n);
  const SA = SA_from_SP_batch(SP, p, lon, lat);
  const outSA = new Float64Array(n);
  const outCT = new Float64Array(n);
  const dir = mkdtempSync(join(tmpdir(), 'sigmaline-bench-'));
  try {
    for (const [name, column] of Object.entries({ SP, t, p, lon, lat, SA })) {
      writeFileSync(join(dir, `${name}.f64`), new Uint8Array(column.buffer, column.byteOffset, column.byteLength));
    }
    const best = { oursSA: Infinity, oursCT: Infinity, refSA: Infinity, refCT: Infinity };
    for (let r = 0; r < rounds; r++) {
      best.oursSA = Math.min(
        best.oursSA,
        bestOf3(() => SA_from_SP_batch(SP, p, lon, lat, outSA)),
      );
      best.oursCT = Math.min(
        best.oursCT,
        bestOf3(() => CT_from_t_batch(SA, t, p, outCT)),
      );
      const ref = JSON.parse(execFileSync(GSW_PYTHON, ['-c', PYTHON, dir], { encoding: 'utf8' })) as Record<
        string,
        number
      >;
      best.refSA = Math.min(best.refSA, ref.SA_from_SP);
      best.refCT = Math.min(best.refCT, ref.CT_from_t);
    }
    return [
      { name: 'SA_from_SP', oursMs: best.oursSA, refMs: best.refSA },
      { name: 'CT_from_t', oursMs: best.oursCT, refMs: best.refCT },
    ];
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

// Run directly: npx tsx tests/bench/seawater-thermo.ts [n]
if (import.meta.url === `file://${process.argv[1]}`) {
  const n = Number(process.argv[2] ?? 1_000_000);
  for (const row of benchThermo(n)) {
    console.log(
      `${row.name.padEnd(12)} ours ${row.oursMs.toFixed(1)} ms  gsw ${row.refMs.toFixed(1)} ms  ratio ${(row.oursMs / row.refMs).toFixed(2)}`,
    );
  }
}
