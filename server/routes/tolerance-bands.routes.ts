import { Router } from 'express';
import { toleranceBandQuerySchema } from '@shared/schemas/tolerance.schema';
import { principalOf } from '../middleware/auth.middleware';
import { validate } from '../middleware/validate.middleware';
import type { RouteContext } from './context';

export function toleranceBandRoutes(ctx: RouteContext): Router {
  const router = Router();
  const { guard } = ctx;
  router.get(
    '/api/tolerance-bands',
    guard.authenticate,
    guard.authorize('tolerance:read'),
    validate({ query: toleranceBandQuerySchema }),
    async (req, res) => {
      res.json(await ctx.toleranceBands.list(principalOf(req), req.query as { ageGroupId?: string }));
    },
  );
  return router;
}
