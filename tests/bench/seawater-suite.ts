// The seawater core's figures for `npm run bench`: both halves at 1 000 000 random ocean points,
// each against python3-gsw in the same run (target ratio ours / reference ≤ 1.5, aim ≤ 1.0).
import type { BenchResult } from './modules';
import { benchSeawater } from './seawater';

const N = 1_000_000;
const TARGET = '≤ 1.5× reference (aim ≤ 1.0×)';

interface TimedRow {
  name: string;
  oursMs: number;
  refMs: number;
}

export async function bench(): Promise<BenchResult[]> {
  const rows: TimedRow[] = [];
  try {
    const thermo = (await import('./seawater-thermo')) as { benchThermo?: (n: number) => TimedRow[] };
    if (thermo.benchThermo) rows.push(...thermo.benchThermo(N));
  } catch (err) {
    console.warn(`seawater-thermo bench skipped: ${(err as Error).message}`);
  }
  rows.push(...benchSeawater(N));
  return rows.map((r) => ({
    name: `${r.name} batch, ${N.toLocaleString('en')} points`,
    value: r.oursMs,
    unit: 'ms',
    reference: r.refMs,
    target: TARGET,
  }));
}
