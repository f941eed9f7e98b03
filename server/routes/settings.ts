// The configured values screens must agree with (shared/api/settings.ts).
import { defineRoute, type RouteSpec } from '../lib/routeTable';
import type { AppDeps } from '../lib/deps';
import { clientSettingsSchema, type ClientSettings } from '../../shared/api/settings';

export function settingsRoutes(deps: AppDeps): RouteSpec[] {
  return [
    defineRoute({
      method: 'get',
      path: '/settings',
      summary: 'Configured values the screens use (inversion threshold, upload limit)',
      rule: { kind: 'signed_in' },
      response: clientSettingsSchema,
      handler: (): ClientSettings => ({
        inversionThreshold: deps.settings.INVERSION_THRESHOLD,
        uploadMaxBytes: deps.settings.UPLOAD_MAX_BYTES,
      }),
    }),
  ];
}
