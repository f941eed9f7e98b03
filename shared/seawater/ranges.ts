// Where the seawater functions give numbers, and why they give NaN elsewhere.
//
// TEOS-10's Gibbs function is fitted for 0–42 g/kg at all pressures to 10 000 dbar, up to
// 120 g/kg at the surface, from the freezing point to 40 °C (IAPWS R13-08, §4 "Range of
// validity"; IOC et al. 2010, §2.2). PSS-78 is defined for 2 ≤ SP ≤ 42 (UNESCO 1983), and
// Hill, Dauphinee & Woods (1986) extend it down to fresh water. Sigmaline's box is a little
// wider than the standard one on Absolute Salinity, so that every PSS-78 salinity (SP = 42 gives
// SA ≈ 42.2 g/kg) still gets values, and it allows a few decibars of negative sea pressure,
// which CTD pressure offsets produce at the surface. Outside the box a function returns NaN and
// `checkRange` says why, so a caller can show the reason instead of a silent number.

/** Absolute (or Reference) Salinity, g/kg. */
export const SA_RANGE = [0, 50] as const;
/** In-situ, potential or Conservative Temperature, °C: below −6 °C no seawater is liquid at
 * ocean pressures; TEOS-10's oceanographic range ends at 40 °C. */
export const T_RANGE = [-6, 40] as const;
/** Sea pressure, dbar (IAPWS-08 is valid to 100 MPa, i.e. about 10 000 dbar of sea pressure). */
export const P_RANGE = [-5, 10000] as const;
/** Practical Salinity: PSS-78 for 2–42, the Hill et al. (1986) extension below 2. */
export const SP_RANGE = [0, 42] as const;
/** Conductivity, mS/cm (SP = 42 at 40 °C is about 90 mS/cm). */
export const C_RANGE = [0, 100] as const;
/** Latitude, °N, and longitude, °E (any turn of the circle). */
export const LAT_RANGE = [-90, 90] as const;
export const LON_RANGE = [-360, 720] as const;

/**
 * True when (SA, temperature, p) lies inside the box (any NaN gives false).
 * Reference: IAPWS R13-08 (2008), §4; IOC, SCOR & IAPSO (2010), §2.2; UNESCO (1983).
 * @param SA Absolute Salinity, g/kg
 * @param T temperature (in-situ or Conservative), °C
 * @param p sea pressure (absolute pressure minus 10.1325 dbar), dbar
 * @returns whether the inputs lie inside the seawater core’s range of validity
 */
export function inRange(SA: number, T: number, p: number): boolean {
  return (
    SA >= SA_RANGE[0] && SA <= SA_RANGE[1] && T >= T_RANGE[0] && T <= T_RANGE[1] && p >= P_RANGE[0] && p <= P_RANGE[1]
  );
}

/** The inputs a seawater function may take, by their TEOS-10 names. */
export interface SeawaterInputs {
  SP?: number;
  SA?: number;
  C?: number;
  t?: number;
  pt?: number;
  CT?: number;
  p?: number;
  p_ref?: number;
  lon?: number;
  lat?: number;
}

const LIMITS: Record<keyof SeawaterInputs, { unit: string; range: readonly [number, number] }> = {
  SP: { unit: '', range: SP_RANGE },
  SA: { unit: 'g/kg', range: SA_RANGE },
  C: { unit: 'mS/cm', range: C_RANGE },
  t: { unit: '°C', range: T_RANGE },
  pt: { unit: '°C', range: T_RANGE },
  CT: { unit: '°C', range: T_RANGE },
  p: { unit: 'dbar', range: P_RANGE },
  p_ref: { unit: 'dbar', range: P_RANGE },
  lon: { unit: '°E', range: LON_RANGE },
  lat: { unit: '°N', range: LAT_RANGE },
};

/**
 * Why a function given these inputs returns NaN, in words a hydrographer can read, or null when
 * every input is usable. Only the inputs passed are checked, e.g. `checkRange({ SA, t, p })`.
 * Reference: IAPWS R13-08 (2008), §4; IOC, SCOR & IAPSO (2010), §2.2; UNESCO (1983).
 * @param inputs named scalar inputs (SA g/kg, SP unitless, t and CT °C, p dbar); absent ones are not checked
 * @returns the reason the first input out of range gives NaN, or null when all are in range
 */
export function checkRange(inputs: SeawaterInputs): string | null {
  for (const name of Object.keys(inputs) as (keyof SeawaterInputs)[]) {
    const value = inputs[name];
    if (value === undefined) continue;
    const { unit, range } = LIMITS[name];
    if (Number.isNaN(value)) return `${name} is missing`;
    if (!Number.isFinite(value)) return `${name} is not a finite number`;
    if (value < range[0] || value > range[1]) {
      const u = unit ? ` ${unit}` : '';
      return `${name} = ${value}${u} is outside ${range[0]} to ${range[1]}${u}, where Sigmaline evaluates TEOS-10`;
    }
  }
  return null;
}

/** One reason with the levels it applies to (indices into the cast's columns). */
export interface RangeNote {
  /** The reason for the first level it applies to. */
  reason: string;
  /** Which input failed. */
  input: keyof SeawaterInputs;
  count: number;
  first: number;
  last: number;
}

/**
 * Scan a cast's columns and group its unusable levels by the input that failed, for the cast's
 * notes: a cast gives a few lines, not one per level.
 * Reference: IAPWS R13-08 (2008), §4; IOC, SCOR & IAPSO (2010), §2.2; UNESCO (1983).
 * @param columns named input columns in the same units as `inputs` of checkRange
 * @returns one note per input column that leaves the range: where and how often
 */
export function rangeNotes(columns: { [K in keyof SeawaterInputs]?: ArrayLike<number> }): RangeNote[] {
  const names = Object.keys(columns) as (keyof SeawaterInputs)[];
  const n = names.length ? (columns[names[0]] as ArrayLike<number>).length : 0;
  const notes = new Map<keyof SeawaterInputs, RangeNote>();
  const point: SeawaterInputs = {};
  for (let i = 0; i < n; i++) {
    for (const name of names) point[name] = (columns[name] as ArrayLike<number>)[i];
    const reason = checkRange(point);
    if (reason === null) continue;
    const input = reason.split(' ')[0] as keyof SeawaterInputs;
    const note = notes.get(input);
    if (note) {
      note.count++;
      note.last = i;
    } else {
      notes.set(input, { reason, input, count: 1, first: i, last: i });
    }
  }
  return [...notes.values()];
}
