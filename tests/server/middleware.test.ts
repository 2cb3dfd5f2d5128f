import fs from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import express from 'express';
import { pino } from 'pino';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { HttpError } from '@server/errors';
import { createErrorHandler } from '@server/middleware/error.middleware';
import { createRequestLogger } from '@server/middleware/request-logger.middleware';
import { staticRoutes } from '@server/routes/static.routes';

function appWithLog() {
  const lines: Record<string, unknown>[] = [];
  const logger = pino({ level: 'info' }, { write: (line: string) => lines.push(JSON.parse(line)) });
  const app = express();
  app.use(createRequestLogger(logger));
  app.get('/boom', () => {
    throw new Error('database password is hunter2');
  });
  app.get('/teapot', () => {
    throw new HttpError(418, 'teapot', 'Short and stout', { spout: true });
  });
  app.get('/ok', (_req, res) => {
    res.json({ ok: true });
  });
  app.use(createErrorHandler({ maxUploadBytes: 1024 }));
  return { app, lines };
}

describe('error handler and request log', () => {
  it('turns unknown errors into a generic 500 and logs the real one', async () => {
    const { app, lines } = appWithLog();
    const res = await supertest(app).get('/boom');
    expect(res.status).toBe(500);
    expect(res.body).toEqual({
      error: { code: 'internal', message: 'Something went wrong on the server; the error was logged' },
    });
    expect(JSON.stringify(res.body)).not.toContain('hunter2');
    const logged = lines.find((l) => l.msg === 'unhandled error') as { err: { message: string } } | undefined;
    expect(logged?.err.message).toBe('database password is hunter2');
  });

  it('passes HttpError status, code, message and details through', async () => {
    const res = await supertest(appWithLog().app).get('/teapot');
    expect(res.status).toBe(418);
    expect(res.body).toEqual({
      error: { code: 'teapot', message: 'Short and stout', details: { spout: true } },
    });
  });

  it('logs one line per request with a request id, echoing a sane X-Request-Id and keeping tokens out', async () => {
    const { app, lines } = appWithLog();
    const res = await supertest(app).get('/ok?token=secret-media-token').set('X-Request-Id', 'trace-abc.1');
    expect(res.headers['x-request-id']).toBe('trace-abc.1');
    const line = lines.find((l) => l.msg === 'request completed') as { req: { id: string; url: string } };
    expect(line.req.id).toBe('trace-abc.1');
    expect(line.req.url).toBe('/ok?token=[redacted]');
    expect(JSON.stringify(lines)).not.toContain('secret-media-token');

    const generated = await supertest(app).get('/ok').set('X-Request-Id', 'no spaces allowed <script>');
    expect(generated.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
  });
});

describe('static routes', () => {
  let root: string;

  beforeAll(async () => {
    root = await fs.mkdtemp(path.join(os.tmpdir(), 'stanceline-static-'));
    await fs.mkdir(path.join(root, 'models', 'movenet'), { recursive: true });
    await fs.writeFile(path.join(root, 'models', 'movenet', 'model.json'), '{"format":"graph-model"}');
  });
  afterAll(async () => {
    await fs.rm(root, { recursive: true, force: true });
  });

  it('says to build the client when dist/ is missing, and still serves models', async () => {
    const app = express().use(staticRoutes(root));
    const page = await supertest(app).get('/sessions');
    expect(page.status).toBe(503);
    expect(page.text).toContain('npm run build');
    const model = await supertest(app).get('/models/movenet/model.json');
    expect(model.status).toBe(200);
    expect(model.body).toEqual({ format: 'graph-model' });
  });

  it('falls back to index.html for client routes once built', async () => {
    await fs.mkdir(path.join(root, 'dist'), { recursive: true });
    await fs.writeFile(path.join(root, 'dist', 'index.html'), '<!doctype html><div id="root"></div>');
    const app = express().use(staticRoutes(root));
    const deep = await supertest(app).get('/athletes/123/clips');
    expect(deep.status).toBe(200);
    expect(deep.text).toContain('id="root"');
    const missingModel = await supertest(app).get('/models/none.json');
    expect(missingModel.status).toBe(404);
  });
});
