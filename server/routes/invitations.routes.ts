import { Router } from 'express';
import {
  acceptInvitationSchema,
  createInvitationSchema,
  type AcceptInvitationInput,
  type CreateInvitationInput,
} from '@shared/schemas/auth.schema';
import { principalOf } from '../middleware/auth.middleware';
import { validate } from '../middleware/validate.middleware';
import { setRefreshCookie } from './auth.routes';
import type { RouteContext } from './context';

export function invitationRoutes(ctx: RouteContext): Router {
  const router = Router();
  const { guard } = ctx;

  router.post(
    '/api/invitations',
    guard.authenticate,
    guard.authorize('invitation:create'),
    validate({ body: createInvitationSchema }),
    async (req, res) => {
      res.status(201).json(await ctx.invitations.create(principalOf(req), req.body as CreateInvitationInput));
    },
  );

  // Public: the holder of the e-mailed token is the only one who can know it.
  router.post('/api/invitations/accept', validate({ body: acceptInvitationSchema }), async (req, res) => {
    const signedIn = await ctx.invitations.accept(req.body as AcceptInvitationInput);
    res.status(201).json(setRefreshCookie(res, signedIn, ctx.config.cookieSecure));
  });

  router.get('/api/invitations/:token', async (req, res) => {
    res.json(await ctx.invitations.preview(req.params.token as string));
  });

  return router;
}
