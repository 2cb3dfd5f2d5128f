import { Router, type Request, type Response } from 'express';
import type { ExportKind } from '@shared/exports/codebook';
import {
  exportCountQuerySchema,
  exportQuerySchema,
  type ExportCountQuery,
  type ExportQuery,
} from '@shared/schemas/export.schema';
import { principalOf } from '../middleware/auth.middleware';
import { validate } from '../middleware/validate.middleware';
import type { RouteContext } from './context';

export function exportRoutes(ctx: RouteContext): Router {
  const router = Router();
  const { guard } = ctx;

  const download = (kind: ExportKind) => async (req: Request, res: Response) => {
    const query = req.query as unknown as ExportQuery;
    let closed = false;
    res.on('close', () => (closed = true));
    // The clips are looked up before the first byte, so a clip outside the caller's reach is a 404.
    const plan = await ctx.exports.plan(principalOf(req), query);
    const day = new Date().toISOString().slice(0, 10);
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', `attachment; filename="stanceline-${kind}-${day}.csv"`);
    res.setHeader('Cache-Control', 'no-store');
    await ctx.exports.write(plan, kind, query, res, () => closed);
  };

  for (const kind of ['frames', 'keypoints', 'turns'] as const) {
    router.get(
      `/api/exports/${kind}.csv`,
      guard.authenticate,
      guard.authorize('export:read'),
      validate({ query: exportQuerySchema }),
      download(kind),
    );
  }
  router.get(
    '/api/exports/count',
    guard.authenticate,
    guard.authorize('export:read'),
    validate({ query: exportCountQuerySchema }),
    async (req, res) => {
      res.json(await ctx.exports.count(principalOf(req), req.query as unknown as ExportCountQuery));
    },
  );
  router.get('/api/exports/codebook', guard.authenticate, guard.authorize('export:read'), (_req, res) => {
    res.json(ctx.exports.codebook());
  });
  return router;
}
