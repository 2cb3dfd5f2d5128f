import { Router } from 'express';
import { principalOf } from '../middleware/auth.middleware';
import type { RouteContext } from './context';

export function clubRoutes(ctx: RouteContext): Router {
  const router = Router();
  const { guard } = ctx;

  router.get('/api/club/members', guard.authenticate, guard.authorize('club:members'), async (req, res) => {
    res.json(await ctx.club.members(principalOf(req)));
  });

  return router;
}
