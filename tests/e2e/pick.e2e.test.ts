// Picking the athlete in the clip workspace, in headless Chromium, on the invented demo club's front
// clip (fixtures/phantom/demo): the coach clicks "Pick the athlete", then on the skier's hips at
// frame 0; the pick is stored where they clicked. With a model not yet run on the clip, the next frame
// is read around the skier found there (the last, far from any read frame, in the whole picture, and
// the readout says so). The whole-clip run, read carefully, follows the skier from the pick through
// every frame, and "Forget" goes back to whoever the model finds.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ClipResponse } from '@shared/schemas/clip.schema';
import type { ClipFramesResponse } from '@shared/schemas/frames.schema';
import type { StartedStanceline } from '@server/start';
import { getAs, screenshotPath, signIn, startDemoApp, type DemoApp } from './browser';

const COACH = 'coach@larchwood.example';
const FRONT = 'phantom-front-turns';
const truth = JSON.parse(
  readFileSync(join(process.cwd(), 'fixtures', 'phantom', 'demo', `${FRONT}.truth.json`), 'utf8'),
) as {
  frames: { joints: Record<string, [number, number]>; width: number; height: number; torsoLength: number }[];
};

let app: StartedStanceline;
let browser: Browser;
let demo: DemoApp | undefined;

beforeAll(async () => {
  demo = await startDemoApp('pick');
  ({ app, browser } = demo);
}, 180_000);
afterAll(async () => {
  await demo?.close();
});

/** Clicks the stage at a point of the video (pixels), through the pick layer. */
async function clickVideoPoint(
  page: Page,
  [x, y]: [number, number],
  size: { width: number; height: number },
) {
  const layer = page.getByRole('button', { name: 'Click on the athlete' });
  const box = (await layer.boundingBox())!;
  // At 100 % the video fills the stage's width (the stage keeps the video's aspect).
  await layer.click({ position: { x: (x / size.width) * box.width, y: (y / size.height) * box.height } });
}

describe('picking the athlete', () => {
  it(
    'a coach picks the skier with one click, sees them measured, and the pick is stored',
    { timeout: 180_000 },
    async () => {
      const page = await (await browser.newContext({ viewport: { width: 1400, height: 1000 } })).newPage();
      await signIn(page, app.url, COACH);
      await page.getByRole('link', { name: 'Athletes' }).click();
      await page.getByRole('link', { name: 'Elsie Marrow', exact: true }).click();
      await page
        .getByRole('link', { name: `${FRONT}.mp4` })
        .first()
        .click();
      const readouts = page.getByRole('region', { name: 'Readouts' });
      await readouts.getByText('whoever the model finds').waitFor();
      const first = truth.frames[0];
      const hips: [number, number] = [
        (first.joints.left_hip[0] + first.joints.right_hip[0]) / 2,
        (first.joints.left_hip[1] + first.joints.right_hip[1]) / 2,
      ];

      await readouts.getByRole('button', { name: 'Pick the athlete' }).click();
      await clickVideoPoint(page, hips, first);
      await page.getByText(/Athlete picked at frame 0/).waitFor();
      await readouts.getByText('picked at frame 0').waitFor();
      const inclination = readouts.locator('[data-metric="inclination"]');
      await expect
        .poll(async () => (await inclination.textContent()) ?? '', { timeout: 60_000 })
        .toMatch(/-?\d+\.\d°/);
      await page.screenshot({ path: screenshotPath('pick-athlete'), fullPage: true });

      // With a model that has no stored analysis of this clip, the pick's frame is read at the pick,
      // and the next frame around the athlete as found there.
      await readouts.getByRole('combobox', { name: 'Pose model' }).selectOption('thunder');
      await readouts.getByText('at the athlete you picked').waitFor({ timeout: 60_000 });
      await page.getByRole('button', { name: 'Next frame' }).click();
      await readouts.getByText('around the athlete as found in frame 0').waitFor({ timeout: 60_000 });
      // The last frame is far from any read frame: read in the whole picture, and the readout says so.
      await page.keyboard.press('End');
      await readouts.getByText(/Read in the whole picture, so another person may be measured/).waitFor({
        timeout: 60_000,
      });
      await readouts.getByRole('combobox', { name: 'Pose model' }).selectOption('lightning');
      await page.keyboard.press('Home');

      // Stored with the clip, in the clip's own pixels, where the coach clicked.
      const clipId = /\/clips\/([0-9a-f-]+)/.exec(page.url())![1];
      const stored = await getAs<ClipResponse>(app.url, COACH, `/api/clips/${clipId}`);
      expect(stored.clip.athletePick?.frameIndex).toBe(0);
      expect(
        Math.hypot(stored.clip.athletePick!.x - hips[0], stored.clip.athletePick!.y - hips[1]),
      ).toBeLessThan(3);

      // The whole-clip run starts at the pick and follows the skier through every frame, read carefully
      // (each box with its mirror image too), which the page says before the run and after it.
      await page.getByRole('checkbox', { name: 'Careful reading' }).check();
      await page.getByTestId('careful-note').getByText('about 2 times as long').waitFor();
      await page.getByRole('button', { name: 'Analyze whole clip' }).click();
      await page.getByTestId('analysis-finished').getByText('read carefully').waitFor({ timeout: 300_000 });
      await page.getByTestId('stored-analysis').getByText('read carefully').waitFor();
      const frames = await getAs<ClipFramesResponse>(
        app.url,
        COACH,
        `/api/clips/${clipId}/frames?model=lightning`,
      );
      expect(frames.frames.length).toBe(truth.frames.length);
      expect(frames.frames.every((f) => f.careful)).toBe(true);
      let onSkier = 0;
      for (const f of frames.frames) {
        const want = truth.frames[f.frameIndex];
        const at = (name: string) => f.keypoints.find((k) => k.name === name);
        const l = at('left_hip');
        const r = at('right_hip');
        if (!l || !r) continue;
        const apart = Math.hypot(
          (l.x + r.x) / 2 - (want.joints.left_hip[0] + want.joints.right_hip[0]) / 2,
          (l.y + r.y) / 2 - (want.joints.left_hip[1] + want.joints.right_hip[1]) / 2,
        );
        if (apart / want.torsoLength < 0.25) onSkier += 1;
      }
      expect(onSkier / truth.frames.length).toBeGreaterThan(0.95);

      await readouts.getByRole('button', { name: 'Forget' }).click();
      await readouts.getByText('whoever the model finds').waitFor();
    },
  );
});
