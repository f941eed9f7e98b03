import { z } from 'zod';

/**
 * The one HTTP helper of the client. Every request to the API goes through `http`, which
 * - sends the session cookie (`credentials: 'same-origin'`),
 * - adds the CSRF token to every state-changing request (fetched once from
 *   `GET /api/auth/csrf`, cached, refetched after the session changes or on a 403 `csrf`),
 * - turns the API's error shape into an `ApiError`,
 * - parses every successful response body with the caller's zod schema, so nothing
 *   unchecked crosses into the screens.
 */

export const apiErrorBodySchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    details: z.array(z.unknown()).optional().default([]),
  }),
});

/** One entry of `details` for a form field (the server's 400 `validation`). */
export const fieldDetailSchema = z.object({ field: z.string(), message: z.string() });
export type FieldDetail = z.infer<typeof fieldDetailSchema>;

export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly details: unknown[];

  constructor(status: number, code: string, message: string, details: unknown[] = []) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.details = details;
  }

  /** The `{field, message}` items of a validation error, keyed by field. */
  fieldErrors(): Record<string, string> {
    const out: Record<string, string> = {};
    for (const item of this.details) {
      const parsed = fieldDetailSchema.safeParse(item);
      if (parsed.success && !(parsed.data.field in out)) out[parsed.data.field] = parsed.data.message;
    }
    return out;
  }
}

export function isApiError(error: unknown, status?: number): error is ApiError {
  return error instanceof ApiError && (status === undefined || error.status === status);
}

type Method = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';

export interface RequestOptions<S extends z.ZodType | undefined> {
  method?: Method;
  body?: unknown;
  /** Schema of a successful response body; omit for 204 responses. */
  schema?: S;
  /** The request signs in or out, so the server issues a new session and CSRF token. */
  changesSession?: boolean;
  signal?: AbortSignal;
}

const csrfResponseSchema = z.object({ token: z.string().min(1) });

let csrfToken: Promise<string> | null = null;

/** Forget the cached CSRF token; the next state-changing request fetches a new one. */
export function resetCsrfToken(): void {
  csrfToken = null;
}

function getCsrfToken(): Promise<string> {
  if (!csrfToken) {
    const pending = fetch('/api/auth/csrf', {
      method: 'GET',
      credentials: 'same-origin',
      headers: { accept: 'application/json' },
    }).then(async (response) => {
      if (!response.ok) throw await toApiError(response);
      return csrfResponseSchema.parse(await response.json()).token;
    });
    // A failed fetch must not poison the cache.
    pending.catch(() => {
      if (csrfToken === pending) csrfToken = null;
    });
    csrfToken = pending;
  }
  return csrfToken;
}

async function toApiError(response: Response): Promise<ApiError> {
  let payload: unknown;
  try {
    payload = await response.json();
  } catch {
    payload = null;
  }
  const parsed = apiErrorBodySchema.safeParse(payload);
  if (parsed.success) {
    const { code, message, details } = parsed.data.error;
    return new ApiError(response.status, code, message, details);
  }
  return new ApiError(
    response.status,
    `http_${response.status}`,
    response.statusText || `The server answered ${response.status}.`,
  );
}

type Result<S> = S extends z.ZodType ? z.output<S> : undefined;

export async function http<S extends z.ZodType | undefined = undefined>(
  path: string,
  options: RequestOptions<S> = {},
): Promise<Result<S>> {
  const method = options.method ?? 'GET';
  const mutating = method !== 'GET';

  const send = async (): Promise<Response> => {
    const headers: Record<string, string> = { accept: 'application/json' };
    if (options.body !== undefined) headers['content-type'] = 'application/json';
    if (mutating) headers['x-csrf-token'] = await getCsrfToken();
    return fetch(path, {
      method,
      headers,
      credentials: 'same-origin',
      body: options.body === undefined ? undefined : JSON.stringify(options.body),
      signal: options.signal,
    });
  };

  let response = await send();
  if (!response.ok) {
    let error = await toApiError(response);
    if (mutating && error.status === 403 && error.code === 'csrf') {
      // The session (and with it the token) changed under us: fetch a fresh token, try once more.
      resetCsrfToken();
      response = await send();
      if (!response.ok) error = await toApiError(response);
    }
    if (!response.ok) throw error;
  }

  if (options.changesSession) resetCsrfToken();

  if (!options.schema) return undefined as Result<S>;
  if (response.status === 204) {
    throw new ApiError(response.status, 'empty_response', `Expected a response body from ${path}.`);
  }
  let payload: unknown;
  try {
    payload = await response.json();
  } catch {
    throw new ApiError(response.status, 'bad_response', `The server sent something other than JSON for ${path}.`);
  }
  const parsed = options.schema.safeParse(payload);
  if (!parsed.success) {
    throw new ApiError(
      response.status,
      'bad_response',
      `The server's answer for ${path} did not have the expected shape.`,
      parsed.error.issues,
    );
  }
  return parsed.data as Result<S>;
}
