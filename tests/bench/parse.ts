// Parsing speed of one 6000-level plain cast file (best of 5 after a warm-up).
import type { BenchResult } from './modules';
import { parseUpload } from '../../server/parsers/index';

export async function bench(): Promise<BenchResult[]> {
  const lines = ['pressure [dbar],temperature [ITS-90 degC],salinity [PSS-78],oxygen [umol/kg],fluorescence'];
  for (let i = 1; i <= 6000; i++)
    lines.push(`${i}.0,${(20 - i / 400).toFixed(4)},${(35 - i / 20000).toFixed(4)},210.5,0.05`);
  const buf = Buffer.from(lines.join('\n'));
  await parseUpload('big.csv', buf);
  let best = Infinity;
  for (let k = 0; k < 5; k++) {
    const t0 = performance.now();
    const r = await parseUpload('big.csv', buf);
    best = Math.min(best, performance.now() - t0);
    if (!r.ok) throw new Error('the bench file did not parse');
  }
  return [{ name: 'parse a 6000-level plain CSV (best of 5)', value: best, unit: 'ms', target: 'a few ms' }];
}
