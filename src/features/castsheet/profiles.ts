import { sigma_pr } from '../../../shared/seawater/density';
import { detectInversions } from '../../../shared/remap/inversions';
import type { CastDetail, CastInversion, FlagEdit, FlagVariable } from './types';

/** Reference pressures offered for σ, dbar (TEOS-10's σ0 … σ4). */
export { REFERENCE_PRESSURES, type ReferencePressure } from '../../../shared/api/levels';

/** Smallest σ deficit counted as an inversion, kg/m³ (docs/science.md §3.1; the intake uses the same). */
export const INVERSION_THRESHOLD = 0.01;

const toNaN = (v: number | null | undefined) => (v == null ? NaN : v);

/**
 * σ at the reference pressure for every level, from SA and CT with the seawater core
 * (TEOS-10 75-term polynomial, Roquet et al. 2015). Levels without SA or CT, or outside the
 * polynomial's range, are null.
 */
export function sigmaProfile(SA: readonly (number | null)[] | undefined, CT: readonly (number | null)[] | undefined, ref: number): (number | null)[] {
  if (!SA || !CT) return [];
  return SA.map((sa, i) => {
    const ct = CT[i];
    if (sa == null || ct == null) return null;
    const s = sigma_pr(sa, ct, ref);
    return Number.isFinite(s) ? s : null;
  });
}

export interface InversionSet {
  inversions: CastInversion[];
  /** Which choice made the list, said on screen. */
  source: string;
}

/**
 * The cast's inversions in σ at the chosen reference: σ0 ones are those the intake stored; at
 * another reference they are found here with the same scan (shared/remap/inversions) on σ computed
 * from SA and CT, so the list always matches the σ drawn.
 */
export function inversionsAt(cast: CastDetail, ref: number, sigma: readonly (number | null)[]): InversionSet {
  if (ref === 0) {
    return { inversions: cast.inversions, source: `σ₀, as found at intake (deficit over ${INVERSION_THRESHOLD} kg/m³)` };
  }
  const p = Float64Array.from(cast.columns.pressure, toNaN);
  const s = Float64Array.from(sigma, toNaN);
  const N2 = cast.columns.N2 ? Float64Array.from(cast.columns.N2, toNaN) : undefined;
  const p_mid = cast.columns.p_mid ? Float64Array.from(cast.columns.p_mid, toNaN) : undefined;
  const z = cast.columns.z ? Float64Array.from(cast.columns.z, toNaN) : undefined;
  const found = detectInversions(p, s, { threshold: INVERSION_THRESHOLD, N2, p_mid, z });
  return {
    inversions: found.map((inv) => ({ ...inv })),
    source: `σ at ${ref} dbar, found in this browser from SA and CT (deficit over ${INVERSION_THRESHOLD} kg/m³)`,
  };
}

/** Flag columns that bear on each plotted variable. */
const FLAG_SOURCES: Record<'CT' | 'SA' | 'sigma', string[]> = {
  CT: ['temperature'],
  SA: ['salinity', 'conductivity'],
  sigma: ['temperature', 'salinity', 'conductivity'],
};

/** Indices of levels flagged questionable (3) and bad (4) in the flags that bear on a variable. */
export function flaggedLevels(flags: CastDetail['flags'], variable: 'CT' | 'SA' | 'sigma'): { questionable: number[]; bad: number[] } {
  const worst = new Map<number, number>();
  for (const name of FLAG_SOURCES[variable]) {
    const f = flags[name];
    if (!f) continue;
    f.forEach((v, i) => {
      if (v === 3 || v === 4) worst.set(i, Math.max(worst.get(i) ?? 0, v));
    });
  }
  const questionable: number[] = [];
  const bad: number[] = [];
  for (const [i, v] of [...worst.entries()].sort((a, b) => a[0] - b[0])) (v === 4 ? bad : questionable).push(i);
  return { questionable, bad };
}

/** The 1–9 flag scale for water-column data as the community uses it; Sigmaline offers these five. */
export const FLAG_CHOICES = [
  { value: 2, label: '2 · good' },
  { value: 3, label: '3 · questionable' },
  { value: 4, label: '4 · bad' },
  { value: 9, label: '9 · missing' },
  { value: 1, label: '1 · not assessed' },
] as const;

export const FLAG_VARIABLE_LABELS: Record<FlagVariable, string> = {
  temperature: 'Temperature',
  salinity: 'Salinity',
  conductivity: 'Conductivity',
  oxygen: 'Oxygen',
  all: 'All sensors',
};

export interface FlagFormValues {
  variable: FlagVariable | '';
  pFrom: string;
  pTo: string;
  flag: string;
  reason: string;
}

export type FlagFormResult = { ok: true; edit: FlagEdit; levels: number } | { ok: false; errors: Partial<Record<keyof FlagFormValues, string>>; levels: number };

/** Levels of the cast whose pressure lies in [pFrom, pTo]. */
export function levelsInRange(pressure: readonly (number | null)[], pFrom: number, pTo: number): number {
  let n = 0;
  for (const p of pressure) if (p != null && p >= pFrom && p <= pTo) n++;
  return n;
}

const NUMBER = /^[+-]?(\d+(\.\d*)?|\.\d+)$/;

/**
 * Check the flag form before anything is sent: a variable, a pressure range that is two numbers
 * in order and holds at least one level of this cast, one of the offered flags, and a reason when a
 * level is downgraded (3, 4, 9) — the audit trail should say why.
 */
export function validateFlagForm(values: FlagFormValues, pressure: readonly (number | null)[]): FlagFormResult {
  const errors: Partial<Record<keyof FlagFormValues, string>> = {};
  if (!values.variable) errors.variable = 'Choose the variable to flag.';
  const from = values.pFrom.trim();
  const to = values.pTo.trim();
  const pFrom = Number(from);
  const pTo = Number(to);
  if (from === '') errors.pFrom = 'Enter the top of the range, dbar.';
  else if (!NUMBER.test(from)) errors.pFrom = 'The top of the range is a number of dbar.';
  if (to === '') errors.pTo = 'Enter the bottom of the range, dbar.';
  else if (!NUMBER.test(to)) errors.pTo = 'The bottom of the range is a number of dbar.';
  let levels = 0;
  if (!errors.pFrom && !errors.pTo) {
    if (pTo < pFrom) errors.pTo = 'The bottom of the range is deeper than (or equal to) its top.';
    else {
      levels = levelsInRange(pressure, pFrom, pTo);
      if (levels === 0) errors.pTo = `No level of this cast lies between ${pFrom} and ${pTo} dbar.`;
    }
  }
  const flag = Number(values.flag);
  if (!FLAG_CHOICES.some((c) => c.value === flag)) errors.flag = 'Choose a flag.';
  const reason = values.reason.trim();
  if ((flag === 3 || flag === 4 || flag === 9) && reason === '') errors.reason = 'Say why these levels are downgraded; it goes in the audit trail.';
  if (reason.length > 500) errors.reason = 'At most 500 characters.';
  if (Object.keys(errors).length > 0) return { ok: false, errors, levels };
  return {
    ok: true,
    levels,
    edit: { variable: values.variable as FlagVariable, pFrom, pTo, flag: flag as FlagEdit['flag'], ...(reason ? { reason } : {}) },
  };
}
