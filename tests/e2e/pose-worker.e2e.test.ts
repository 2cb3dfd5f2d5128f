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
import type { Keypoint, PoseModelName } from '@shared/keypoints';
import { computeFrameMetrics } from '@shared/metrics';
import { createNodePoseDetector } from '@server/pose/node-detector';
import type { PoseFrameRequest, PoseFrameResult } from '@/lib/pose-client';
import { AthleteFollower } from '@shared/pose/follow';
import { orientKeypoints } from '@shared/pose/keypoint-mapping';
import type { PixelBox } from '@shared/pose/pose-detector';
import {
  renderPhantom,
  renderPhantomGroup,
  type PhantomFrameSpec,
} from '../../fixtures/phantom/render-phantom';
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
  for (let i = 0; i < CROSSING_FRAMES; i++)
    writeFileSync(join(framesDir, `crossing-${i}.png`), await crossingPng(i));
  writeFileSync(join(framesDir, 'behind.png'), await renderPhantom(BEHIND).png());
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

// Two skiers crossing (the picked one in front, the other further up the hill behind), as in
// tests/pose/follow.test.ts, and one skier filmed from behind leaning to their left.
const CROSSING_FRAMES = 8;
/** Boxes a pick reads (shared/pose/follow.ts); a careful pick reads each twice. */
const PICK_BOXES = 4;
function crossingSpecs(i: number): [PhantomFrameSpec, PhantomFrameSpec] {
  const t = i / (CROSSING_FRAMES - 1);
  const common = { width: 960, height: 540, roll: 0, seed: 3 } as const;
  return [
    {
      ...common,
      pose: { view: 'front', facing: 'toward', inclination: -12, kneeFlexion: 40 },
      skierHeight: 540 * 0.34,
      origin: [960 * (0.75 - 0.5 * t), 540 * 0.62],
      outfit: 2,
    },
    {
      ...common,
      pose: { view: 'front', facing: 'toward', inclination: 15, kneeFlexion: 50 },
      skierHeight: 540 * 0.45,
      origin: [960 * (0.25 + 0.5 * t), 540 * 0.93],
      outfit: 0,
    },
  ];
}
async function crossingPng(i: number): Promise<Buffer> {
  return renderPhantomGroup(crossingSpecs(i)).png();
}
const BEHIND: PhantomFrameSpec = {
  pose: { view: 'front', facing: 'away', inclination: 18, angulation: 5 },
  width: 640,
  height: 480,
  skierHeight: 320,
};

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

  it('follows a picked athlete and swaps a skier filmed from behind as Node and the command line do', async () => {
    const page = await openHarness();
    const node = await createNodePoseDetector('lightning');
    try {
      await page.evaluate(() =>
        (window as unknown as { poseHarness: { reset(): Promise<void> } }).poseHarness.reset(),
      );
      const follower = new AthleteFollower({ width: 960, height: 540 });
      for (let i = 0; i < CROSSING_FRAMES; i++) {
        const group = renderPhantomGroup(crossingSpecs(i));
        const picked = group.truths[1];
        const point = {
          x: (picked.joints.left_hip[0] + picked.joints.right_hip[0]) / 2,
          y: (picked.joints.left_hip[1] + picked.joints.right_hip[1]) / 2,
        };
        const follow = i === 0 ? { pick: point } : { next: true as const };
        const inBrowser = await detectIn(page, `/frames/crossing-${i}.png`, {
          frameIndex: i,
          timeMs: i * 40,
          model: 'lightning',
          view: 'front',
          follow,
        });
        expect(inBrowser.followed?.state, `frame ${i}: ${inBrowser.followed?.reason}`).toBe('following');
        const image = { data: group.rgba, width: 960, height: 540, channels: 4 as const };
        const read = async (region: PixelBox) => (await node.detect(image, { region })).keypoints;
        const inNode = i === 0 ? await follower.pick(point, read) : await follower.next(read);
        for (const joint of BODY_JOINTS) {
          const a = inBrowser.keypoints.find((k) => k.name === joint)!;
          const b = inNode.keypoints.find((k) => k.name === joint)!;
          const apart = Math.hypot(a.x - b.x, a.y - b.y) / picked.torsoLength;
          expect(apart, `frame ${i}: ${joint} browser vs Node`).toBeLessThan(BROWSER_NODE_AGREEMENT);
        }
        // The picked skier, not the other one.
        expect(evaluateFrame(inBrowser.keypoints, picked).jointError.left_hip!, `frame ${i}`).toBeLessThan(
          0.2,
        );
      }

      // A live read away from any followed run starts from a known frame's points (a stored frame's,
      // here the picked skier's true points a frame earlier) and reads around them: the picked
      // skier is measured, not the one crossing.
      for (let i = 1; i < CROSSING_FRAMES; i++) {
        const earlier = renderPhantomGroup(crossingSpecs(i - 1)).truths[1];
        const known = Object.entries(earlier.joints).map(([name, [x, y]]) => ({ name, x, y, score: 0.9 }));
        await page.evaluate(() =>
          (window as unknown as { poseHarness: { reset(): Promise<void> } }).poseHarness.reset(),
        );
        const near = await detectIn(page, `/frames/crossing-${i}.png`, {
          frameIndex: i,
          timeMs: i * 40,
          model: 'lightning',
          view: 'front',
          still: true,
          follow: { near: { keypoints: known as Keypoint[], framesApart: 1 } },
        });
        expect(near.followed?.state, `frame ${i}: ${near.followed?.reason}`).toBe('following');
        const picked = renderPhantomGroup(crossingSpecs(i)).truths[1];
        expect(
          evaluateFrame(near.keypoints, picked).jointError.left_hip!,
          `near read, frame ${i}`,
        ).toBeLessThan(0.2);
      }

      // Careful reading of the pick (the box and its mirror image, averaged): the same points as Node's.
      {
        await page.evaluate(() =>
          (window as unknown as { poseHarness: { reset(): Promise<void> } }).poseHarness.reset(),
        );
        const group = renderPhantomGroup(crossingSpecs(0));
        const picked = group.truths[1];
        const point = {
          x: (picked.joints.left_hip[0] + picked.joints.right_hip[0]) / 2,
          y: (picked.joints.left_hip[1] + picked.joints.right_hip[1]) / 2,
        };
        const inBrowser = await detectIn(page, '/frames/crossing-0.png', {
          frameIndex: 0,
          timeMs: 0,
          model: 'lightning',
          view: 'front',
          follow: { pick: point },
          careful: true,
        });
        expect(inBrowser.timings.passes).toBeGreaterThan(PICK_BOXES);
        const image = { data: group.rgba, width: 960, height: 540, channels: 4 as const };
        const inNode = await new AthleteFollower({ width: 960, height: 540 }).pick(
          point,
          async (region) => (await node.detect(image, { region, flipAverage: true })).keypoints,
        );
        for (const joint of BODY_JOINTS) {
          const a = inBrowser.keypoints.find((k) => k.name === joint)!;
          const b = inNode.keypoints.find((k) => k.name === joint)!;
          const apart = Math.hypot(a.x - b.x, a.y - b.y) / picked.torsoLength;
          expect(apart, `careful: ${joint} browser vs Node`).toBeLessThan(BROWSER_NODE_AGREEMENT);
        }
      }

      // Filmed from behind: the worker swaps to the skier's own sides exactly as orientKeypoints does in Node.
      const frame = renderPhantom(BEHIND);
      await page.evaluate(() =>
        (window as unknown as { poseHarness: { reset(): Promise<void> } }).poseHarness.reset(),
      );
      const away = await detectIn(page, '/frames/behind.png', {
        frameIndex: 0,
        timeMs: 0,
        model: 'lightning',
        view: 'front',
        facing: 'away',
        still: true,
        referenceLine: frame.truth.referenceLine,
      });
      node.reset();
      const nodeAway = orientKeypoints(
        (await node.detect({ data: frame.rgba, width: frame.width, height: frame.height, channels: 4 }))
          .keypoints,
        'away',
      );
      for (const joint of BODY_JOINTS) {
        const a = away.keypoints.find((k) => k.name === joint)!;
        const b = nodeAway.find((k) => k.name === joint)!;
        expect(
          Math.hypot(a.x - b.x, a.y - b.y) / frame.truth.torsoLength,
          `${joint} browser vs Node`,
        ).toBeLessThan(BROWSER_NODE_AGREEMENT);
      }
      expect(Math.sign(away.metrics.inclination!)).toBe(Math.sign(frame.truth.metrics.inclination!));
    } finally {
      node.dispose();
      await page.close();
    }
  }, 300_000);

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
