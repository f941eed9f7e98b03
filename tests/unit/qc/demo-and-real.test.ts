// The automatic tests on whole casts, through the same path as the intake (parse → processCast → stored
// columns → runQc): no proposal on the stable invented demo casts, the planted inversions proposed; and the
// SR1B real section processed with its proposals counted per test.
import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parseUpload } from '../../../server/parsers/index';
import { processCast } from '../../../server/services/processCast';
import { countByTest, qcProfileFromColumns, runQc, type QcProposal } from '../../../shared/qc';
import type { ParsedCast } from '../../../shared/schemas/cast';
import { readSr1b } from './sr1b';

const OPTS = { inversionThreshold: 0.01 };

function proposalsOf(c: ParsedCast): QcProposal[] {
  const r = processCast(c, OPTS);
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  const cols = Object.fromEntries(
    r.cast.columns.filter((x) => x.kind !== 'flag').map((x) => [x.name, x.values as Float64Array]),
  );
  return runQc(qcProfileFromColumns(cols, c.metadata.latitude!, c.metadata.longitude!), OPTS);
}

describe('invented demo casts (fixtures/demo, a behaviour check, not a reference)', () => {
  const dir = join(process.cwd(), 'fixtures/demo/casts');
  const planted = JSON.parse(readFileSync(join(process.cwd(), 'fixtures/demo/planted.json'), 'utf8')).planted as {
    station: string;
    file: string;
    kind: string;
    pressure?: number;
    pTop?: number;
    pBottom?: number;
  }[];
  it('no proposal on a stable cast; each planted inversion proposed where it was planted, and nothing else', async () => {
    const files = readdirSync(dir).filter((f) => /\.csv$/.test(f));
    expect(files.length).toBeGreaterThanOrEqual(40);
    const stableWithProposals: string[] = [];
    for (const f of files) {
      const parsed = await parseUpload(f, readFileSync(join(dir, f)), {});
      if (!parsed.ok) throw new Error(`${f}: ${JSON.stringify(parsed.errors)}`);
      const props = proposalsOf(parsed.casts[0]);
      const plant = planted.find((x) => x.file === f);
      if (!plant) {
        if (props.length) stableWithProposals.push(`${f}: ${props.map((x) => `${x.test} ${x.pFrom}`).join(', ')}`);
        continue;
      }
      expect(
        props.map((x) => x.test),
        f,
      ).toEqual(['density_inversion']);
      if (plant.kind === 'spike') expect(props[0].pFrom, f).toBe(plant.pressure);
      else {
        expect(props[0].pFrom, f).toBeGreaterThanOrEqual(plant.pTop! - 4);
        expect(props[0].pTo, f).toBeLessThanOrEqual(plant.pBottom! + 4);
      }
    }
    expect(stableWithProposals).toEqual([]);
  }, 60_000);
});

// Real data: SR1B Drake Passage, January 2015 (CCHDO distribution of GO-SHIP cruise 74JC20150110, RRS James
// Clark Ross JR306). "Data were collected and made publicly available by the International Global Ship-based
// Hydrographic Investigations Program (GO-SHIP; http://www.go-ship.org/) with National Capability funding from
// the UK Natural Environment Research Council to the National Oceanography Centre."
describe('SR1B 2015 real section (fixtures/real/sr1b-2015)', () => {
  it('processes all 30 casts; proposals per test are few, as for a calibrated good-quality section', async () => {
    const casts = await readSr1b();
    expect(casts).toHaveLength(30);
    const all: (QcProposal & { station: string })[] = [];
    for (const c of casts) for (const p of proposalsOf(c)) all.push({ ...p, station: c.metadata.station! });
    const counts = countByTest(all);
    console.log('SR1B proposals per test', JSON.stringify(counts));
    for (const p of all) console.log(`  ${p.station} ${p.test} ${p.variable} ${p.pFrom}–${p.pTo} dbar: ${p.detail}`);
    // The data office flagged pressure, temperature and salinity 2 (good) everywhere: none of the hard tests
    // (pressure, ranges, spike, gradient, stuck) may fire on T and S of this calibrated section.
    const hard = all.filter((p) => p.test !== 'density_inversion' && p.variable !== 'oxygen');
    expect(hard).toEqual([]);
    // Density inversions at the 0.01 kg/m³ threshold: a handful, in the near-surface layer where real
    // overturns and sensor-lag spikes are expected (common practice), none in the deep water.
    const inv = all.filter((p) => p.test === 'density_inversion');
    expect(inv.length).toBeLessThanOrEqual(30);
    for (const p of inv) expect(p.pFrom, `${p.station} ${p.detail}`).toBeLessThan(1000);
  }, 60_000);
});
