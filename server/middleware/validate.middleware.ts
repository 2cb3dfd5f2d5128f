import type { RequestHandler } from 'express';
import type { ZodType } from 'zod';

/**
 * Parses path parameters, body and/or query with the shared zod schemas; a ZodError goes to the error handler (400
 * with the issues listed). Parsed values replace the raw ones, so routes read clean, typed input.
 */
export function validate(schemas: { body?: ZodType; query?: ZodType; params?: ZodType }): RequestHandler {
  return (req, _res, next) => {
    if (schemas.params) req.params = schemas.params.parse(req.params) as typeof req.params;
    if (schemas.body) req.body = schemas.body.parse(req.body ?? {});
    if (schemas.query) {
      // Express 5 exposes req.query through a getter; shadow it with the parsed value.
      Object.defineProperty(req, 'query', { value: schemas.query.parse(req.query), writable: true });
    }
    next();
  };
}
