import type { ErrorRequestHandler, RequestHandler } from 'express';
import { MulterError } from 'multer';
import { ZodError } from 'zod';
import type { ApiErrorBody } from '@shared/schemas/error.schema';
import { HttpError } from '../errors';

function formatBytes(bytes: number): string {
  const units = ['bytes', 'KiB', 'MiB', 'GiB', 'TiB'];
  let value = bytes;
  let unit = 0;
  while (value >= 1024 && unit < units.length - 1) {
    value /= 1024;
    unit += 1;
  }
  return `${Number.isInteger(value) ? value : value.toFixed(1)} ${units[unit]}`;
}

function fromMulter(error: MulterError, maxUploadBytes: number): HttpError {
  switch (error.code) {
    case 'LIMIT_FILE_SIZE':
      return new HttpError(
        413,
        'file_too_large',
        `The file is larger than the ${formatBytes(maxUploadBytes)} limit`,
      );
    case 'LIMIT_FILE_COUNT':
    case 'LIMIT_UNEXPECTED_FILE':
      return new HttpError(400, 'unexpected_file', 'Send exactly one file, in the form field "file"');
    default:
      return new HttpError(400, 'bad_upload', `The upload was not accepted: ${error.message}`);
  }
}

/** Unknown /api paths answer in the API's error shape, not with the client app. */
export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new HttpError(404, 'not_found', `No API route ${req.method} ${req.originalUrl.split('?')[0]}`));
};

/** The one place errors become responses: HttpError as is, ZodError 400 with issues, unknown 500. */
export function createErrorHandler(opts: { maxUploadBytes: number }): ErrorRequestHandler {
  return (error: unknown, req, res, next) => {
    if (res.headersSent) return next(error);
    let http: HttpError;
    if (error instanceof HttpError) {
      http = error;
      if (http.status >= 500) req.log?.error({ err: http.cause ?? http, code: http.code }, http.message);
    } else if (error instanceof ZodError) {
      http = new HttpError(
        400,
        'validation_failed',
        error.issues.map((i) => (i.path.length ? `${i.path.join('.')}: ${i.message}` : i.message)).join('; '),
        { issues: error.issues.map((i) => ({ path: i.path, message: i.message, code: i.code })) },
      );
    } else if (error instanceof MulterError) http = fromMulter(error, opts.maxUploadBytes);
    else if (isBodyParserError(error)) {
      http =
        error.type === 'entity.too.large'
          ? new HttpError(413, 'body_too_large', 'The request body is too large')
          : new HttpError(400, 'malformed_body', 'The request body is not valid JSON');
    } else if (isClientHttpError(error)) {
      // http-errors from Express itself (static files not found, bad URL encoding, ...).
      // System errors (ENOENT paths) are not exposed, so they get a plain message.
      const notFoundError = error.status === 404;
      const message = error.expose ? error.message : notFoundError ? 'Not found' : 'Bad request';
      http = new HttpError(error.status, notFoundError ? 'not_found' : 'bad_request', message);
    } else {
      req.log?.error({ err: error }, 'unhandled error');
      http = new HttpError(500, 'internal', 'Something went wrong on the server; the error was logged');
    }
    const body: ApiErrorBody = { error: { code: http.code, message: http.message } };
    if (http.details !== undefined) body.error.details = http.details;
    res.status(http.status).json(body);
  };
}

function isBodyParserError(error: unknown): error is { type: string; status: number } {
  return (
    typeof error === 'object' &&
    error !== null &&
    'type' in error &&
    typeof (error as { type: unknown }).type === 'string' &&
    (error as { type: string }).type.startsWith('entity.')
  );
}

function isClientHttpError(error: unknown): error is { status: number; message: string; expose?: boolean } {
  if (typeof error !== 'object' || error === null) return false;
  const { status } = error as { status?: unknown };
  return typeof status === 'number' && status >= 400 && status < 500;
}
