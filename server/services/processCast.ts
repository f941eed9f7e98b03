// From a parsed cast to the stored one: pressure from depth where needed, Practical Salinity from
// conductivity where needed, the TEOS-10 columns, the inversions of σ0 and the fitness of each
// candidate vertical coordinate. Pure: no I/O.
import { STORED_UNITS } from '../../shared/api/variables';
import type { ParsedCast, FileError } from '../../shared/schemas/cast';
import { deriveCast, p_from_z } from '../../shared/seawater/index';
import { detectInversions } from '../../shared/remap/inversions';
import { coordinateFitness, coordinateFitnessAtResolution } from '../../shared/remap/fitness';
import type { StoredColumn } from './columns';

export type ProcessedCast = {
  levels: number;
  columns: StoredColumn[];
  inversions: unknown[];
  fitness: Record<string, unknown>;
  notes: string[];
  saar: string;
  mld: unknown;
};

/** Stored unit of each column: the catalogue's (shared/api/variables.ts). */
const UNITS = STORED_UNITS;

export function processCast(
  c0: ParsedCast,
  opts: { inversionThreshold: number },
): { ok: true; cast: ProcessedCast } | { ok: false; errors: FileError[] } {
  let c = c0;
  const lat = c.metadata.latitude!;
  const lon = c.metadata.longitude!;
  let n = c.profile.levels;
  let p = c.columns.pressure;
  const notes: string[] = [];
  if (!p) {
    const d = c.columns.depth!;
    p = new Float64Array(n);
    for (let i = 0; i < n; i++) p[i] = p_from_z(-d[i], lat);
    notes.push('pressure computed from depth with TEOS-10 p_from_z at the cast latitude');
  }
  // Pressure reversals (ship heave) are counted by the parser; the profile used downstream keeps
  // only levels deeper than every level before them, so pressure increases strictly.
  let keep: number[] | null = null;
  for (let i = 1, max = p[0]; i < n; i++) {
    if (!(p[i] > max)) {
      keep ??= Array.from({ length: i }, (_, k) => k);
      continue;
    }
    max = p[i];
    keep?.push(i);
  }
  if (keep) {
    const pick = (a: Float64Array) => Float64Array.from(keep!, (k) => a[k]);
    const pickU8 = (a: Uint8Array) => Uint8Array.from(keep!, (k) => a[k]);
    notes.push(`${n - keep.length} levels dropped where pressure did not increase (pressure reversals)`);
    c = {
      ...c,
      columns: Object.fromEntries(
        Object.entries(c.columns).map(([k, v]) => [k, v ? pick(v) : v]),
      ) as ParsedCast['columns'],
      extras: Object.fromEntries(
        Object.entries(c.extras).map(([k, e]) => [k, { unit: e.unit, values: pick(e.values) }]),
      ),
      flags: Object.fromEntries(Object.entries(c.flags).map(([k, v]) => [k, pickU8(v)])),
      profile: { ...c.profile, levels: keep.length },
    };
    p = pick(p);
    n = keep.length;
  }
  const f = (a: Float64Array) => a as Float64Array<ArrayBuffer>;
  const input = c.columns.salinity
    ? { SP: f(c.columns.salinity), t: f(c.columns.temperature), p: f(p), lon, lat }
    : { C: f(c.columns.conductivity!), t: f(c.columns.temperature), p: f(p), lon, lat };
  const derived = deriveCast(input);
  notes.push(...derived.notes.map((n) => n.message + (n.count && n.count > 1 ? ` (${n.count} levels)` : '')));
  const z = new Float64Array(n);
  for (let i = 0; i < n; i++) z[i] = -derived.depth[i];
  const cols: Record<string, Float64Array | undefined> = {
    SP: derived.SP,
    SA: derived.SA,
    CT: derived.CT,
    pt0: derived.pt0,
    sigma0: derived.sigma0,
    sigma1: derived.sigma1,
    sigma2: derived.sigma2,
    sigma3: derived.sigma3,
    sigma4: derived.sigma4,
    rho: derived.rho,
    spiciness0: derived.spiciness0,
    N2: derived.N2,
    p_mid: derived.p_mid,
    z,
  };
  const srFallback = derived.notes.some((n) => n.kind === 'sr_fallback');
  const sigma0 = cols.sigma0!;
  const inversions = detectInversions(p, sigma0, {
    threshold: opts.inversionThreshold,
    N2: cols.N2,
    p_mid: cols.p_mid,
    z: cols.z,
  });
  const fitness: Record<string, unknown> = {};
  for (const name of ['sigma0', 'sigma1', 'sigma2', 'sigma3', 'sigma4', 'CT', 'SA', 'pressure']) {
    const v = name === 'pressure' ? p : cols[name];
    // strict, and at the resolution the analysis works at (σ: the inversion threshold; CT 0.01 °C,
    // SA 0.005 g/kg — sensor-noise scales of the trade, common practice)
    const tol = name.startsWith('sigma') ? opts.inversionThreshold : name === 'CT' ? 0.01 : name === 'SA' ? 0.005 : 0;
    if (v) fitness[name] = { ...coordinateFitness(p, v), resolved: coordinateFitnessAtResolution(p, v, tol) };
  }
  const columns: StoredColumn[] = [
    { name: 'pressure', unit: 'dbar', kind: c.vertical === 'pressure' ? 'measured' : 'derived', values: p },
  ];
  if (c.columns.depth) columns.push({ name: 'depth', unit: 'm', kind: 'measured', values: c.columns.depth });
  columns.push({ name: 'temperature', unit: UNITS.temperature, kind: 'measured', values: c.columns.temperature });
  if (c.columns.salinity) columns.push({ name: 'SP', unit: UNITS.SP, kind: 'measured', values: c.columns.salinity });
  if (c.columns.conductivity)
    columns.push({ name: 'conductivity', unit: 'mS/cm', kind: 'measured', values: c.columns.conductivity });
  if (c.columns.oxygen) columns.push(oxygenColumn(c.columns.oxygen, c.units.oxygen ?? null, derived.sigma0, notes));
  for (const [name, v] of Object.entries(cols)) {
    if (!v || name === 'pressure' || (name === 'SP' && c.columns.salinity)) continue;
    columns.push({ name, unit: UNITS[name] ?? null, kind: 'derived', values: v });
  }
  for (const [name, e] of Object.entries(c.extras))
    columns.push({ name: `x:${name}`, unit: e.unit, kind: 'extra', values: e.values });
  for (const [name, f] of Object.entries(c.flags))
    columns.push({ name: `flag:${name}`, unit: null, kind: 'flag', values: f });
  return {
    ok: true,
    cast: {
      levels: n,
      columns,
      inversions,
      fitness,
      notes,
      saar: srFallback ? 'SR fallback (outside the SAAR atlas)' : 'SAAR atlas',
      mld: derived.mld,
    },
  };
}

/** Inversions of σ0 over the levels whose T and S flags are good (1 or 2): a level a technician
 * flags questionable or bad stops raising a warning. Indices refer to the full profile. */
export function inversionsOfGoodLevels(
  cols: Record<string, Float64Array>,
  flags: Record<string, Uint8Array>,
  threshold: number,
) {
  const p = cols.pressure;
  const keep: number[] = [];
  for (let i = 0; i < p.length; i++) {
    let ok = true;
    for (const [name, f] of Object.entries(flags))
      if (/^flag:(temperature|salinity|conductivity)$/.test(name) && f[i] !== 1 && f[i] !== 2) ok = false;
    if (ok) keep.push(i);
  }
  const pick = (a: Float64Array) => Float64Array.from(keep, (k) => a[k]);
  const found = detectInversions(pick(p), pick(cols.sigma0), { threshold, z: cols.z ? pick(cols.z) : undefined });
  return found.map((v) => ({ ...v, iTop: keep[v.iTop], iBottom: keep[v.iBottom] }));
}

/**
 * The stored oxygen column, per kilogram of sea water: a volume concentration (µmol/l, which the
 * parsers make of ml/l and mg/l) divided by the potential density of the sample, ρθ = σ0 + 1000
 * kg/m³, in kg/l: the conversion of the trade (common practice; e.g. Langdon 2010, "Determination of
 * dissolved oxygen in seawater by Winkler titration using the amperometric technique", GO-SHIP Repeat
 * Hydrography Manual; from memory). Other units stay as given.
 */
export function oxygenColumn(
  o2: Float64Array,
  unit: string | null,
  sigma0: Float64Array,
  notes: string[],
): StoredColumn {
  if (unit !== 'µmol/l') return { name: 'oxygen', unit, kind: 'measured', values: o2 };
  const out = new Float64Array(o2.length);
  for (let i = 0; i < o2.length; i++) out[i] = o2[i] / ((sigma0[i] + 1000) / 1000);
  notes.push('oxygen converted from µmol/l to µmol/kg with the potential density of each sample (σ0 + 1000 kg/m³)');
  return { name: 'oxygen', unit: 'µmol/kg', kind: 'measured', values: out };
}
