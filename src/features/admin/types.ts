import { z } from 'zod';

export const caughtMailSchema = z.object({
  id: z.union([z.string(), z.number()]).transform(String),
  from: z
    .string()
    .nullable()
    .transform((s) => s ?? ''),
  to: z.array(z.string()),
  subject: z
    .string()
    .nullable()
    .transform((s) => s ?? '(no subject)'),
  date: z.string().nullable(),
  text: z
    .string()
    .nullable()
    .transform((s) => s ?? ''),
  html: z
    .string()
    .nullable()
    .transform((s) => s ?? ''),
});
export type CaughtMail = z.infer<typeof caughtMailSchema>;
export const caughtMailListSchema = z.array(caughtMailSchema);
