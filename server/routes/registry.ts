// Every route module of the API, in one list: the app mounts what these factories return, and the
// OpenAPI document, docs/api.md and the role × route matrix are built from the same routes.
import type { RouteSpec } from '../lib/routeTable';
import type { AppDeps } from '../lib/deps';
import { authRoutes } from './auth';
import { cruiseRoutes } from './cruises';
import { teamRoutes } from './team';
import { adminRoutes } from './admin';
import { uploadRoutes } from './uploads';
import { castRoutes } from './casts';
import { sectionRoutes } from './sections';
import { analysisRoutes } from './analysis';
import { deliveryRoutes } from './deliveries';
import { castLifeRoutes } from './castLife';
import { settingsRoutes } from './settings';
import { lineRoutes } from './lines';
import { qcRoutes } from './qc';
import { comparisonRoutes } from './comparisons';

type RouteFactory = (deps: AppDeps) => RouteSpec[];

/** The route modules after the foundation's; add a new area's factory here. */
export const extraRouteFactories: RouteFactory[] = [
  uploadRoutes,
  castRoutes,
  sectionRoutes,
  analysisRoutes,
  deliveryRoutes,
  settingsRoutes,
  lineRoutes,
  qcRoutes,
  castLifeRoutes,
  comparisonRoutes,
];

/** Every route module, the foundation's first. */
export const routeFactories: RouteFactory[] = [
  authRoutes,
  cruiseRoutes,
  teamRoutes,
  adminRoutes,
  ...extraRouteFactories,
];

/** Every route of the API. */
export function allRoutes(deps: AppDeps): RouteSpec[] {
  return routeFactories.flatMap((f) => f(deps));
}
