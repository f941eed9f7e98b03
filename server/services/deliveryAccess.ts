// Who may download a delivery: ONE rule, read by the download route, by the delivery list the screen
// shows (each delivery's `canDownload`) and by the release e-mail (sent only to those who may).
//
// The rule: before release, a delivery is work in progress of those who build deliveries (PI, chief
// scientist, analyst); once the PI releases it, every member of the cruise may download it, whatever
// the role (technicians included: the release e-mail invites them to).
import type { Role } from '../models/index';

/** Roles that build, see unreleased and delete deliveries. */
export const DELIVERY_BUILDERS = ['pi', 'chief_scientist', 'analyst'] as const satisfies readonly Role[];

/** Whether a member with this role may download this delivery (null role: not a member). */
export function mayDownload(role: Role | null | undefined, d: { released: boolean }): boolean {
  if (!role) return false;
  if (d.released) return true;
  return (DELIVERY_BUILDERS as readonly Role[]).includes(role);
}

/** The members the release e-mail goes to: those the rule lets download the released delivery. */
export function releaseRecipients<M extends { role: Role; email: string }>(members: readonly M[]): string[] {
  return members.filter((m) => mayDownload(m.role, { released: true })).map((m) => m.email);
}
