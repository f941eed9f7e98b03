import { z } from 'zod';
import { roleSchema } from '../auth';

const id = z.union([z.string(), z.number()]).transform(String);
const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Use the form YYYY-MM-DD.');

export const cruiseSchema = z.object({
  id,
  name: z.string(),
  ship: z.string(),
  startDate: isoDate.nullable(),
  endDate: isoDate.nullable(),
  portStart: z.string().nullable().optional().default(null),
  portEnd: z.string().nullable().optional().default(null),
  region: z.string().nullable().optional().default(null),
  description: z.string().nullable().optional().default(null),
  locked: z.boolean().optional().default(false),
  role: roleSchema.nullable().optional().default(null),
  stationCount: z.number().int().nonnegative().optional().default(0),
  castCount: z.number().int().nonnegative().optional().default(0),
  createdAt: z.string().optional(),
});
export type Cruise = z.infer<typeof cruiseSchema>;
export const cruiseListSchema = z.array(cruiseSchema);

export const stationSchema = z.object({
  id,
  name: z.string(),
  latitude: z.number(),
  longitude: z.number(),
  plannedDepth: z.number().nullable().optional().default(null),
  order: z.number(),
  occupied: z.boolean(),
  /** live casts at the station */
  casts: z.number().int().nonnegative().optional(),
});
export type Station = z.infer<typeof stationSchema>;
export const stationListSchema = z.array(stationSchema);

const optionalText = (max: number) =>
  z
    .string()
    .trim()
    .max(max, `At most ${max} characters.`)
    .transform((s) => (s === '' ? undefined : s))
    .optional();

function isRealDate(s: string): boolean {
  const t = Date.parse(`${s}T00:00:00Z`);
  return !Number.isNaN(t) && new Date(t).toISOString().slice(0, 10) === s;
}

const requiredDate = (what: string) =>
  z
    .string()
    .trim()
    .min(1, `Enter the ${what}.`)
    .refine((s) => /^\d{4}-\d{2}-\d{2}$/.test(s) && isRealDate(s), 'Use a real date, YYYY-MM-DD.');

/** A required decimal-degree value typed into a form (a string), checked for range. */
const degrees = (what: string, limit: number) =>
  z
    .string()
    .trim()
    .min(1, `Enter the ${what} in decimal degrees.`)
    .transform(Number)
    .refine(Number.isFinite, `The ${what} is a number of decimal degrees.`)
    .refine((n) => n >= -limit && n <= limit, `The ${what} is between −${limit} and ${limit}.`);

/** What the create-cruise form sends; checked here first, and again by the server. */
export const newCruiseSchema = z
  .object({
    name: z.string().trim().min(1, 'Give the cruise a name.').max(120, 'At most 120 characters.'),
    ship: z.string().trim().min(1, 'Name the ship.').max(120, 'At most 120 characters.'),
    startDate: requiredDate('departure date'),
    endDate: requiredDate('return date'),
    portStart: optionalText(120),
    portEnd: optionalText(120),
    region: optionalText(200),
    description: optionalText(4000),
  })
  .refine((c) => !isRealDate(c.startDate) || !isRealDate(c.endDate) || c.endDate >= c.startDate, {
    path: ['endDate'],
    message: 'The cruise cannot end before it starts.',
  });
export type NewCruiseInput = z.input<typeof newCruiseSchema>;
export type NewCruise = z.output<typeof newCruiseSchema>;

/** What the add-station form sends (form values are strings; the output is numbers). */
export const newStationSchema = z.object({
  name: z.string().trim().min(1, 'Name the station.').max(40, 'At most 40 characters.'),
  latitude: degrees('latitude', 90),
  longitude: degrees('longitude', 180),
  plannedDepth: z
    .string()
    .trim()
    .transform((s) => (s === '' ? undefined : Number(s)))
    .refine(
      (n) => n === undefined || (Number.isFinite(n) && n > 0 && n < 12000),
      'Depth in metres, between 0 and 12 000.',
    )
    .optional(),
});
export type NewStation = z.output<typeof newStationSchema>;

/** First message per field of a failed zod parse, for inline form errors. */
export function fieldErrorsOf(error: z.ZodError): Record<string, string> {
  const out: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = String(issue.path[0] ?? '');
    if (key && !(key in out)) out[key] = issue.message;
  }
  return out;
}
