// What a delivery writes for each variable of a cast: the column name, which quality flags it depends
// on, and how the exchange format names it; unit, standard name and decimals come from the variable
// catalogue (shared/api/variables.ts), the flag scale from shared/api/flags.ts.
//
// Precision rule (stated in every file's provenance, PRECISION_RULE): the catalogue's decimals per
// variable, far finer than what a CTD resolves, so a read-back reproduces the engine's numbers to
// that step; variables the catalogue does not know are written to 7 significant digits.
import { VARIABLES, variableInfo as catalogue } from '../../../shared/api/variables';

/** Order of severity used to combine flags (a value takes the worst of the flags it comes from). */
const SEVERITY: Record<number, number> = { 2: 0, 1: 1, 6: 2, 7: 3, 3: 4, 4: 5, 5: 6, 8: 6, 9: 7 };
/** The worse of two WOCE flags (0 = no flag yet). */
export function worseFlag(a: number, b: number): number {
  if (a === 0) return b;
  if (b === 0) return a;
  return (SEVERITY[b] ?? 6) > (SEVERITY[a] ?? 6) ? b : a;
}

export interface VariableInfo {
  /** Column key in the cast store (`temperature`, `SP`, `x:fluorescence`, a derived name). */
  key: string;
  /** Column name in the tables (letters, digits, underscore). */
  column: string;
  unit: string | null;
  longName: string;
  standardName?: string;
  /** Decimals written; null: 7 significant digits. */
  decimals: number | null;
  /** Flag keys (cast store, without `flag:`) the value depends on; the worst of them is its flag. */
  flagsFrom: string[];
  /** Exchange-format parameter name, unit text and decimals (the trade's usual ones). */
  exchange?: { name: string; unit: string; decimals: number };
}

const decimalsOf = (name: string): number | null => catalogue(name)?.decimals ?? null;

export const PRECISION_RULE =
  'values rounded to fixed decimals per variable: latitude, longitude 1e-6 degree; ' +
  ['pressure', 'depth', 'CT', 'SA', 'sigma0', 'temperature', 'SP', 'conductivity', 'oxygen', 'pt0', 'spiciness0']
    .map((n) => `${n} ${decimalsOf(n)} decimals`)
    .join(', ') +
  '; thickness and bottom_depth 3 decimals; other variables 7 significant digits';

export const FLAG_RULE =
  'WOCE flags per value (1 not calibrated, 2 good, 3 questionable, 4 bad, 9 missing or no value); a value computed ' +
  'from several measured variables (CT from temperature and salinity) takes the worst of their flags; a value on an ' +
  'isopycnal the worst of the two measured levels it was interpolated between; a bin mean the worst of its samples; ' +
  'an empty cell is 9';

const TS = ['temperature', 'salinity', 'conductivity'];
const S = ['salinity', 'conductivity'];

/** A variable of the catalogue as a table column. */
function fromCatalogue(
  key: string,
  column: string,
  flagsFrom: string[],
  exchange?: VariableInfo['exchange'],
): VariableInfo {
  const c = catalogue(key)!;
  return {
    key,
    column,
    unit: c.storedUnit === null ? null : c.cfUnit === '1' ? null : c.storedUnit.replace(/ \(.*\)$/, ''),
    longName: c.label,
    ...(c.standardName ? { standardName: c.standardName } : {}),
    decimals: c.decimals,
    flagsFrom,
    ...(exchange ? { exchange } : {}),
  };
}

/** Known measured variables of a cast, in the order the tables write them after the contract columns. */
export const KNOWN_VARIABLES: readonly VariableInfo[] = [
  fromCatalogue('temperature', 't', ['temperature'], { name: 'CTDTMP', unit: 'ITS-90', decimals: 4 }),
  fromCatalogue('SP', 'SP', S, { name: 'CTDSAL', unit: 'PSS-78', decimals: 4 }),
  fromCatalogue('conductivity', 'conductivity', ['conductivity']),
  fromCatalogue('oxygen', 'oxygen', ['oxygen'], { name: 'CTDOXY', unit: 'UMOL/KG', decimals: 1 }),
];

/** Derived variables a request may add by name (stored with every cast): the catalogue's sectionable derived ones. */
export const DERIVED_VARIABLES: readonly VariableInfo[] = VARIABLES.filter(
  (v) => v.kind === 'derived' && v.sectionable && !['SA', 'CT'].includes(v.name),
).map((v) => fromCatalogue(v.name, v.name, TS));

/** Flag keys behind CT and SA. */
export const CT_FLAGS_FROM = TS;
export const SA_FLAGS_FROM = S;

/** Round to the written precision: fixed decimals, or 7 significant digits when decimals is null. */
export function roundTo(v: number, decimals: number | null): number {
  if (!Number.isFinite(v)) return v;
  if (decimals === null) return Number(v.toPrecision(7));
  const s = 10 ** decimals;
  const r = Math.round(v * s) / s;
  return r === 0 ? 0 : r;
}

/** A column name from a store key: `x:fluor-ECO` → `fluor_ECO`. */
export function columnName(key: string): string {
  return (
    key
      .replace(/^x:/, '')
      .replace(/[^A-Za-z0-9_]/g, '_')
      .replace(/^(\d)/, '_$1')
      .slice(0, 58) || 'extra'
  );
}

/** The catalogue entry for a store key; unknown extras get 7 significant digits and their own flag. */
export function variableInfo(key: string, unit: string | null): VariableInfo {
  const known = [...KNOWN_VARIABLES, ...DERIVED_VARIABLES].find((v) => v.key === key);
  if (known) return known;
  const bare = key.replace(/^x:/, '');
  return {
    key,
    column: columnName(key),
    unit: unit || null,
    longName: bare,
    decimals: null,
    flagsFrom: key.startsWith('x:') ? [bare] : TS,
  };
}
