import { z } from 'zod';
import { apiErrorBodySchema, ApiError, http } from '../../lib/http';
import { uploadBatchSchema, type Upload } from './types';

/**
 * Sending one file to `POST /api/cruises/:id/uploads` with XMLHttpRequest, because only XHR
 * reports bytes sent (`upload.onprogress`); fetch cannot. One request per file, so every file has
 * its own bar. The CSRF token comes from the same route the http helper uses; a 403 `csrf` (the
 * session changed) gets a fresh token and one more try, as the helper does.
 */

const csrfSchema = z.object({ token: z.string().min(1) });

let token: Promise<string> | null = null;
function csrfToken(fresh = false): Promise<string> {
  if (fresh || !token) {
    const pending = http('/api/auth/csrf', { schema: csrfSchema }).then((r) => r.token);
    pending.catch(() => {
      if (token === pending) token = null;
    });
    token = pending;
  }
  return token;
}

/** Forget the cached token (tests; after sign-out). */
export function resetUploadToken(): void {
  token = null;
}

export interface SendProgress {
  loaded: number;
  total: number;
}

export interface SendOptions {
  onProgress?: (progress: SendProgress) => void;
  signal?: AbortSignal;
}

function errorFrom(xhr: XMLHttpRequest, filename: string): ApiError {
  let body: unknown;
  try {
    body = JSON.parse(xhr.responseText);
  } catch {
    body = null;
  }
  const parsed = apiErrorBodySchema.safeParse(body);
  if (parsed.success)
    return new ApiError(xhr.status, parsed.data.error.code, parsed.data.error.message, parsed.data.error.details);
  if (xhr.status === 413) return new ApiError(413, 'too_large', `${filename} is larger than the server accepts.`);
  if (xhr.status === 503)
    return new ApiError(
      503,
      'storage_unavailable',
      `Storage is not reachable; ${filename} was not stored. Try again later.`,
    );
  return new ApiError(
    xhr.status,
    `http_${xhr.status}`,
    xhr.statusText || `The server answered ${xhr.status} for ${filename}.`,
  );
}

function sendOnce(cruiseId: string, file: File, csrf: string, options: SendOptions): Promise<Upload[]> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `/api/cruises/${encodeURIComponent(cruiseId)}/uploads`);
    xhr.setRequestHeader('accept', 'application/json');
    xhr.setRequestHeader('x-csrf-token', csrf);
    xhr.upload.onprogress = (e: ProgressEvent) => {
      options.onProgress?.({ loaded: e.loaded, total: e.lengthComputable && e.total > 0 ? e.total : file.size });
    };
    xhr.onload = () => {
      if (xhr.status >= 200 && xhr.status < 300) {
        let body: unknown;
        try {
          body = JSON.parse(xhr.responseText);
        } catch {
          reject(
            new ApiError(xhr.status, 'bad_response', `The server sent something other than JSON for ${file.name}.`),
          );
          return;
        }
        const parsed = uploadBatchSchema.safeParse(body);
        if (!parsed.success) {
          reject(
            new ApiError(
              xhr.status,
              'bad_response',
              `The server's answer for ${file.name} did not have the expected shape.`,
              parsed.error.issues,
            ),
          );
          return;
        }
        resolve(parsed.data.uploads);
      } else {
        reject(errorFrom(xhr, file.name));
      }
    };
    xhr.onerror = () => reject(new ApiError(0, 'network', `The connection dropped while sending ${file.name}.`));
    xhr.onabort = () => reject(new ApiError(0, 'aborted', `Sending ${file.name} was cancelled.`));
    if (options.signal) {
      if (options.signal.aborted) {
        reject(new ApiError(0, 'aborted', `Sending ${file.name} was cancelled.`));
        return;
      }
      options.signal.addEventListener('abort', () => xhr.abort(), { once: true });
    }
    const form = new FormData();
    form.append('files', file, file.name);
    xhr.send(form);
  });
}

/** Send one file; resolves with the upload records the server made (one, or one per zip entry). */
export async function sendFile(cruiseId: string, file: File, options: SendOptions = {}): Promise<Upload[]> {
  try {
    return await sendOnce(cruiseId, file, await csrfToken(), options);
  } catch (error) {
    if (error instanceof ApiError && error.status === 403 && error.code === 'csrf') {
      return sendOnce(cruiseId, file, await csrfToken(true), options);
    }
    throw error;
  }
}
