// The demo cruise of fixtures/demo (scripts/make-demo-cruise.ts): every file parses through
// parseUpload, the cruise description agrees with the casts, and the planted inversions are where
// README.md and planted.json say. Parser-level checks on the values; no density check here.
import { existsSync, readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { z } from 'zod';
import type { ParsedCast } from '../../shared/schemas/cast';
import { parseUpload } from '../../server/parsers/index';

const DIR = join(import.meta.dirname, '..', '..', 'fixtures', 'demo');
const Planted = z.object({
  planted: z.array(
    z.discriminatedUnion('kind', [
      z.object({
        kind: z.literal('spike'),
        station: z.string(),
        file: z.string(),
        pressure: z.number(),
        dSP: z.number(),
        sigma0Drop: z.number(),
      }),
      z.object({
        kind: z.literal('overturn'),
        station: z.string(),
        file: z.string(),
        pTop: z.number(),
        pBottom: z.number(),
        sigma0Deficit: z.number(),
      }),
    ]),
  ),
});
const Cruise = z.object({
  name: z.string(),
  ship: z.string(),
  startDate: z.string(),
  endDate: z.string(),
  team: z.array(
    z.object({ name: z.string(), role: z.enum(['chief_scientist', 'technician', 'analyst', 'pi']), email: z.string() }),
  ),
  plannedStations: z.array(
    z.object({
      station: z.string(),
      latitude: z.number(),
      longitude: z.number(),
      occupied: z.boolean(),
      castFile: z.string().nullable(),
    }),
  ),
  repeatCasts: z.array(z.object({ station: z.string(), cast: z.string(), file: z.string(), note: z.string() })),
  lines: z.array(
    z.object({
      name: z.string(),
      stations: z.array(z.string()),
      composite: z
        .object({ station: z.string(), shallowCast: z.string(), deepCast: z.string(), joinPressure: z.number() })
        .optional(),
    }),
  ),
});
const planted = Planted.parse(JSON.parse(readFileSync(join(DIR, 'planted.json'), 'utf8'))).planted;
const cruise = Cruise.parse(JSON.parse(readFileSync(join(DIR, 'cruise.json'), 'utf8')));
const castFiles = readdirSync(join(DIR, 'casts')).sort();
const casts = new Map<string, ParsedCast>();

beforeAll(async () => {
  for (const f of castFiles) {
    const r = await parseUpload(f, readFileSync(join(DIR, 'casts', f)));
    if (!r.ok) throw new Error(`${f}: ${JSON.stringify(r.errors.slice(0, 3))}`);
    casts.set(f, r.casts[0]);
  }
});

const at = (c: ParsedCast, p: number): number => (c.columns.pressure as Float64Array).indexOf(p);

describe('demo cruise', () => {
  const repeat = new Set(cruise.repeatCasts.map((r) => r.file.replace(/^casts\//, '')));
  it('about 40 casts, in both formats, each a full-depth downcast at 2 dbar (but the repeat shallow casts)', () => {
    expect(castFiles.length).toBeGreaterThanOrEqual(38);
    const formats = new Set([...casts.values()].map((c) => c.format));
    expect(formats).toEqual(new Set(['plain', 'exchange']));
    for (const [f, c] of casts) {
      expect(c.metadata.station, f).toBe(f.replace(/(_ct\d)?\.csv$/, ''));
      if (repeat.has(f)) continue;
      expect(c.metadata.latitude).not.toBeNull();
      expect(c.metadata.time).not.toBeNull();
      const p = c.columns.pressure as Float64Array;
      expect(p[1] - p[0]).toBe(2);
      const bottom = c.metadata.bottomDepth as number;
      expect(bottom).toBeGreaterThanOrEqual(2000);
      expect(bottom).toBeLessThanOrEqual(5200);
      expect(p[p.length - 1]).toBeGreaterThan(bottom * 0.98); // to near the bottom (pressure ≈ depth × 1.01)
      expect(c.profile.hasUpcast).toBe(false);
    }
  });

  it('cruise.json: planned stations, 2–3 not occupied, every occupied one has its file', () => {
    const unoccupied = cruise.plannedStations.filter((s) => !s.occupied);
    expect(unoccupied.length).toBeGreaterThanOrEqual(2);
    expect(unoccupied.length).toBeLessThanOrEqual(3);
    const files = cruise.plannedStations.filter((s) => s.occupied).map((s) => s.castFile);
    expect(files.length + cruise.repeatCasts.length).toBe(castFiles.length);
    for (const f of files) expect(existsSync(join(DIR, f as string)), String(f)).toBe(true);
    expect(new Set(cruise.team.map((t) => t.role))).toEqual(
      new Set(['chief_scientist', 'technician', 'analyst', 'pi']),
    );
  });

  it('the station table parses and agrees with the casts', async () => {
    const r = await parseUpload('stations.csv', readFileSync(join(DIR, 'stations.csv')));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.stations.length).toBe(castFiles.length);
    for (const s of r.stations) {
      const c = [...casts.values()].find(
        (x) => x.metadata.station === s.station && x.metadata.cast === s.cast,
      ) as ParsedCast;
      expect(c.metadata.latitude).toBeCloseTo(s.latitude, 4);
      expect(c.metadata.time).toBe(s.time);
    }
  });

  it('the section has the salinity minimum near 900 dbar and a colder bottom layer in the deep basins', () => {
    for (const [f, c] of casts) {
      const p = c.columns.pressure as Float64Array;
      const s = c.columns.salinity as Float64Array;
      const spikeAt = new Set(
        planted.filter((x) => x.kind === 'spike' && x.file === f).map((x) => (x.kind === 'spike' ? x.pressure : NaN)),
      );
      let kMin = 0;
      for (let k = 0; k < p.length; k++)
        if (p[k] > 300 && p[k] < 1500 && !spikeAt.has(p[k]) && s[k] < s[kMin]) kMin = k;
      expect(p[kMin]).toBeGreaterThan(750);
      expect(p[kMin]).toBeLessThan(1100);
      expect(s[kMin]).toBeGreaterThan(34.2);
      expect(s[kMin]).toBeLessThan(34.45);
      if (p[p.length - 1] > 4500)
        expect(c.columns.temperature[at(c, 4400)]).toBeLessThan(c.columns.temperature[at(c, 3400)] - 0.8);
    }
  });

  const spikes = planted.filter((p) => p.kind === 'spike');
  it('at least six single-scan spikes and one overturn are planted and listed in README.md', () => {
    expect(spikes.length).toBeGreaterThanOrEqual(6);
    expect(planted.filter((p) => p.kind === 'overturn')).toHaveLength(1);
    const readme = readFileSync(join(DIR, 'README.md'), 'utf8');
    for (const p of planted) expect(readme).toContain(`casts/${p.file}`);
    for (const p of planted) expect(p.kind === 'spike' ? p.sigma0Drop : p.sigma0Deficit).toBeGreaterThanOrEqual(0.02);
  });

  it.each(spikes.map((s) => [s.station, s] as const))(
    'spike in %s is one level of low salinity where listed',
    (_n, sp) => {
      if (sp.kind !== 'spike') return;
      const c = casts.get(sp.file) as ParsedCast;
      const s = c.columns.salinity as Float64Array;
      const k = at(c, sp.pressure);
      expect(k).toBeGreaterThan(0);
      expect(s[k - 1] - s[k]).toBeGreaterThan(0.8 * sp.dSP);
      expect(s[k + 1] - s[k]).toBeGreaterThan(0.8 * sp.dSP);
      // and no other level of the cast jumps like that
      let others = 0;
      for (let j = 1; j < s.length - 1; j++) if (j !== k && s[j - 1] - s[j] > 0.02 && s[j + 1] - s[j] > 0.02) others++;
      expect(others).toBe(0);
    },
  );

  it('the overturn: temperature rises with pressure through the slab, unlike the neighbours', () => {
    const ov = planted.find((p) => p.kind === 'overturn');
    if (!ov || ov.kind !== 'overturn') throw new Error('no overturn planted');
    expect(ov.pBottom - ov.pTop).toBeGreaterThanOrEqual(20);
    expect(ov.pBottom - ov.pTop).toBeLessThanOrEqual(40);
    const c = casts.get(ov.file) as ParsedCast;
    const t = c.columns.temperature;
    const s = c.columns.salinity as Float64Array;
    const k0 = at(c, ov.pTop);
    const k1 = at(c, ov.pBottom);
    expect(t[k1] - t[k0]).toBeGreaterThan(0.3);
    let rises = 0;
    for (let k = k0 + 1; k <= k1; k++) if (t[k] > t[k - 1]) rises++;
    expect(rises).toBeGreaterThanOrEqual(0.8 * (k1 - k0));
    expect(Number.isFinite(s[k0])).toBe(true);
    // The stations either side have normal (falling) temperature over the same pressures.
    const idx = castFiles.indexOf(ov.file);
    for (const nb of [castFiles[idx - 1], castFiles[idx + 1]]) {
      const n = casts.get(nb) as ParsedCast;
      expect(n.columns.temperature[at(n, ov.pBottom)]).toBeLessThan(n.columns.temperature[at(n, ov.pTop)]);
    }
  });

  it('exchange casts carry flags, with the oxygen dropout flagged 9', () => {
    const ex = [...casts.values()].filter((c) => c.format === 'exchange');
    expect(ex.length).toBeGreaterThanOrEqual(2);
    for (const c of ex) {
      const k = at(c, 206);
      expect(Number.isNaN((c.columns.oxygen as Float64Array)[k])).toBe(true);
      expect(c.flags.oxygen[k]).toBe(9);
      expect(c.flags.salinity[k]).toBe(2);
      expect(c.extras.fluorescence.values.length).toBe(c.profile.levels);
    }
  });

  it('a short cross-line over the Corrow Rise that crosses the main line (not a stretch of it)', () => {
    const pos = new Map(cruise.plannedStations.map((p) => [p.station, p]));
    const main = cruise.lines.find((l) => !l.composite)!;
    const cross = cruise.lines.find((l) => l.composite)!;
    expect(cross.stations.length).toBeGreaterThanOrEqual(4);
    expect(cross.stations.length).toBeLessThan(main.stations.length / 4);
    // exactly one station shared with the main line: the crossing; the others are off it
    const shared = cross.stations.filter((s) => main.stations.includes(s));
    expect(shared).toEqual([cross.composite!.station]);
    const i = cross.stations.indexOf(shared[0]);
    expect(i).toBeGreaterThan(0);
    expect(i).toBeLessThan(cross.stations.length - 1);
    // the cross-line's ends lie either side of the main line (north of it, then south of it),
    // and its bottom is shallowest at the crossing, on the crest of the rise
    const mainLatAt = (lon: number) => {
      const m = main.stations.map((s) => pos.get(s)!).sort((a, b) => a.longitude - b.longitude);
      const k = m.findIndex((p) => p.longitude > lon);
      const a = m[k - 1];
      const b = m[k];
      return a.latitude + ((b.latitude - a.latitude) * (lon - a.longitude)) / (b.longitude - a.longitude);
    };
    const side = (s: string) => Math.sign(pos.get(s)!.latitude - mainLatAt(pos.get(s)!.longitude));
    expect(side(cross.stations[0])).toBe(1);
    expect(side(cross.stations[cross.stations.length - 1])).toBe(-1);
    const bottoms = cross.stations.map((s) => {
      const c = [...casts.values()].find((x) => x.metadata.station === s && x.metadata.cast === '1')!;
      return c.metadata.bottomDepth as number;
    });
    expect(Math.min(...bottoms)).toBe(bottoms[i]);
    expect(bottoms[0] - bottoms[i]).toBeGreaterThan(1000);
    expect(bottoms[bottoms.length - 1] - bottoms[i]).toBeGreaterThan(1000);
  });

  it('a repeat shallow cast beside the full-depth cast at the crossing, deep enough for the join', () => {
    expect(cruise.repeatCasts).toHaveLength(1);
    const r = cruise.repeatCasts[0];
    const shallow = casts.get(r.file.replace(/^casts\//, ''))!;
    const deep = [...casts.values()].find((x) => x.metadata.station === r.station && x.metadata.cast === '1')!;
    expect(shallow.metadata.cast).toBe('2');
    expect(shallow.metadata.latitude).toBeCloseTo(deep.metadata.latitude!, 3);
    expect(shallow.metadata.longitude).toBeCloseTo(deep.metadata.longitude!, 3);
    const ps = shallow.columns.pressure as Float64Array;
    const pd = deep.columns.pressure as Float64Array;
    expect(ps[ps.length - 1]).toBeLessThan(0.6 * pd[pd.length - 1]);
    const join = cruise.lines.find((l) => l.composite)!.composite!.joinPressure;
    expect(ps[0]).toBeLessThan(join);
    expect(ps[ps.length - 1]).toBeGreaterThan(join);
    expect(Date.parse(shallow.metadata.time!)).toBeGreaterThan(Date.parse(deep.metadata.time!));
  });

  it('a time-series site far off the line, which the off-line rule leaves out', async () => {
    const { offLineStations } = await import('../../shared/section/index');
    const pts = cruise.plannedStations
      .filter((s) => s.occupied)
      .map((s) => ({ station: s.station, lon: s.longitude, lat: s.latitude }));
    expect(offLineStations(pts, 3).map((o) => o.station)).toEqual(['KT-01']);
  });
});
