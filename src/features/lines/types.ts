import { z } from 'zod';

/** A line's station as the lines routes answer it (docs/lines.md). */
export const lineStationSchema = z.object({
  station: z.string(),
  castId: z.string(),
  cast: z.string(),
  latitude: z.number(),
  longitude: z.number(),
  choice: z.enum(['deepest', 'picked', 'composite']),
  composite: z
    .object({
      shallowCastId: z.string(),
      shallowCast: z.string(),
      deepCastId: z.string(),
      deepCast: z.string(),
      joinPressure: z.number(),
    })
    .nullable(),
  deepest: z.number(),
  candidates: z
    .array(z.object({ castId: z.string(), cast: z.string(), deepest: z.number() }))
    .optional()
    .default([]),
  note: z.string().nullable(),
  x: z.number(),
  bottomDepth: z.number().nullable().optional(),
  bottomSource: z.enum(['file', 'plan']).nullable().optional(),
});
export type LineStation = z.infer<typeof lineStationSchema>;

export const lineSchema = z.object({
  id: z.string(),
  name: z.string(),
  isDefault: z.boolean(),
  polyline: z.array(z.tuple([z.number(), z.number()])).nullable(),
  corridorKm: z.number().nullable(),
  stations: z.array(lineStationSchema),
  offLine: z.array(
    z.object({
      station: z.string(),
      offKm: z.number(),
      spacingKm: z.number(),
      castId: z.string(),
      latitude: z.number(),
      longitude: z.number(),
    }),
  ),
  excluded: z.array(z.object({ station: z.string(), why: z.string() })),
  include: z.array(z.string()).optional().default([]),
});
export type Line = z.infer<typeof lineSchema>;
export const lineListSchema = z.array(lineSchema);

export type CastChoice = string | { shallow: string; deep: string; joinPressure: number };
export type LineInput = {
  name?: string;
  stations?: string[];
  casts?: Record<string, CastChoice | null>;
  polyline?: [number, number][] | null;
  corridorKm?: number;
  include?: string[];
  exclude?: string[];
};

/** Station names from pasted text: commas, semicolons, tabs, spaces or new lines between them. */
export function parseStationList(text: string): string[] {
  return text
    .split(/[\s,;]+/)
    .map((s) => s.trim())
    .filter(Boolean);
}
