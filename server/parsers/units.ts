// Unit strings from column headers: what each means and how to bring it to the unit a cast stores.
// mathjs units do the arithmetic where they know the unit (pressure, length, conductivity,
// temperature); the trade's own labels (PSS-78, ITS-90, IPTS-68) are recognised here by their text.
import { unit } from 'mathjs';
import type { ColumnRole } from '../../shared/schemas/cast';

/** A linear conversion to the stored unit: stored = value * factor + offset, then / t68 when IPTS-68. */
export type UnitConversion = {
  unit: string; // the stored unit as it is reported in ParsedCast.units
  factor: number;
  offset: number;
  ipts68: boolean; // t90 = t68 / 1.00024 after the conversion to °C
  identity: boolean;
  note: string | null; // a processing note when anything was assumed or converted
  guessConductivity?: boolean; // no unit given: decide between S/m and mS/cm from the values
};
export type UnitResult =
  { ok: true; conv: UnitConversion } | { ok: false; code: 'unit_unknown' | 'unit_unconvertible'; message: string };

const IDENTITY = (u: string, note: string | null = null): UnitConversion => ({
  unit: u,
  factor: 1,
  offset: 0,
  ipts68: false,
  identity: true,
  note,
});

/** Factor and offset from a mathjs unit text to a target, or null if mathjs cannot relate them. */
function mathjsLinear(from: string, to: string): { factor: number; offset: number } | null {
  try {
    const zero = unit(0, from).toNumber(to);
    const one = unit(1, from).toNumber(to);
    if (!Number.isFinite(zero) || !Number.isFinite(one)) return null;
    return { factor: one - zero, offset: zero };
  } catch {
    return null;
  }
}

function clean(text: string): string {
  return udunits(text.trim().replace(/µ|μ/g, 'u').replace(/\s+/g, ' ').toLowerCase());
}

/** The UDUNITS spellings netCDF files use ("S m-1", "umol kg-1", "degree_Celsius") as "S/m" etc. */
export function udunits(t: string): string {
  const m = /^([a-z%]+)[ .]([a-z]+)(?:-1|\^-1)$/.exec(t);
  if (m) return `${m[1]}/${m[2]}`;
  return t;
}

function pressureUnit(t: string, col: string): UnitResult {
  if (t === '') return { ok: true, conv: IDENTITY('dbar', `${col}: no unit given; dbar assumed`) };
  const alias: Record<string, string> = {
    db: 'dbar',
    dbars: 'dbar',
    decibar: 'dbar',
    decibars: 'dbar',
    'd bar': 'dbar',
    kpa: 'kPa',
    mpa: 'MPa',
    hpa: 'hPa',
    pa: 'Pa',
    mbar: 'mbar',
    bar: 'bar',
    bars: 'bar',
    psi: 'psi',
  };
  const u = alias[t] ?? t;
  if (u === 'dbar') return { ok: true, conv: IDENTITY('dbar') };
  const lin = mathjsLinear(u, 'dbar');
  if (!lin) return unconvertible(col, t, 'a pressure unit (dbar, kPa, bar)');
  return {
    ok: true,
    conv: {
      unit: 'dbar',
      ...lin,
      ipts68: false,
      identity: false,
      note: `${col}: pressure converted from ${t} to dbar`,
    },
  };
}

function depthUnit(t: string, col: string): UnitResult {
  if (t === '') return { ok: true, conv: IDENTITY('m', `${col}: no unit given; metres assumed`) };
  const alias: Record<string, string> = { meter: 'm', meters: 'm', metre: 'm', metres: 'm', feet: 'ft', foot: 'ft' };
  const u = alias[t] ?? t;
  if (u === 'm') return { ok: true, conv: IDENTITY('m') };
  if (u === 'fathom' || u === 'fathoms' || u === 'fm') {
    return {
      ok: true,
      conv: {
        unit: 'm',
        factor: 1.8288,
        offset: 0,
        ipts68: false,
        identity: false,
        note: `${col}: depth converted from fathoms to m`,
      },
    };
  }
  const lin = mathjsLinear(u, 'm');
  if (!lin) return unconvertible(col, t, 'a length unit (m, ft)');
  return {
    ok: true,
    conv: { unit: 'm', ...lin, ipts68: false, identity: false, note: `${col}: depth converted from ${t} to m` },
  };
}

function temperatureUnit(t: string, col: string): UnitResult {
  // The scale is read from the text (ITS-90 / IPTS-68, T90 / T68); what is left is the unit proper.
  let scale: 'its90' | 'ipts68' | null = null;
  let rest = t;
  const scaleRe = /\b(ipts[- ]?68|t68|its[- ]?90|t90|68|90)\b/g;
  for (const m of t.matchAll(scaleRe)) {
    const s = m[1].includes('68') ? 'ipts68' : 'its90';
    if (scale && scale !== s)
      return {
        ok: false,
        code: 'unit_unknown',
        message: `column ${col}: the unit "${t}" names both ITS-90 and IPTS-68`,
      };
    scale = s;
  }
  rest = rest
    .replace(scaleRe, ' ')
    .replace(/[,;:()[\]]/g, ' ')
    .replace(/\s+/g, ' ')
    .trim();
  const alias: Record<string, string> = {
    '': 'degC',
    degc: 'degC',
    degree_celsius: 'degC',
    degrees_celsius: 'degC',
    degree_c: 'degC',
    degrees_c: 'degC',
    deg_c: 'degC',
    'deg c': 'degC',
    '°c': 'degC',
    '° c': 'degC',
    'º c': 'degC',
    ºc: 'degC',
    c: 'degC',
    celsius: 'degC',
    'deg celsius': 'degC',
    'degrees c': 'degC',
    'degrees celsius': 'degC',
    deg: 'degC',
    k: 'K',
    kelvin: 'K',
    degf: 'degF',
    '°f': 'degF',
    'deg f': 'degF',
    f: 'degF',
    fahrenheit: 'degF',
  };
  const u = alias[rest];
  if (!u) {
    // Not one of the usual labels: let mathjs try (it knows K, degC, degF, degR).
    const lin = mathjsLinear(rest, 'degC');
    if (!lin) return unconvertible(col, t, 'a temperature unit (°C ITS-90, °C IPTS-68, K)');
    return { ok: true, conv: tempConv(lin, scale, t, col) };
  }
  const lin = u === 'degC' ? { factor: 1, offset: 0 } : mathjsLinear(u, 'degC');
  if (!lin) return unconvertible(col, t, 'a temperature unit');
  return { ok: true, conv: tempConv(lin, scale, t, col) };
}

function tempConv(
  lin: { factor: number; offset: number },
  scale: 'its90' | 'ipts68' | null,
  t: string,
  col: string,
): UnitConversion {
  const notes: string[] = [];
  const identityUnit = lin.factor === 1 && lin.offset === 0;
  if (!identityUnit) notes.push(`${col}: temperature converted from "${t}" to °C`);
  if (scale === 'ipts68') notes.push(`${col}: temperature converted from IPTS-68 to ITS-90 (t90 = t68 / 1.00024)`);
  if (scale === null) notes.push(`${col}: temperature scale not stated; ITS-90 assumed`);
  return {
    unit: 'ITS-90 degC',
    factor: lin.factor,
    offset: lin.offset,
    ipts68: scale === 'ipts68',
    identity: identityUnit && scale !== 'ipts68',
    note: notes.length ? notes.join('; ') : null,
  };
}

function salinityUnit(t: string, col: string): UnitResult {
  const ok = new Set([
    '',
    'pss-78',
    'pss78',
    'pss 78',
    'pss',
    'psu',
    '1',
    'practical',
    'unitless',
    'none',
    'sp',
    'pss-78 psu',
    '1e-3',
    '0.001',
    'pss-78 (psu)',
  ]);
  if (ok.has(t))
    return {
      ok: true,
      conv: IDENTITY('PSS-78', t === '' ? `${col}: no unit given; Practical Salinity (PSS-78) assumed` : null),
    };
  if (t === 'g/kg' || t === 'g kg-1' || t === 'g kg^-1')
    return {
      ok: false,
      code: 'unit_unconvertible',
      message: `column ${col}: unit "${t}" is Absolute Salinity, which cannot be read as Practical Salinity (PSS-78) without knowing how it was made; upload Practical Salinity or conductivity`,
    };
  return unconvertible(col, t, 'Practical Salinity (PSS-78, PSU)');
}

function conductivityUnit(t: string, col: string): UnitResult {
  if (t === '') return { ok: true, conv: { ...IDENTITY('mS/cm'), guessConductivity: true } };
  const u = t.replace(/mmho/g, 'mS').replace(/umho/g, 'uS').replace(/mho/g, 'S').replace(/ /g, '');
  const fixed = u.replace(/^ms\//, 'mS/').replace(/^us\//, 'uS/').replace(/^s\//, 'S/');
  if (fixed === 'mS/cm') return { ok: true, conv: IDENTITY('mS/cm') };
  const lin = mathjsLinear(fixed, 'mS/cm');
  if (!lin || lin.offset !== 0) return unconvertible(col, t, 'a conductivity unit (mS/cm, S/m)');
  return {
    ok: true,
    conv: {
      unit: 'mS/cm',
      ...lin,
      ipts68: false,
      identity: false,
      note: `${col}: conductivity converted from ${t} to mS/cm`,
    },
  };
}

/** 1 ml of O2 = 44.661 µmol: the conversion the trade uses (common practice; the molar volume of O2
 * as a real gas at STP, 22.3916 l/mol, after Garcia & Gordon 1992, "Oxygen solubility in seawater:
 * better fitting equations"; from memory). */
export const UMOL_PER_ML_O2 = 44.661;
/** Molar mass of O2, g/mol (from memory: 2 × 15.9994). */
const O2_G_PER_MOL = 31.9988;

/**
 * Oxygen to one of the two stored forms: µmol/kg (stored as is) or µmol/l (turned into µmol/kg per
 * kilogram of sea water with the sample's potential density when the cast is processed; see
 * processCast). ml/l and mg/l are brought to µmol/l here.
 */
function oxygenUnit(t: string, col: string, unitText: string | null): UnitResult {
  const perKg = new Set(['umol/kg', 'micromol/kg', 'micromoles/kg', 'umol kg-1', 'umol/kg-1', 'umolkg-1', 'mmol/t']);
  const perL = new Set(['umol/l', 'um', 'micromol/l', 'micromoles/l', 'mmol/m3', 'mmol/m^3', 'mmol m-3', 'umol/dm3']);
  const mlL = new Set(['ml/l', 'mll-1', 'ml/ l', 'ml l-1']);
  const mgL = new Set(['mg/l', 'mg l-1', 'g/m3', 'g m-3']);
  const v = t.replace(/\s*\/\s*/g, '/');
  if (v === '') return { ok: true, conv: IDENTITY('µmol/kg', `${col}: no oxygen unit given; µmol/kg assumed`) };
  if (perKg.has(v)) return { ok: true, conv: IDENTITY('µmol/kg') };
  if (v === 'mol/kg')
    return {
      ok: true,
      conv: {
        ...IDENTITY('µmol/kg'),
        factor: 1e6,
        identity: false,
        note: `${col}: oxygen converted from mol/kg to µmol/kg`,
      },
    };
  if (perL.has(v)) return { ok: true, conv: IDENTITY('µmol/l') };
  if (v === 'mol/m3' || v === 'mmol/l')
    return {
      ok: true,
      conv: {
        ...IDENTITY('µmol/l'),
        factor: 1000,
        identity: false,
        note: `${col}: oxygen converted from ${t} to µmol/l`,
      },
    };
  if (mlL.has(v))
    return {
      ok: true,
      conv: {
        ...IDENTITY('µmol/l'),
        factor: UMOL_PER_ML_O2,
        identity: false,
        note: `${col}: oxygen converted from ml/l to µmol/l (${UMOL_PER_ML_O2} µmol/l per ml/l)`,
      },
    };
  if (mgL.has(v))
    return {
      ok: true,
      conv: {
        ...IDENTITY('µmol/l'),
        factor: 1000 / O2_G_PER_MOL,
        identity: false,
        note: `${col}: oxygen converted from mg/l to µmol/l (O2 ${O2_G_PER_MOL} g/mol)`,
      },
    };
  return {
    ok: true,
    conv: IDENTITY(
      (unitText ?? '').trim(),
      `${col}: oxygen unit "${t}" not recognised; values kept as given and not converted to µmol/kg`,
    ),
  };
}

function unconvertible(col: string, t: string, wanted: string): UnitResult {
  return {
    ok: false,
    code: 'unit_unconvertible',
    message: `column ${col}: unit "${t}" cannot be converted; expected ${wanted}`,
  };
}

/**
 * How to read a column of the given role whose header carried `unitText` (null when none).
 * `col` is the column's name as the file gives it, used in notes and errors.
 */
export function resolveUnit(role: ColumnRole | 'extra', unitText: string | null, col: string): UnitResult {
  const t = clean(unitText ?? '');
  const r = resolveClean(role, t, col, unitText);
  // Notes and messages quote the unit as the file wrote it, not its folded form.
  const orig = (unitText ?? '').trim();
  if (orig && t !== orig) {
    if (r.ok && r.conv.note)
      r.conv.note = r.conv.note.split(`"${t}"`).join(`"${orig}"`).split(` ${t} `).join(` ${orig} `);
    if (!r.ok) r.message = r.message.split(`"${t}"`).join(`"${orig}"`);
  }
  return r;
}

function resolveClean(role: ColumnRole | 'extra', t: string, col: string, unitText: string | null): UnitResult {
  switch (role) {
    case 'pressure':
      return pressureUnit(t, col);
    case 'depth':
      return depthUnit(t, col);
    case 'temperature':
      return temperatureUnit(t, col);
    case 'salinity':
      return salinityUnit(t, col);
    case 'conductivity':
      return conductivityUnit(t, col);
    case 'oxygen':
      return oxygenUnit(t, col, unitText);
    case 'extra':
      return { ok: true, conv: IDENTITY((unitText ?? '').trim()) };
  }
}

/** t90 from t68 (IPTS-68 to ITS-90), the relation in docs/science.md §1. */
export function t90_from_t68(t68: number): number {
  return t68 / 1.00024;
}
