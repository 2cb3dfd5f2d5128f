import { Router } from 'express';
import { createSessionSchema, type CreateSessionInput } from '@shared/schemas/session.schema';
import { principalOf } from '../middleware/auth.middleware';
import { validate } from '../middleware/validate.middleware';
import type { RouteContext } from './context';

export function sessionRoutes(ctx: RouteContext): Router {
  const router = Router();
  const { guard } = ctx;

  router.get('/api/sessions', guard.authenticate, guard.authorize('session:read'), async (req, res) => {
    res.json(await ctx.sessions.list(principalOf(req)));
  });

  router.post(
    '/api/sessions',
    guard.authenticate,
    guard.authorize('session:create'),
    validate({ body: createSessionSchema }),
    async (req, res) => {
      res.status(201).json(await ctx.sessions.create(principalOf(req), req.body as CreateSessionInput));
    },
  );

  router.get('/api/sessions/:id', guard.authenticate, guard.authorize('session:read'), async (req, res) => {
    res.json(await ctx.sessions.get(principalOf(req), req.params.id as string));
  });

  return router;
}
