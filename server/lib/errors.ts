// The one error shape of the API: {"error": {"code", "message", "details"}}.
export type FileProblem = { file: string; line: number | null; column: number | null; message: string };
export type ErrorDetail = FileProblem | { field: string; message: string } | Record<string, unknown>;

export class HttpError extends Error {
  constructor(
    public readonly status: number,
    public readonly code: string,
    message: string,
    public readonly details: ErrorDetail[] = [],
  ) {
    super(message);
  }
}

export const badRequest = (message: string, details: ErrorDetail[] = [], code = 'validation') =>
  new HttpError(400, code, message, details);
export const unauthorized = () => new HttpError(401, 'unauthenticated', 'Sign in to continue.');
export const forbidden = (message = 'Your role on this cruise does not allow this.') =>
  new HttpError(403, 'forbidden', message);
export const notFound = (what = 'Not found') => new HttpError(404, 'not_found', what);
export const conflict = (message: string) => new HttpError(409, 'conflict', message);

export function errorBody(code: string, message: string, details: ErrorDetail[] = []) {
  return { error: { code, message, details } };
}
