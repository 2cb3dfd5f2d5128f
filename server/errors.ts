/** The one error type services throw; the error middleware turns it into `{error: {code, message, details}}`. */
export class HttpError extends Error {
  override name = 'HttpError';

  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
    /** The underlying failure; logged for 5xx answers, never sent to the client. */
    options?: { cause?: unknown },
  ) {
    super(message, options);
  }
}

export const badRequest = (code: string, message: string, details?: unknown) =>
  new HttpError(400, code, message, details);
/** A 400 naming the field, as the validation middleware words it, so forms can place it. */
export const fieldError = (field: string, message: string) =>
  badRequest('validation_failed', message, { issues: [{ path: [field], message }] });
export const unauthorized = (code: string, message: string) => new HttpError(401, code, message);
export const forbidden = (message: string) => new HttpError(403, 'forbidden', message);
export const notFound = (what: string) => new HttpError(404, 'not_found', `${what} not found`);
export const conflict = (code: string, message: string, details?: unknown) =>
  new HttpError(409, code, message, details);
