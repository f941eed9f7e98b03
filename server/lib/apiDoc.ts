// docs/api.md, rendered from the route table so it cannot drift from the routes (a test compares the
// committed file with a fresh rendering; `npx tsx scripts/make-api-doc.ts` writes it).
import { z } from 'zod';
import type { RouteSpec, Rule } from './routeTable';
import type { AppDeps } from './deps';

const ROLE_TEXT: Record<string, string> = {
  chief_scientist: 'chief scientist',
  technician: 'technician',
  analyst: 'analyst',
  pi: 'PI',
};

function who(rule: Rule): string {
  if (rule.kind === 'public') return 'anyone';
  if (rule.kind === 'signed_in') return 'signed in';
  if (rule.kind === 'admin') return 'site admin';
  return rule.roles === 'any' ? 'member' : rule.roles.map((r) => ROLE_TEXT[r] ?? r).join(', ');
}

/** The field names of an object schema with `?` after optional ones, for a table cell. */
function fields(schema: z.ZodType | undefined, io: 'input' | 'output'): string {
  if (!schema) return '';
  const json = z.toJSONSchema(schema, { unrepresentable: 'any', io }) as {
    properties?: Record<string, unknown>;
    required?: string[];
  };
  const req = new Set(json.required ?? []);
  return Object.keys(json.properties ?? {})
    .map((k) => `\`${k}${req.has(k) ? '' : '?'}\``)
    .join(' ');
}

const area = (path: string) => path.split('/')[1] ?? '';
const cell = (s: string) => s.replace(/\|/g, '\\|').replace(/\n/g, ' ');

const HEAD = `# Sigmaline HTTP API

The whole API, rendered from the route table (\`server/routes/\`), so every route here exists with exactly
this access rule. The machine-readable form is \`GET /api/openapi.json\` (OpenAPI 3, request and, where
declared, response schemas). Do not edit by hand: \`npx tsx scripts/make-api-doc.ts\` writes this file,
and \`tests/api/api-doc.test.ts\` fails when it is stale.

## Conventions (the public contract outside clients rely on)

- JSON in and out, except uploads (multipart, field \`files\`) and downloads (files).
- Errors: \`{"error": {"code", "message", "details": [...]}}\` with a 4xx or 5xx status; file problems
  carry \`{"file", "line", "column", "message"}\` items in \`details\`.
- Sessions by cookie. Every state-changing request carries \`x-csrf-token\` with the value from
  \`GET /api/auth/csrf\`; without it, 403.
- 401 when not signed in, 403 when signed in without the role, 404 for a cruise you are not a member of
  (its existence is not revealed) and for anything inside it.
- Every section-shaped route takes \`line=<id>\`; without it, the cruise's default line.
- \`GET /api/health\`: \`{"status":"ok","db":"ok","storage":"ok","queue":"ok"}\`, or 503 naming the part
  that is down.

In the tables, a field with \`?\` is optional; "who" lists the cruise roles allowed (member of the cruise
required) or the kind of caller.
`;

/** docs/api.md for a route table. */
export function renderApiDoc(routes: readonly RouteSpec[]): string {
  const sorted = [...routes].sort((a, b) => a.path.localeCompare(b.path) || a.method.localeCompare(b.method));
  const areas = [...new Set(sorted.map((r) => area(r.path)))];
  const out = [HEAD];
  for (const a of areas) {
    out.push(`## /api/${a}\n`);
    out.push('| method | path | who | what | body | query |');
    out.push('|---|---|---|---|---|---|');
    for (const r of sorted.filter((x) => area(x.path) === a)) {
      out.push(
        `| ${r.method.toUpperCase()} | \`/api${r.path}\` | ${who(r.rule)} | ${cell(r.summary)} | ${fields(r.body, 'input')} | ${fields(r.query, 'input')} |`,
      );
    }
    out.push('');
  }
  return out.join('\n');
}

/**
 * Dependencies for describing routes without serving them: route factories read settings and keep
 * references to the services, but a description never calls a handler, so every service is inert.
 */
export function describingDeps(settings: AppDeps['settings']): AppDeps {
  const inert: unknown = new Proxy(function inert() {}, {
    get: (_t, key) => (key === 'then' ? undefined : inert),
    apply: () => inert,
  });
  return { settings, db: inert, storage: inert, mailer: inert, queue: inert } as AppDeps;
}
