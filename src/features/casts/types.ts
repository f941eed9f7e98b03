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
});
export type CastSummary = z.infer<typeof castSummarySchema>;
export const castListSchema = z.array(castSummarySchema);
