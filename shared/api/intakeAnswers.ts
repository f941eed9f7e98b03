// The intake's answers: what a technician tells Sigmaline when the files of an upload lack what a cast
// needs (station, cast, position, time, the unit of a column). The answers are given once for a batch,
// remembered for the cruise, and applied by the parsers and the ingest (docs/formats.md, "The mapping
// step"). One schema for the request, the stored form, the upload's list of what is missing and the
// preview, read by the server (zod at the edge) and the Intake screen alike.
import { z } from 'zod';

/** Column roles whose unit is asked for when the header does not say it (an assumed unit would be risky). */
export const ASKED_UNIT_ROLES = ['oxygen'] as const;
export type AskedUnitRole = (typeof ASKED_UNIT_ROLES)[number];

/**
 * The units a technician can choose for a column of each asked role, as the unit reader
 * (server/parsers/units.ts) understands them, with a label for the screen.
 */
export const UNIT_CHOICES: Readonly<Record<AskedUnitRole, readonly { unit: string; label: string }[]>> = {
  oxygen: [
    { unit: 'ml/l', label: 'ml/l (millilitres per litre)' },
    { unit: 'µmol/l', label: 'µmol/l (micromoles per litre)' },
    { unit: 'µmol/kg', label: 'µmol/kg (micromoles per kilogram)' },
  ],
};
const OXYGEN_UNITS = ['ml/l', 'µmol/l', 'µmol/kg'] as const;

/** The metadata of a cast that the intake may ask for. */
export const ASKED_FIELDS = ['station', 'cast', 'position', 'time'] as const;
export type AskedField = (typeof ASKED_FIELDS)[number];

/** The key a unit answer is remembered under: the column's name as a file writes it, folded. */
export function unitAnswerKey(column: string): string {
  return column.trim().toLowerCase().replace(/\s+/g, ' ');
}

const text = (max: number, what: string) =>
  z
    .string()
    .trim()
    .min(1, `${what} is empty`)
    .max(max, `${what} is longer than ${max} characters`)
    .refine((s) => ![...s].some((ch) => ch.charCodeAt(0) < 32), `${what} holds a control character`);

/** Metadata answers for one file of the batch (by its file name, or its path inside a zip). */
export const CastAnswerSchema = z
  .object({
    station: text(64, 'the station').optional(),
    cast: text(16, 'the cast').optional(),
    latitude: z
      .number()
      .finite()
      .min(-90, 'latitude must lie in -90..90')
      .max(90, 'latitude must lie in -90..90')
      .optional(),
    longitude: z
      .number()
      .finite()
      .min(-180, 'longitude must lie in -180..360')
      .max(360, 'longitude must lie in -180..360')
      .transform((x) => (x > 180 ? x - 360 : x))
      .optional(),
    time: z.iso.datetime({ message: 'the time must be ISO 8601 in UTC (2026-03-04T05:06:00Z)' }).optional(),
  })
  .strict()
  .refine((a) => (a.latitude === undefined) === (a.longitude === undefined), {
    message: 'give latitude and longitude together',
  });
export type CastAnswer = z.infer<typeof CastAnswerSchema>;

/** The answers as a request sends them and the cruise remembers them. */
export const IntakeAnswersSchema = z
  .object({
    /** unit of a column without one, by the column's name (any case): e.g. { "oxygen": "ml/l" } */
    units: z.record(text(200, 'the column name'), z.enum(OXYGEN_UNITS)).default({}),
    /** metadata of a file, by file name (or path inside a zip) */
    casts: z.record(text(300, 'the file name'), CastAnswerSchema).default({}),
  })
  .strict()
  .refine((a) => Object.keys(a.units).length + Object.keys(a.casts).length <= 2000, {
    message: 'at most 2000 answers at a time',
  });
export type IntakeAnswers = z.infer<typeof IntakeAnswersSchema>;

/** What one file of an upload lacks; the Intake screen asks for it. */
export const FileNeedSchema = z.object({
  file: z.string(),
  /** metadata the file does not carry (and no station table, plan or answer supplied) */
  missing: z.array(z.enum(ASKED_FIELDS)),
  /** columns whose unit is not stated */
  units: z.array(z.object({ column: z.string(), role: z.enum(ASKED_UNIT_ROLES) })),
  /** what the file does carry, for the screen to show beside the questions */
  known: z.object({
    station: z.string().nullable(),
    cast: z.string().nullable(),
    latitude: z.number().nullable(),
    longitude: z.number().nullable(),
    time: z.string().nullable(),
  }),
});
export type FileNeed = z.infer<typeof FileNeedSchema>;

/** Where a value of a cast's metadata came from (preview and notes). */
export const VALUE_SOURCES = ['file', 'file name', 'station table', 'plan', 'answer', 'default', 'missing'] as const;
export type ValueSource = (typeof VALUE_SOURCES)[number];

const sourced = <T extends z.ZodTypeAny>(value: T) =>
  z.object({ value: value.nullable(), source: z.enum(VALUE_SOURCES) });

/** The first rows of one file as they will be read, with the answers applied. */
export const FilePreviewSchema = z.object({
  file: z.string(),
  metadata: z.object({
    station: sourced(z.string()),
    cast: sourced(z.string()),
    latitude: sourced(z.number()),
    longitude: sourced(z.number()),
    time: sourced(z.string()),
  }),
  /** column names and the units the values below are in */
  columns: z.array(z.object({ name: z.string(), label: z.string(), unit: z.string() })),
  rows: z.array(z.array(z.number().nullable())),
  levels: z.number().int().nonnegative(),
  notes: z.array(z.string()),
  /** what is still missing with these answers */
  stillMissing: z.array(z.string()),
});
export type FilePreview = z.infer<typeof FilePreviewSchema>;

export const UploadPreviewSchema = z.object({
  files: z.array(FilePreviewSchema),
  /** files of the upload beyond those previewed */
  more: z.number().int().nonnegative(),
  errors: z.array(z.object({ file: z.string(), message: z.string() })),
});
export type UploadPreview = z.infer<typeof UploadPreviewSchema>;
