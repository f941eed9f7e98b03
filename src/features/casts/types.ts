import { z } from 'zod';

const id = z.union([z.string(), z.number()]).transform(String);
/** Station and cast identifiers are text on the wire (`K-07`, `12A`); numbers are accepted and kept as text. */
const label = z.union([z.string(), z.number()]).transform(String);

export const castSummarySchema = z.object({
  id,
  station: label,
  cast: label,
  latitude: z.number().nullable(),
  longitude: z.number().nullable(),
  time: z.string().nullable(),
  bottomDepth: z.number().nullable(),
  levels: z.number().int().nonnegative(),
  /** How many density inversions the cast has. */
  inversions: z.number().int().nonnegative(),
  sourceFile: z.string().nullish(),
  /** Lines of the file left out because they could not be read; decision null: awaiting the technician. */
  partlyRead: z
    .object({
      dropped: z.array(z.object({ line: z.number().nullable(), column: z.number().nullable(), message: z.string() })),
      decision: z.string().nullable(),
    })
    .nullish(),
});
export type CastSummary = z.infer<typeof castSummarySchema>;
export const castListSchema = z.array(castSummarySchema);

export const removedCastSchema = z.object({
  id,
  station: label,
  cast: label,
  sourceFile: z.string(),
  removedAt: z.string().nullable(),
});
export const removedCastListSchema = z.array(removedCastSchema);
export type RemovedCast = z.infer<typeof removedCastSchema>;
