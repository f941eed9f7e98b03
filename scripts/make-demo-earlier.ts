// Writes fixtures/demo-earlier/: an invented EARLIER occupation of the demo line, "TS-16-02", on
// the same invented RV Tessellate ten years before the demo cruise (TS-26-04). It is made from the
// demo cruise's own cast files (fixtures/demo/casts, written by scripts/make-demo-cruise.ts), so
// the two stay one line whatever that generator changes, with two changes planted on purpose so a
// comparison of the two occupations has known answers (planted.json):
// - heave: in the northern half of the line the thermocline isopycnals lie SHALLOWER in the
//   earlier occupation, i.e. they deepened by h(x, p) = H·north(x)·exp(−((p − pc)/w)²) by the demo
//   cruise (the earlier water at p is the demo's water from p + h);
// - water-mass change: intermediate water along a σ0 band was SALTIER (and, density-compensated,
//   warmer) in the earlier occupation, i.e. it freshened along isopycnals by the demo cruise.
// Positions differ by about a kilometre, station CP-07 was not occupied, times are ten years
// earlier. Deterministic. Run: npx tsx scripts/make-demo-earlier.ts (after make-demo-cruise.ts).
import { mkdirSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { parseUpload } from '../server/parsers/index';
import { CT_from_t, t_from_CT } from '../shared/seawater/conversions';
import { sigma0 } from '../shared/seawater/density';

const ROOT = join(import.meta.dirname, '..');
const DEMO = join(ROOT, 'fixtures', 'demo');
const OUT = join(ROOT, 'fixtures', 'demo-earlier');

/** The plants, in the terms of the later occupation minus the earlier one (B − A). */
export const PLANTS = {
  heave: {
    /** Deepening of the thermocline isopycnals at the core of the plant, dbar. */
    dbar: 40,
    /** Centre and e-folding half-width of the plant in pressure, dbar (earlier occupation's pressure). */
    pCentre: 450,
    pWidth: 280,
    /** The plant rises from 0 to full over the line fraction 0.5 ± 0.04 (stations CP-21…CP-23). */
    xStep: 0.5,
    xWidth: 0.04,
  },
  freshening: {
    /** Change of practical salinity along the band, B − A. */
    dSP: -0.05,
    /** σ0 band: centre and e-folding half-width, kg/m³. */
    sigma0Centre: 27.1,
    sigma0Width: 0.06,
  },
  years: 10,
} as const;

const PLANNED = 43;
const frac = (station: string): number => (Number(station.replace(/\D/g, '')) - 1) / (PLANNED - 1);
const north = (x: number): number => 0.5 * (1 + Math.tanh((x - PLANTS.heave.xStep) / PLANTS.heave.xWidth));
/** The planted heave (B − A), dbar, at line fraction x and the earlier occupation's pressure p. */
export const plantedHeave = (x: number, p: number): number =>
  PLANTS.heave.dbar * north(x) * Math.exp(-(((p - PLANTS.heave.pCentre) / PLANTS.heave.pWidth) ** 2));
/** The planted salinity change (B − A, PSS-78) on the isopycnal σ0. */
export const plantedFreshening = (s0: number): number =>
  PLANTS.freshening.dSP * Math.exp(-(((s0 - PLANTS.freshening.sigma0Centre) / PLANTS.freshening.sigma0Width) ** 2));

const SR = (SP: number): number => (SP * 35.16504) / 35; // Reference Salinity, as the demo generator builds its water
const SPof = (sr: number): number => (sr * 35) / 35.16504;
const TEN_YEARS_MS = 3652 * 86_400_000; // ten years of days (two leap days)

function interp(p: Float64Array, v: Float64Array, q: number): number {
  if (q <= p[0]) return v[0];
  const n = p.length;
  if (q >= p[n - 1]) return v[n - 1];
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const m = (lo + hi) >> 1;
    if (p[m] <= q) lo = m;
    else hi = m;
  }
  const w = (q - p[lo]) / (p[hi] - p[lo]);
  return v[lo] + w * (v[hi] - v[lo]);
}

/** CT that keeps σ0 when SR rises by dSR (secant iteration on the TEOS-10 σ0). */
function compensate(sr: number, ct: number, dSR: number): number {
  const target = sigma0(sr, ct);
  let c = ct;
  for (let it = 0; it < 8; it++) {
    const f = sigma0(sr + dSR, c) - target;
    const g = (sigma0(sr + dSR, c + 1e-4) - sigma0(sr + dSR, c)) / 1e-4;
    if (Math.abs(f) < 1e-10) break;
    c -= f / g;
  }
  return c;
}

async function main(): Promise<void> {
  const demo = JSON.parse(readFileSync(join(DEMO, 'cruise.json'), 'utf8')) as {
    plannedStations: { station: string; latitude: number; longitude: number; plannedBottomDepth: number }[];
  };
  mkdirSync(join(OUT, 'casts'), { recursive: true });
  for (const f of readdirSync(join(OUT, 'casts'))) rmSync(join(OUT, 'casts', f));
  const files = readdirSync(join(DEMO, 'casts'))
    .filter((f) => !f.startsWith('.'))
    .sort();
  const done = new Set<string>();
  const written: { station: string; file: string; time: string }[] = [];
  for (const f of files) {
    const r = await parseUpload(f, readFileSync(join(DEMO, 'casts', f)));
    if (!r.ok) throw new Error(`${f}: ${r.errors.map((e) => e.message).join('; ')}`);
    for (const c of r.casts) {
      const md = c.metadata;
      const st = md.station!;
      // the main line only (not the cross-line, the time-series site or repeat casts added after
      // it): one cast a station (the demo's first, deepest profile), and CP-07 missed in the earlier year
      if (!/^CP-\d\d$/.test(st) || done.has(st) || st === 'CP-07' || md.cast !== '1') continue;
      done.add(st);
      const x = frac(st);
      const p = c.columns.pressure!;
      const n = p.length;
      const srD = Float64Array.from(c.columns.salinity!, SR);
      const ctD = Float64Array.from(c.columns.temperature, (t, k) => CT_from_t(srD[k], t, p[k]));
      const o2 = c.columns.oxygen;
      const rows: string[] = [];
      for (let k = 0; k < n; k++) {
        const q = p[k] + plantedHeave(x, p[k]); // the demo's water from q sits at p in the earlier year
        let sr = interp(p, srD, q);
        let ct = interp(p, ctD, q);
        const dSR = -SR(plantedFreshening(sigma0(sr, ct))); // saltier before: A = B − change
        if (Math.abs(dSR) > 1e-7) {
          ct = compensate(sr, ct, dSR);
          sr += dSR;
        }
        const t = t_from_CT(sr, ct, p[k]);
        const ox = o2 ? interp(p, o2, q) : NaN;
        rows.push(
          [p[k].toFixed(1), t.toFixed(4), SPof(sr).toFixed(4), Number.isFinite(ox) ? ox.toFixed(1) : ''].join(','),
        );
      }
      const i = Number(st.replace(/\D/g, ''));
      const when = new Date(Date.parse(md.time!) - TEN_YEARS_MS);
      const lat = md.latitude! + 0.008 * Math.cos(i);
      const lon = md.longitude! + 0.01 * Math.sin(i);
      const time = when.toISOString().replace(/\.\d{3}Z$/, 'Z');
      const head = [
        `# station: ${st}`,
        '# cast: 1',
        `# latitude: ${lat.toFixed(4)}`,
        `# longitude: ${lon.toFixed(4)}`,
        `# time: ${time}`,
        `# bottom_depth: ${md.bottomDepth ?? ''}`,
        '# ship: RV Tessellate',
        '# cruise: TS-16-02',
        '# SECT_ID: CORROW',
      ];
      const file = `${st}.csv`;
      writeFileSync(
        join(OUT, 'casts', file),
        [...head, 'pressure [dbar],temperature [ITS-90 degC],salinity [PSS-78],oxygen [umol/kg]', ...rows].join('\n') +
          '\n',
      );
      written.push({ station: st, file, time });
    }
  }
  const planned = demo.plannedStations
    .filter((s) => /^CP-\d\d$/.test(s.station)) // the main line's plan; the later cruise's additions were not planned then
    .map((s) => ({
      station: s.station,
      latitude: s.latitude,
      longitude: s.longitude,
      plannedBottomDepth: s.plannedBottomDepth,
    }));
  const cruise = {
    name: 'TS-16-02 Corrow Passage section (first occupation)',
    code: 'TS-16-02',
    ship: 'RV Tessellate',
    startDate: '2016-03-02',
    endDate: '2016-03-20',
    ports: { departure: 'Port Haverel', arrival: 'Saltmere Quay' },
    region: { name: 'Corrow Passage' },
    description:
      'The first occupation of the invented Corrow Passage line, ten years before TS-26-04. Invented demo data.',
    team: [
      { name: 'Priya Castellane', role: 'analyst', email: 'analyst@sigmaline.test' },
      { name: 'Prof. Aurel Kimathi-Brandt', role: 'pi', email: 'pi@sigmaline.test' },
    ],
    plannedStations: planned,
    occupiedCount: written.length,
  };
  writeFileSync(join(OUT, 'cruise.json'), JSON.stringify(cruise, null, 1) + '\n');
  writeFileSync(
    join(OUT, 'planted.json'),
    JSON.stringify(
      { generatedBy: 'scripts/make-demo-earlier.ts', sense: 'later (TS-26-04) minus earlier (TS-16-02)', ...PLANTS },
      null,
      1,
    ) + '\n',
  );
  writeFileSync(
    join(OUT, 'README.md'),
    [
      '# TS-16-02: the invented earlier occupation of the demo line',
      '',
      "Generated by `scripts/make-demo-earlier.ts` from the demo cruise's casts; invented like them.",
      `${written.length} casts, ten years before TS-26-04, positions about a kilometre from the demo's, station CP-07 not occupied.`,
      '',
      'Planted (TS-26-04 minus TS-16-02):',
      `- heave: the thermocline isopycnals deepened by up to ${PLANTS.heave.dbar} dbar (centred at ${PLANTS.heave.pCentre} dbar, half-width ${PLANTS.heave.pWidth} dbar) in the northern half of the line (from about CP-22);`,
      `- freshening: ${PLANTS.freshening.dSP} in practical salinity along σ0 = ${PLANTS.freshening.sigma0Centre} ± ${PLANTS.freshening.sigma0Width} kg/m³ (intermediate water), density-compensated.`,
      '',
    ].join('\n'),
  );
  console.log(`wrote ${written.length} casts of the earlier occupation`);
}

if (process.argv[1] && /make-demo-earlier\.ts$/.test(process.argv[1])) await main();
