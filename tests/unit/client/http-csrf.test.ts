import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { z } from 'zod';
import { ApiError, http, resetCsrfToken } from '../../../src/lib/http';

type Call = { url: string; method: string; headers: Record<string, string>; body?: string; credentials?: string };

function json(status: number, body: unknown): Response {
  return new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });
}

/**
 * A fake server: hands out numbered CSRF tokens and accepts a mutation only when it carries
 * the token most recently issued (as a real session-bound token would behave).
 */
function fakeServer() {
  const calls: Call[] = [];
  let issued = 0;
  let valid = '';
  const routes: Record<string, (call: Call) => Response> = {};
  const fetchMock = vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const call: Call = {
      url: String(input),
      method: init?.method ?? 'GET',
      headers: { ...(init?.headers as Record<string, string>) },
      body: init?.body as string | undefined,
      credentials: init?.credentials,
    };
    calls.push(call);
    if (call.url === '/api/auth/csrf') {
      issued += 1;
      valid = `token-${issued}`;
      return json(200, { token: valid });
    }
    if (call.method !== 'GET' && call.headers['x-csrf-token'] !== valid) {
      return json(403, { error: { code: 'csrf', message: 'Missing or stale CSRF token', details: [] } });
    }
    const handler = routes[`${call.method} ${call.url}`];
    return handler ? handler(call) : json(404, { error: { code: 'not_found', message: 'No route', details: [] } });
  });
  return {
    calls,
    fetchMock,
    routes,
    /** The server starts a new session (e.g. it expired): old tokens stop working. */
    rotate: () => {
      valid = 'rotated-on-server';
    },
    csrfFetches: () => calls.filter((c) => c.url === '/api/auth/csrf').length,
  };
}

describe('http helper: CSRF', () => {
  let server: ReturnType<typeof fakeServer>;

  beforeEach(() => {
    resetCsrfToken();
    server = fakeServer();
    vi.stubGlobal('fetch', server.fetchMock);
    server.routes['POST /api/cruises'] = () => json(201, { id: 7 });
    server.routes['GET /api/cruises'] = () => json(200, []);
    server.routes['POST /api/auth/login'] = () => json(200, { user: { id: 1 } });
  });
  afterEach(() => vi.unstubAllGlobals());

  it('does not fetch a token for GET requests and sends no token header', async () => {
    await http('/api/cruises', { schema: z.array(z.unknown()) });
    expect(server.csrfFetches()).toBe(0);
    expect(server.calls[0].headers['x-csrf-token']).toBeUndefined();
    expect(server.calls[0].credentials).toBe('same-origin');
  });

  it('fetches the token once and reuses it for later mutations', async () => {
    await http('/api/cruises', { method: 'POST', body: { name: 'A' } });
    await http('/api/cruises', { method: 'POST', body: { name: 'B' } });
    expect(server.csrfFetches()).toBe(1);
    const posts = server.calls.filter((c) => c.method === 'POST');
    expect(posts.map((c) => c.headers['x-csrf-token'])).toEqual(['token-1', 'token-1']);
    expect(posts[0].credentials).toBe('same-origin');
    expect(JSON.parse(posts[0].body ?? '')).toEqual({ name: 'A' });
  });

  it('shares one token fetch between concurrent mutations', async () => {
    await Promise.all([
      http('/api/cruises', { method: 'POST', body: {} }),
      http('/api/cruises', { method: 'POST', body: {} }),
    ]);
    expect(server.csrfFetches()).toBe(1);
  });

  it('refetches the token and retries once on a 403 csrf', async () => {
    await http('/api/cruises', { method: 'POST', body: {} });
    server.rotate();
    const result = await http('/api/cruises', { method: 'POST', body: {}, schema: z.object({ id: z.number() }) });
    expect(result).toEqual({ id: 7 });
    expect(server.csrfFetches()).toBe(2);
    const posts = server.calls.filter((c) => c.method === 'POST');
    expect(posts.map((c) => c.headers['x-csrf-token'])).toEqual(['token-1', 'token-1', 'token-2']);
  });

  it('does not retry a 403 that is not about CSRF', async () => {
    server.routes['POST /api/cruises/1/members'] = () =>
      json(403, { error: { code: 'forbidden', message: 'Chief scientists only', details: [] } });
    const error = await http('/api/cruises/1/members', { method: 'POST', body: {} }).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect((error as ApiError).code).toBe('forbidden');
    expect(server.calls.filter((c) => c.url === '/api/cruises/1/members')).toHaveLength(1);
  });

  it('forgets the token after a request that changes the session', async () => {
    await http('/api/auth/login', { method: 'POST', body: {}, changesSession: true });
    await http('/api/cruises', { method: 'POST', body: {} });
    expect(server.csrfFetches()).toBe(2);
    const create = server.calls.find((c) => c.url === '/api/cruises' && c.method === 'POST');
    expect(create?.headers['x-csrf-token']).toBe('token-2');
  });

  it('turns the error shape into an ApiError with code, message and details', async () => {
    server.routes['POST /api/cruises'] = () =>
      json(400, {
        error: { code: 'validation', message: 'Invalid cruise', details: [{ field: 'ship', message: 'Required' }] },
      });
    const error = (await http('/api/cruises', { method: 'POST', body: {} }).catch((e: unknown) => e)) as ApiError;
    expect(error).toBeInstanceOf(ApiError);
    expect(error.status).toBe(400);
    expect(error.code).toBe('validation');
    expect(error.fieldErrors()).toEqual({ ship: 'Required' });
  });

  it('rejects a response that does not match the schema', async () => {
    server.routes['GET /api/cruises'] = () => json(200, [{ id: 'x' }]);
    const error = (await http('/api/cruises', { schema: z.array(z.object({ name: z.string() })) }).catch(
      (e: unknown) => e,
    )) as ApiError;
    expect(error).toBeInstanceOf(ApiError);
    expect(error.code).toBe('bad_response');
  });
});
