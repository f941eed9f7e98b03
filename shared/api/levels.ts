/**
 * The one levels policy: target isopycnal levels (σ at one reference pressure, kg/m³) as the
 * section, the exports, geostrophy, the deliveries and the client read them.
 *
 * - Parsing: `start:step:end` (end included when it falls on a step) or a comma list.
 * - Validation: at most {@link MAX_LEVELS} levels, at most {@link MAX_LEVEL_DECIMALS} decimals,
 *   strictly increasing, within 0–60 kg/m³.
 * - Defaults: {@link defaultLevels} — about {@link DEFAULT_LEVEL_COUNT} levels on a round step over
 *   the σ range the cruise's good values (flags 1 and 2) span at the reference pressure; with no
 *   casts, {@link FALLBACK_LEVELS}. Geostrophy's default layer boundaries are a thinned subset of the
 *   same levels ({@link defaultLayerBoundaries}), so every layer boundary is a level of the section.
 *
 * Nothing here imports from server/ or src/.
 */
import { z } from 'zod';
import { REFERENCE_PRESSURES, referencePressureSchema, type ReferencePressure } from './enums';

export { REFERENCE_PRESSURES, referencePressureSchema, type ReferencePressure };

/** Most levels one set may hold (keeps a section request bounded). */
export const MAX_LEVELS = 2000;
/** Most decimals a level or step may be written with (0.0001 kg/m³ is far below what a CTD resolves). */
export const MAX_LEVEL_DECIMALS = 4;
/** Levels a default set aims at over the cruise's σ range. */
export const DEFAULT_LEVEL_COUNT = 100;
/** Layers geostrophy's default boundaries aim at. */
export const DEFAULT_LAYER_COUNT = 8;
/** Round steps a default set may use, kg/m³. */
export const DEFAULT_STEPS = [0.005, 0.01, 0.02, 0.025, 0.05, 0.1, 0.2, 0.25, 0.5, 1] as const;

/**
 * Levels when a cruise has no casts to take a range from: σ0 of the open ocean spans roughly
 * 23–28 kg/m³ (common practice); the deeper references shifted by about 4.6 kg/m³ per 1000 dbar
 * (from memory), on a 0.05 step.
 */
export const FALLBACK_LEVELS: Readonly<Record<ReferencePressure, string>> = {
  0: '23.00:0.05:27.90',
  1000: '27.50:0.05:32.50',
  2000: '32.00:0.05:37.20',
  3000: '37.00:0.05:41.60',
  4000: '41.00:0.05:46.00',
};

/** The policy in words, for provenance and the screens. */
export const DEFAULT_LEVELS_RULE =
  `about ${DEFAULT_LEVEL_COUNT} levels on a round step (${DEFAULT_STEPS.join(', ')} kg/m³) over the σ range ` +
  "the cruise's good values (flags 1 and 2) span at the reference pressure";

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

const number = z
  .string()
  .trim()
  .regex(/^[+-]?(\d{1,6}(\.\d*)?|\.\d+)$/, 'not a number')
  .refine((t) => decimals(t) <= MAX_LEVEL_DECIMALS, `at most ${MAX_LEVEL_DECIMALS} decimals`);

const rangeSpec = z
  .string()
  .trim()
  .regex(/^[^:]+:[^:]+:[^:]+$/, 'start:step:end must be three numbers')
  .transform((s, ctx) => {
    const [a, b, c] = s.split(':');
    const parts = [a, b, c].map((t) => number.safeParse(t));
    const bad = parts.find((r) => !r.success);
    if (bad && !bad.success) {
      const msg = bad.error.issues[0]?.message ?? 'not a number';
      ctx.addIssue({ code: 'custom', message: msg === 'not a number' ? 'start:step:end must be three numbers' : msg });
      return z.NEVER;
    }
    const start = Number(a);
    const step = Number(b);
    const end = Number(c);
    if (!(step > 0)) {
      ctx.addIssue({ code: 'custom', message: 'step must be positive' });
      return z.NEVER;
    }
    if (!(end >= start)) {
      ctx.addIssue({ code: 'custom', message: 'end must not be below start' });
      return z.NEVER;
    }
    const count = Math.floor((end - start) / step + 1e-9) + 1;
    if (count > MAX_LEVELS) {
      ctx.addIssue({ code: 'custom', message: `more than ${MAX_LEVELS} levels` });
      return z.NEVER;
    }
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
    const items = s
      .split(',')
      .map((t) => t.trim())
      .filter((t) => t.length > 0);
    if (items.length === 0) {
      ctx.addIssue({ code: 'custom', message: 'no levels' });
      return z.NEVER;
    }
    if (items.length > MAX_LEVELS) {
      ctx.addIssue({ code: 'custom', message: `more than ${MAX_LEVELS} levels` });
      return z.NEVER;
    }
    const levels: number[] = [];
    for (const t of items) {
      const r = number.safeParse(t);
      if (!r.success) {
        const msg = r.error.issues[0]?.message ?? 'not a number';
        ctx.addIssue({ code: 'custom', message: msg === 'not a number' ? `"${t}" is not a number` : `"${t}": ${msg}` });
        return z.NEVER;
      }
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
      if (!(levels[i] >= 0 && levels[i] <= 60))
        ctx.addIssue({ code: 'custom', message: `level ${levels[i]} outside 0–60 kg/m³` });
      if (i > 0 && !(levels[i] > levels[i - 1]))
        ctx.addIssue({ code: 'custom', message: 'levels must be strictly increasing' });
    }
  });

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
    if (!r.success)
      for (const issue of r.error.issues) ctx.addIssue({ code: 'custom', path: ['spec'], message: issue.message });
    if (v.pMin !== undefined && v.pMax !== undefined && !(v.pMax > v.pMin)) {
      ctx.addIssue({ code: 'custom', path: ['pMax'], message: 'pMax must exceed pMin' });
    }
  })
  .transform((v): LayerSet => ({ ...v, ref: v.ref as ReferencePressure, levels: levelSpecSchema.parse(v.spec) }));

/** Parse a level specification; throws a ZodError naming the problem. */
export function parseLevels(spec: string): Float64Array {
  return Float64Array.from(levelSpecSchema.parse(spec));
}

/** Parse a level specification without throwing. */
export function safeParseLevels(spec: string): { ok: true; levels: Float64Array } | { ok: false; errors: string[] } {
  const r = levelSpecSchema.safeParse(spec);
  return r.success
    ? { ok: true, levels: Float64Array.from(r.data) }
    : { ok: false, errors: r.error.issues.map((i) => i.message) };
}

const isRef = (v: number): v is ReferencePressure => (REFERENCE_PRESSURES as readonly number[]).includes(v);

/**
 * The default levels at a reference pressure, as a `start:step:end` text.
 * @param ref reference pressure, dbar (one of {@link REFERENCE_PRESSURES})
 * @param range [min, max] σ at `ref` of the cruise's good values, kg/m³; null or empty when there are none
 * @param count levels to aim at (the policy's {@link DEFAULT_LEVEL_COUNT}; geostrophy thins these)
 */
export function defaultLevels(
  ref: number,
  range: readonly [number, number] | null,
  count = DEFAULT_LEVEL_COUNT,
): string {
  const fallback = isRef(ref) ? FALLBACK_LEVELS[ref] : FALLBACK_LEVELS[0];
  if (!range) return fallback;
  const [min, max] = range;
  if (!Number.isFinite(min) || !Number.isFinite(max) || !(max > min) || min < 0 || max > 60) return fallback;
  const raw = (max - min) / count;
  const step = DEFAULT_STEPS.find((s) => s >= raw) ?? 1;
  const lo = Math.floor(min / step + 1e-9) * step;
  const hi = Math.ceil(max / step - 1e-9) * step;
  const dp = step < 0.01 ? 3 : 2;
  return `${lo.toFixed(dp)}:${step}:${hi.toFixed(dp)}`;
}

/**
 * Geostrophy's default layer boundaries: every k-th of the default levels (and the last), about
 * {@link DEFAULT_LAYER_COUNT} layers, so each boundary is a level the section and the tables use.
 */
export function defaultLayerBoundaries(ref: number, range: readonly [number, number] | null): string {
  const levels = parseLevels(defaultLevels(ref, range));
  const k = Math.max(1, Math.ceil((levels.length - 1) / DEFAULT_LAYER_COUNT));
  const out: number[] = [];
  for (let i = 0; i < levels.length; i += k) out.push(levels[i]);
  if (out[out.length - 1] !== levels[levels.length - 1]) out.push(levels[levels.length - 1]);
  return out.map((v) => v.toFixed(3).replace(/0+$/, '').replace(/\.$/, '')).join(',');
}

/**
 * Layer sets a new cruise starts with (suggestions the analyst may edit, not the defaults above):
 * σ0 24.0–27.6 by 0.1 for the upper ocean (open-ocean surface σ0 lies roughly between 20 and
 * 27 kg/m³, common practice) used above 1000 dbar, and σ2 36.0–37.2 by 0.05 for intermediate and
 * deep water used below it, where σ0 loses resolution.
 */
export function suggestedLayerSets(): LayerSet[] {
  return [
    layerSetSchema.parse({ name: 'σ0 upper ocean', ref: 0, spec: '24.0:0.1:27.6', pMax: 1000 }),
    layerSetSchema.parse({ name: 'σ2 deep water', ref: 2000, spec: '36.0:0.05:37.2', pMin: 1000 }),
  ];
}
