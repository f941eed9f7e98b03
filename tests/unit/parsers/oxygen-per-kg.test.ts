// Oxygen in ml/l: 1 ml/l = 44.661 µmol/l (the trade's conversion), then per kilogram with the
// potential density of each sample, ρθ = σ0 + 1000 kg/m³. σ0 here comes from Debian's python3-gsw
// (/usr/bin/python3 or $GSW_PYTHON), independently of our seawater core.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { parseUpload } from '../../../server/parsers/index';
import { processCast } from '../../../server/services/processCast';

const FILE = join(import.meta.dirname, '..', '..', '..', 'fixtures', 'samples', 'acquisition-two-pairs.txt');

describe('oxygen to µmol/kg', () => {
  it('ml/l × 44.661 / (ρθ/1000), with ρθ from python3-gsw', async () => {
    const r = await parseUpload('acquisition-two-pairs.txt', readFileSync(FILE));
    if (!r.ok) throw new Error(JSON.stringify(r.errors));
    const c = r.casts[0];
    const out = processCast(c, { inversionThreshold: 0.01 });
    if (!out.ok) throw new Error(JSON.stringify(out.errors));
    const o2 = out.cast.columns.find((col) => col.name === 'oxygen')!;
    expect(o2.unit).toBe('µmol/kg');
    expect(out.cast.notes.join(' ')).toMatch(/oxygen converted from µmol\/l to µmol\/kg with the potential density/);
    // the file's own ml/l values, read straight from the text (column 6 of the data lines)
    const lines = readFileSync(FILE, 'utf8').split('\n');
    const data = lines
      .slice(lines.indexOf('*END*') + 1)
      .filter((l) => l.trim() !== '')
      .map((l) => l.trim().split(/\s+/).map(Number));
    const ks = [0, 25, 75, 149];
    const py = spawnSync(
      process.env.GSW_PYTHON ?? '/usr/bin/python3',
      [
        '-c',
        String.raw`
import sys, json, gsw
rows = json.loads(sys.stdin.read())
out = []
for p, t, sp in rows:
    sa = gsw.SA_from_SP(sp, p, -21.5, -34.125)
    out.append(float(gsw.sigma0(sa, gsw.CT_from_t(sa, t, p))))
print(json.dumps(out))
`,
      ],
      { input: JSON.stringify(ks.map((k) => [data[k][0], data[k][1], data[k][6]])), encoding: 'utf8' },
    );
    expect(py.status, py.stderr).toBe(0);
    const sigma0 = JSON.parse(py.stdout) as number[];
    ks.forEach((k, i) => {
      const want = (data[k][5] * 44.661) / ((sigma0[i] + 1000) / 1000);
      expect(Math.abs((o2.values as Float64Array)[k] - want) / want).toBeLessThan(1e-9);
    });
  });
});
