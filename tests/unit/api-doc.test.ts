// docs/api.md is the route table rendered (server/lib/apiDoc.ts), and the route table holds every route
// of the public contract that outside clients rely on (the product's HTTP contract: cruises, uploads,
// casts, sections, exports, deliveries, lines, comparisons).
import { describe, it, expect } from 'vitest';
import { readFileSync } from 'node:fs';
import { allRoutes } from '../../server/routes/registry';
import { renderApiDoc, describingDeps } from '../../server/lib/apiDoc';
import { loadSettings } from '../../server/config';

const routes = allRoutes(describingDeps(loadSettings({})));

/** The public contract: method and path of every route outside clients call, with who may call it. */
const CONTRACT: [string, string, string][] = [
  ['get', '/auth/csrf', 'anyone'],
  ['post', '/auth/login', 'anyone'],
  ['post', '/auth/logout', 'signed in'],
  ['get', '/auth/me', 'signed in'],
  ['post', '/cruises', 'signed in'],
  ['get', '/cruises', 'signed in'],
  ['get', '/cruises/:id', 'member'],
  ['post', '/cruises/:id/members', 'chief_scientist'],
  ['post', '/cruises/:id/uploads', 'technician,chief_scientist'],
  ['get', '/uploads/:id', 'member'],
  ['get', '/cruises/:id/casts', 'member'],
  ['get', '/casts/:id', 'member'],
  ['get', '/cruises/:id/section', 'member'],
  ['get', '/cruises/:id/exports/isopycnal.csv', 'pi,chief_scientist,analyst'],
  ['get', '/cruises/:id/exports/pressure.csv', 'pi,chief_scientist,analyst'],
  ['post', '/cruises/:id/deliveries', 'pi,chief_scientist,analyst'],
  ['get', '/deliveries/:id', 'member'],
  ['get', '/cruises/:id/lines', 'member'],
  ['post', '/cruises/:id/lines', 'chief_scientist,analyst'],
  ['patch', '/lines/:id', 'chief_scientist,analyst'],
  ['delete', '/lines/:id', 'chief_scientist,analyst'],
  ['post', '/comparisons', 'member'],
];

const ruleText = (r: (typeof routes)[number]['rule']) =>
  r.kind === 'member'
    ? r.roles === 'any'
      ? 'member'
      : [...r.roles].sort().join(',')
    : r.kind === 'signed_in'
      ? 'signed in'
      : r.kind === 'public'
        ? 'anyone'
        : r.kind;

describe('the API documents', () => {
  it('docs/api.md is current (regenerate with `npx tsx scripts/make-api-doc.ts`)', () => {
    const committed = readFileSync(new URL('../../docs/api.md', import.meta.url), 'utf8');
    expect(committed).toBe(renderApiDoc(routes));
  });

  it.each(CONTRACT)('the contract route %s %s exists with its access rule', (method, path, who) => {
    const r = routes.find((x) => x.method === method && x.path === path);
    expect(r, `${method.toUpperCase()} ${path}`).toBeDefined();
    const expected = who.includes(',') || who === 'chief_scientist' ? who.split(',').sort().join(',') : who;
    if (r!.rule.kind === 'member' && r!.rule.roles !== 'any' && who === 'member') {
      // a contract route open to members may be narrowed to all four roles spelled out
      expect([...r!.rule.roles].sort()).toEqual(['analyst', 'chief_scientist', 'pi', 'technician']);
    } else expect(ruleText(r!.rule)).toBe(expected);
  });

  it('every route path is unique per method', () => {
    const keys = routes.map((r) => `${r.method} ${r.path}`);
    expect(new Set(keys).size).toBe(keys.length);
  });
});
