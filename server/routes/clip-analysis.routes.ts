import { Router } from 'express';
import { z } from 'zod';
import type { PoseModelName } from '@shared/keypoints';
import { serverAnalysisRequestSchema, updateClipSchema } from '@shared/schemas/clip.schema';
import { frameBatchSchema, frameCorrectionSchema, frameListQuerySchema } from '@shared/schemas/frames.schema';
import { principalOf } from '../middleware/auth.middleware';
import { validate } from '../middleware/validate.middleware';
import type { RouteContext } from './context';

const clipParams = z.object({ id: z.string().uuid('Not a clip id') });
const frameIndexSchema = z.coerce.number().int('frameIndex is a whole number').min(0);

/** Clip settings (view, model, snow line) and the stored per-frame results with their flags. */
export function clipAnalysisRoutes(ctx: RouteContext): Router {
  const router = Router();
  const { guard } = ctx;

  router.patch(
    '/api/clips/:id',
    guard.authenticate,
    guard.authorize('clip:analyse'),
    validate({ body: updateClipSchema }),
    async (req, res) => {
      res.json(await ctx.analysis.updateSettings(principalOf(req), req.params.id as string, req.body));
    },
  );

  router.get(
    '/api/clips/:id/server-analysis',
    guard.authenticate,
    guard.authorize('clip:read'),
    validate({ params: clipParams }),
    async (req, res) => {
      res.json(await ctx.analysis.serverAnalysis(principalOf(req), req.params.id as string));
    },
  );

  router.post(
    '/api/clips/:id/server-analysis',
    guard.authenticate,
    guard.authorize('clip:analyse'),
    validate({ params: clipParams, body: serverAnalysisRequestSchema }),
    async (req, res) => {
      res
        .status(202)
        .json(await ctx.analysis.queueServerAnalysis(principalOf(req), req.params.id as string, req.body));
    },
  );

  router.post(
    '/api/clips/:id/frames',
    guard.authenticate,
    guard.authorize('clip:analyse'),
    validate({ body: frameBatchSchema }),
    async (req, res) => {
      res.json(await ctx.analysis.ingest(principalOf(req), req.params.id as string, req.body));
    },
  );

  router.get(
    '/api/clips/:id/frames',
    guard.authenticate,
    guard.authorize('clip:read'),
    validate({ query: frameListQuerySchema }),
    async (req, res) => {
      const { model } = req.query as { model?: PoseModelName };
      res.json(await ctx.analysis.read(principalOf(req), req.params.id as string, model));
    },
  );

  router.put(
    '/api/clips/:id/frames/:frameIndex',
    guard.authenticate,
    guard.authorize('clip:analyse'),
    validate({ body: frameCorrectionSchema }),
    async (req, res) => {
      const frameIndex = frameIndexSchema.parse(req.params.frameIndex);
      res.json(await ctx.analysis.correct(principalOf(req), req.params.id as string, frameIndex, req.body));
    },
  );

  return router;
}
