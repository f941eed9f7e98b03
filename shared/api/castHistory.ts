// The history of a cast: every version of its station and cast (the files uploaded for it), which one
// is live, and for each replacement the flags carried over from the earlier version or listed as not
// carried (no level of the same pressure in the new file). Read by the cast sheet's history panel.
import { z } from 'zod';
import { idSchema } from './resources';

const person = z.object({ id: idSchema, name: z.string() }).nullable();
const when = z.union([z.string(), z.date()]).transform((d) => (d instanceof Date ? d.toISOString() : d));

export const castVersionSchema = z.object({
  id: idSchema,
  station: z.string(),
  cast: z.string(),
  sourceFile: z.string(),
  live: z.boolean(),
  removedAt: when.nullable(),
  removedBy: person,
  supersededBy: idSchema.nullable(),
  supersededAt: when.nullable(),
  createdAt: when,
  uploadId: idSchema.nullable(),
  uploadFile: z.string().nullable(),
  uploadedBy: person,
  uploadedAt: when,
  /** what this version replaced, and the flags that came over; null for a first version */
  replacement: z
    .object({
      replacedCastId: idSchema.nullable(),
      replacedFile: z.string().nullable(),
      at: when,
      /** flagged levels of the earlier version set on this one (same pressure within 1e-6 dbar) */
      flagsCarried: z.number().int().nonnegative(),
      /** flagged levels of the earlier version with no level of the same pressure here */
      notCarriedCount: z.number().int().nonnegative(),
      notCarried: z.array(z.object({ variable: z.string(), pressure: z.number(), flag: z.number() })),
    })
    .nullable(),
});
export type CastVersion = z.output<typeof castVersionSchema>;

export const castHistoryResponseSchema = z.object({
  station: z.string(),
  cast: z.string(),
  versions: z.array(castVersionSchema),
});
export type CastHistory = z.output<typeof castHistoryResponseSchema>;
