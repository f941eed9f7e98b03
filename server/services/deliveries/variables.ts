// What a delivery writes for each variable of a cast: the column name, unit, CF unit and standard
// name, the precision it is written with, which quality flags it depends on, and how the exchange
// format names it. One table so the CSV, the spreadsheet, the NetCDF and the exchange files agree.
//
// Precision rule (stated in every file's provenance, PRECISION_RULE): a fixed number of decimals
// per variable, far finer than what a CTD resolves (pressure and depth 0.001 dbar/m; CT, SA, t, SP,
// σ 1e-6), so a read-back reproduces the engine's numbers to that step; variables the catalogue
// does not know are written to 7 significant digits.

/** WOCE CTD quality flags (the trade's 1–9 scale; meanings from memory of the WOCE manual). */
export const WOCE_FLAGS = [
  { value: 1, meaning: 'not_calibrated' },
  { value: 2, meaning: 'acceptable' },
  { value: 3, meaning: 'questionable' },
  { value: 4, meaning: 'bad' },
  { value: 5, meaning: 'not_reported' },
  { value: 6, meaning: 'interpolated_over_gap' },
  { value: 7, meaning: 'despiked' },
  { value: 9, meaning: 'not_sampled' },
] as const;

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

export const PRECISION_RULE =
  'values rounded to fixed decimals per variable: latitude, longitude 1e-6 degree; pressure, depth, thickness, bottom_depth ' +
  '0.001 (dbar, m); CT, SA, t, SP, sigma, pt0, spiciness0, conductivity 1e-6; oxygen 0.001; other variables 7 significant digits';

export const FLAG_RULE =
  'WOCE flags per value (1 not calibrated/assessed, 2 acceptable, 3 questionable, 4 bad, 9 no value); a value computed ' +
  'from several measured variables (CT from temperature and salinity) takes the worst of their flags; a value on an ' +
  'isopycnal the worst of the two measured levels it was interpolated between; a bin mean the worst of its samples; ' +
  'an empty cell is 9';

const TS = ['temperature', 'salinity', 'conductivity'];
const S = ['salinity', 'conductivity'];

/** Known variables of a cast, in the order the tables write them after the contract columns. */
export const KNOWN_VARIABLES: readonly VariableInfo[] = [
  { key: 'temperature', column: 't', unit: 'degC', longName: 'In-situ temperature (ITS-90)', standardName: 'sea_water_temperature', decimals: 6,
    flagsFrom: ['temperature'], exchange: { name: 'CTDTMP', unit: 'ITS-90', decimals: 4 } },
  { key: 'SP', column: 'SP', unit: null, longName: 'Practical Salinity (PSS-78)', standardName: 'sea_water_practical_salinity', decimals: 6,
    flagsFrom: S, exchange: { name: 'CTDSAL', unit: 'PSS-78', decimals: 4 } },
  { key: 'conductivity', column: 'conductivity', unit: 'mS/cm', longName: 'Electrical conductivity',
    standardName: 'sea_water_electrical_conductivity', decimals: 6, flagsFrom: ['conductivity'] },
  { key: 'oxygen', column: 'oxygen', unit: 'umol/kg', longName: 'Dissolved oxygen',
    standardName: 'moles_of_oxygen_per_unit_mass_in_sea_water', decimals: 3, flagsFrom: ['oxygen'],
    exchange: { name: 'CTDOXY', unit: 'UMOL/KG', decimals: 1 } },
];

/** Derived variables a request may add by name (stored with every cast). */
export const DERIVED_VARIABLES: readonly VariableInfo[] = [
  { key: 'pt0', column: 'pt0', unit: 'degC', longName: 'Potential temperature referenced to 0 dbar',
    standardName: 'sea_water_potential_temperature', decimals: 6, flagsFrom: TS },
  { key: 'spiciness0', column: 'spiciness0', unit: 'kg/m3', longName: 'Spiciness referenced to 0 dbar', decimals: 6, flagsFrom: TS },
  ...[0, 1, 2, 3, 4].map((k): VariableInfo => ({ key: `sigma${k}`, column: `sigma${k}`, unit: 'kg/m3',
    longName: `Potential density anomaly referenced to ${k * 1000} dbar`, standardName: 'sea_water_sigma_theta', decimals: 6, flagsFrom: TS })),
  { key: 'rho', column: 'rho', unit: 'kg/m3', longName: 'In-situ density', standardName: 'sea_water_density', decimals: 6, flagsFrom: TS },
];

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
  return key.replace(/^x:/, '').replace(/[^A-Za-z0-9_]/g, '_').replace(/^(\d)/, '_$1').slice(0, 58) || 'extra';
}

/** The catalogue entry for a store key; unknown extras get 7 significant digits and their own flag. */
export function variableInfo(key: string, unit: string | null): VariableInfo {
  const known = [...KNOWN_VARIABLES, ...DERIVED_VARIABLES].find((v) => v.key === key);
  if (known) return known;
  const bare = key.replace(/^x:/, '');
  return { key, column: columnName(key), unit: unit || null, longName: bare, decimals: null, flagsFrom: key.startsWith('x:') ? [bare] : TS };
}
