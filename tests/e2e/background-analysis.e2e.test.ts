// A training day's clips analysed on the coach's computer in the background, in headless Chromium on
// the invented demo club: the coach uploads a clip on the Upload page, the browser analyses it from the
// local file while the coach goes on in the app (a header indicator says so; pause and resume work), the
// server's own analysis of the clip waits meanwhile, and the stored points are the ones the server
// computes from the same file (the analyze CLI's committed keypoints, per joint within 0.05 torso
// lengths at the median).
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ClipResponse, ServerAnalysisResponse } from '@shared/schemas/clip.schema';
import type { ClipFramesResponse } from '@shared/schemas/frames.schema';
import type { StartedStanceline } from '@server/start';
import { getAs, screenshotPath, signIn, startDemoApp, type DemoApp } from './browser';

const COACH = 'coach@larchwood.example';
const SIDE = 'phantom-side-run';
const FILE = join(process.cwd(), 'fixtures', 'phantom', 'demo', `${SIDE}.mp4`);
const truth = JSON.parse(
  readFileSync(join(process.cwd(), 'fixtures', 'phantom', 'demo', `${SIDE}.truth.json`), 'utf8'),
) as { frames: { torsoLength: number }[] };
const cli = JSON.parse(
  readFileSync(join(process.cwd(), 'fixtures', 'media', 'demo', `${SIDE}.lightning.json`), 'utf8'),
) as { frames: { frameIndex: number; keypoints: { name: string; x: number; y: number }[] }[] };

let app: StartedStanceline;
let browser: Browser;
let demo: DemoApp | undefined;

beforeAll(async () => {
  // No server workers: whatever gets stored here, the browser computed.
  demo = await startDemoApp('background');
  ({ app, browser } = demo);
}, 180_000);
afterAll(async () => {
  await demo?.close();
});

const api = <T>(path: string) => getAs<T>(app.url, COACH, path);

describe('analysis on this computer after an upload', () => {
  it(
    'analyses the uploaded clip in the background, pauses and resumes, and stores the same points as the server would',
    { timeout: 300_000 },
    async () => {
      const page = await (await browser.newContext({ viewport: { width: 1400, height: 1000 } })).newPage();
      await signIn(page, app.url, COACH);
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Upload' }).click();
      await page.getByRole('heading', { name: 'Upload clips' }).waitFor();
      expect(await page.getByLabel(/Analyse the clips on this computer/).isChecked()).toBe(true);
      await page.getByLabel('Choose clips').setInputFiles([FILE]);
      const name = `${SIDE}.mp4`;
      const row = page.getByRole('listitem', { name });
      await row.getByLabel(`Add athlete to ${name}`).selectOption({ label: 'Elsie Marrow' });
      await row.getByLabel(`View of ${name}`).selectOption('side');
      await page.getByRole('button', { name: 'Upload clip' }).click();

      const status = row.getByTestId('background-analysis');
      await expect.poll(() => status.getAttribute('data-state'), { timeout: 60_000 }).toBe('analysing');
      await page.getByRole('button', { name: 'Pause analysis' }).click();
      await expect.poll(() => status.getAttribute('data-state')).toBe('paused');
      await page.getByText(/Analysis here is paused/).waitFor();
      await page.screenshot({ path: screenshotPath('background-analysis-paused'), fullPage: true });
      await page.getByRole('button', { name: 'Resume analysis' }).click();
      await expect.poll(() => status.getAttribute('data-state'), { timeout: 30_000 }).toBe('analysing');

      // The coach goes on in the app; the header says the analysis runs.
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Home' }).click();
      const indicator = page.getByTestId('background-indicator');
      await expect
        .poll(async () => (await indicator.textContent()) ?? '', { timeout: 30_000 })
        .toMatch(/Analysing 1 clip/);
      await page.screenshot({ path: screenshotPath('background-analysis-indicator'), fullPage: true });
      await indicator.waitFor({ state: 'detached', timeout: 240_000 });

      const clipId = (await api<{ clips: ClipResponse['clip'][] }>('/api/clips')).clips.find(
        (c) => c.originalName === name && c.createdAt > new Date(Date.now() - 600_000).toISOString(),
      )!.id;
      const server = await api<ServerAnalysisResponse>(`/api/clips/${clipId}/server-analysis`);
      expect(server.storedFrames).toBe(server.frameCount);
      // The server's job waited (held by the browser) and read nothing.
      expect(server.serverAnalysis?.status).toBe('queued');

      const stored = await api<ClipFramesResponse>(`/api/clips/${clipId}/frames?model=lightning`);
      expect(stored.frames.map((f) => f.frameIndex)).toEqual(cli.frames.map((f) => f.frameIndex));
      const gaps = new Map<string, number[]>();
      for (const [i, f] of stored.frames.entries()) {
        for (const k of f.keypoints) {
          const o = cli.frames[i].keypoints.find((p) => p.name === k.name);
          if (!o) continue;
          gaps.set(k.name, [
            ...(gaps.get(k.name) ?? []),
            Math.hypot(k.x - o.x, k.y - o.y) / truth.frames[f.frameIndex].torsoLength,
          ]);
        }
      }
      for (const [joint, values] of gaps) {
        const median = [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)];
        expect(median, joint).toBeLessThan(0.05);
      }
    },
  );
});
