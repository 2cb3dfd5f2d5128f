import { Router } from 'express';
import { z } from 'zod';
import { createReviewSchema, reviewListQuerySchema, updateReviewSchema } from '@shared/schemas/review.schema';
import { principalOf } from '../middleware/auth.middleware';
import { validate } from '../middleware/validate.middleware';
import type { RouteContext } from './context';

const reviewParams = z.object({ id: z.string().uuid('Not a review id') });

/** Reviews: drafts coaches write, publish and withdraw; the page athletes and guardians read. */
export function reviewRoutes(ctx: RouteContext): Router {
  const router = Router();
  const { guard } = ctx;
  const read = [guard.authenticate, guard.authorize('review:read')];
  const write = [guard.authenticate, guard.authorize('review:write')];

  router.get('/api/reviews', ...read, validate({ query: reviewListQuerySchema }), async (req, res) => {
    res.json({
      reviews: await ctx.reviews.list(principalOf(req), req.query as { clipId?: string; athleteId?: string }),
    });
  });
  router.post('/api/reviews', ...write, validate({ body: createReviewSchema }), async (req, res) => {
    const body = req.body as { clipId: string; athleteId: string };
    res.status(201).json({ review: await ctx.reviews.create(principalOf(req), body.clipId, body.athleteId) });
  });
  router.get('/api/reviews/:id', ...read, validate({ params: reviewParams }), async (req, res) => {
    res.json({ review: await ctx.reviews.get(principalOf(req), req.params.id as string) });
  });
  router.patch(
    '/api/reviews/:id',
    ...write,
    validate({ params: reviewParams, body: updateReviewSchema }),
    async (req, res) => {
      res.json({ review: await ctx.reviews.update(principalOf(req), req.params.id as string, req.body) });
    },
  );
  router.get('/api/reviews/:id/view', ...read, validate({ params: reviewParams }), async (req, res) => {
    res.json(await ctx.reviews.view(principalOf(req), req.params.id as string));
  });
  router.post('/api/reviews/:id/publish', ...write, validate({ params: reviewParams }), async (req, res) => {
    res.json(await ctx.reviews.publish(principalOf(req), req.params.id as string));
  });
  router.post(
    '/api/reviews/:id/unpublish',
    ...write,
    validate({ params: reviewParams }),
    async (req, res) => {
      res.json({ review: await ctx.reviews.unpublish(principalOf(req), req.params.id as string) });
    },
  );
  router.get('/api/reviews/:id/receipts', ...read, validate({ params: reviewParams }), async (req, res) => {
    res.json({ receipts: await ctx.reviews.receipts(principalOf(req), req.params.id as string) });
  });
  return router;
}
