import { defineRoute, type RouteSpec } from '../lib/routeTable';
import type { AppDeps } from '../lib/deps';

export function adminRoutes(deps: AppDeps): RouteSpec[] {
  return [
    defineRoute({
      method: 'get',
      path: '/admin/mail',
      summary: 'Outgoing mail caught by the local SMTP fake (development)',
      rule: { kind: 'admin' },
      handler: async () => (await deps.mailer.caught()).slice().reverse(),
    }),
  ];
}
