import { z } from 'zod';
import { FileNeedSchema } from '../../../shared/api/intakeAnswers';

const id = z.union([z.string(), z.number()]).transform(String);

/** A problem in a file, where it is: line and column are 1-based, absent when the whole file is at fault. */
export const fileProblemSchema = z.object({
  file: z
    .string()
    .nullish()
    .transform((v) => v ?? null),
  line: z
    .number()
    .int()
    .nullish()
    .transform((v) => v ?? null),
  column: z
    .union([z.number().int(), z.string()])
    .nullish()
    .transform((v) => (v == null ? null : v)),
  message: z.string(),
  code: z
    .string()
    .nullish()
    .transform((v) => v ?? null),
});
export type FileProblem = z.infer<typeof fileProblemSchema>;

/** Errors and warnings arrive as file problems; a bare message is accepted as one without a place. */
const problemList = z
  .array(
    z.union([
      fileProblemSchema,
      z.string().transform((message): FileProblem => ({ file: null, line: null, column: null, message, code: null })),
    ]),
  )
  .nullish()
  .transform((v) => v ?? []);

export const UPLOAD_STATUSES = ['queued', 'processing', 'ready', 'failed', 'awaiting_decision'] as const;
export const uploadStatusSchema = z.enum(UPLOAD_STATUSES);
export type UploadStatus = z.infer<typeof uploadStatusSchema>;

export const uploadSchema = z.object({
  id,
  filename: z.string(),
  status: uploadStatusSchema,
  /** Processing progress of the background job, 0–1. */
  progress: z
    .number()
    .nullish()
    .transform((v) => (v == null ? 0 : Math.max(0, Math.min(1, v)))),
  size: z
    .number()
    .nullish()
    .transform((v) => v ?? null),
  sha256: z
    .string()
    .nullish()
    .transform((v) => v ?? null),
  errors: problemList,
  warnings: problemList,
  castIds: z
    .array(id)
    .nullish()
    .transform((v) => v ?? []),
  /** Headers the parser did not recognise; the mapping step asks what they are. */
  unmappedHeaders: z
    .array(z.string())
    .nullish()
    .transform((v) => v ?? null),
  duplicate: z.boolean().optional(),
  /** What the files lack (station, cast, position, time, unit of a column): the answers step asks. */
  needs: z
    .array(FileNeedSchema)
    .nullish()
    .transform((v) => v ?? null),
  /** Casts of this upload whose station and cast are already live: replace them, or keep the earlier ones? */
  conflicts: z
    .object({
      items: z.array(
        z.object({
          file: z.string(),
          station: z.string(),
          cast: z.string(),
          existingCastId: z.string(),
          existingFile: z.string(),
        }),
      ),
      decision: z.enum(['replace', 'keep']).nullable(),
    })
    .nullish()
    .transform((v) => v ?? null),
  createdAt: z
    .string()
    .nullish()
    .transform((v) => v ?? null),
  updatedAt: z
    .string()
    .nullish()
    .transform((v) => v ?? null),
});
export type Upload = z.infer<typeof uploadSchema>;
export const uploadListSchema = z.array(uploadSchema);
export const uploadBatchSchema = z.object({ uploads: z.array(uploadSchema) });

export const isActive = (status: UploadStatus) => status === 'queued' || status === 'processing';

/** What a header can be told to be. */
export const COLUMN_ROLES = [
  'pressure',
  'depth',
  'temperature',
  'salinity',
  'conductivity',
  'oxygen',
  'extra',
  'ignore',
] as const;
export const columnRoleSchema = z.enum(COLUMN_ROLES);
export type ColumnRole = z.infer<typeof columnRoleSchema>;

export const COLUMN_ROLE_LABELS: Readonly<Record<ColumnRole, string>> = {
  pressure: 'Pressure (dbar)',
  depth: 'Depth (m)',
  temperature: 'Temperature',
  salinity: 'Practical salinity',
  conductivity: 'Conductivity',
  oxygen: 'Dissolved oxygen',
  extra: 'Keep as an extra variable',
  ignore: 'Ignore this column',
};

export const columnMappingSchema = z.record(z.string(), columnRoleSchema);
export type ColumnMapping = z.infer<typeof columnMappingSchema>;

export {
  IntakeAnswersSchema as intakeAnswersSchema,
  UploadPreviewSchema as uploadPreviewSchema,
  UNIT_CHOICES,
  unitAnswerKey,
  type IntakeAnswers,
  type CastAnswer,
  type FileNeed,
  type UploadPreview,
  type FilePreview,
} from '../../../shared/api/intakeAnswers';

/** A failed upload that waits for answers about what its files lack. */
export const needsAnswers = (u: Upload) => u.status === 'failed' && (u.needs?.length ?? 0) > 0;
