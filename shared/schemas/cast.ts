// Zod schemas and types of a parsed cast: what the file parsers (server/parsers) hand to the ingest.
// Columns are typed arrays; the schemas check their kind and that every column has the same length.
import { z } from 'zod';
import { ASKED_UNIT_ROLES } from '../api/intakeAnswers';

/** Machine-readable kinds of file problems; the UI and the bad-file corpus key on these. */
export const FILE_ERROR_CODES = [
  'empty_file',
  'file_too_large',
  'too_many_levels',
  'binary',
  'invalid_utf8',
  'line_too_long',
  'too_many_columns',
  'unknown_format',
  'no_header',
  'no_data',
  'duplicate_column',
  'missing_column',
  'unrecognised_columns',
  'bad_mapping',
  'unit_unknown',
  'unit_unconvertible',
  'text_in_numeric',
  'nan_inf',
  'field_count',
  'truncated',
  'repeated_header',
  'pressure_out_of_range',
  'depth_out_of_range',
  'salinity_out_of_range',
  'temperature_out_of_range',
  'conductivity_out_of_range',
  'latitude_out_of_range',
  'longitude_out_of_range',
  'bad_time',
  'bad_metadata',
  'bad_flag',
  'duplicate_station',
  'exchange_bad_header',
  'exchange_missing_end',
  'exchange_bottle',
  'missing_header',
  'needs_answer',
  'netcdf_corrupt',
  'netcdf_unsupported',
  'netcdf_bad_structure',
  'netcdf_not_profile',
  'acquisition_bad_header',
  'acquisition_missing_end',
  'zip_corrupt',
  'zip_unsafe_path',
  'zip_too_many_entries',
  'zip_too_large',
  'zip_ratio',
  'zip_nested',
  'zip_encrypted',
  'zip_empty',
  'internal_error',
] as const;
export const FileErrorCodeSchema = z.enum(FILE_ERROR_CODES);
export type FileErrorCode = z.infer<typeof FileErrorCodeSchema>;

export const FileErrorSchema = z.object({
  file: z.string(),
  line: z.number().int().positive().nullable(), // 1-based line in the original file
  column: z.number().int().positive().nullable(), // 1-based field index
  message: z.string().min(1),
  code: z.string().min(1),
});
export type FileError = z.infer<typeof FileErrorSchema>;

export const CastFormatSchema = z.enum(['plain', 'exchange', 'netcdf', 'acquisition']);
export type CastFormat = z.infer<typeof CastFormatSchema>;

export const CastMetadataSchema = z.object({
  station: z.string().min(1).nullable(),
  cast: z.string().min(1).nullable(),
  latitude: z.number().min(-90).max(90).nullable(),
  longitude: z.number().min(-180).max(180).nullable(),
  time: z.iso.datetime().nullable(), // ISO 8601 UTC
  bottomDepth: z.number().nonnegative().nullable(), // m
  extra: z.record(z.string(), z.string()),
});
export type CastMetadata = z.infer<typeof CastMetadataSchema>;

const f64 = z.custom<Float64Array>((v) => v instanceof Float64Array, { message: 'expected a Float64Array' });
const u8 = z.custom<Uint8Array>((v) => v instanceof Uint8Array, { message: 'expected a Uint8Array' });

/** The roles a column can play in a cast (besides extras and flags). */
export const COLUMN_ROLES = ['pressure', 'depth', 'temperature', 'salinity', 'conductivity', 'oxygen'] as const;
export const ColumnRoleSchema = z.enum(COLUMN_ROLES);
export type ColumnRole = z.infer<typeof ColumnRoleSchema>;

export const CastColumnsSchema = z.object({
  pressure: f64.optional(), // dbar
  depth: f64.optional(), // m, positive down
  temperature: f64, // ITS-90 °C
  salinity: f64.optional(), // PSS-78
  conductivity: f64.optional(), // mS/cm
  oxygen: f64.optional(), // as given; unit in units.oxygen
});
export type CastColumns = z.infer<typeof CastColumnsSchema>;

export const CastProfileSchema = z.object({
  levels: z.number().int().nonnegative(),
  downcastEnd: z.number().int().nonnegative(), // index of the deepest sample in the file's order
  hasUpcast: z.boolean(),
  reversals: z.number().int().nonnegative(),
});
export type CastProfile = z.infer<typeof CastProfileSchema>;

export const ParsedCastSchema = z
  .object({
    file: z.string(),
    format: CastFormatSchema,
    metadata: CastMetadataSchema,
    vertical: z.enum(['pressure', 'depth']),
    columns: CastColumnsSchema,
    units: z.record(z.string(), z.string()),
    extras: z.record(z.string(), z.object({ unit: z.string(), values: f64 })),
    flags: z.record(z.string(), u8),
    profile: CastProfileSchema,
    notes: z.array(z.string()),
    /** Lines left out because they could not be read (salvage): the cast is "partly read". */
    dropped: z.array(FileErrorSchema).optional(),
    /** Columns whose unit the file does not state and no intake answer gave (the Intake screen asks). */
    unitsNeeded: z.array(z.object({ column: z.string(), role: z.enum(ASKED_UNIT_ROLES) })).optional(),
  })
  .superRefine((c, ctx) => {
    const n = c.profile.levels;
    const check = (name: string, len: number): void => {
      if (len !== n) ctx.addIssue({ code: 'custom', message: `column ${name} has ${len} values, expected ${n}` });
    };
    for (const [k, v] of Object.entries(c.columns)) if (v) check(k, v.length);
    for (const [k, v] of Object.entries(c.extras)) check(`extra ${k}`, v.values.length);
    for (const [k, v] of Object.entries(c.flags)) check(`flag ${k}`, v.length);
    if (c.vertical === 'pressure' && !c.columns.pressure)
      ctx.addIssue({ code: 'custom', message: 'pressure column missing' });
    if (c.vertical === 'depth' && !c.columns.depth) ctx.addIssue({ code: 'custom', message: 'depth column missing' });
    if (!c.columns.salinity && !c.columns.conductivity)
      ctx.addIssue({ code: 'custom', message: 'neither salinity nor conductivity' });
  });
export type ParsedCast = z.infer<typeof ParsedCastSchema>;

export const StationRowSchema = z.object({
  station: z.string().min(1),
  cast: z.string().min(1).nullable(),
  latitude: z.number().min(-90).max(90),
  longitude: z.number().min(-180).max(180),
  time: z.iso.datetime().nullable(),
  bottomDepth: z.number().nonnegative().nullable(),
  line: z.number().int().positive(),
});
export type StationRow = z.infer<typeof StationRowSchema>;

export const ParseResultSchema = z.discriminatedUnion('ok', [
  z.object({
    ok: z.literal(true),
    casts: z.array(ParsedCastSchema),
    stations: z.array(StationRowSchema),
    warnings: z.array(FileErrorSchema),
  }),
  z.object({
    ok: z.literal(false),
    errors: z.array(FileErrorSchema).min(1),
    unmappedHeaders: z.object({ file: z.string(), headers: z.array(z.string()) }).optional(),
  }),
]);
export type ParseResult = z.infer<typeof ParseResultSchema>;

/** A user-supplied mapping of header text to role: a column role, `extra`, `ignore`, or `flag:<role>`. */
export const ColumnMappingSchema = z.record(
  z.string(),
  z.union([ColumnRoleSchema, z.literal('extra'), z.literal('ignore'), z.string().regex(/^flag:[A-Za-z0-9_ ]+$/)]),
);
export type ColumnMapping = z.infer<typeof ColumnMappingSchema>;
