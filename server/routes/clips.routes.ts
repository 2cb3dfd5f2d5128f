import { pipeline } from 'node:stream/promises';
import { Router, type Request, type Response } from 'express';
import { z } from 'zod';
import { clipListQuerySchema } from '@shared/schemas/clip.schema';
import { HttpError } from '../errors';
import { principalOf } from '../middleware/auth.middleware';
import { createUploadMiddleware, stagedUpload } from '../middleware/upload.middleware';
import { validate } from '../middleware/validate.middleware';
import type { MediaTarget } from '../services/clip.service';
import type { ObjectRange } from '../storage/object-storage';
import type { RouteContext } from './context';

/**
 * The byte range to send: undefined for the whole file, or one satisfiable range.
 * Malformed and multi-range headers are ignored (a full 200 is always a valid answer).
 */
function pickRange(req: Request, size: number): ObjectRange | undefined | 'unsatisfiable' {
  if (!req.headers.range) return undefined;
  const ranges = req.range(size, { combine: true });
  if (ranges === -1) return 'unsatisfiable';
  if (ranges === -2 || ranges === undefined || ranges.type !== 'bytes' || ranges.length !== 1)
    return undefined;
  return { start: ranges[0].start, end: ranges[0].end };
}

async function sendMedia(ctx: RouteContext, req: Request, res: Response, target: MediaTarget): Promise<void> {
  const size = target.sizeBytes;
  res.setHeader('Accept-Ranges', 'bytes');
  const range = pickRange(req, size);
  if (range === 'unsatisfiable') {
    res.setHeader('Content-Range', `bytes */${size}`);
    throw new HttpError(416, 'range_not_satisfiable', `The requested range is outside the ${size}-byte file`);
  }
  res.setHeader('Content-Type', target.contentType);
  res.setHeader('Cache-Control', 'private, max-age=3600');
  // The playable copy has other bytes than the original, so it needs its own validator.
  const copy = target.key === target.clip.storageKey ? '' : '-playable';
  res.setHeader('ETag', `"${target.clip.sha256}${copy}"`);
  if (range) {
    res.status(206);
    res.setHeader('Content-Range', `bytes ${range.start}-${range.end}/${size}`);
    res.setHeader('Content-Length', String(range.end - range.start + 1));
  } else {
    res.status(200);
    res.setHeader('Content-Length', String(size));
  }
  if (req.method === 'HEAD') {
    res.end();
    return;
  }
  const body = await ctx.storage.getStream(target.key, range);
  // pipeline destroys the S3 stream when the player aborts (seeking sends a new range request).
  await pipeline(body, res).catch((error: NodeJS.ErrnoException) => {
    if (error.code !== 'ERR_STREAM_PREMATURE_CLOSE')
      req.log?.warn({ err: error }, 'media stream ended early');
  });
}

export function clipRoutes(ctx: RouteContext): Router {
  const router = Router();
  const { guard } = ctx;
  const upload = createUploadMiddleware({
    tempDir: ctx.config.uploadTempDir,
    maxBytes: ctx.config.maxUploadBytes,
    // Session, athletes, consent: checked from the fields that precede the file, so a refused upload
    // is refused before a byte of the video is written.
    precheck: async (req) => {
      // Only when the fields came first (as the app sends them); otherwise they are checked with the file.
      const fields = req.body as Record<string, unknown> | undefined;
      if (!fields?.sessionId || !fields.athleteIds || !fields.view) return;
      await ctx.clips.precheck(principalOf(req), fields);
    },
  });

  router.get(
    '/api/clips',
    guard.authenticate,
    guard.authorize('clip:read'),
    validate({ query: clipListQuerySchema }),
    async (req, res) => {
      res.json(
        await ctx.clips.list(principalOf(req), req.query as { athleteId?: string; sessionId?: string }),
      );
    },
  );

  // The role check runs before multer, so a refused caller never streams a byte to disk.
  router.post('/api/clips', guard.authenticate, guard.authorize('clip:upload'), upload, async (req, res) => {
    res.status(201).json(await ctx.clips.upload(principalOf(req), req.body, stagedUpload(req)));
  });

  router.get('/api/clips/:id', guard.authenticate, guard.authorize('clip:read'), async (req, res) => {
    res.json(await ctx.clips.get(principalOf(req), req.params.id as string));
  });

  router.delete(
    '/api/clips/:id',
    guard.authenticate,
    guard.authorize('clip:erase'),
    validate({ params: z.object({ id: z.string().uuid('Not a clip id') }) }),
    async (req, res) => {
      await ctx.erasure.eraseClip(principalOf(req), req.params.id as string);
      res.status(204).end();
    },
  );

  router.get(
    '/api/clips/:id/media',
    guard.authenticateMedia,
    guard.authorize('clip:read'),
    async (req, res) => {
      // The playable copy unless ?variant=original asks for the file as uploaded.
      const variant = req.query.variant === 'original' ? 'original' : 'playable';
      const target = await ctx.clips.mediaTarget(principalOf(req), req.params.id as string, variant);
      await sendMedia(ctx, req, res, target);
    },
  );

  return router;
}
