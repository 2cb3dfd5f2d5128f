import type { NextFunction, Request, RequestHandler, Response } from 'express';
import jwt from 'jsonwebtoken';
import { Passport } from 'passport';
import { ExtractJwt, Strategy as JwtStrategy } from 'passport-jwt';
import { HttpError, unauthorized } from '../errors';
import type { Permission } from '@shared/access/permissions';
import type { AccessService } from '../services/access.service';
import type { AuthService } from '../services/auth.service';
import type { Principal } from '../services/principal';
import {
  ACCESS_AUDIENCE,
  athleteExportScope,
  TOKEN_ISSUER,
  type TokenService,
} from '../services/token.service';

function tokenFailure(info: unknown): HttpError {
  if (info instanceof jwt.TokenExpiredError) {
    return unauthorized('token_expired', 'Your access token expired; refresh it and try again');
  }
  if (info instanceof jwt.JsonWebTokenError)
    return unauthorized('invalid_token', 'The access token is not valid');
  if (info instanceof Error && info.message === 'No auth token') {
    return unauthorized('unauthenticated', 'Sign in first: send a bearer token in Authorization');
  }
  return unauthorized('invalid_token', 'The access token is no longer valid; sign in again');
}

export interface AuthMiddleware {
  /** Requires a valid bearer access token and attaches the principal. */
  authenticate: RequestHandler;
  /** Media routes: a signed `?token=` for this clip (what a <video> element can send) or a bearer token. */
  authenticateMedia: RequestHandler;
  authenticateExport: RequestHandler;
  /** The role check of the access table; must follow authenticate. */
  authorize(permission: Permission): RequestHandler;
}

export function createAuthMiddleware(deps: {
  auth: AuthService;
  access: AccessService;
  tokens: TokenService;
}): AuthMiddleware {
  const passport = new Passport();
  passport.use(
    new JwtStrategy(
      {
        jwtFromRequest: ExtractJwt.fromAuthHeaderAsBearerToken(),
        // The token service's KeyObject (jsonwebtoken takes it as is; a string is re-parsed per call).
        secretOrKey: deps.tokens.key as unknown as string,
        algorithms: ['HS256'],
        audience: ACCESS_AUDIENCE,
        issuer: TOKEN_ISSUER,
      },
      (
        payload: { sub?: unknown; ver?: unknown; sid?: unknown },
        done: (err: unknown, user?: Principal | false) => void,
      ) => {
        if (typeof payload.sub !== 'string') return done(null, false);
        deps.auth
          .loadPrincipal(payload.sub, Number(payload.ver), payload.sid)
          .then((principal) => done(null, principal ?? false))
          .catch(done);
      },
    ),
  );

  const authenticate: RequestHandler = (req, res, next) => {
    passport.authenticate(
      'jwt',
      { session: false },
      (err: unknown, principal: Principal | false, info: unknown) => {
        if (err) return next(err);
        if (!principal) return next(tokenFailure(info));
        req.principal = principal;
        next();
      },
    )(req, res, next);
  };

  /**
   * A signed link (`?token=`) for what a browser loads by address (video, images, a download), bound to
   * one scope; without a token, the bearer token as everywhere else.
   */
  const authenticateSigned =
    (scopeOf: (req: Request) => string, what: string): RequestHandler =>
    (req: Request, res: Response, next: NextFunction) => {
      const token = typeof req.query.token === 'string' ? req.query.token : undefined;
      if (!token) return authenticate(req, res, next);
      let claims;
      try {
        claims = deps.tokens.verifyMedia(token);
      } catch (error) {
        if (error instanceof jwt.TokenExpiredError) {
          return next(
            unauthorized(
              'media_token_expired',
              `The ${what} link expired; ${what === 'media' ? 'reload the clip' : 'ask for the download again'}`,
            ),
          );
        }
        return next(unauthorized('invalid_media_token', `The ${what} link is not valid`));
      }
      if (claims.clip !== scopeOf(req)) {
        return next(unauthorized('invalid_media_token', `The ${what} link is for something else`));
      }
      deps.auth
        .loadPrincipal(claims.sub, claims.ver, claims.sid)
        .then((principal) => {
          if (!principal)
            return next(unauthorized('invalid_media_token', 'The media link is no longer valid'));
          req.principal = principal;
          next();
        })
        .catch(next);
    };

  const authorize =
    (permission: Permission): RequestHandler =>
    (req, _res, next) => {
      if (!req.principal) return next(unauthorized('unauthenticated', 'Sign in first'));
      deps.access.require(req.principal, permission);
      next();
    };

  const authenticateMedia = authenticateSigned((req) => String(req.params.id), 'media');
  const authenticateExport = authenticateSigned(
    (req) => athleteExportScope(String(req.params.id)),
    'download',
  );

  return { authenticate, authenticateMedia, authenticateExport, authorize };
}

/** The principal of an authenticated request (routes run after authenticate). */
export function principalOf(req: Request): Principal {
  if (!req.principal) throw unauthorized('unauthenticated', 'Sign in first');
  return req.principal;
}
