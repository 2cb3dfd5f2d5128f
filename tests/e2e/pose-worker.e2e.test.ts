// The pose worker in headless Chromium: a production build of a harness page (tests/e2e/pose-harness)
// loads phantom frames, hands them to the real worker through src/lib/pose-client.ts, and must get
// keypoints within the same tolerances as the Node tests, agreeing with Node on the same frame.
import { createReadStream, existsSync, mkdirSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { extname, join, normalize, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Browser, Page } from 'playwright-core';
import { build } from 'vite';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { PoseModelName } from '@shared/keypoints';
import { computeFrameMetrics } from '@shared/metrics';
import { createNodePoseDetector } from '@server/pose/node-detector';
import type { PoseFrameRequest, PoseFrameResult } from '@/lib/pose-client';
import { renderPhantom } from '../../fixtures/phantom/render-phantom';
import { PHANTOM_CASES } from '../pose/phantom-cases';
import { BODY_JOINTS, evaluateFrame } from '../pose/phantom-eval';
import { BROWSER_NODE_AGREEMENT, JOINT_TOLERANCE, METRIC_TOLERANCE } from '../pose/tolerances';
import { launchBrowser, screenshotPath } from './browser';

const root = process.cwd();
const here = fileURLToPath(new URL('.', import.meta.url));
const work = join(root, 'fixtures', 'generated', 'e2e-pose');
const site = join(work, 'site');
const framesDir = join(work, 'frames');

const TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript',
  '.json': 'application/json',
  '.wasm': 'application/wasm',
  '.bin': 'application/octet-stream',
  '.png': 'image/png',
  '.map': 'application/json',
};

/** Static files only, from the app's own origin: the build, /models, /wasm and the phantom frames. */
function serve(): Promise<Server> {
  const mounts: [string, string][] = [
    ['/models/', join(root, 'models')],
    ['/wasm/', join(root, 'node_modules', '@tensorflow', 'tfjs-backend-wasm', 'dist')],
    ['/frames/', framesDir],
    ['/', site],
  ];
  const server = createServer((req, res) => {
    const url = new URL(req.url ?? '/', 'http://localhost');
    const mount = mounts.find(([prefix]) => url.pathname.startsWith(prefix));
    if (!mount) return void res.writeHead(404).end();
    const base = resolve(mount[1]);
    const file = normalize(join(base, decodeURIComponent(url.pathname.slice(mount[0].length))));
    if (!file.startsWith(base) || !existsSync(file) || !statSync(file).isFile())
      return void res.writeHead(404).end();
    res.writeHead(200, { 'content-type': TYPES[extname(file)] ?? 'application/octet-stream' });
    createReadStream(file).pipe(res);
  });
  return new Promise((ok) => server.listen(0, '127.0.0.1', () => ok(server)));
}

let server: Server;
let browser: Browser;
let origin: string;

beforeAll(async () => {
  rmSync(work, { recursive: true, force: true });
  mkdirSync(framesDir, { recursive: true });
  for (const [i, c] of PHANTOM_CASES.entries()) {
    writeFileSync(join(framesDir, `case-${i}.png`), await renderPhantom(c.spec).png());
  }
  await build({
    configFile: false,
    logLevel: 'error',
    root: join(here, 'pose-harness'),
    base: '/',
    resolve: {
      alias: {
        '@shared': join(root, 'shared'),
        '@': join(root, 'src'),
        '@mediapipe/pose': join(root, 'shared', 'pose', 'mediapipe-pose-shim.ts'),
      },
    },
    worker: { format: 'es' },
    build: { outDir: site, emptyOutDir: true, chunkSizeWarningLimit: 8000 },
  });
  server = await serve();
  origin = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
  await new Promise((ok) => (server ? server.close(ok) : ok(null)));
});

async function openHarness(query = ''): Promise<Page> {
  const page = await browser.newPage();
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  await page.goto(`${origin}/index.html${query}`);
  await page.waitForFunction(() => document.getElementById('status')?.textContent === 'ready', null, {
    timeout: 30_000,
  });
  expect(errors).toEqual([]);
  return page;
}

function detectIn(page: Page, url: string, req: PoseFrameRequest): Promise<PoseFrameResult> {
  return page.evaluate(
    ([u, r]) =>
      (
        window as unknown as {
          poseHarness: { detect(u: string, r: PoseFrameRequest): Promise<PoseFrameResult> };
        }
      ).poseHarness.detect(u, r),
    [url, req] as const,
  );
}

describe('pose worker in headless Chromium', () => {
  const models: PoseModelName[] = ['lightning', 'blazepose'];

  it.each(models)(
    '%s: keypoints within the Node tolerances and in agreement with Node',
    async (model) => {
      const page = await openHarness();
      const node = await createNodePoseDetector(model);
      try {
        let backend = '';
        for (const [i, c] of PHANTOM_CASES.entries()) {
          await page.evaluate(() =>
            (window as unknown as { poseHarness: { reset(): Promise<void> } }).poseHarness.reset(),
          );
          const frame = renderPhantom(c.spec);
          const req: PoseFrameRequest = {
            frameIndex: i,
            timeMs: 0,
            model,
            view: c.spec.pose.view,
            still: true,
          };
          const result = await detectIn(page, `/frames/case-${i}.png`, {
            ...req,
            referenceLine: frame.truth.referenceLine,
          });
          backend = result.backend;
          expect(result.width).toBe(frame.width);
          expect(result.timings.detectMs).toBeGreaterThan(0);
          expect(result.timings.totalMs).toBeGreaterThanOrEqual(result.timings.detectMs);
          const evaluation = evaluateFrame(result.keypoints, frame.truth);
          for (const joint of BODY_JOINTS) {
            expect(evaluation.jointError[joint], `${c.name}: ${joint}`).toBeLessThan(JOINT_TOLERANCE[joint]);
          }
          node.reset();
          const inNode = await node.detect({
            data: frame.rgba,
            width: frame.width,
            height: frame.height,
            channels: 4,
          });
          // The worker computed its metrics itself with shared/metrics (default confidence floor)
          // against the true snow line. A metric it leaves out (a far-side joint below the floor) must
          // be left out in Node too; every metric it gives must be within the tolerance of the truth.
          const nodeMetrics = computeFrameMetrics({
            keypoints: inNode.keypoints,
            view: c.spec.pose.view,
            referenceLine: frame.truth.referenceLine,
          }).metrics;
          for (const { key, tolerance, why } of METRIC_TOLERANCE) {
            const want = frame.truth.metrics[key];
            if (want === null) continue;
            const got = result.metrics[key];
            expect(got === null, `${c.name}: ${key} null in the browser as in Node`).toBe(
              nodeMetrics[key] === null,
            );
            if (got === null)
              expect(result.reasons[key], `${c.name}: ${key}`).toMatch(/missing|low confidence|facing/);
            else expect(Math.abs(got - want), `${c.name}: ${key} (${why})`).toBeLessThan(tolerance);
          }
          for (const joint of BODY_JOINTS) {
            const a = result.keypoints.find((k) => k.name === joint)!;
            const b = inNode.keypoints.find((k) => k.name === joint)!;
            const apart = Math.hypot(a.x - b.x, a.y - b.y) / frame.truth.torsoLength;
            expect(apart, `${c.name}: ${joint} browser vs Node`).toBeLessThan(BROWSER_NODE_AGREEMENT);
          }
        }
        // Debian's Chromium runs headless without a GPU, so WebGL is drawn in software: the worker
        // skips it for WASM, the same kernels as Node.
        expect(backend).toBe('wasm');
        await page.screenshot({ path: screenshotPath(`pose-worker-${model}`) });
      } finally {
        node.dispose();
        await page.close();
      }
    },
    300_000,
  );

  it.each([
    ['software WebGL when allowed', '?software-webgl', 'webgl'],
    ['the CPU backend when it is the only one listed', '?backends=cpu', 'cpu'],
  ])(
    'runs on %s, with keypoints within the Node tolerances',
    async (_label, query, expected) => {
      const page = await openHarness(query);
      try {
        const frame = renderPhantom(PHANTOM_CASES[0].spec);
        const result = await detectIn(page, '/frames/case-0.png', {
          frameIndex: 0,
          timeMs: 0,
          model: 'lightning',
          view: 'front',
          still: true,
        });
        expect(result.backend).toBe(expected);
        const evaluation = evaluateFrame(result.keypoints, frame.truth);
        for (const joint of BODY_JOINTS)
          expect(evaluation.jointError[joint], joint).toBeLessThan(JOINT_TOLERANCE[joint]);
      } finally {
        await page.close();
      }
    },
    120_000,
  );

  it('runs a queue with progress without blocking the page, and cancels it', async () => {
    const page = await openHarness();
    try {
      const req: PoseFrameRequest = { frameIndex: 0, timeMs: 0, model: 'lightning', view: 'front' };
      type QueueResult = { results: number; progress: number[]; error: string | null; heartbeats: number };
      const run = (count: number, abortAfter?: number) =>
        page.evaluate(
          ([r, n, a]) =>
            (
              window as unknown as {
                poseHarness: {
                  queue(u: string, r: PoseFrameRequest, n: number, a?: number): Promise<QueueResult>;
                };
              }
            ).poseHarness.queue('/frames/case-0.png', r, n, a ?? undefined),
          [req, count, abortAfter ?? null] as const,
        );
      const full = await run(5);
      expect(full.error).toBeNull();
      expect(full.results).toBe(5);
      expect(full.progress).toEqual([1, 2, 3, 4, 5]);
      // Timers kept firing on the page while frames were analysed in the worker.
      expect(full.heartbeats).toBeGreaterThan(0);

      const cancelled = await run(12, 2);
      expect(cancelled.error).toBe('AbortError');
      expect(cancelled.progress.length).toBeLessThan(12);
    } finally {
      await page.close();
    }
  });
});
