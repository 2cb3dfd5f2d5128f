import { pipeline } from 'node:stream/promises';
import { Router } from 'express';
import { z } from 'zod';
import {
  baselineInputSchema,
  compareStillInputSchema,
  compareStillQuerySchema,
  focusPointInputSchema,
  focusPointOrderSchema,
  planQuerySchema,
  seasonInputSchema,
} from '@shared/schemas/plan.schema';
import { principalOf } from '../middleware/auth.middleware';
import { validate } from '../middleware/validate.middleware';
import type { RouteContext } from './context';

const athleteParams = z.object({ id: z.string().uuid('Not an athlete id') });
const focusPointParams = z.object({ id: z.string().uuid('Not a focus point id') });
const stillParams = z.object({ id: z.string().uuid('Not a still id') });
const orderBody = focusPointOrderSchema.and(z.object({ seasonId: z.string().uuid('Choose a season') }));

/** Seasons, season plans (focus points, baseline, progress) and side-by-side stills of compared clips. */
export function planRoutes(ctx: RouteContext): Router {
  const router = Router();
  const { guard } = ctx;

  router.get('/api/seasons', guard.authenticate, guard.authorize('season:read'), async (req, res) => {
    res.json({ seasons: await ctx.plans.listSeasons(principalOf(req)) });
  });
  router.post(
    '/api/seasons',
    guard.authenticate,
    guard.authorize('season:write'),
    validate({ body: seasonInputSchema }),
    async (req, res) => {
      res.status(201).json({ season: await ctx.plans.createSeason(principalOf(req), req.body) });
    },
  );

  router.get(
    '/api/athletes/:id/plan',
    guard.authenticate,
    guard.authorize('plan:read'),
    validate({ params: athleteParams, query: planQuerySchema }),
    async (req, res) => {
      const { seasonId } = req.query as { seasonId?: string };
      res.json(await ctx.plans.getPlan(principalOf(req), req.params.id as string, seasonId));
    },
  );
  router.post(
    '/api/athletes/:id/focus-points',
    guard.authenticate,
    guard.authorize('plan:write'),
    validate({ params: athleteParams, body: focusPointInputSchema }),
    async (req, res) => {
      const point = await ctx.plans.addFocusPoint(principalOf(req), req.params.id as string, req.body);
      res.status(201).json({ focusPoint: point });
    },
  );
  router.put(
    '/api/athletes/:id/focus-points/order',
    guard.authenticate,
    guard.authorize('plan:write'),
    validate({ params: athleteParams, body: orderBody }),
    async (req, res) => {
      const body = req.body as { seasonId: string; ids: string[] };
      const points = await ctx.plans.reorder(
        principalOf(req),
        req.params.id as string,
        body.seasonId,
        body.ids,
      );
      res.json({ focusPoints: points });
    },
  );
  router.put(
    '/api/athletes/:id/baseline',
    guard.authenticate,
    guard.authorize('plan:write'),
    validate({ params: athleteParams, body: baselineInputSchema }),
    async (req, res) => {
      const body = req.body as { seasonId: string; clipId: string | null };
      res.json(
        await ctx.plans.setBaseline(principalOf(req), req.params.id as string, body.seasonId, body.clipId),
      );
    },
  );
  router.put(
    '/api/focus-points/:id',
    guard.authenticate,
    guard.authorize('plan:write'),
    validate({ params: focusPointParams, body: focusPointInputSchema }),
    async (req, res) => {
      res.json({
        focusPoint: await ctx.plans.updateFocusPoint(principalOf(req), req.params.id as string, req.body),
      });
    },
  );
  router.delete(
    '/api/focus-points/:id',
    guard.authenticate,
    guard.authorize('plan:write'),
    validate({ params: focusPointParams }),
    async (req, res) => {
      await ctx.plans.deleteFocusPoint(principalOf(req), req.params.id as string);
      res.status(204).end();
    },
  );

  router.get(
    '/api/compare-stills',
    guard.authenticate,
    guard.authorize('compare:read'),
    validate({ query: compareStillQuerySchema }),
    async (req, res) => {
      const { a, b } = req.query as { a: string; b: string };
      res.json({ stills: await ctx.compareStills.list(principalOf(req), a, b) });
    },
  );
  router.post(
    '/api/compare-stills',
    guard.authenticate,
    guard.authorize('compare:write'),
    validate({ body: compareStillInputSchema }),
    async (req, res) => {
      res.status(201).json({ still: await ctx.compareStills.save(principalOf(req), req.body) });
    },
  );
  router.get(
    '/api/compare-stills/:id/image',
    guard.authenticate,
    guard.authorize('compare:read'),
    validate({ params: stillParams }),
    async (req, res) => {
      const still = await ctx.compareStills.image(principalOf(req), req.params.id as string);
      res.setHeader('Content-Type', 'image/png');
      res.setHeader('Cache-Control', 'private, max-age=3600');
      res.setHeader('Content-Disposition', `inline; filename="side-by-side-${still.id.slice(0, 8)}.png"`);
      await pipeline(await ctx.storage.getStream(still.storageKey), res);
    },
  );
  return router;
}
