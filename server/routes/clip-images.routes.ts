import { pipeline } from 'node:stream/promises';
import { Router, type Request, type Response } from 'express';
import { principalOf } from '../middleware/auth.middleware';
import type { ClipImageKind } from '../services/clip-image.service';
import type { RouteContext } from './context';

async function sendImage(ctx: RouteContext, req: Request, res: Response, kind: ClipImageKind): Promise<void> {
  const { clip, key } = await ctx.clipImages.target(principalOf(req), req.params.id as string, kind);
  res.setHeader('Content-Type', 'image/jpeg');
  res.setHeader('Cache-Control', 'private, max-age=3600');
  res.setHeader('ETag', `"${clip.sha256}-${kind}"`);
  const body = await ctx.storage.getStream(key);
  await pipeline(body, res).catch((error: NodeJS.ErrnoException) => {
    if (error.code !== 'ERR_STREAM_PREMATURE_CLOSE')
      req.log?.warn({ err: error }, 'image stream ended early');
  });
}

/** Poster frame and thumbnail sprite; like media, reachable by an <img> with the signed ?token=. */
export function clipImageRoutes(ctx: RouteContext): Router {
  const router = Router();
  const { guard } = ctx;
  router.get('/api/clips/:id/poster', guard.authenticateMedia, guard.authorize('clip:read'), (req, res) =>
    sendImage(ctx, req, res, 'poster'),
  );
  router.get('/api/clips/:id/thumbnails', guard.authenticateMedia, guard.authorize('clip:read'), (req, res) =>
    sendImage(ctx, req, res, 'thumbnails'),
  );
  return router;
}
