import { z } from 'zod';

const id = z.union([z.string(), z.number()]).transform(String);
const label = z.union([z.string(), z.number()]).transform(String);
/** Grid cells and per-station values: a number, or null where there is no water or no data. */
const cell = z.number().nullable();

export { REFERENCE_PRESSURES, type ReferencePressure } from '../../../shared/api/levels';
export const INVERSION_HANDLINGS = ['sort', 'drop', 'raw'] as const;
export type InversionHandling = (typeof INVERSION_HANDLINGS)[number];
/** The pressure frame's vertical axis and the frames' horizontal axis (see axes.ts). */
export const Y_AXES = ['pressure', 'depth'] as const;
export type YAxisKind = (typeof Y_AXES)[number];
export const X_AXES = ['distance', 'latitude', 'longitude'] as const;
export type XAxisKind = (typeof X_AXES)[number];
export const INTERPOLATIONS = ['linear', 'pchip'] as const;
export type Interpolation = (typeof INTERPOLATIONS)[number];

export const sectionStationSchema = z.object({
  id,
  station: label,
  cast: label,
  x: z.number(),
  latitude: z.number().nullable(),
  longitude: z.number().nullable(),
  bottom: z.number().nullable(),
  deepest: z.number().nullable(),
  /** A composite cast (docs/lines.md): the shallow cast above the join, the deep cast from it down. */
  composite: z.object({ shallowCast: label, deepCast: label, joinPressure: z.number() }).nullable().optional(),
});
export type SectionStation = z.infer<typeof sectionStationSchema>;

export const sectionInversionSchema = z.object({
  castId: id,
  station: label,
  x: z.number(),
  pTop: z.number(),
  pBottom: z.number(),
  deficit: z.number(),
  class: z.enum(['spike', 'overturn']),
  sigmaTop: z.number().nullable(),
  sigmaBottom: z.number().nullable(),
});
export type SectionInversion = z.infer<typeof sectionInversionSchema>;

export const sectionSchema = z.object({
  choices: z.object({
    property: z.string(),
    coord: z.enum(['pressure', 'density']),
    ref: z.number(),
    sigma: z.string(),
    levels: z.string(),
    inversions: z.enum(INVERSION_HANDLINGS),
    interpolation: z.enum(INTERPOLATIONS),
    bin: z.number(),
    gapFactor: z.number(),
    threshold: z.number(),
  }),
  unit: z.string(),
  grid: z.object({ x: z.array(z.number()), y: z.array(z.number()), z: z.array(z.array(cell)) }),
  stations: z.array(sectionStationSchema),
  /** The line drawn (docs/lines.md). */
  line: z
    .object({
      id: z.string(),
      name: z.string(),
      isDefault: z.boolean(),
      offLine: z.array(z.object({ station: z.string() })),
    })
    .optional(),
  // known: a bottom depth was known there; where not, the cast only stopped (no data below, never land)
  bottom: z
    .array(z.object({ x: z.number(), p: z.number(), known: z.boolean().optional().default(true) }))
    .optional()
    .default([]),
  inversions: z.array(sectionInversionSchema),
  isopycnals: z
    .array(z.object({ sigma: z.number(), p: z.array(cell) }))
    .optional()
    .default([]),
});
export type Section = z.infer<typeof sectionSchema>;

export const tsCastSchema = z.object({
  castId: id,
  station: label,
  x: z.number(),
  SA: z.array(cell),
  CT: z.array(cell),
  p: z.array(cell),
});
export type TsCast = z.infer<typeof tsCastSchema>;
export const tsSchema = z.array(tsCastSchema);

export const geostrophySchema = z.object({
  choices: z.object({ pRef: z.union([z.number(), z.string()]), ref: z.number(), levels: z.string() }),
  /** Which way a positive velocity points, in words (e.g. "positive is to the left looking along the track"). */
  convention: z.string(),
  pressure: z.array(z.number()),
  pairs: z.array(z.object({ a: label, b: label, x: z.number(), widthKm: z.number() })),
  velocity: z.array(z.array(cell)),
  layers: z.array(
    z.object({ sigmaTop: z.number(), sigmaBottom: z.number(), transport: z.array(cell), total: z.number().nullable() }),
  ),
});
export type Geostrophy = z.infer<typeof geostrophySchema>;

export {
  savedViewResponseSchema as savedViewSchema,
  savedViewListResponseSchema as savedViewListSchema,
} from '../../../shared/api/resources';
export type { SavedViewResponse as SavedView } from '../../../shared/api/resources';

export type {
  LayerSetResponse as LayerSet,
  DerivedVariableResponse as DerivedVariable,
} from '../../../shared/api/resources';
