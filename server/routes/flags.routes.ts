import { Router } from 'express';
import { z } from 'zod';
import { flagQuerySchema, flagUpdateSchema, type FlagQuery } from '@shared/schemas/flag.schema';
import { principalOf } from '../middleware/auth.middleware';
import { validate } from '../middleware/validate.middleware';
import type { RouteContext } from './context';

const flagParamsSchema = z.object({ id: z.string().uuid('Not a flag id') });

export function flagRoutes(ctx: RouteContext): Router {
  const router = Router();
  const { guard } = ctx;
  router.get(
    '/api/flags',
    guard.authenticate,
    guard.authorize('flag:read'),
    validate({ query: flagQuerySchema }),
    async (req, res) => {
      res.json(await ctx.flags.list(principalOf(req), req.query as unknown as FlagQuery));
    },
  );
  router.patch(
    '/api/flags/:id',
    guard.authenticate,
    guard.authorize('flag:review'),
    validate({ params: flagParamsSchema, body: flagUpdateSchema }),
    async (req, res) => {
      res.json(await ctx.flags.update(principalOf(req), req.params.id as string, req.body));
    },
  );
  return router;
}
