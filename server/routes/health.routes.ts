import { Router } from 'express';
import type { RouteContext } from './context';

export function healthRoutes(ctx: RouteContext): Router {
  const router = Router();
  // Public on purpose: load balancers and the e2e harness poll it before signing in.
  router.get('/api/health', async (_req, res) => {
    const checks = { database: false, storage: false };
    await ctx.dataSource
      .query('SELECT 1')
      .then(() => (checks.database = true))
      .catch(() => undefined);
    await ctx.storage
      .ping()
      .then(() => (checks.storage = true))
      .catch(() => undefined);
    const ok = checks.database && checks.storage;
    res.status(ok ? 200 : 503).json({ status: ok ? 'ok' : 'degraded', checks });
  });
  return router;
}
