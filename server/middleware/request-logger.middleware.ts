import { randomUUID } from 'node:crypto';
import type { RequestHandler } from 'express';
import type { Logger } from 'pino';
import { pinoHttp } from 'pino-http';

const REQUEST_ID = /^[A-Za-z0-9._-]{1,64}$/;

/** Path segments that follow these carry a secret: invitation and password-reset links. */
const SECRET_PATH = /(\/(?:api\/invitations|invite|api\/auth\/password-reset|reset-password)\/)[^/?#]+/g;
/** Query parameters that carry a secret (signed media links, reset codes, anything named like a password). */
const SECRET_QUERY = /([?&](?:token|code|password|secret|key)=)[^&#]*/gi;

/** The URL as it may be logged: every secret in its path or query replaced by [redacted]. */
export function redactUrl(url: string): string {
  return url.replace(SECRET_PATH, '$1[redacted]').replace(SECRET_QUERY, '$1[redacted]');
}

/** One structured log line per request with a request id (taken from X-Request-Id when sane). */
export function createRequestLogger(logger: Logger): RequestHandler {
  return pinoHttp({
    logger,
    genReqId(req, res) {
      const incoming = req.headers['x-request-id'];
      const id = typeof incoming === 'string' && REQUEST_ID.test(incoming) ? incoming : randomUUID();
      res.setHeader('X-Request-Id', id);
      return id;
    },
    customLogLevel(_req, res, error) {
      if (error || res.statusCode >= 500) return 'error';
      if (res.statusCode >= 400) return 'warn';
      return 'info';
    },
    serializers: {
      req: (req: { id: string; method: string; url: string }) => ({
        id: req.id,
        method: req.method,
        // Invitation links carry their secret in the path, media links in the query. Bodies (passwords)
        // are never logged.
        url: redactUrl(req.url),
      }),
      res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
    },
  });
}
