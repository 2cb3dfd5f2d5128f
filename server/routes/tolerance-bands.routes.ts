import { Router } from 'express';
import {
  toleranceBandInputSchema,
  toleranceBandParamsSchema,
  toleranceBandQuerySchema,
  toleranceHistoryQuerySchema,
} from '@shared/schemas/tolerance.schema';
import type { BandMetricKey } from '@shared/tolerance';
import { z } from 'zod';
import { principalOf } from '../middleware/auth.middleware';
import { validate } from '../middleware/validate.middleware';
import type { RouteContext } from './context';

const jobParamsSchema = z.object({ id: z.string().uuid('Not a job id') });

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
  router.get(
    '/api/tolerance-bands/history',
    guard.authenticate,
    guard.authorize('tolerance:read'),
    validate({ query: toleranceHistoryQuerySchema }),
    async (req, res) => {
      const query = req.query as unknown as z.infer<typeof toleranceHistoryQuerySchema>;
      res.json(await ctx.toleranceBands.history(principalOf(req), query));
    },
  );
  router.put(
    '/api/tolerance-bands/:ageGroupId/:metric',
    guard.authenticate,
    guard.authorize('tolerance:write'),
    validate({ params: toleranceBandParamsSchema }),
    async (req, res) => {
      const metric = req.params.metric as BandMetricKey;
      // The limits a metric can take depend on the metric, so the body is read once the path is known.
      const input = toleranceBandInputSchema(metric).parse(req.body ?? {});
      res.json(
        await ctx.toleranceBands.update(principalOf(req), req.params.ageGroupId as string, metric, input),
      );
    },
  );
  router.post(
    '/api/tolerance-bands/:ageGroupId/:metric/reset',
    guard.authenticate,
    guard.authorize('tolerance:write'),
    validate({ params: toleranceBandParamsSchema }),
    async (req, res) => {
      const metric = req.params.metric as BandMetricKey;
      res.json(await ctx.toleranceBands.reset(principalOf(req), req.params.ageGroupId as string, metric));
    },
  );
  router.get(
    '/api/jobs/:id',
    guard.authenticate,
    guard.authorize('job:read'),
    validate({ params: jobParamsSchema }),
    async (req, res) => {
      res.json(await ctx.toleranceBands.job(principalOf(req), req.params.id as string));
    },
  );
  return router;
}
