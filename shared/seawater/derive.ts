/**
 * Every derived column of one cast, from what a CTD records (practical salinity or conductivity,
 * in-situ temperature, pressure) and the cast's position, with notes that say where and why a
 * value is missing. Each column is computed by the named TEOS-10 function of the seawater core
 * (see their files for the papers); nothing is computed here that is not in one of them.
 */
import { z } from 'zod';
import { pt0_CT_from_t } from './conversions';
import { SP_from_C } from './pss78';
import { SA_from_SP_cast } from './saar';
import { checkRange, P_RANGE, SP_RANGE, T_RANGE } from './ranges';
import { rho_batch, sigma_batch, SIGMA_REFERENCE_PRESSURES } from './density';
import { depth_from_p_batch } from './depth';
import { Nsquared } from './stability';
import { spiciness0_batch } from './spiciness';
import { mixed_layer_depth, type MldResult } from './mld';

const column = z.union([z.instanceof(Float64Array), z.array(z.number().or(z.nan()))]);

/** What deriveCast accepts: SP or C (not both needed), t (ITS-90 °C), p (dbar), position. */
export const CastInputSchema = z
  .object({
    SP: column.optional(),
    /** Conductivity; unit chosen by conductivityUnit (default mS/cm). */
    C: column.optional(),
    conductivityUnit: z.enum(['mS/cm', 'S/m']).default('mS/cm'),
    t: column,
    p: column,
    lon: z.number().min(-360).max(720),
    lat: z.number().min(-90).max(90),
    /** Mixed-layer threshold Δσ0, kg/m³ (de Boyer Montégut et al. 2004 use 0.03). */
    mldThreshold: z.number().positive().default(0.03),
  })
  .refine((v) => v.SP !== undefined || v.C !== undefined, { message: 'give SP or C' })
  .refine((v) => v.t.length === v.p.length && (v.SP ?? v.C ?? v.t).length === v.p.length, {
    message: 'columns differ in length',
  });

export type CastInput = z.input<typeof CastInputSchema>;

export interface CastNote {
  /** 'sr_fallback' | 'out_of_range' | 'pressure_order' | 'mld' */
  kind: 'sr_fallback' | 'out_of_range' | 'pressure_order' | 'mld';
  message: string;
  /** Level indices the note covers (first and last; count of levels). */
  first?: number;
  last?: number;
  count?: number;
}

export interface DerivedCast {
  p: Float64Array;
  depth: Float64Array;
  SP: Float64Array;
  SA: Float64Array;
  CT: Float64Array;
  pt0: Float64Array;
  sigma0: Float64Array;
  sigma1: Float64Array;
  sigma2: Float64Array;
  sigma3: Float64Array;
  sigma4: Float64Array;
  rho: Float64Array;
  spiciness0: Float64Array;
  /** Buoyancy frequency squared between adjacent levels, s⁻² (length n − 1). */
  N2: Float64Array;
  p_mid: Float64Array;
  mld: MldResult;
  notes: CastNote[];
}

/** Group consecutive flagged levels by message so a cast gives a few notes, not one per level. */
function collectNotes(kind: CastNote['kind'], reasons: (string | null)[]): CastNote[] {
  const byMessage = new Map<string, CastNote>();
  reasons.forEach((r, i) => {
    if (r === null) return;
    const key = r.replace(/= [-\d.e+]+/, '= …');
    const note = byMessage.get(key);
    if (note) {
      note.last = i;
      note.count = (note.count ?? 0) + 1;
    } else byMessage.set(key, { kind, message: r, first: i, last: i, count: 1 });
  });
  return [...byMessage.values()];
}

/**
 * Derive every TEOS-10 column of a cast. Levels whose inputs are out of range come back NaN and
 * are listed in the notes with the reason; where the Absolute Salinity atlas has no value the
 * Reference Salinity is used (SA = SR) and the notes say so.
 * Reference: the TEOS-10 functions it calls (IOC, SCOR & IAPSO 2010); see docs/science.md.
 * @param input the measured columns of one cast and its position (CastInput: p dbar, t °C, SP or C mS/cm, lon, lat degrees)
 * @returns the derived columns (SA g/kg, CT °C, σ kg/m³, N² 1/s², …) and notes on missing values
 */
export function deriveCast(input: CastInput): DerivedCast {
  const cast = CastInputSchema.parse(input);
  const n = cast.p.length;
  const p = Float64Array.from(cast.p);
  const t = Float64Array.from(cast.t);
  const { lon, lat } = cast;
  const notes: CastNote[] = [];

  const SP = new Float64Array(n);
  if (cast.SP !== undefined) SP.set(cast.SP);
  else {
    const C = cast.C as ArrayLike<number>;
    const factor = cast.conductivityUnit === 'S/m' ? 10 : 1; // 1 S/m = 10 mS/cm
    for (let i = 0; i < n; i++) SP[i] = SP_from_C(C[i] * factor, t[i], p[i]);
  }

  const SA = new Float64Array(n),
    CT = new Float64Array(n),
    pt0 = new Float64Array(n);
  const depth = new Float64Array(n);
  const reasons: (string | null)[] = new Array(n).fill(null);
  const fallback: (string | null)[] = new Array(n).fill(null);
  // Column by column with the batch kernels (nothing allocated per level); the words for a level
  // that cannot be used are only written where one is out of range.
  const silent = new Uint8Array(n);
  SA_from_SP_cast(SP, p, lon, lat, SA, silent);
  const pair = new Float64Array(2);
  for (let i = 0; i < n; i++) {
    pt0_CT_from_t(SA[i], t[i], p[i], pair);
    pt0[i] = pair[0];
    CT[i] = pair[1];
    if (silent[i] && SA[i] === SA[i])
      fallback[i] = 'no Absolute Salinity Anomaly Ratio atlas value here: SA = SR (Reference Salinity) used';
    if (!(
      SP[i] >= SP_RANGE[0] &&
      SP[i] <= SP_RANGE[1] &&
      t[i] >= T_RANGE[0] &&
      t[i] <= T_RANGE[1] &&
      p[i] >= P_RANGE[0] &&
      p[i] <= P_RANGE[1]
    )) {
      reasons[i] = checkRange({ SP: SP[i], t: t[i], p: p[i] });
    }
    if (reasons[i] === null && CT[i] !== CT[i])
      reasons[i] = checkRange({ SA: SA[i], t: t[i], p: p[i] }) ?? 'Conservative Temperature could not be computed';
  }
  const sig = SIGMA_REFERENCE_PRESSURES.map((pr) => sigma_batch(SA, CT, pr));
  const rhoCol = rho_batch(SA, CT, p);
  const spic = spiciness0_batch(SA, CT);
  depth_from_p_batch(p, lat, depth);
  notes.push(...collectNotes('sr_fallback', fallback), ...collectNotes('out_of_range', reasons));

  // N² needs pressure increasing; a cast with reversals is reported, not silently reordered.
  let increasing = true;
  for (let i = 1; i < n; i++)
    if (!(p[i] > p[i - 1])) {
      increasing = false;
      break;
    }
  if (!increasing)
    notes.push({
      kind: 'pressure_order',
      message: 'pressure does not increase at every level: N² is NaN where it does not',
    });
  const { N2, p_mid } = Nsquared(SA, CT, p, lat);
  for (let i = 0; i < N2.length; i++) if (!(p[i + 1] > p[i])) N2[i] = NaN;

  const mld = mixed_layer_depth(sig[0], p, { threshold: cast.mldThreshold });
  if (mld.status !== 'ok') notes.push({ kind: 'mld', message: mld.reason });

  return {
    p,
    depth,
    SP,
    SA,
    CT,
    pt0,
    sigma0: sig[0],
    sigma1: sig[1],
    sigma2: sig[2],
    sigma3: sig[3],
    sigma4: sig[4],
    rho: rhoCol,
    spiciness0: spic,
    N2,
    p_mid,
    mld,
    notes,
  };
}
