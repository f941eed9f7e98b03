import type { Role } from './types';

/** How each per-cruise role reads on screen. */
export const ROLE_LABELS: Readonly<Record<Role, string>> = {
  chief_scientist: 'Chief scientist',
  technician: 'Technician',
  analyst: 'Analyst',
  pi: 'Principal investigator',
};

/** The order roles are offered in pickers: who runs the cruise first, then who uses the data. */
export const ROLE_ORDER: readonly Role[] = ['chief_scientist', 'technician', 'analyst', 'pi'];

export function roleLabel(role: Role): string {
  return ROLE_LABELS[role];
}

/** What each role may do on a cruise, as product.md gives it; screens hide what a role cannot do. */
export const can = {
  editCruise: (role: Role | null | undefined) => role === 'chief_scientist',
  planStations: (role: Role | null | undefined) => role === 'chief_scientist',
  manageTeam: (role: Role | null | undefined) => role === 'chief_scientist',
  uploadCasts: (role: Role | null | undefined) => role === 'chief_scientist' || role === 'technician',
} as const;
