// Recognising the columns of a cast table by name (and the unit written with it). A user-supplied
// mapping {header -> role} wins over recognition, so files with unusual headers can still be read.
import type { ColumnRole } from '../../shared/schemas/cast';
import { COLUMN_ROLES } from '../../shared/schemas/cast';

export type ColumnAssignment =
  | { kind: 'role'; role: ColumnRole }
  | { kind: 'flag'; of: string } // a quality-flag column of a role or of an extra (by its key)
  | { kind: 'extra'; key: string; recognised: boolean } // recognised: a known optional variable
  | { kind: 'ignore' };

/** Split "pressure [dbar]", "pressure (dbar)", "pressure {dbar}" into name and unit. */
export function splitHeader(raw: string): { name: string; unit: string | null } {
  const h = raw.trim();
  const m = /^(.*?)\s*[[({]\s*([^\])}]*)\s*[\])}]\s*$/.exec(h);
  if (m && m[1].length > 0) return { name: m[1].trim(), unit: m[2].trim() };
  return { name: h, unit: null };
}

export function normaliseName(name: string): string {
  return name
    .toLowerCase()
    .replace(/[_\-.:/]+/g, ' ')
    .replace(/\s+/g, ' ')
    .trim();
}

const NAMES: Record<ColumnRole, string[]> = {
  pressure: ['pressure', 'pres', 'press', 'prs', 'p', 'ctdprs', 'sea pressure', 'ctd pressure', 'pressure sea'],
  depth: ['depth', 'dep', 'depth below surface', 'ctd depth', 'depth m', 'ctddep'],
  temperature: [
    'temperature',
    'temp',
    't',
    'ctdtmp',
    'ctd temperature',
    'water temperature',
    'in situ temperature',
    'insitu temperature',
    't90',
    't68',
    'tmp',
  ],
  salinity: ['salinity', 'sal', 's', 'sp', 'psal', 'ctdsal', 'practical salinity', 'salt', 'ctd salinity'],
  conductivity: ['conductivity', 'cond', 'c', 'ctdcond', 'ctdcnd', 'ctd conductivity'],
  oxygen: ['oxygen', 'oxy', 'o2', 'ctdoxy', 'dissolved oxygen', 'ctd oxygen', 'do'],
};
const BY_NAME = new Map<string, ColumnRole>();
for (const role of COLUMN_ROLES) for (const n of NAMES[role]) BY_NAME.set(n, role);

/** Optional variables the product knows by name; kept as extras under a tidy key. */
const KNOWN_EXTRAS: Record<string, string> = {
  fluorescence: 'fluorescence',
  fluor: 'fluorescence',
  ctdfluor: 'fluorescence',
  chlorophyll: 'fluorescence',
  fl: 'fluorescence',
  turbidity: 'turbidity',
  turb: 'turbidity',
  ctdturb: 'turbidity',
  ntu: 'turbidity',
  transmissometer: 'transmission',
  transmission: 'transmission',
  ctdxmiss: 'transmission',
  xmiss: 'transmission',
  par: 'par',
  ctdpar: 'par',
  scan: 'scan',
  'scan number': 'scan',
  nbin: 'nbin',
  ctdnobs: 'nbin',
};

const FLAG_SUFFIX = /^(.*?)\s+(?:flag w|flag|qc|quality|q)$/;

export function roleOfName(name: string): ColumnRole | null {
  return BY_NAME.get(normaliseName(name)) ?? null;
}

export function extraKey(name: string): string {
  const n = normaliseName(name);
  return KNOWN_EXTRAS[n] ?? (n.replace(/ /g, '_') || 'column');
}

const MAPPING_ROLES = new Set<string>([...COLUMN_ROLES, 'extra', 'ignore']);

/** Is a mapping value acceptable? (role, extra, ignore, or flag:<role or extra key>) */
export function validMappingValue(v: string): boolean {
  return MAPPING_ROLES.has(v) || /^flag:[A-Za-z0-9_ ]+$/.test(v);
}

function lookupMapping(mapping: Record<string, string> | undefined, raw: string, name: string): string | undefined {
  if (!mapping) return undefined;
  const trimmed = raw.trim();
  if (mapping[trimmed] !== undefined) return mapping[trimmed];
  const lowRaw = trimmed.toLowerCase();
  const lowName = normaliseName(name);
  for (const [k, v] of Object.entries(mapping)) {
    const lk = k.trim().toLowerCase();
    if (lk === lowRaw || normaliseName(k) === lowName) return v;
  }
  return undefined;
}

/**
 * Assign each header its part in the cast. `names` are header names without units.
 * A later column naming a role already taken becomes an extra (dual sensors are common).
 */
export function assignColumns(
  rawHeaders: string[],
  names: string[],
  mapping?: Record<string, string>,
): { assignments: ColumnAssignment[]; duplicates: { index: number; role: string }[] } {
  const out: ColumnAssignment[] = [];
  const taken = new Set<string>();
  const duplicates: { index: number; role: string }[] = [];
  for (let i = 0; i < rawHeaders.length; i++) {
    const name = names[i];
    const mapped = lookupMapping(mapping, rawHeaders[i], name);
    let a: ColumnAssignment;
    if (mapped !== undefined) {
      if (mapped === 'ignore') a = { kind: 'ignore' };
      else if (mapped === 'extra') a = { kind: 'extra', key: extraKey(name), recognised: true };
      else if (mapped.startsWith('flag:')) a = { kind: 'flag', of: mapped.slice(5).trim() };
      else a = { kind: 'role', role: mapped as ColumnRole };
    } else {
      const role = roleOfName(name);
      if (role) a = { kind: 'role', role };
      else {
        const fm = FLAG_SUFFIX.exec(normaliseName(name));
        const base = fm ? fm[1].trim() : null;
        if (base && fm && fm[0] !== base) {
          const baseRole = roleOfName(base);
          a = { kind: 'flag', of: baseRole ?? extraKey(base) };
        } else {
          const key = extraKey(name);
          a = { kind: 'extra', key, recognised: KNOWN_EXTRAS[normaliseName(name)] !== undefined };
        }
      }
    }
    if (a.kind === 'role') {
      if (taken.has(a.role)) {
        duplicates.push({ index: i, role: a.role });
        a = { kind: 'extra', key: extraKey(name + ' ' + (i + 1)), recognised: true };
      } else taken.add(a.role);
    }
    out.push(a);
  }
  return { assignments: out, duplicates };
}
