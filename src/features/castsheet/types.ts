import { z } from 'zod';

const id = z.union([z.string(), z.number()]).transform(String);
const label = z.union([z.string(), z.number()]).transform(String);
const nullableNumber = z.number().nullable();
const maybeNumber = z
  .number()
  .nullish()
  .transform((v) => v ?? null);
const column = z.array(nullableNumber);

export const inversionSchema = z.object({
  iTop: z.number().int(),
  iBottom: z.number().int(),
  pTop: z.number(),
  pBottom: z.number(),
  depthTop: maybeNumber,
  depthBottom: maybeNumber,
  /** kg/m³ */
  deficit: z.number(),
  /** s⁻², or null */
  minN2: maybeNumber,
  class: z.enum(['spike', 'overturn']),
  levels: z.number().int(),
});
export type CastInversion = z.infer<typeof inversionSchema>;

const fitnessFigures = z.object({
  monotonicShare: z.number(),
  multiValuedShare: z.number(),
  direction: z
    .union([z.string(), z.number()])
    .nullish()
    .transform((v) => (v == null ? null : String(v))),
  segments: z
    .array(z.object({ pTop: z.number(), pBottom: z.number() }))
    .nullish()
    .transform((v) => v ?? []),
});
export const fitnessEntrySchema = fitnessFigures.extend({
  /** the same figures at the analysis resolution (reversals smaller than `tolerance` ignored) */
  resolved: fitnessFigures
    .extend({ tolerance: z.number() })
    .nullish()
    .transform((v) => v ?? null),
});
export type FitnessEntry = z.infer<typeof fitnessEntrySchema>;

export const mixedLayerSchema = z
  .object({
    p_mld: maybeNumber,
    sigma0_ref: maybeNumber,
    status: z
      .string()
      .nullish()
      .transform((v) => v ?? null),
    reason: z
      .string()
      .nullish()
      .transform((v) => v ?? null),
  })
  .nullish()
  .transform((v) => v ?? null);

export const castMetadataSchema = z
  .object({
    format: z
      .string()
      .nullish()
      .transform((v) => v ?? null),
    units: z.unknown().optional(),
    profile: z
      .object({
        levels: maybeNumber,
        downcastEnd: maybeNumber,
        hasUpcast: z
          .boolean()
          .nullish()
          .transform((v) => v ?? null),
        reversals: maybeNumber,
      })
      .nullish()
      .transform((v) => v ?? null),
    saar: z
      .string()
      .nullish()
      .transform((v) => v ?? null),
    mixedLayer: mixedLayerSchema,
  })
  .loose();

/** Processing notes are sentences; a structured note is shown by its message. */
const noteSchema = z.union([
  z.string(),
  z
    .object({ message: z.string() })
    .loose()
    .transform((n) => n.message),
]);

export const FLAG_VARIABLES = ['temperature', 'salinity', 'conductivity', 'oxygen', 'all'] as const;
export type FlagVariable = (typeof FLAG_VARIABLES)[number];

export const castDetailSchema = z.object({
  id,
  station: label,
  cast: label,
  latitude: maybeNumber,
  longitude: maybeNumber,
  time: z
    .string()
    .nullish()
    .transform((v) => v ?? null),
  bottomDepth: maybeNumber,
  levels: z.number().int().nonnegative(),
  uploadId: id.nullish().transform((v) => v ?? null),
  sourceFile: z
    .string()
    .nullish()
    .transform((v) => v ?? null),
  inversions: z
    .array(inversionSchema)
    .nullish()
    .transform((v) => v ?? []),
  metadata: castMetadataSchema
    .nullish()
    .transform((v) => v ?? { format: null, profile: null, saar: null, mixedLayer: null }),
  notes: z
    .array(noteSchema)
    .nullish()
    .transform((v) => v ?? []),
  fitness: z
    .record(z.string(), fitnessEntrySchema)
    .nullish()
    .transform((v) => v ?? {}),
  columns: z
    .object({
      pressure: column,
      SA: column.optional(),
      CT: column.optional(),
      N2: column.optional(),
      p_mid: column.optional(),
    })
    .catchall(column),
  units: z
    .record(z.string(), z.string().nullable())
    .nullish()
    .transform((v) => v ?? {}),
  extras: z
    .record(
      z.string(),
      z.object({
        unit: z
          .string()
          .nullish()
          .transform((v) => v ?? null),
        values: column,
      }),
    )
    .nullish()
    .transform((v) => v ?? {}),
  flags: z
    .record(z.string(), z.array(z.number()))
    .nullish()
    .transform((v) => v ?? {}),
});
export type CastDetail = z.infer<typeof castDetailSchema>;

export const flagResultSchema = z.object({ levels: z.number().int().nonnegative() });

export interface FlagEdit {
  variable: FlagVariable;
  pFrom: number;
  pTo: number;
  flag: 1 | 2 | 3 | 4 | 9;
  reason?: string;
}

export const flagResultWithChangeSchema = z.object({
  levels: z.number().int().nonnegative(),
  changeId: z.string().optional(),
});

export const QC_TEST_IDS = [
  'pressure_increasing',
  'global_range',
  'regional_range',
  'spike',
  'gradient',
  'density_inversion',
  'stuck_value',
  'sensor_pair',
] as const;
export type QcTestId = (typeof QC_TEST_IDS)[number];

export const proposalSchema = z.object({
  id: z.string(),
  test: z.enum(QC_TEST_IDS),
  variable: z.enum(['temperature', 'salinity', 'conductivity', 'oxygen', 'all']),
  iFrom: z.number().int(),
  iTo: z.number().int(),
  pFrom: z.number(),
  pTo: z.number(),
  levels: z.number().int(),
  flag: z.number().int(),
  detail: z.string(),
  status: z.enum(['pending', 'accepted', 'rejected']),
  decidedAt: z.string().nullable(),
  /** the flag-log entry an accepted proposal made (undoing it reopens the proposal) */
  flagChangeId: z
    .string()
    .nullish()
    .transform((v) => v ?? null),
});
export type Proposal = z.infer<typeof proposalSchema>;

export const castQcSchema = z.object({
  tests: z.array(z.object({ id: z.enum(QC_TEST_IDS), label: z.string(), source: z.string() })),
  proposals: z.array(proposalSchema),
  intakeInversions: z.array(inversionSchema),
});
export type CastQc = z.infer<typeof castQcSchema>;

export const flagLogEntrySchema = z.object({
  id: z.string(),
  at: z.string(),
  who: z.string().nullable(),
  variable: z.string(),
  pFrom: z.number(),
  pTo: z.number(),
  levels: z.number().int(),
  from: z.record(z.string(), z.array(z.number())),
  to: z.union([z.number(), z.array(z.number())]),
  reason: z.string().nullable(),
  source: z.enum(['manual', 'proposal', 'undo']),
  proposalId: z.string().nullable(),
  undoes: z.string().nullable(),
  undoneBy: z.string().nullable(),
  undoable: z.boolean(),
});
export type FlagLogEntry = z.infer<typeof flagLogEntrySchema>;

const earlierSchema = z.object({
  cruiseId: id,
  cruise: z.string(),
  ship: z.string(),
  startDate: z.string(),
  lineId: id,
  line: z.string(),
  why: z.array(z.string()),
  partner: z
    .object({
      id,
      station: label,
      cast: label,
      time: z.string().nullable(),
      offsetKm: z.number(),
      columns: z.record(z.string(), column.optional()),
      extras: z.record(z.string(), column),
    })
    .nullable(),
  note: z.string().nullable(),
});
export type EarlierOccupation = z.infer<typeof earlierSchema>;

export const neighboursSchema = z.object({
  order: z.string(),
  neighbours: z.array(
    z.object({
      id,
      station: label,
      cast: label,
      role: z.enum(['previous', 'next']),
      columns: z.record(z.string(), column.optional()),
      extras: z.record(z.string(), column),
    }),
  ),
  pairDistanceKm: z
    .number()
    .nullish()
    .transform((v) => v ?? null),
  /** the same station in earlier occupations of the line (only cruises the user belongs to), newest first */
  earlier: z
    .array(earlierSchema)
    .nullish()
    .transform((v) => v ?? []),
});
export type Neighbours = z.infer<typeof neighboursSchema>;
export type Neighbour = Neighbours['neighbours'][number];

/** A cast drawn over this one: a neighbouring station, or the same station in an earlier occupation. */
export type OverlayRole = 'previous' | 'next' | 'earlier';
export interface OverlayCast {
  station: string;
  role: OverlayRole;
  /** what the overlay is called on the figures and in the legend */
  label: string;
  columns: Record<string, (number | null)[] | undefined>;
  extras: Record<string, (number | null)[]>;
}

export const pendingSchema = z.array(z.object({ castId: id, pending: z.number().int() }));
