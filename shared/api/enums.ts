// The domain's closed sets of choices, declared once and read by the server's schemas, the client's
// controls and the deliveries. zod enums are built from these lists where a request names one.
import { z } from 'zod';

/** Reference pressures of the potential density anomalies σ0 … σ4, dbar (TEOS-10). */
export const REFERENCE_PRESSURES = [0, 1000, 2000, 3000, 4000] as const;
export type ReferencePressure = (typeof REFERENCE_PRESSURES)[number];
export const referencePressureSchema = z.coerce
  .number()
  .refine(
    (v): v is ReferencePressure => (REFERENCE_PRESSURES as readonly number[]).includes(v),
    `the reference pressure is one of ${REFERENCE_PRESSURES.join(', ')} dbar`,
  );

/** How a remap treats density inversions (docs/science.md §3.3). */
export const INVERSION_HANDLINGS = ['sort', 'drop', 'raw'] as const;
export type InversionHandling = (typeof INVERSION_HANDLINGS)[number];
export const inversionHandlingSchema = z.enum(INVERSION_HANDLINGS);

/** Interpolation between levels: linear in σ, or monotone piecewise-cubic (Fritsch & Carlson 1980). */
export const INTERPOLATIONS = ['linear', 'pchip'] as const;
export type Interpolation = (typeof INTERPOLATIONS)[number];
export const interpolationSchema = z.enum(INTERPOLATIONS);

/** The roles a member holds on a cruise, in the order screens list them. */
export const ROLES = ['chief_scientist', 'technician', 'analyst', 'pi'] as const;
export type Role = (typeof ROLES)[number];
export const roleSchema = z.enum(ROLES);

/** What a role is called on screen and in mail. */
export const ROLE_LABELS: Readonly<Record<Role, string>> = {
  chief_scientist: 'Chief scientist',
  technician: 'Technician',
  analyst: 'Analyst',
  pi: 'Principal investigator',
};
