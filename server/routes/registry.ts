// Route factories beyond the foundation's (intake, casts, sections, exports, deliveries).
// Each returns RouteSpecs; add yours to the list.
import type { RouteSpec } from '../lib/routeTable';
import type { AppDeps } from '../lib/deps';
import { uploadRoutes } from './uploads';
import { castRoutes } from './casts';
import { sectionRoutes } from './sections';
import { analysisRoutes } from './analysis';
import { deliveryRoutes } from './deliveries';
import { settingsRoutes } from './settings';

export const extraRouteFactories: ((deps: AppDeps) => RouteSpec[])[] = [uploadRoutes, castRoutes, sectionRoutes, analysisRoutes, deliveryRoutes, settingsRoutes];
