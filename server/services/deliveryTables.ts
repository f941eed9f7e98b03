// The regridded tables every export and delivery writes: the isopycnal table (one row per cast and
// target level) and the pressure table (one row per cast and pressure bin). The api.md columns
// come first in their order; after them cruise, line, time, bottom_depth, the WOCE flags of CT and
// SA, every other variable of the casts with its flag, and the derived variables asked for.
// Values are rounded to the stated precision of each variable (deliveries/variables.ts).
import { Op } from 'sequelize';
import { AuditEntry, Cast, Cruise, User } from '../models/index';
import { loadCruiseCasts, applyFlags, type CruiseCast } from './cruiseData';
import { propertyColumns } from './sectionView';
import { resolveLevels } from './levels';
import { castsOfLine, type DeliveryLine } from './deliveryLine';
import {
  remapToIsopycnals,
  binToPressure,
  flagNames,
  type InversionHandling,
  type SigmaInterpolation,
} from '../../shared/remap/index';
import { sigma_batch } from '../../shared/seawater/index';
import { DEFAULT_LEVELS_RULE } from '../../shared/api/levels';
import { variableInfo as catalogue } from '../../shared/api/variables';
import {
  ISOPYCNAL_COLUMNS,
  PRESSURE_COLUMNS,
  type DeliveryColumn,
  type DeliveryRow,
  type DeliveryTable,
  type Provenance,
} from './deliveries/index';
import {
  CT_FLAGS_FROM,
  DERIVED_VARIABLES,
  FLAG_RULE,
  KNOWN_VARIABLES,
  PRECISION_RULE,
  SA_FLAGS_FROM,
  columnName,
  roundTo,
  variableInfo,
  worseFlag,
  type VariableInfo,
} from './deliveries/variables';
import { VERSION } from '../version';

export const EOS = 'TEOS-10 (IOC, SCOR & IAPSO 2010); density from the 75-term polynomial of Roquet et al. (2015)';
export const SAAR_SOURCE = 'McDougall et al. (2012) SAAR atlas, regenerated from Debian python3-gsw 3.6.16';

/** levels: a specification as asked for, or null for the default levels of the reference pressure. */
export type IsopycnalRequest = {
  ref: number;
  levels: string | null;
  handling: InversionHandling;
  interpolation: SigmaInterpolation;
  flags: number[];
  /** Derived variables to add (stored derived columns such as pt0, or the cruise's derived variables by name). */
  extras: string[];
  line?: string | null;
};
export type PressureRequest = { bin: number; flags: number[]; extras: string[]; line?: string | null };

/** Columns after the api.md ones, the same in both tables. */
const CONTEXT_COLUMNS: DeliveryColumn[] = [
  { name: 'cruise', unit: null, type: 'string', long_name: 'Cruise (expocode where known)' },
  { name: 'line', unit: null, type: 'string', long_name: 'Line (section) the cast belongs to' },
  { name: 'time', unit: 'ISO 8601 UTC', type: 'string', long_name: 'Time of the cast' },
  {
    name: 'bottom_depth',
    unit: 'm',
    type: 'number',
    long_name: 'Depth of the sea floor at the cast',
    standard_name: 'sea_floor_depth_below_sea_surface',
  },
];
const flagColumn = (of: string): DeliveryColumn => ({
  name: `${of}_flag`,
  unit: null,
  type: 'number',
  long_name: `WOCE quality flag of ${of}`,
});

/** Decimals of the contract columns (the rest come from the variable catalogue). */
const DECIMALS: Record<string, number> = {
  latitude: 6,
  longitude: 6,
  sigma_ref: 0,
  sigma_level: 6,
  thickness: 3,
  crossings: 0,
  count: 0,
  bottom_depth: 3,
};
const decimalsOf = (name: string): number =>
  DECIMALS[name] ?? catalogue(name === 't' ? 'temperature' : name)?.decimals ?? 6;
const r = (name: string, v: number | null | undefined): number | null =>
  v === null || v === undefined || !Number.isFinite(v) ? null : roundTo(v, decimalsOf(name));

/** The cruise identifier a data office knows: the expocode the casts' files carry, else the cruise name. */
async function cruiseLabel(cruiseId: string, name: string): Promise<{ label: string; expocode: string | null }> {
  const rows = await Cast.findAll({ where: { cruiseId }, attributes: ['metadata'], limit: 200 });
  const counts = new Map<string, number>();
  for (const c of rows) {
    const md = (c.metadata ?? {}) as Record<string, unknown>;
    const key = Object.keys(md).find((k) => k.toLowerCase() === 'expocode');
    const v = key ? String(md[key]).trim() : '';
    if (v) counts.set(v, (counts.get(v) ?? 0) + 1);
  }
  const expocode = [...counts.entries()].sort((a, b) => b[1] - a[1])[0]?.[0] ?? null;
  return { label: expocode ?? name, expocode };
}

/** How many levels each technician flagged what, from the audit trail. */
async function flagHistory(cruiseId: string): Promise<string[]> {
  const rows = await AuditEntry.findAll({
    where: { cruiseId, action: 'set_flag', entity: 'cast' },
    order: [['at', 'ASC']],
    limit: 5000,
  });
  if (!rows.length) return ['no flags set by hand'];
  const users = await User.findAll({
    where: { id: { [Op.in]: [...new Set(rows.map((a) => a.userId).filter((u): u is string => !!u))] } },
  });
  const name = new Map(users.map((u) => [u.id, u.email]));
  const sum = new Map<string, { levels: number; edits: number }>();
  for (const a of rows) {
    const after = (a.after ?? {}) as { variable?: string; flag?: number; levels?: number };
    const k = `${name.get(a.userId ?? '') ?? 'unknown'}|${after.variable ?? '?'}|${after.flag ?? '?'}`;
    const s = sum.get(k) ?? { levels: 0, edits: 0 };
    s.levels += Number(after.levels ?? 0);
    s.edits += 1;
    sum.set(k, s);
  }
  return [...sum.entries()].map(([k, s]) => {
    const [who, variable, flag] = k.split('|');
    return `${who} set flag ${flag} on ${s.levels} ${variable} levels (${s.edits} edits)`;
  });
}

export async function provenanceFor(cruiseId: string, who: string, p: Partial<Provenance>): Promise<Provenance> {
  const c = (await Cruise.findByPk(cruiseId))!;
  return {
    software: 'Sigmaline',
    version: VERSION,
    equationOfState: EOS,
    functions: ['SA_from_SP', 'CT_from_t', 'sigma_pr', 'Nsquared', 'z_from_p'],
    saarSource: SAAR_SOURCE,
    referencePressure: null,
    layerSet: null,
    inversionHandling: null,
    interpolation: null,
    flagsIncluded: [1, 2],
    exportedBy: who,
    exportedAt: new Date().toISOString(),
    cruise: { id: c.id, name: c.name, ship: c.ship },
    precision: PRECISION_RULE,
    flagRule: FLAG_RULE,
    flagHistory: await flagHistory(cruiseId),
    ...p,
  };
}

type Plan = { vars: VariableInfo[]; columns: DeliveryColumn[] };

/** The other variables the casts carry (measured ones first, then extras), and the derived ones asked for. */
function planVariables(
  casts: readonly CruiseCast[],
  extras: readonly string[],
  taken: Set<string>,
  skip: readonly string[] = [],
): Plan {
  const keys = new Set<string>();
  for (const c of casts) for (const k of Object.keys(c.columns)) keys.add(k);
  const found: VariableInfo[] = [];
  for (const v of KNOWN_VARIABLES) if (keys.has(v.key)) found.push(v);
  for (const k of [...keys].filter((k) => k.startsWith('x:')).sort()) {
    const unit = casts.find((c) => c.columns[k])?.units[k] ?? null;
    found.push(variableInfo(k, unit));
  }
  for (const e of extras) {
    if (found.some((v) => v.key === e)) continue;
    const known = DERIVED_VARIABLES.find((v) => v.key === e);
    found.push(known ?? { ...variableInfo(e, null), flagsFrom: CT_FLAGS_FROM, longName: `Derived variable ${e}` });
  }
  const vars: VariableInfo[] = [];
  const columns: DeliveryColumn[] = [];
  for (const v of found) {
    if (skip.includes(v.key)) continue;
    let name = v.column;
    while (taken.has(name) || taken.has(`${name}_flag`)) name = `x_${name}`;
    taken.add(name);
    taken.add(`${name}_flag`);
    vars.push({ ...v, column: name });
    columns.push({
      name,
      unit: v.unit,
      type: 'number',
      long_name: v.longName,
      ...(v.standardName ? { standard_name: v.standardName } : {}),
    });
    columns.push(flagColumn(name));
  }
  return { vars, columns };
}

/** Per-level flag of a variable: the worst of its source flags (2 where the cast has none of them). */
function levelFlags(c: CruiseCast, from: readonly string[], n: number): Float64Array {
  const out = new Float64Array(n);
  let any = false;
  for (const k of from) {
    const f = c.flags[`flag:${k}`];
    if (!f || f.length !== n) continue;
    any = true;
    for (let i = 0; i < n; i++) out[i] = worseFlag(out[i], f[i]);
  }
  if (!any) out.fill(2);
  return out;
}

/** The cast's values of every planned variable (store column or derived formula). */
async function variableValues(
  cruiseId: string,
  casts: CruiseCast[],
  vars: readonly VariableInfo[],
): Promise<Map<string, (Float64Array | null)[]>> {
  const out = new Map<string, (Float64Array | null)[]>();
  for (const v of vars) {
    if (casts.some((c) => c.columns[v.key]))
      out.set(
        v.key,
        casts.map((c) => c.columns[v.key] ?? null),
      );
    else out.set(v.key, await propertyColumns(cruiseId, v.key, casts));
  }
  return out;
}

/** Index i with p[i-1] ≤ x ≤ p[i] in an increasing array (clamped). */
function bracket(p: Float64Array, x: number): number {
  let lo = 0;
  let hi = p.length - 1;
  if (x <= p[0]) return 0;
  if (x >= p[hi]) return hi;
  while (hi - lo > 1) {
    const m = (lo + hi) >> 1;
    if (p[m] <= x) lo = m;
    else hi = m;
  }
  return hi;
}

/** The casts of a line with the flagged levels kept or dropped, flags filtered alongside. */
function withFlags(
  c: CruiseCast,
  include: number[],
  sources: Record<string, readonly string[]>,
  values: Record<string, Float64Array | null>,
) {
  const n = c.columns.pressure.length;
  const extra: Record<string, Float64Array> = {};
  for (const [name, from] of Object.entries(sources)) extra[`__flag:${name}`] = levelFlags(c, from, n);
  for (const [name, v] of Object.entries(values)) if (v && v.length === n) extra[`__val:${name}`] = v;
  return applyFlags({ ...c, columns: { ...c.columns, ...extra } }, include);
}

async function lineCasts(
  cruiseId: string,
  line: string | null | undefined,
): Promise<{ line: DeliveryLine; casts: CruiseCast[] }> {
  const all = await loadCruiseCasts(cruiseId);
  const l = await castsOfLine(cruiseId, line ?? null, all);
  return { line: l, casts: l.casts };
}

export async function isopycnalTable(cruiseId: string, who: string, q: IsopycnalRequest): Promise<DeliveryTable> {
  const cruise = (await Cruise.findByPk(cruiseId))!;
  const { line, casts } = await lineCasts(cruiseId, q.line);
  const { label, expocode } = await cruiseLabel(cruiseId, cruise.name);
  const { text: levelsText, levels, isDefault } = resolveLevels(casts, q.ref, q.levels);
  const taken = new Set([...ISOPYCNAL_COLUMNS, ...CONTEXT_COLUMNS].map((c) => c.name).concat(['CT_flag', 'SA_flag']));
  const plan = planVariables(casts, q.extras, taken);
  const values = await variableValues(cruiseId, casts, plan.vars);
  const rows: DeliveryRow[] = [];
  casts.forEach((c, ci) => {
    const sources: Record<string, readonly string[]> = { CT: CT_FLAGS_FROM, SA: SA_FLAGS_FROM };
    for (const v of plan.vars) sources[v.key] = v.flagsFrom;
    const cols = withFlags(
      c,
      q.flags,
      sources,
      Object.fromEntries(plan.vars.map((v) => [v.key, values.get(v.key)![ci]])),
    );
    if (!cols.pressure || cols.pressure.length < 2) return;
    const sigma = sigma_batch(cols.SA, cols.CT, q.ref);
    const props: Record<string, Float64Array> = { CT: cols.CT, SA: cols.SA };
    for (const v of plan.vars) if (cols[`__val:${v.key}`]) props[v.key] = cols[`__val:${v.key}`];
    const rm = remapToIsopycnals({ p: cols.pressure, z: cols.z, sigma, props }, levels, {
      handling: q.handling,
      interpolation: q.interpolation,
    });
    const thick = rm.thicknessDepth ?? rm.thickness;
    const time = c.time ? c.time.toISOString().replace('.000Z', 'Z') : null;
    const bottom = r('bottom_depth', c.bottomDepth);
    for (let k = 0; k < levels.length; k++) {
      const pk = rm.pressure[k];
      const at = Number.isFinite(pk) ? bracket(cols.pressure, pk) : -1;
      const flagAt = (name: string, v: number | null): number => {
        if (v === null || at < 0) return 9;
        const f = cols[`__flag:${name}`];
        return at > 0 ? worseFlag(f[at - 1], f[at]) : f[at];
      };
      const ct = r('CT', rm.props.CT[k]);
      const sa = r('SA', rm.props.SA[k]);
      const row: DeliveryRow = [
        c.station,
        c.cast,
        r('latitude', c.latitude),
        r('longitude', c.longitude),
        q.ref,
        r('sigma_level', levels[k]),
        r('pressure', pk),
        rm.depth ? r('depth', rm.depth[k]) : null,
        ct,
        sa,
        r('thickness', thick[k]),
        rm.crossings[k],
        flagNames(rm.flags[k]).join(';') || null,
        label,
        line.name,
        time,
        bottom,
        flagAt('CT', ct),
        flagAt('SA', sa),
      ];
      for (const v of plan.vars) {
        const raw = rm.props[v.key] ? rm.props[v.key][k] : NaN;
        const val = Number.isFinite(raw) ? roundTo(raw, v.decimals) : null;
        row.push(val, cols[`__flag:${v.key}`] ? flagAt(v.key, val) : 9);
      }
      rows.push(row);
    }
  });
  const columns = [...ISOPYCNAL_COLUMNS, ...CONTEXT_COLUMNS, flagColumn('CT'), flagColumn('SA'), ...plan.columns];
  const notes = [
    ...(isDefault ? [`Levels: the default policy, ${DEFAULT_LEVELS_RULE}.`] : []),
    line.note ?? `Line ${line.name}: ${casts.length} casts.`,
  ];
  return {
    kind: 'isopycnal',
    columns,
    rows,
    provenance: await provenanceFor(cruiseId, who, {
      referencePressure: q.ref,
      layerSet: levelsText,
      inversionHandling: q.handling,
      interpolation: q.interpolation,
      flagsIncluded: q.flags,
      line: line.name,
      expocode,
      notes,
    }),
  };
}

export async function pressureTable(cruiseId: string, who: string, q: PressureRequest): Promise<DeliveryTable> {
  const cruise = (await Cruise.findByPk(cruiseId))!;
  const { line, casts } = await lineCasts(cruiseId, q.line);
  const { label, expocode } = await cruiseLabel(cruiseId, cruise.name);
  // t and SP are contract columns of the pressure table; the plan adds the rest.
  const taken = new Set(
    [...PRESSURE_COLUMNS, ...CONTEXT_COLUMNS].map((c) => c.name).concat(['CT_flag', 'SA_flag', 't_flag', 'SP_flag']),
  );
  const plan = planVariables(casts, q.extras, taken, ['temperature', 'SP']);
  const values = await variableValues(cruiseId, casts, plan.vars);
  const rows: DeliveryRow[] = [];
  casts.forEach((c, ci) => {
    const sources: Record<string, readonly string[]> = {
      CT: CT_FLAGS_FROM,
      SA: SA_FLAGS_FROM,
      temperature: ['temperature'],
      SP: SA_FLAGS_FROM,
    };
    for (const v of plan.vars) sources[v.key] = v.flagsFrom;
    const cols = withFlags(
      c,
      q.flags,
      sources,
      Object.fromEntries(plan.vars.map((v) => [v.key, values.get(v.key)![ci]])),
    );
    if (!cols.pressure || !cols.pressure.length) return;
    const props: Record<string, Float64Array> = {};
    for (const n of ['CT', 'SA', 'sigma0', 'z', 'temperature', 'SP']) if (cols[n]) props[n] = cols[n];
    for (const v of plan.vars) if (cols[`__val:${v.key}`]) props[v.key] = cols[`__val:${v.key}`];
    const b = binToPressure(cols.pressure, props, q.bin);
    // worst flag of the samples in each bin (same bins as binToPressure: centre k·bin, half-open)
    const kFirst = Math.round(b.pressure[0] / q.bin);
    const binFlags = (name: string): Int16Array => {
      const out = new Int16Array(b.pressure.length);
      const f = cols[`__flag:${name}`];
      if (!f) return out.fill(9);
      for (let i = 0; i < cols.pressure.length; i++) {
        const k = Math.floor(cols.pressure[i] / q.bin + 0.5) - kFirst;
        if (k >= 0 && k < out.length) out[k] = worseFlag(out[k], f[i]);
      }
      return out;
    };
    const flags: Record<string, Int16Array> = {};
    for (const name of Object.keys(sources)) flags[name] = binFlags(name);
    const time = c.time ? c.time.toISOString().replace('.000Z', 'Z') : null;
    const bottom = r('bottom_depth', c.bottomDepth);
    for (let k = 0; k < b.pressure.length; k++) {
      if (b.count[k] === 0) continue;
      const g = (n: string, name = n) => (b.props[n] ? r(name, b.props[n][k]) : null);
      const fl = (name: string, v: number | null) => (v === null ? 9 : flags[name][k] || 9);
      const z = g('z', 'depth');
      const ct = g('CT');
      const sa = g('SA');
      const t = g('temperature', 't');
      const sp = g('SP');
      const row: DeliveryRow = [
        c.station,
        c.cast,
        r('latitude', c.latitude),
        r('longitude', c.longitude),
        r('pressure', b.pressure[k]),
        b.count[k],
        ct,
        sa,
        g('sigma0'),
        z === null ? null : -z || 0,
        t,
        sp,
        label,
        line.name,
        time,
        bottom,
        fl('CT', ct),
        fl('SA', sa),
        fl('temperature', t),
        fl('SP', sp),
      ];
      for (const v of plan.vars) {
        const raw = b.props[v.key] ? b.props[v.key][k] : NaN;
        const val = Number.isFinite(raw) ? roundTo(raw, v.decimals) : null;
        row.push(val, fl(v.key, val));
      }
      rows.push(row);
    }
  });
  const columns = [
    ...PRESSURE_COLUMNS,
    ...CONTEXT_COLUMNS,
    flagColumn('CT'),
    flagColumn('SA'),
    flagColumn('t'),
    flagColumn('SP'),
    ...plan.columns,
  ];
  return {
    kind: 'pressure',
    columns,
    rows,
    provenance: await provenanceFor(cruiseId, who, {
      layerSet: `pressure bins of ${q.bin} dbar`,
      flagsIncluded: q.flags,
      line: line.name,
      expocode,
      notes: [line.note ?? `Line ${line.name}: ${casts.length} casts.`],
    }),
  };
}

export { columnName };

/** The line's casts with every column and flag, for the exchange files. */
export async function lineCastsForDelivery(cruiseId: string, line: string | null): Promise<CruiseCast[]> {
  return (await lineCasts(cruiseId, line)).casts;
}
