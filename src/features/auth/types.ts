import { z } from 'zod';

export const roleSchema = z.enum(['chief_scientist', 'technician', 'analyst', 'pi']);
export type Role = z.infer<typeof roleSchema>;

export const userSchema = z.object({
  id: z.union([z.string(), z.number()]).transform(String),
  email: z.string(),
  name: z.string(),
  isAdmin: z.boolean(),
});
export type User = z.infer<typeof userSchema>;

export const membershipSchema = z.object({
  cruiseId: z.union([z.string(), z.number()]).transform(String),
  role: roleSchema,
});
export type Membership = z.infer<typeof membershipSchema>;

export const meSchema = z.object({
  user: userSchema,
  memberships: z.array(membershipSchema),
});
export type Me = z.infer<typeof meSchema>;

export const signedInSchema = z.object({ user: userSchema });
