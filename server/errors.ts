/** An error with an HTTP status, a stable code for programs and a sentence for people. */
export class HttpError extends Error {
  constructor(
    public readonly status: number,
    public readonly code: string,
    message: string,
    public readonly details?: unknown,
  ) {
    super(message);
    this.name = 'HttpError';
  }
}

export const badRequest = (message: string, details?: unknown) =>
  new HttpError(400, 'VALIDATION', message, details);
export const unauthenticated = (message = 'Please sign in first.') =>
  new HttpError(401, 'UNAUTHENTICATED', message);
export const forbidden = (message = 'Your account is not allowed to do this.') =>
  new HttpError(403, 'FORBIDDEN', message);
export const notFound = (message = 'Nothing was found at this address.') =>
  new HttpError(404, 'NOT_FOUND', message);
export const conflict = (code: string, message: string, details?: unknown) =>
  new HttpError(409, code, message, details);
