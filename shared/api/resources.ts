// Answers of the API as both sides read them: the server declares them as route responses (OpenAPI and
// the API tests check answers against them) and the client parses with the same schemas.
import { z } from 'zod';

/** An id as the API sends it (a UUID string; older rows may come as numbers). */
export const idSchema = z.union([z.string(), z.number()]).transform(String);

/** A saved layer set: target isopycnals at one reference pressure, as written. */
export const layerSetResponseSchema = z.object({
  id: idSchema,
  name: z.string(),
  referencePressure: z.number(),
  /** as written: `start:step:end` or a comma list */
  levels: z.string(),
  count: z.number().int().nonnegative(),
});
export type LayerSetResponse = z.output<typeof layerSetResponseSchema>;
export const layerSetListResponseSchema = z.array(layerSetResponseSchema);

/** An analyst's derived variable: a formula over a cast's columns, with its unit. */
export const derivedVariableResponseSchema = z.object({
  id: idSchema,
  name: z.string(),
  formula: z.string(),
  unit: z
    .string()
    .nullish()
    .transform((v) => v ?? null),
  description: z
    .string()
    .nullish()
    .transform((v) => v ?? null),
});
export type DerivedVariableResponse = z.output<typeof derivedVariableResponseSchema>;
export const derivedVariableListResponseSchema = z.array(derivedVariableResponseSchema);

/** A variable the casts of a cruise carry beyond the catalogue (`x:<name>`: fluorescence, a second sensor…). */
export const fileVariableResponseSchema = z.object({
  name: z.string(),
  label: z.string(),
  unit: z.string(),
  /** how many live casts carry it */
  casts: z.number().int().nonnegative(),
});
export const fileVariableListResponseSchema = z.array(fileVariableResponseSchema);
export type FileVariableResponse = z.infer<typeof fileVariableResponseSchema>;
/**
 * A saved section view: the Section screen's query under a name. The owner alone edits, shares and
 * deletes it; a shared view is read (opened, copied) by every member of the cruise.
 */
export const savedViewResponseSchema = z.object({
  id: idSchema,
  name: z.string(),
  /** the Section screen's URL query, without the leading `?` */
  query: z.string(),
  shared: z.boolean(),
  owner: z.object({ id: z.string(), name: z.string() }),
  /** the caller saved it (and so may edit and delete it) */
  mine: z.boolean(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type SavedViewResponse = z.output<typeof savedViewResponseSchema>;
export const savedViewListResponseSchema = z.array(savedViewResponseSchema);
