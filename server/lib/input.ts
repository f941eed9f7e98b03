// Input checks every route gets from the route table, before its rule and handler run
// (docs/security.md): malformed but plausible input answers 400 with the error shape.
//  - ids in the path (`:id`, `:userId`, `:setId`, …) are UUIDs;
//  - no NUL character anywhere in the path, the query or the body (PostgreSQL text cannot hold one);
//  - no prototype key (`__proto__`, `constructor`, `toString`, …) as a query name or value, nor as
//    a key of a JSON body: such names reach object lookups by name.
import type { Request } from 'express';
import { HttpError, badRequest } from './errors';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
export const isUuid = (v: string) => UUID.test(v);

/** Names on Object.prototype (and `prototype`): never a column, variable or option name. */
export const PROTOTYPE_KEYS: ReadonlySet<string> = new Set([
  ...Object.getOwnPropertyNames(Object.prototype),
  'prototype',
]);
const isPrototypeKey = (s: string) => PROTOTYPE_KEYS.has(s.trim());

const MAX_DEPTH = 40;

function bodyProblem(v: unknown, path: string, depth: number): HttpError | null {
  if (depth > MAX_DEPTH)
    return badRequest('The request body nests too deeply.', [{ field: path, message: 'too deep' }], 'bad_body');
  if (typeof v === 'string')
    return v.includes('\u0000')
      ? badRequest(
          'Text may not hold a NUL character.',
          [{ field: path || 'body', message: 'NUL character' }],
          'bad_text',
        )
      : null;
  if (Array.isArray(v)) {
    for (let i = 0; i < v.length; i++) {
      const p = bodyProblem(v[i], `${path}.${i}`, depth + 1);
      if (p) return p;
    }
    return null;
  }
  if (v && typeof v === 'object') {
    for (const k of Object.keys(v)) {
      const at = path ? `${path}.${k}` : k;
      if (k.includes('\u0000'))
        return badRequest('Names may not hold a NUL character.', [{ field: at, message: 'NUL character' }], 'bad_text');
      if (k === '__proto__' || k === 'constructor' || k === 'prototype')
        return badRequest(
          `"${k}" is not allowed as a name in the body.`,
          [{ field: at, message: 'reserved name' }],
          'bad_body',
        );
      const p = bodyProblem((v as Record<string, unknown>)[k], at, depth + 1);
      if (p) return p;
    }
  }
  return null;
}

function queryValues(v: unknown): string[] {
  if (typeof v === 'string') return [v];
  if (Array.isArray(v)) return v.flatMap(queryValues);
  if (v && typeof v === 'object') return Object.values(v).flatMap(queryValues);
  return [];
}

/** Ids in the path: `:id` (which finds the cruise) before the rule runs, `:userId`, `:setId`, … after
 * it, so that a non-member learns nothing about what lies under a cruise. */
export function idProblem(req: Request, which: 'id' | 'children'): HttpError | null {
  for (const [name, value] of Object.entries(req.params ?? {})) {
    if (typeof value !== 'string') continue;
    const wanted = which === 'id' ? name === 'id' : name !== 'id' && /Id$/.test(name);
    if (wanted && !isUuid(value))
      return badRequest(`The ${name} in the path is not an id.`, [{ field: name, message: 'not a UUID' }], 'bad_id');
  }
  return null;
}

/** The first problem with the request's path (NUL, the `:id`), query or body, or null. */
export function inputProblem(req: Request): HttpError | null {
  for (const [name, value] of Object.entries(req.params ?? {})) {
    if (typeof value === 'string' && value.includes('\u0000'))
      return badRequest(
        'The path may not hold a NUL character.',
        [{ field: name, message: 'NUL character' }],
        'bad_text',
      );
  }
  const id = idProblem(req, 'id');
  if (id) return id;
  const q = (req.query ?? {}) as Record<string, unknown>;
  for (const name of Object.keys(q)) {
    if (isPrototypeKey(name) || name.includes('\u0000'))
      return badRequest(
        `"${name.split('\u0000').join('\\0')}" is not a query parameter.`,
        [{ field: name, message: 'reserved name' }],
        'bad_query',
      );
    for (const value of queryValues(q[name])) {
      if (value.includes('\u0000'))
        return badRequest(
          'The query may not hold a NUL character.',
          [{ field: name, message: 'NUL character' }],
          'bad_text',
        );
      if (value.split(',').some(isPrototypeKey))
        return badRequest(
          `"${value.slice(0, 40)}" is not a valid value of ${name}.`,
          [{ field: name, message: 'reserved name' }],
          'bad_query',
        );
    }
  }
  return bodyProblem(req.body, '', 0);
}
