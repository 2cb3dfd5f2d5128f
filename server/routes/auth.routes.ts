import { Router, type Response } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import {
  loginSchema,
  logoutSchema,
  type LoginInput,
  type LoginResponse,
  type LogoutInput,
} from '@shared/schemas/auth.schema';
import { HttpError } from '../errors';
import { principalOf } from '../middleware/auth.middleware';
import { validate } from '../middleware/validate.middleware';
import type { SignedIn } from '../services/auth.service';
import type { RouteContext } from './context';

export const REFRESH_COOKIE = 'stanceline_refresh';
const COOKIE_PATH = '/api/auth';

export function setRefreshCookie(res: Response, signedIn: SignedIn, secure: boolean): LoginResponse {
  res.cookie(REFRESH_COOKIE, signedIn.refreshToken, {
    httpOnly: true,
    sameSite: 'lax',
    secure,
    path: COOKIE_PATH,
    expires: signedIn.refreshExpiresAt,
  });
  return { accessToken: signedIn.accessToken, user: signedIn.user };
}

export function authRoutes(ctx: RouteContext): Router {
  const router = Router();
  const { guard } = ctx;
  const loginLimiter = rateLimit({
    windowMs: 15 * 60_000,
    limit: ctx.config.loginRateLimit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    // Per address and e-mail, so one locked-out member does not lock out a shared club network.
    keyGenerator: (req) =>
      `${ipKeyGenerator(req.ip ?? 'unknown')}|${typeof req.body?.email === 'string' ? req.body.email.toLowerCase() : ''}`,
    handler: (_req, _res, next) =>
      next(
        new HttpError(429, 'too_many_attempts', 'Too many sign-in attempts; wait 15 minutes and try again'),
      ),
  });

  router.post('/api/auth/login', loginLimiter, validate({ body: loginSchema }), async (req, res) => {
    const signedIn = await ctx.auth.login(req.body as LoginInput);
    res.json(setRefreshCookie(res, signedIn, ctx.config.cookieSecure));
  });

  router.post('/api/auth/refresh', async (req, res) => {
    const token = (req.cookies as Record<string, string | undefined>)[REFRESH_COOKIE];
    try {
      const signedIn = await ctx.auth.refresh(token);
      res.json(setRefreshCookie(res, signedIn, ctx.config.cookieSecure));
    } catch (error) {
      res.clearCookie(REFRESH_COOKIE, { path: COOKIE_PATH });
      throw error;
    }
  });

  // No bearer needed: an expired access token must not stop a member from signing out.
  router.post('/api/auth/logout', validate({ body: logoutSchema }), async (req, res) => {
    const { everywhere } = req.body as LogoutInput;
    await ctx.auth.logout((req.cookies as Record<string, string | undefined>)[REFRESH_COOKIE], everywhere);
    res.clearCookie(REFRESH_COOKIE, { path: COOKIE_PATH });
    res.status(204).end();
  });

  router.get('/api/me', guard.authenticate, guard.authorize('me:read'), async (req, res) => {
    res.json(await ctx.auth.me(principalOf(req)));
  });

  return router;
}
