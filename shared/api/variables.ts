// The catalogue of variables: for every column a cast, a section or a delivery can carry, how a screen
// labels it, the unit it is displayed and stored in, its CF unit and standard name, the seawater-core
// function that makes it (for derived ones), and the decimals it is written with. Server, client and
// deliveries read it here and nowhere else (docs/science.md §1).
//
// CF standard names are from the CF standard name table as we know it (from memory, checked by the
// delivery tests' read-back); where CF has no name, `standardName` is null.

export type VariableKind = 'coordinate' | 'measured' | 'derived';

export interface VariableInfo {
  name: string;
  label: string;
  /** unit as a screen shows it ('' for a unitless quantity) */
  unit: string;
  /** the unit string stored with the column */
  storedUnit: string | null;
  /** UDUNITS spelling for NetCDF-CF */
  cfUnit: string;
  standardName: string | null;
  kind: VariableKind;
  /** the seawater-core function (shared/seawater) that computes it */
  formula: string | null;
  /** decimals written in delivered tables: far below what sensors resolve, not the float's full repr */
  decimals: number;
  /** whether a section can draw it (N² lives on mid-points and cannot) */
  sectionable: boolean;
}

const v = (info: VariableInfo): VariableInfo => Object.freeze(info);

const sigma = (r: 0 | 1 | 2 | 3 | 4): VariableInfo =>
  v({
    name: `sigma${r}`,
    label: `σ${r} potential density anomaly`,
    unit: 'kg/m³',
    storedUnit: 'kg/m3',
    cfUnit: 'kg m-3',
    // CF's name for potential density anomaly is sea_water_sigma_theta with the reference pressure
    // given separately (`reference_pressure` attribute of the variable), from memory.
    standardName: 'sea_water_sigma_theta',
    kind: 'derived',
    formula: `sigma${r}`,
    decimals: 6,
    sectionable: true,
  });

export const VARIABLES: readonly VariableInfo[] = Object.freeze([
  v({
    name: 'pressure',
    label: 'Sea pressure',
    unit: 'dbar',
    storedUnit: 'dbar',
    cfUnit: 'dbar',
    standardName: 'sea_water_pressure_due_to_sea_water',
    kind: 'coordinate',
    formula: null,
    decimals: 3,
    sectionable: false,
  }),
  v({
    name: 'depth',
    label: 'Depth',
    unit: 'm',
    storedUnit: 'm',
    cfUnit: 'm',
    standardName: 'depth',
    kind: 'coordinate',
    formula: 'z_from_p',
    decimals: 3,
    sectionable: false,
  }),
  v({
    name: 'z',
    label: 'Height (negative below the surface)',
    unit: 'm',
    storedUnit: 'm',
    cfUnit: 'm',
    standardName: null,
    kind: 'derived',
    formula: 'z_from_p',
    decimals: 3,
    sectionable: false,
  }),
  v({
    name: 'temperature',
    label: 'In-situ temperature (ITS-90)',
    unit: '°C',
    storedUnit: 'degC (ITS-90)',
    cfUnit: 'degree_Celsius',
    standardName: 'sea_water_temperature',
    kind: 'measured',
    formula: null,
    decimals: 4,
    sectionable: true,
  }),
  v({
    name: 'SP',
    label: 'Practical Salinity',
    unit: '',
    storedUnit: '1 (PSS-78)',
    cfUnit: '1',
    standardName: 'sea_water_practical_salinity',
    kind: 'measured',
    formula: 'SP_from_C',
    decimals: 4,
    sectionable: true,
  }),
  v({
    name: 'conductivity',
    label: 'Conductivity',
    unit: 'mS/cm',
    storedUnit: 'mS/cm',
    cfUnit: 'mS cm-1',
    standardName: 'sea_water_electrical_conductivity',
    kind: 'measured',
    formula: null,
    decimals: 5,
    sectionable: true,
  }),
  v({
    name: 'oxygen',
    label: 'Dissolved oxygen',
    unit: 'µmol/kg',
    storedUnit: 'umol/kg',
    cfUnit: 'umol kg-1',
    standardName: 'moles_of_oxygen_per_unit_mass_in_sea_water',
    kind: 'measured',
    formula: null,
    decimals: 2,
    sectionable: true,
  }),
  v({
    name: 'SR',
    label: 'Reference Salinity',
    unit: 'g/kg',
    storedUnit: 'g/kg',
    cfUnit: 'g kg-1',
    standardName: 'sea_water_reference_salinity',
    kind: 'derived',
    formula: 'SR_from_SP',
    decimals: 6,
    sectionable: true,
  }),
  v({
    name: 'SA',
    label: 'Absolute Salinity',
    unit: 'g/kg',
    storedUnit: 'g/kg',
    cfUnit: 'g kg-1',
    standardName: 'sea_water_absolute_salinity',
    kind: 'derived',
    formula: 'SA_from_SP',
    decimals: 6,
    sectionable: true,
  }),
  v({
    name: 'CT',
    label: 'Conservative Temperature',
    unit: '°C',
    storedUnit: 'degC',
    cfUnit: 'degree_Celsius',
    standardName: 'sea_water_conservative_temperature',
    kind: 'derived',
    formula: 'CT_from_t',
    decimals: 6,
    sectionable: true,
  }),
  v({
    name: 'pt0',
    label: 'Potential temperature θ',
    unit: '°C',
    storedUnit: 'degC',
    cfUnit: 'degree_Celsius',
    standardName: 'sea_water_potential_temperature',
    kind: 'derived',
    formula: 'pt0_from_t',
    decimals: 6,
    sectionable: true,
  }),
  v({
    name: 'rho',
    label: 'In-situ density',
    unit: 'kg/m³',
    storedUnit: 'kg/m3',
    cfUnit: 'kg m-3',
    standardName: 'sea_water_density',
    kind: 'derived',
    formula: 'rho',
    decimals: 6,
    sectionable: true,
  }),
  sigma(0),
  sigma(1),
  sigma(2),
  sigma(3),
  sigma(4),
  v({
    name: 'spiciness0',
    label: 'Spiciness (0 dbar)',
    unit: 'kg/m³',
    storedUnit: 'kg/m3',
    cfUnit: 'kg m-3',
    standardName: null,
    kind: 'derived',
    formula: 'spiciness0',
    decimals: 6,
    sectionable: true,
  }),
  v({
    name: 'N2',
    label: 'Buoyancy frequency squared N²',
    unit: 's⁻²',
    storedUnit: '1/s2',
    cfUnit: 's-2',
    standardName: 'square_of_brunt_vaisala_frequency_in_sea_water',
    kind: 'derived',
    formula: 'Nsquared',
    decimals: 10,
    sectionable: false,
  }),
  v({
    name: 'p_mid',
    label: 'Mid-point pressure of N²',
    unit: 'dbar',
    storedUnit: 'dbar',
    cfUnit: 'dbar',
    standardName: null,
    kind: 'derived',
    formula: 'Nsquared',
    decimals: 3,
    sectionable: false,
  }),
]);

const BY_NAME = new Map(VARIABLES.map((x) => [x.name, x]));

/** The catalogue entry of a variable, or undefined for an extra or derived variable of the analyst's. */
export function variableInfo(name: string): VariableInfo | undefined {
  return BY_NAME.get(name);
}

/** The variables a section can draw, in the order the property menu lists them. */
export const SECTION_VARIABLES: readonly VariableInfo[] = Object.freeze(
  [
    'CT',
    'SA',
    'SP',
    'temperature',
    'pt0',
    'sigma0',
    'sigma1',
    'sigma2',
    'sigma3',
    'sigma4',
    'spiciness0',
    'oxygen',
  ].map((n) => BY_NAME.get(n)!),
);

/** Stored unit string of each catalogued column (the spelling kept in cast columns). */
export const STORED_UNITS: Readonly<Record<string, string>> = Object.freeze(
  Object.fromEntries(VARIABLES.filter((x) => x.storedUnit !== null).map((x) => [x.name, x.storedUnit as string])),
);

/** Display unit of each catalogued column. */
export const DISPLAY_UNITS: Readonly<Record<string, string>> = Object.freeze(
  Object.fromEntries(VARIABLES.map((x) => [x.name, x.unit])),
);

/**
 * How a screen labels a property: the catalogue's label and unit, an analyst's derived variable with its
 * own unit, or an extra variable of the files (`x:<name>`) with the unit it came with.
 */
export function propertyLabel(
  name: string,
  others: readonly { name: string; unit: string | null }[] = [],
): { label: string; unit: string } {
  const known = BY_NAME.get(name);
  if (known) return { label: known.label, unit: known.unit };
  const d = others.find((o) => o.name === name);
  const shown = name.startsWith('x:') ? name.slice(2) : name;
  return { label: d && !name.startsWith('x:') ? `${shown} (derived)` : shown, unit: d?.unit ?? '' };
}
