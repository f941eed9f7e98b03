/**
 * Layer sets: the target isopycnal levels of a remap, one reference pressure per set
 * (docs/science.md §3.3). Written `start:step:end` (end included when it falls on a step) or as a
 * comma list; validated with zod where they enter from HTTP or a saved set.
 */
import { z } from 'zod';

/** Reference pressures of σ0 … σ4, dbar. */
export const REFERENCE_PRESSURES = [0, 1000, 2000, 3000, 4000] as const;
export type ReferencePressure = (typeof REFERENCE_PRESSURES)[number];

/** Most levels one set may hold (keeps a section request bounded). */
export const MAX_LEVELS = 2000;

export interface LayerSet {
  name: string;
  /** Reference pressure of the σ the levels are in, dbar. */
  ref: ReferencePressure;
  /** Strictly increasing σ levels, kg/m³. */
  levels: number[];
  /** The text the set was written as. */
  spec: string;
  /** Pressure range where the set is meant to be used, dbar (e.g. σ0 above 1000, σ2 below). */
  pMin?: number;
  pMax?: number;
}

const decimals = (s: string): number => {
  const m = /\.(\d+)/.exec(s.trim());
  return m ? m[1].length : 0;
};

const number = z.string().trim().regex(/^[+-]?(\d+(\.\d*)?|\.\d+)$/, 'not a number');

const rangeSpec = z
  .string()
  .trim()
  .regex(/^[^:]+:[^:]+:[^:]+$/)
  .transform((s, ctx) => {
    const [a, b, c] = s.split(':');
    const parts = [a, b, c].map((t) => number.safeParse(t));
    if (parts.some((r) => !r.success)) {
      ctx.addIssue({ code: 'custom', message: 'start:step:end must be three numbers' });
      return z.NEVER;
    }
    const start = Number(a);
    const step = Number(b);
    const end = Number(c);
    if (!(step > 0)) { ctx.addIssue({ code: 'custom', message: 'step must be positive' }); return z.NEVER; }
    if (!(end >= start)) { ctx.addIssue({ code: 'custom', message: 'end must not be below start' }); return z.NEVER; }
    const count = Math.floor((end - start) / step + 1e-9) + 1;
    if (count > MAX_LEVELS) { ctx.addIssue({ code: 'custom', message: `more than ${MAX_LEVELS} levels` }); return z.NEVER; }
    // Round to the digits written so 24.0:0.1:27.6 gives 24.3, not 24.300000000000004.
    const dp = Math.max(decimals(a), decimals(b));
    const levels: number[] = [];
    for (let i = 0; i < count; i++) levels.push(Number((start + i * step).toFixed(dp)));
    return levels;
  });

const listSpec = z
  .string()
  .trim()
  .transform((s, ctx) => {
    const items = s.split(',').map((t) => t.trim()).filter((t) => t.length > 0);
    if (items.length === 0) { ctx.addIssue({ code: 'custom', message: 'no levels' }); return z.NEVER; }
    if (items.length > MAX_LEVELS) { ctx.addIssue({ code: 'custom', message: `more than ${MAX_LEVELS} levels` }); return z.NEVER; }
    const levels: number[] = [];
    for (const t of items) {
      if (!number.safeParse(t).success) { ctx.addIssue({ code: 'custom', message: `"${t}" is not a number` }); return z.NEVER; }
      levels.push(Number(t));
    }
    return levels;
  });

/**
 * Schema of a level specification (`start:step:end` or comma list) → strictly increasing σ
 * levels within the plausible range of potential density anomalies (0–60 kg/m³).
 */
export const levelSpecSchema = z
  .string()
  .max(20000)
  .transform((s, ctx) => {
    const r = s.includes(':') ? rangeSpec.safeParse(s) : listSpec.safeParse(s);
    if (!r.success) {
      for (const issue of r.error.issues) ctx.addIssue({ code: 'custom', message: issue.message });
      return z.NEVER;
    }
    return r.data;
  })
  .superRefine((levels, ctx) => {
    for (let i = 0; i < levels.length; i++) {
      if (!(levels[i] >= 0 && levels[i] <= 60)) ctx.addIssue({ code: 'custom', message: `level ${levels[i]} outside 0–60 kg/m³` });
      if (i > 0 && !(levels[i] > levels[i - 1])) ctx.addIssue({ code: 'custom', message: 'levels must be strictly increasing' });
    }
  });

export const referencePressureSchema = z.coerce
  .number()
  .refine((v): v is ReferencePressure => (REFERENCE_PRESSURES as readonly number[]).includes(v), 'reference pressure must be 0, 1000, 2000, 3000 or 4000 dbar');

/** Schema of a layer set as it arrives from a form or the database. */
export const layerSetSchema = z
  .object({
    name: z.string().trim().min(1).max(100),
    ref: referencePressureSchema,
    spec: z.string().trim().min(1).max(20000),
    pMin: z.number().min(0).max(12000).optional(),
    pMax: z.number().min(0).max(12000).optional(),
  })
  .superRefine((v, ctx) => {
    const r = levelSpecSchema.safeParse(v.spec);
    if (!r.success) for (const issue of r.error.issues) ctx.addIssue({ code: 'custom', path: ['spec'], message: issue.message });
    if (v.pMin !== undefined && v.pMax !== undefined && !(v.pMax > v.pMin)) ctx.addIssue({ code: 'custom', path: ['pMax'], message: 'pMax must exceed pMin' });
  })
  .transform((v): LayerSet => ({ ...v, ref: v.ref as ReferencePressure, levels: levelSpecSchema.parse(v.spec) }));

/** Parse a level specification; throws a ZodError naming the problem. */
export function parseLevels(spec: string): Float64Array {
  return Float64Array.from(levelSpecSchema.parse(spec));
}

/** Parse a level specification without throwing. */
export function safeParseLevels(spec: string): { ok: true; levels: Float64Array } | { ok: false; errors: string[] } {
  const r = levelSpecSchema.safeParse(spec);
  return r.success ? { ok: true, levels: Float64Array.from(r.data) } : { ok: false, errors: r.error.issues.map((i) => i.message) };
}

/**
 * Default layer sets for a cruise: σ0 24.0–27.6 by 0.1 for the upper ocean (open-ocean surface
 * σ0 lies roughly between 20 and 27 kg/m³, common practice) used above 1000 dbar, and σ2
 * 36.0–37.2 by 0.05 for intermediate and deep water used below it, where σ0 loses resolution.
 */
export function defaultLayerSets(): LayerSet[] {
  return [
    layerSetSchema.parse({ name: 'σ0 upper ocean', ref: 0, spec: '24.0:0.1:27.6', pMax: 1000 }),
    layerSetSchema.parse({ name: 'σ2 deep water', ref: 2000, spec: '36.0:0.05:37.2', pMin: 1000 }),
  ];
}
