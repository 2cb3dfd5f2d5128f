// The whole-clip run's two ways of getting frames, in headless Chromium on the demo club's side clip
// (the phantom skier, fixtures/phantom/demo): decoding in order with WebCodecs (mediabunny demuxes,
// the browser's VideoDecoder decodes), and the fallback that seeks a hidden <video> for each frame.
// Both must give the same frame numbers and the same points (within 0.05 torso lengths per joint).
// The time each took is printed for information; speed is measured by `npm run bench`.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ClipFramesResponse } from '@shared/schemas/frames.schema';
import type { StartedStanceline } from '@server/start';
import { getAs, signIn, startDemoApp, type DemoApp } from './browser';

const COACH = 'coach@larchwood.example';
const SIDE = 'phantom-side-run';
const truth = JSON.parse(
  readFileSync(join(process.cwd(), 'fixtures', 'phantom', 'demo', `${SIDE}.truth.json`), 'utf8'),
) as { frames: { torsoLength: number }[] };

let app: StartedStanceline;
let browser: Browser;
let demo: DemoApp | undefined;

beforeAll(async () => {
  demo = await startDemoApp('decoder');
  ({ app, browser } = demo);
}, 180_000);
afterAll(async () => {
  await demo?.close();
});

async function storedFrames(clipId: string): Promise<ClipFramesResponse['frames']> {
  return (await getAs<ClipFramesResponse>(app.url, COACH, `/api/clips/${clipId}/frames?model=lightning`))
    .frames;
}

/** Runs "Analyze whole clip" on the open clip; returns the decoder it reported and the seconds taken. */
async function analyseWholeClip(page: Page): Promise<{ decoder: string; seconds: number }> {
  await page.getByRole('button', { name: 'Analyze whole clip' }).click();
  const finished = page.getByTestId('analysis-finished');
  await finished.waitFor({ timeout: 300_000 });
  const elapsed = Number(await finished.locator('[data-elapsed-ms]').getAttribute('data-elapsed-ms'));
  return { decoder: (await finished.getAttribute('data-decoder')) ?? '', seconds: elapsed / 1000 };
}

describe('decoding frames for the whole-clip run', () => {
  it(
    'WebCodecs and the seek fallback give the same frames and the same points',
    { timeout: 600_000 },
    async () => {
      const page = await (await browser.newContext({ viewport: { width: 1400, height: 1000 } })).newPage();
      await signIn(page, app.url, COACH);
      await page.getByRole('link', { name: 'Athletes' }).click();
      await page.getByRole('link', { name: 'Elsie Marrow', exact: true }).click();
      await page
        .getByRole('region', { name: 'Clips', exact: true })
        .getByRole('link', { name: new RegExp(`${SIDE}\\.mp4`) })
        .click();
      await page.getByRole('button', { name: 'Analyze whole clip' }).waitFor();
      const clipId = /\/clips\/([0-9a-f-]+)/.exec(page.url())![1];

      const decoded = await analyseWholeClip(page);
      expect(decoded.decoder).toBe('webcodecs');
      const byDecoder = await storedFrames(clipId);

      // The same run with the fallback: a setting the app reads for exactly this comparison.
      await page.evaluate(() => window.localStorage.setItem('stanceline.analysis.decoder', 'seek'));
      await page.reload();
      const sought = await analyseWholeClip(page);
      expect(sought.decoder).toBe('seek');
      const bySeeking = await storedFrames(clipId);
      process.stdout.write(
        `whole clip (${bySeeking.length} frames, Lightning): WebCodecs ${decoded.seconds.toFixed(1)} s, seeking ${sought.seconds.toFixed(1)} s\n`,
      );

      expect(byDecoder.map((f) => f.frameIndex)).toEqual([...truth.frames.keys()]);
      expect(bySeeking.map((f) => f.frameIndex)).toEqual(byDecoder.map((f) => f.frameIndex));
      // The two decoders' pixels differ a little (colour conversion), and the model answers a little
      // differently: per joint, the median over the clip's frames must be within 0.05 torso lengths,
      // and so must 95 % of all readings; none may be on another body part (0.25).
      const gaps = new Map<string, number[]>();
      for (const [i, a] of byDecoder.entries()) {
        const b = bySeeking[i];
        expect(a.keypoints.length, `frame ${a.frameIndex}`).toBe(b.keypoints.length);
        for (const k of a.keypoints) {
          const o = b.keypoints.find((p) => p.name === k.name)!;
          const gap = Math.hypot(k.x - o.x, k.y - o.y) / truth.frames[a.frameIndex].torsoLength;
          gaps.set(k.name, [...(gaps.get(k.name) ?? []), gap]);
        }
      }
      const sorted = (v: number[]) => [...v].sort((p, q) => p - q);
      for (const [joint, values] of gaps) {
        expect(sorted(values)[Math.floor(values.length / 2)], `${joint}, median`).toBeLessThan(0.05);
      }
      const all = sorted([...gaps.values()].flat());
      expect(all[Math.floor(all.length * 0.95)], '95th percentile').toBeLessThan(0.05);
      expect(all[all.length - 1], 'largest').toBeLessThan(0.25);
      process.stdout.write(
        `decoder against seeking: median ${all[Math.floor(all.length / 2)].toFixed(3)}, p95 ${all[Math.floor(all.length * 0.95)].toFixed(3)}, largest ${all[all.length - 1].toFixed(3)} torso lengths\n`,
      );
    },
  );
});
