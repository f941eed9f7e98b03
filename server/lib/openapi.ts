import { z } from 'zod';
import type { RouteSpec } from './routeTable';

const RULE_TEXT = (r: RouteSpec['rule']) =>
  r.kind === 'member'
    ? `member of the cruise${r.roles === 'any' ? '' : ` with role ${r.roles.join(' or ')}`}`
    : r.kind === 'admin'
      ? 'site admin'
      : r.kind === 'signed_in'
        ? 'signed in'
        : 'anyone';

/** The status of a route's success answer: 201 for a creating POST that declares it, else 200. */
const okStatus = (r: RouteSpec) => (r.responses && Object.keys(r.responses).find((c) => c.startsWith('2'))) ?? '200';

/** The OpenAPI 3 document, built from the route table so it cannot drift from the routes. */
export function openApiDocument(routes: RouteSpec[], version: string) {
  const paths: Record<string, Record<string, unknown>> = {};
  for (const r of routes) {
    const path = '/api' + r.path.replace(/:(\w+)/g, '{$1}');
    const params = [...r.path.matchAll(/:(\w+)/g)].map((m) => ({
      name: m[1],
      in: 'path',
      required: true,
      schema: { type: 'string' },
    }));
    const ok: { description: string; content?: object } = { description: 'success' };
    if (r.response)
      ok.content = {
        'application/json': { schema: z.toJSONSchema(r.response, { unrepresentable: 'any', io: 'output' }) },
      };
    const responses: Record<string, { description: string; content?: object }> = { [okStatus(r)]: ok };
    for (const [code, text] of Object.entries(r.responses ?? {}))
      responses[code] = { ...responses[code], description: text };
    if (r.rule.kind !== 'public') responses[401] = { description: 'not signed in' };
    if (r.rule.kind === 'member' || r.rule.kind === 'admin')
      responses[403] = { description: 'signed in without the role' };
    if (r.rule.kind === 'member')
      responses[404] = { description: 'not a member of the cruise (its existence is not revealed)' };
    const op: Record<string, unknown> = {
      summary: r.summary,
      description: `Who: ${RULE_TEXT(r.rule)}.`,
      parameters: params,
      responses,
      'x-sigmaline-rule': r.rule.kind === 'member' ? { member: r.rule.roles } : r.rule.kind,
    };
    if (r.query) {
      const schema = z.toJSONSchema(r.query, { unrepresentable: 'any', io: 'input' }) as {
        properties?: Record<string, unknown>;
      };
      for (const [name, s] of Object.entries(schema.properties ?? {}))
        (op.parameters as object[]).push({ name, in: 'query', required: false, schema: s });
    }
    if (r.body)
      op.requestBody = {
        required: true,
        content: { 'application/json': { schema: z.toJSONSchema(r.body, { unrepresentable: 'any', io: 'input' }) } },
      };
    (paths[path] ??= {})[r.method] = op;
  }
  return {
    openapi: '3.0.3',
    info: {
      title: 'Sigmaline API',
      version,
      description:
        'Cruises, casts, density-coordinate sections and deliveries. Errors: {"error":{"code","message","details"}}. State-changing requests need the x-csrf-token header from GET /api/auth/csrf.',
    },
    servers: [{ url: '/' }],
    components: {
      securitySchemes: {
        session: { type: 'apiKey', in: 'cookie', name: 'sigmaline.sid' },
        csrf: { type: 'apiKey', in: 'header', name: 'x-csrf-token' },
      },
    },
    paths,
  };
}
