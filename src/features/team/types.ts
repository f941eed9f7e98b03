import { z } from 'zod';
import { roleSchema } from '../auth';

const id = z.union([z.string(), z.number()]).transform(String);

export const memberSchema = z.object({
  userId: id,
  name: z.string(),
  email: z.string(),
  role: roleSchema,
});
export type Member = z.infer<typeof memberSchema>;
export const memberListSchema = z.array(memberSchema);

export const invitationSchema = z.object({
  id,
  email: z.string(),
  role: roleSchema,
  createdAt: z.string(),
  expiresAt: z.string().nullable(),
  acceptedAt: z.string().nullable(),
});
export type Invitation = z.infer<typeof invitationSchema>;
export const invitationListSchema = z.array(invitationSchema);

/** What `POST /members` answers; the invitation may come back in full or in part. */
export const inviteResultSchema = z.object({
  invitation: z.object({ id, email: z.string(), role: roleSchema }).loose(),
});

/** What the person following an invitation link sees before accepting. */
export const invitationPreviewSchema = z.object({
  email: z.string(),
  role: roleSchema,
  cruise: z.object({ id, name: z.string(), ship: z.string() }),
  invitedBy: z.string(),
  accountExists: z.boolean(),
});
export type InvitationPreview = z.infer<typeof invitationPreviewSchema>;

export const inviteFormSchema = z.object({
  email: z.string().trim().min(1, 'Enter an e-mail address.').pipe(z.email('That is not an e-mail address.')),
  role: roleSchema,
});
