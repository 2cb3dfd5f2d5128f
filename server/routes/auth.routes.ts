import { Router, type Request, type Response } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import {
  changePasswordSchema,
  loginSchema,
  logoutSchema,
  passwordResetCompleteSchema,
  passwordResetRequestSchema,
  type ChangePasswordInput,
  type PasswordResetCompleteInput,
  type PasswordResetRequestInput,
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
const LOGIN_WINDOW_MS = 15 * 60_000;
/** Sign-in attempts one address may make over all accounts, in multiples of the per-account limit. */
const ADDRESS_LIMIT_FACTOR = 5;

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
  const limiter = (name: string, limit: number, key: (req: Request) => string) =>
    rateLimit({
      windowMs: LOGIN_WINDOW_MS,
      limit,
      standardHeaders: 'draft-8',
      legacyHeaders: false,
      // Counted in the database: every server process sees the same attempts.
      store: ctx.rateLimitStore(`login-${name}:`),
      keyGenerator: key,
      handler: (_req, _res, next) =>
        next(
          new HttpError(429, 'too_many_attempts', 'Too many sign-in attempts; wait 15 minutes and try again'),
        ),
    });
  const address = (req: Request) => ipKeyGenerator(req.ip ?? 'unknown');
  // Per address and account, so one locked-out member does not lock out a shared club network. The
  // e-mail is the one sign-in uses (trimmed, lower case: validation runs first), so spelling it
  // differently gives no fresh tries.
  const perAccount = limiter(
    'account',
    ctx.config.loginRateLimit,
    (req) => `${address(req)}|${(req.body as LoginInput).email}`,
  );
  // Per address over all accounts, so one address cannot try account after account.
  const perAddress = limiter('address', ctx.config.loginRateLimit * ADDRESS_LIMIT_FACTOR, address);

  router.post(
    '/api/auth/login',
    validate({ body: loginSchema }),
    perAddress,
    perAccount,
    async (req, res) => {
      const signedIn = await ctx.auth.login(req.body as LoginInput);
      res.json(setRefreshCookie(res, signedIn, ctx.config.cookieSecure));
    },
  );

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

  router.post(
    '/api/auth/password',
    guard.authenticate,
    guard.authorize('me:read'),
    validate({ body: changePasswordSchema }),
    async (req, res) => {
      const signedIn = await ctx.passwords.change(principalOf(req), req.body as ChangePasswordInput);
      res.json(setRefreshCookie(res, signedIn, ctx.config.cookieSecure));
    },
  );

  // Reset links by e-mail: limited per address, and the answer is the same whether or not the
  // address belongs to a member.
  const resetLimiter = limiter('reset', ctx.config.loginRateLimit, address);
  router.post(
    '/api/auth/password-reset',
    validate({ body: passwordResetRequestSchema }),
    resetLimiter,
    async (req, res) => {
      await ctx.passwords.requestReset((req.body as PasswordResetRequestInput).email);
      res.status(202).json({
        message: 'If that address belongs to a member, a link to choose a new password is on its way.',
      });
    },
  );

  router.get('/api/auth/password-reset/:token', resetLimiter, async (req, res) => {
    res.json(await ctx.passwords.inspectReset(req.params.token as string));
  });

  router.post(
    '/api/auth/password-reset/:token',
    resetLimiter,
    validate({ body: passwordResetCompleteSchema }),
    async (req, res) => {
      const signedIn = await ctx.passwords.completeReset(
        req.params.token as string,
        req.body as PasswordResetCompleteInput,
      );
      res.json(setRefreshCookie(res, signedIn, ctx.config.cookieSecure));
    },
  );

  router.get('/api/me', guard.authenticate, guard.authorize('me:read'), async (req, res) => {
    res.json(await ctx.auth.me(principalOf(req)));
  });

  return router;
}
