import type { Role } from '../auth';

export interface CruiseTab {
  /** Shown in the cruise sub-navigation. */
  label: string;
  /** Relative to `/cruises/:id`; '' is the desk itself. */
  path: string;
  /** Hide the entry from roles that have nothing to do there (the server enforces anyway). */
  visibleTo?: (role: Role | null) => boolean;
}

/**
 * The cruise area's sub-navigation, in the order the work flows:
 * Desk, Intake, Casts, Section, Layer sets, Deliveries, Team.
 * Add an entry here when its route exists (and add the route in src/App.tsx).
 */
export const CRUISE_TABS: readonly CruiseTab[] = [
  { label: 'Desk', path: '' },
  { label: 'Intake', path: 'intake' },
  { label: 'Casts', path: 'casts' },
  { label: 'Section', path: 'section' },
  { label: 'Then and now', path: 'then-and-now' },
  { label: 'Layer sets', path: 'layer-sets' },
  { label: 'Derived variables', path: 'derived' },
  { label: 'Deliveries', path: 'deliveries' },
  { label: 'Team', path: 'team' },
];
