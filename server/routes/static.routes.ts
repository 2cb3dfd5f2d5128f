import fs from 'node:fs';
import path from 'node:path';
import express, { Router } from 'express';

/**
 * The built client (dist/) with an SPA fallback, pose models under /models and the TF.js wasm
 * binaries under /wasm, all from the app's own origin.
 */
export function staticRoutes(projectRoot: string): Router {
  const router = Router();
  const dist = path.join(projectRoot, 'dist');
  const models = path.join(projectRoot, 'models');
  const wasm = path.join(projectRoot, 'node_modules', '@tensorflow', 'tfjs-backend-wasm', 'dist');

  router.use('/models', express.static(models, { fallthrough: false, maxAge: '1d' }));
  router.use('/wasm', express.static(wasm, { fallthrough: false, maxAge: '1d' }));
  router.use(express.static(dist, { index: false, maxAge: '1h' }));

  router.get(/^(?!\/(api|dev|models|wasm)(\/|$)).*/, (req, res) => {
    const index = path.join(dist, 'index.html');
    if (!fs.existsSync(index)) {
      res
        .status(503)
        .type('text/plain')
        .send('The client is not built yet. Run "npm run build" (or "npm start", which builds first).\n');
      return;
    }
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(index);
  });
  return router;
}
