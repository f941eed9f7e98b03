import { z } from 'zod';

const cell = z.number().nullable();
const grid = z.array(z.array(cell));
const series = z.array(cell);

export const occupationSchema = z.object({
  lineId: z.string(),
  line: z.string(),
  isDefaultLine: z.boolean(),
  cruiseId: z.string(),
  cruise: z.string(),
  ship: z.string(),
  firstCast: z.string().nullable(),
  lastCast: z.string().nullable(),
  casts: z.number(),
});

export const comparisonSchema = z.object({
  choices: z
    .object({
      lineA: z.string(),
      lineB: z.string(),
      property: z.string(),
      ref: z.number(),
      levels: z.string(),
      inversions: z.string(),
      interpolation: z.string(),
      pairDistanceKm: z.number(),
      positions: z.string(),
      bin: z.number(),
      sigma: z.string(),
      pressureLevels: z.string(),
      line: z
        .array(z.tuple([z.number(), z.number()]))
        .nullable()
        .optional(),
    })
    .passthrough(),
  unit: z.string(),
  occupations: z.object({ A: occupationSchema, B: occupationSchema }),
  years: z.number().nullable(),
  perDecade: z.number().nullable(),
  x: series,
  positions: z.array(z.object({ latitude: z.number().nullable(), longitude: z.number().nullable() })),
  pairs: z.array(
    z.object({
      x: z.number(),
      stationA: z.string(),
      castA: z.string(),
      stationB: z.string(),
      castB: z.string(),
      offsetKm: z.number(),
    }),
  ),
  excluded: z.array(z.object({ station: z.string(), line: z.enum(['A', 'B']), why: z.string() })),
  counts: z.object({
    flaggedLevels: z.object({ A: z.number(), B: z.number() }),
    leftOut: z.object({ pressure: z.number(), density: z.number() }),
    positions: z.number(),
  }),
  pressure: z.array(z.number()),
  sigma: z.array(z.number()),
  onPressure: z.object({ A: grid, B: grid, diff: grid }),
  onDensity: z.object({ pA: grid, pB: grid, heave: grid, A: grid, B: grid, diff: grid }),
  decomposition: z.object({ waterMassTerm: grid, heaveTerm: grid, residual: grid }),
  means: z.object({
    onPressure: z.object({ diff: series, waterMassTerm: series, heaveTerm: series, residual: series }),
    onDensity: z.object({ heave: series, diff: series }),
  }),
  transport: z.array(
    z.object({ sigmaTop: z.number(), sigmaBottom: z.number(), A: z.number(), B: z.number(), change: z.number() }),
  ),
  ts: z.object({
    A: z.object({ SA: z.array(z.number()), CT: z.array(z.number()) }),
    B: z.object({ SA: z.array(z.number()), CT: z.array(z.number()) }),
  }),
});
export type Comparison = z.infer<typeof comparisonSchema>;

export const offerSchema = z.object({
  lineId: z.string(),
  line: z.string(),
  isDefault: z.boolean(),
  cruiseId: z.string(),
  cruise: z.string(),
  ship: z.string(),
  startDate: z.string(),
  why: z.array(z.string()),
  sectionId: z.string().nullable(),
  linked: z.boolean(),
});
export type OccupationOffer = z.infer<typeof offerSchema>;
export const occupationsSchema = z.object({ line: offerSchema, occupations: z.array(offerSchema) });

export const lineListSchema = z.array(
  z.object({ id: z.string(), name: z.string(), isDefault: z.boolean() }).passthrough(),
);
export const cruiseListSchema = z.array(z.object({ id: z.string(), name: z.string() }).passthrough());
