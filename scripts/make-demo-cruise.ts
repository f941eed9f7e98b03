// Writes fixtures/demo/: the invented demo cruise "TS-26-04 Corrow Passage section" of the invented
// RV Tessellate — cruise.json (metadata, planned stations, team), one cast file per occupied station
// (plain CSV, and a few in the exchange format), stations.csv, planted.json and README.md.
// Everything is invented: ship, people, place names, and the water itself, which is a smooth
// analytic stratification (mixed layer, thermocline, a front, an intermediate salinity minimum,
// deep water, a dense bottom layer) with small sensor noise. Planted on purpose: single-scan
// salinity spikes and one convective overturn, so the inversion finder has known targets.
// Deterministic (seeded PRNG). Run: npx tsx scripts/make-demo-cruise.ts
import { mkdirSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { CT_from_t } from '../shared/seawater/conversions';
import { sigma0 } from '../shared/seawater/density';
import { p_from_z } from '../shared/seawater/depth';
import { mulberry32 } from './lib/prng';

const OUT = join(import.meta.dirname, '..', 'fixtures', 'demo');
const CASTS = join(OUT, 'casts');

const prng = mulberry32;
// The main line draws from one stream; the stations added after it (the cross-line, the repeat
// shallow cast, the time-series site) from a second, so the main line's files never change.
let rand = prng(2604);
/** Roughly Gaussian noise of standard deviation sd (sum of four uniforms). */
const noise = (sd: number): number => (rand() + rand() + rand() + rand() - 2) * sd * Math.sqrt(3);

// ---- the section ---------------------------------------------------------------------------------
const PLANNED = 43;
const SKIPPED = new Map<number, string>([
  [14, 'not occupied: winch fault, station dropped to keep the schedule'],
  [29, 'not occupied: weather (swell over the operating limit)'],
  [43, 'not occupied: dropped to give the time to the Corrow Rise cross-line and the Kestrel time-series site'],
]);
const frac = (i: number): number => (i - 1) / (PLANNED - 1);
const lonOf = (x: number): number => -30 + 20 * x;
const latOf = (x: number): number => -35 + 2 * x + 0.08 * Math.sin(9 * x);
/** Bottom depth (m): deep western basin, the Corrow Rise near x = 0.55, eastern basin. */
function bottomOf(x: number): number {
  const d = 4950 - 2950 * Math.exp(-(((x - 0.55) / 0.085) ** 2)) + 180 * Math.sin(11 * x) - 300 * x;
  return Math.round(Math.min(5200, Math.max(2000, d)));
}
/** 0 west of the Tessellate Front, 1 east of it. */
const frontOf = (x: number): number => 0.5 * (1 + Math.tanh((x - 0.36) / 0.05));

type Water = { theta: number; S: number; o2: number; fl: number };

/** The invented stratification at fraction x along the section and pressure p (dbar). */
function water(x: number, p: number): Water & { mld: number } {
  const F = frontOf(x);
  const mld = 62 + 48 * F + 8 * Math.sin(13 * x);
  const Ht = 380 - 170 * F; // thermocline scale: deeper west of the front, so isopycnals tilt
  const Hs = 0.65 * Ht;
  const BL = 0.5 * (1 + Math.tanh((p - 3900) / 260)); // the dense bottom layer
  // Deep and central water: temperature falls through the central water well enough to outweigh
  // the freshening towards the salinity minimum, as it does in a stable ocean.
  const zc = 520 - 60 * F; // central-water scale, shallower east of the front
  const thetaDeep = (q: number): number =>
    1.55 + 5.2 * Math.exp(-q / 1000) + 9.5 * Math.exp(-q / zc) - 1.25 * (0.5 * (1 + Math.tanh((q - 3900) / 260)));
  const sDeep = (q: number): number =>
    34.885 -
    0.62 * Math.exp(-(((q - 900) / 480) ** 2)) * (q < 900 ? 1 : 1) +
    0.55 * Math.exp(-q / zc) * 0.55 +
    0.02 * Math.exp(-(((q - 2300) / 600) ** 2)) -
    0.035 * (0.5 * (1 + Math.tanh((q - 3900) / 260)));
  const thetaS = 22.6 - 3.8 * F;
  const sS = 36.15 - 0.65 * F;
  const gt = p <= mld ? 1 : Math.exp(-(p - mld) / Ht);
  const gs = p <= mld ? 1 : Math.exp(-(p - mld) / Hs);
  const theta = thetaDeep(p) + (thetaS - thetaDeep(mld)) * gt;
  const S = sDeep(p) + (sS - sDeep(mld)) * gs;
  void BL;
  const o2 =
    238 -
    72 * Math.exp(-(((p - 650) / 260) ** 2)) +
    14 * Math.exp(-(((p - 2400) / 700) ** 2)) -
    8 * F * Math.exp(-p / 300);
  const fl = 0.04 + (0.9 - 0.4 * F) * Math.exp(-(((p - (mld + 15)) / 25) ** 2));
  return { theta, S, o2, fl, mld };
}
/** In-situ temperature from the invented potential temperature: a smooth adiabatic correction. */
const insitu = (theta: number, p: number): number => theta + p * (6.5e-5 + 5e-9 * p) * (1 + 0.02 * theta);

const SA_of = (SP: number): number => (SP * 35.16504) / 35; // Reference Salinity; the demo needs no atlas
const sig0 = (t: number, SP: number, p: number): number => sigma0(SA_of(SP), CT_from_t(SA_of(SP), t, p));

// ---- the plants -------------------------------------------------------------------------------
// station number -> spike: pressure (dbar) and the salinity drop of one scan
const SPIKES: { station: number; p: number; dS: number }[] = [
  { station: 3, p: 1204, dS: 0.05 },
  { station: 8, p: 2416, dS: 0.08 },
  { station: 17, p: 736, dS: 0.1 },
  { station: 21, p: 1588, dS: 0.045 },
  { station: 26, p: 968, dS: 0.065 },
  { station: 33, p: 3102, dS: 0.09 },
  { station: 38, p: 1850, dS: 0.06 },
];
const OVERTURN = { station: 11, span: 30 }; // dbar, just below the mixed layer
const EXCHANGE_STATIONS = new Set([5, 20, 35]);

const stationName = (i: number): string => `CP-${String(i).padStart(2, '0')}`;

type Level = { p: number; t: number; S: number; o2: number; fl: number };
type Planted =
  | { kind: 'spike'; station: string; file: string; pressure: number; dSP: number; sigma0Drop: number }
  | { kind: 'overturn'; station: string; file: string; pTop: number; pBottom: number; sigma0Deficit: number };

function castLevels(
  i: number,
  x: number,
  bottom: number,
  lat: number,
  opts: { pStop?: number; heave?: number } = {},
): { levels: Level[]; mld: number } {
  const pBottom = Math.floor(p_from_z(-(bottom - 8 - 6 * rand()), lat) / 2) * 2;
  const pMax = opts.pStop ?? pBottom;
  const levels: Level[] = [];
  let mld = 0;
  for (let p = 2; p <= pMax; p += 2) {
    // heave: the water found at p sits that many dbar deeper (an internal wave between two casts)
    const w = water(x, Math.max(2, p - (opts.heave ?? 0)));
    mld = w.mld;
    levels.push({
      p,
      t: insitu(w.theta, p) + noise(0.0004),
      S: w.S + noise(0.00025),
      o2: w.o2 + noise(0.6),
      fl: Math.max(0, w.fl + noise(0.01)),
    });
  }
  void i;
  return { levels, mld };
}

function fmt(v: number, d: number): string {
  return v.toFixed(d);
}

function plainFile(name: string, meta: Record<string, string>, levels: Level[]): string {
  const head = Object.entries(meta).map(([k, v]) => `# ${k}: ${v}`);
  const rows = levels.map((l) => [fmt(l.p, 1), fmt(l.t, 4), fmt(l.S, 4), fmt(l.o2, 1), fmt(l.fl, 3)].join(','));
  void name;
  return (
    [
      ...head,
      'pressure [dbar],temperature [ITS-90 degC],salinity [PSS-78],oxygen [umol/kg],fluorescence [mg/m^3]',
      ...rows,
    ].join('\n') + '\n'
  );
}

function exchangeFile(st: number, when: Date, lat: number, lon: number, bottom: number, levels: Level[]): string {
  const d = when.toISOString();
  const rows = levels.map((l) => {
    const missingO2 = l.p > 200 && l.p < 212; // a sensor dropout, flagged 9
    return [
      fmt(l.p, 1),
      '2',
      fmt(l.t, 4),
      '2',
      fmt(l.S, 4),
      '2',
      missingO2 ? '-999.0' : fmt(l.o2, 1),
      missingO2 ? '9' : '2',
      fmt(l.fl, 3),
    ]
      .map((s) => s.padStart(8))
      .join(',');
  });
  return (
    [
      'CTD,20260320TSSLTE',
      '# RV Tessellate cruise TS-26-04, Corrow Passage section (invented demo data)',
      '# CTD processed on board; 2 dbar averages of the downcast',
      'NUMBER_HEADERS = 10',
      'EXPOCODE = TS2604',
      'SECT_ID = CORROW',
      `STNNBR = ${stationName(st)}`,
      'CASTNO = 1',
      `DATE = ${d.slice(0, 10).replace(/-/g, '')}`,
      `TIME = ${d.slice(11, 13)}${d.slice(14, 16)}`,
      `LATITUDE = ${lat.toFixed(4)}`,
      `LONGITUDE = ${lon.toFixed(4)}`,
      `DEPTH = ${bottom}`,
      'CTDPRS,CTDPRS_FLAG_W,CTDTMP,CTDTMP_FLAG_W,CTDSAL,CTDSAL_FLAG_W,CTDOXY,CTDOXY_FLAG_W,CTDFLUOR',
      'DBAR,,ITS-90,,PSS-78,,UMOL/KG,,MG/M^3',
      ...rows,
      'END_DATA',
    ].join('\n') + '\n'
  );
}

function main(): void {
  mkdirSync(CASTS, { recursive: true });
  for (const f of readdirSync(CASTS)) rmSync(join(CASTS, f));
  const planted: Planted[] = [];
  const stations: {
    station: string;
    latitude: number;
    longitude: number;
    plannedBottomDepth: number;
    occupied: boolean;
    note: string | null;
    castFile: string | null;
    time: string | null;
  }[] = [];
  const stationRows: string[] = ['station,cast,latitude,longitude,time,bottom_depth'];
  let clock = Date.UTC(2026, 2, 2, 6, 0, 0); // first cast 2026-03-02 06:00 UTC
  let occupied = 0;
  let maxBackground = 0;
  let worst = '';
  for (let i = 1; i <= PLANNED; i++) {
    const x = frac(i);
    const lat = latOf(x);
    const lon = lonOf(x);
    const bottom = bottomOf(x);
    const name = stationName(i);
    if (SKIPPED.has(i)) {
      stations.push({
        station: name,
        latitude: round(lat, 4),
        longitude: round(lon, 4),
        plannedBottomDepth: bottom,
        occupied: false,
        note: SKIPPED.get(i) ?? null,
        castFile: null,
        time: null,
      });
      clock += 2.4 * 3600e3;
      continue;
    }
    occupied++;
    const { levels, mld } = castLevels(i, x, bottom, lat);
    const file = EXCHANGE_STATIONS.has(i) ? `${name}_ct1.csv` : `${name}.csv`;
    // Background check before planting: σ0 must not fall by more than noise between levels.
    const sig = levels.map((l) => sig0(l.t, l.S, l.p));
    // Measured as the fall below the running maximum, so a slow multi-level decrease counts too.
    let runMax = -Infinity;
    for (let k = 0; k < sig.length; k++) {
      runMax = Math.max(runMax, sig[k]);
      if (runMax - sig[k] > maxBackground) {
        maxBackground = runMax - sig[k];
        worst = `${name} at ${levels[k].p} dbar`;
      }
    }

    const spike = SPIKES.find((s) => s.station === i);
    if (spike) {
      const k = levels.findIndex((l) => l.p === spike.p);
      if (k < 1 || k >= levels.length - 1) throw new Error(`spike at ${spike.p} dbar outside cast ${name}`);
      levels[k].S -= spike.dS;
      const drop =
        sig0(levels[k - 1].t, levels[k - 1].S, levels[k - 1].p) - sig0(levels[k].t, levels[k].S, levels[k].p);
      if (drop < 0.02 || drop > 0.1) throw new Error(`spike in ${name} gives a σ0 drop of ${drop}`);
      planted.push({
        kind: 'spike',
        station: name,
        file,
        pressure: spike.p,
        dSP: spike.dS,
        sigma0Drop: round(drop, 4),
      });
    }
    if (i === OVERTURN.station) {
      // Convective overturn at the mixed-layer base: the water of a 30 dbar slab, turned upside down.
      const top = Math.ceil((mld + 4) / 2) * 2;
      const k0 = levels.findIndex((l) => l.p === top);
      const k1 = levels.findIndex((l) => l.p === top + OVERTURN.span);
      const slab = levels.slice(k0, k1 + 1).map((l) => ({ t: l.t, S: l.S }));
      slab.reverse();
      for (let k = k0; k <= k1; k++) {
        levels[k].t = slab[k - k0].t;
        levels[k].S = slab[k - k0].S;
      }
      const s0 = levels.slice(k0, k1 + 1).map((l) => sig0(l.t, l.S, l.p));
      const deficit = Math.max(...s0) - Math.min(...s0);
      planted.push({
        kind: 'overturn',
        station: name,
        file,
        pTop: top,
        pBottom: top + OVERTURN.span,
        sigma0Deficit: round(deficit, 4),
      });
    }
    const when = new Date(Math.round(clock / 60e3) * 60e3); // whole minutes: the exchange TIME is HHMM
    const time = when.toISOString().replace('.000Z', 'Z');
    const meta = {
      station: name,
      cast: '1',
      latitude: lat.toFixed(4),
      longitude: lon.toFixed(4),
      time,
      bottom_depth: String(bottom),
      ship: 'RV Tessellate',
      cruise: 'TS-26-04',
    };
    const text = EXCHANGE_STATIONS.has(i)
      ? exchangeFile(i, when, lat, lon, bottom, levels)
      : plainFile(file, meta, levels);
    writeFileSync(join(CASTS, file), text);
    stations.push({
      station: name,
      latitude: round(lat, 4),
      longitude: round(lon, 4),
      plannedBottomDepth: bottom,
      occupied: true,
      note: null,
      castFile: `casts/${file}`,
      time,
    });
    stationRows.push([name, '1', lat.toFixed(4), lon.toFixed(4), time, String(bottom)].join(','));
    // ~1.3 h steaming between stations plus the cast itself at 60 m/min down and up.
    clock += (1.3 + (2 * bottom) / 60 / 60 + 0.4) * 3600e3;
  }

  // ---- after the main line: the Kestrel time-series site, the Corrow Rise cross-line, and a
  // repeat shallow cast at CP-24 where the cross-line crosses the main line (a second stream of
  // numbers, so the files above stay as they were).
  rand = prng(2605);
  const repeatCasts: { station: string; cast: string; file: string; note: string }[] = [];
  const crossLine: string[] = [];
  const extraCast = (o: {
    name: string;
    cast: string;
    file: string;
    lat: number;
    lon: number;
    bottom: number;
    x: number;
    pStop?: number;
    heave?: number;
    steamKm: number;
  }) => {
    clock += (o.steamKm / 20) * 3600e3; // 20 km/h between stations
    const { levels } = castLevels(0, o.x, o.bottom, o.lat, { pStop: o.pStop, heave: o.heave });
    const sig = levels.map((l) => sig0(l.t, l.S, l.p));
    let runMax = -Infinity;
    for (let k = 0; k < sig.length; k++) {
      runMax = Math.max(runMax, sig[k]);
      if (runMax - sig[k] > maxBackground) {
        maxBackground = runMax - sig[k];
        worst = `${o.name} cast ${o.cast} at ${levels[k].p} dbar`;
      }
    }
    const when = new Date(Math.round(clock / 60e3) * 60e3);
    const time = when.toISOString().replace('.000Z', 'Z');
    const meta = {
      station: o.name,
      cast: o.cast,
      latitude: o.lat.toFixed(4),
      longitude: o.lon.toFixed(4),
      time,
      bottom_depth: String(o.bottom),
      ship: 'RV Tessellate',
      cruise: 'TS-26-04',
    };
    writeFileSync(join(CASTS, o.file), plainFile(o.file, meta, levels));
    stationRows.push([o.name, o.cast, o.lat.toFixed(4), o.lon.toFixed(4), time, String(o.bottom)].join(','));
    const pLast = levels[levels.length - 1].p;
    clock += (0.4 + (2 * (o.pStop ? pLast : o.bottom)) / 60 / 60) * 3600e3;
    return time;
  };
  const planStation = (name: string, lat: number, lon: number, bottom: number, file: string, time: string) =>
    stations.push({
      station: name,
      latitude: round(lat, 4),
      longitude: round(lon, 4),
      plannedBottomDepth: bottom,
      occupied: true,
      note: null,
      castFile: `casts/${file}`,
      time,
    });
  // The Kestrel time-series site, some 300 km north of the line: the default line leaves it out
  // as "off the line" (docs/lines.md).
  const kt = { lat: -30.62, lon: -14.85, bottom: 4310 };
  const ktTime = extraCast({
    name: 'KT-01',
    cast: '1',
    file: 'KT-01.csv',
    ...kt,
    x: (kt.lon + 30) / 20,
    steamKm: 520,
  });
  planStation('KT-01', kt.lat, kt.lon, kt.bottom, 'KT-01.csv', ktTime);
  occupied++;
  // The cross-line: five stations 40 km apart, north-west to south-east across the crest of the
  // Corrow Rise (its crest runs north-east, so the main line crosses it obliquely), through CP-24.
  const c24 = { lat: latOf(frac(24)), lon: lonOf(frac(24)) };
  const bearing = (135 * Math.PI) / 180;
  const at = (s: number) => ({
    lat: c24.lat + (s * Math.cos(bearing)) / 111.2,
    lon: c24.lon + (s * Math.sin(bearing)) / (111.2 * Math.cos((c24.lat * Math.PI) / 180)),
  });
  /** Bottom across the crest (m): 2000 m on the crest, falling away either side (half-width ~100 km). */
  const crossBottom = (s: number) =>
    Math.round(2000 + 2950 * (1 - Math.exp(-((s / 98) ** 2))) + 60 * Math.sin(s / 17) * Math.min(1, Math.abs(s) / 40));
  /** Where the water of a cross-line station sits on the main line's stratification. */
  const crossX = (s: number) => frac(24) + (0.63 * s) / 1840;
  const legs: { name: string; s: number }[] = [
    { name: 'XR-01', s: -80 },
    { name: 'XR-02', s: -40 },
    { name: 'CP-24', s: 0 },
    { name: 'XR-03', s: 40 },
    { name: 'XR-04', s: 80 },
  ];
  let prev = kt as { lat: number; lon: number };
  for (const leg of legs) {
    const pos = leg.s === 0 ? c24 : at(leg.s);
    const dKm = Math.hypot(
      (pos.lat - prev.lat) * 111.2,
      (pos.lon - prev.lon) * 111.2 * Math.cos((pos.lat * Math.PI) / 180),
    );
    prev = pos;
    crossLine.push(leg.name);
    if (leg.s === 0) {
      // The repeat shallow cast at the crossing: to 1000 dbar, six days after CP-24's full-depth
      // cast, with the thermocline heaved 6 dbar down by an internal wave since.
      const file = 'CP-24_ct2.csv';
      const bottom = bottomOf(frac(24));
      extraCast({
        name: 'CP-24',
        cast: '2',
        file,
        lat: pos.lat,
        lon: pos.lon,
        bottom,
        x: frac(24),
        pStop: 1000,
        heave: 6,
        steamKm: dKm,
      });
      repeatCasts.push({
        station: 'CP-24',
        cast: '2',
        file: `casts/${file}`,
        note: 'repeat shallow cast to 1000 dbar where the cross-line crosses the main line',
      });
      continue;
    }
    const bottom = crossBottom(leg.s);
    const file = `${leg.name}.csv`;
    const time = extraCast({
      name: leg.name,
      cast: '1',
      file,
      lat: pos.lat,
      lon: pos.lon,
      bottom,
      x: crossX(leg.s),
      steamKm: dKm,
    });
    planStation(leg.name, pos.lat, pos.lon, bottom, file, time);
    occupied++;
  }
  if (maxBackground > 0.004) throw new Error(`background stratification has a σ0 fall of ${maxBackground} (${worst})`);

  const cruise = {
    name: 'TS-26-04 Corrow Passage section',
    code: 'TS-26-04',
    ship: 'RV Tessellate',
    startDate: '2026-03-01',
    endDate: '2026-03-19',
    ports: { departure: 'Port Haverel', arrival: 'Saltmere Quay' },
    region: { name: 'Corrow Passage', west: -31, east: -9, south: -36, north: -32 },
    description:
      'A hydrographic line across the invented Corrow Passage, over the Corrow Rise and through the Tessellate Front. Invented demo data.',
    team: [
      { name: 'Dr. Maren Oduya', role: 'chief_scientist', email: 'chief@sigmaline.test' },
      { name: 'Tomas Leivesson', role: 'technician', email: 'tech@sigmaline.test' },
      { name: 'Priya Castellane', role: 'analyst', email: 'analyst@sigmaline.test' },
      { name: 'Prof. Aurel Kimathi-Brandt', role: 'pi', email: 'pi@sigmaline.test' },
      { name: 'Ines Vaark', role: 'technician', email: 'ines.vaark@sigmaline.test' },
    ],
    plannedStations: stations,
    occupiedCount: occupied,
    repeatCasts,
    lines: [
      {
        name: 'Corrow Passage main line',
        stations: stations.filter((s) => /^CP-/.test(s.station) && s.occupied).map((s) => s.station),
      },
      {
        name: 'Corrow Rise cross-line',
        stations: crossLine,
        composite: { station: 'CP-24', shallowCast: '2', deepCast: '1', joinPressure: 500 },
      },
    ],
  };
  writeFileSync(join(OUT, 'cruise.json'), JSON.stringify(cruise, null, 1) + '\n');
  writeFileSync(join(OUT, 'stations.csv'), stationRows.join('\n') + '\n');
  writeFileSync(
    join(OUT, 'planted.json'),
    JSON.stringify({ generatedBy: 'scripts/make-demo-cruise.ts', planted }, null, 1) + '\n',
  );
  writeFileSync(join(OUT, 'README.md'), readme(planted, occupied, repeatCasts.length, maxBackground));
  console.log(
    `wrote ${occupied + repeatCasts.length} casts, ${planted.length} planted inversions; largest background σ0 fall below the running maximum ${maxBackground.toFixed(5)} kg/m³`,
  );
}

function round(v: number, d: number): number {
  const f = 10 ** d;
  return Math.round(v * f) / f;
}

function readme(planted: Planted[], occupied: number, repeats: number, maxBackground: number): string {
  const rows = planted.map((p) =>
    p.kind === 'spike'
      ? `| ${p.station} | \`casts/${p.file}\` | single-scan salinity spike | ${p.pressure} dbar (one level) | SP lowered by ${p.dSP} | ${p.sigma0Drop} |`
      : `| ${p.station} | \`casts/${p.file}\` | convective overturn at the mixed-layer base | ${p.pTop}–${p.pBottom} dbar | the slab's T and S in reversed order | ${p.sigma0Deficit} |`,
  );
  return `# Demo cruise: TS-26-04 Corrow Passage section (invented)

Made by \`npx tsx scripts/make-demo-cruise.ts\` (deterministic, seeded). Everything here is invented:
the ship RV Tessellate, the Corrow Passage and Corrow Rise, the Tessellate Front, the ports, the
people, and the water, which is an analytic stratification with small sensor noise. It is demo data
only and never a reference for a science check.

- \`cruise.json\` — cruise metadata, team, and ${PLANNED} planned stations (${PLANNED - occupied} planned but not occupied).
- \`casts/\` — ${occupied + repeats} casts (${occupied} stations, ${repeats} repeat) at 2 dbar to ~10 m above the bottom: plain CSV (api.md format), and
  ${[...EXCHANGE_STATIONS].map(stationName).join(', ')} in the exchange format with quality flags (an oxygen dropout 202–210 dbar is -999, flag 9).
- After the main line (CP-01…CP-42, west to east): **KT-01**, the invented Kestrel time-series site
  about 300 km north of the line (the default line leaves it out as off the line); then the
  **Corrow Rise cross-line**, XR-01, XR-02, CP-24, XR-03, XR-04, 40 km apart from north-west to
  south-east across the crest of the rise (bottom ~3400 m → 2000 m on the crest → ~3400 m), crossing the main line at
  CP-24; and at CP-24 a **repeat shallow cast** (\`casts/CP-24_ct2.csv\`, cast 2, to 1000 dbar, six days
  after the full-depth cast 1, its thermocline heaved 6 dbar by an internal wave). \`cruise.json\`
  lists both lines (\`lines\`; the cross-line takes cast 2 above 500 dbar and cast 1 below at CP-24, a
  composite) and the repeat casts (\`repeatCasts\`); the seed makes the cross-line and leaves the
  cross-line's own stations out of the default line (the analyst's choice; one click brings them back).
- \`stations.csv\` — the station table of the occupied stations (one row a cast).
- \`planted.json\` — the table below, for tests.

Water: warm salty mixed layer (60–120 dbar, deeper east of the front), thermocline deeper west of the
Tessellate Front (near CP-16) so the isopycnals tilt across it, an intermediate salinity minimum near
900 dbar (SP ≈ 34.3), deep water with a weak salinity maximum near 2300 dbar, and a colder, slightly
fresher, denser bottom layer below ~3900 dbar in the basins either side of the Corrow Rise
(bottom 2000–5200 m). Apart from the plants, σ0 (computed by the generator with the project's seawater
core, SA taken as Reference Salinity) never falls by more than ${maxBackground.toFixed(4)} kg/m³ below its running maximum from the surface.

## Planted inversions

| station | file | what | where | how | σ0 drop (kg/m³) |
|---|---|---|---|---|---|
${rows.join('\n')}

The σ0 drop of a spike is σ0(level above) − σ0(spike level); that of the overturn is the range of σ0
within the slab. All are well above the default inversion threshold of 0.01 kg/m³.
`;
}

main();
