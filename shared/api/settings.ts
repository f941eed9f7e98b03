// The server's configured values that screens must agree with (sent by GET /api/settings), so the client
// never hard-codes a number the server can change.
import { z } from 'zod';

export const clientSettingsSchema = z.object({
  /** smallest σ deficit counted as an inversion, kg/m³ (docs/science.md §3.1) */
  inversionThreshold: z.number().positive(),
  /** largest upload the server accepts, bytes */
  uploadMaxBytes: z.number().int().positive(),
});
export type ClientSettings = z.infer<typeof clientSettingsSchema>;
