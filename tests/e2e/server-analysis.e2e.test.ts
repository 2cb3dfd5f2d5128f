// Analysis on the server, in headless Chromium, on the invented demo club: Finn's clip from the second
// session was left for the server, which analyses it in the background after the first start; the
// athlete page shows where it stands and the clip page shows the progress, then the stored curves.
// And a clip this browser cannot decode (its video answers with bytes no decoder reads) is handed to
// the server with a message instead of an error.
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { StartedStanceline } from '@server/start';
import type { ClipDto } from '@shared/schemas/clip.schema';
import { getAs, screenshotPath, signIn, startDemoApp, type DemoApp } from './browser';

const COACH = 'coach@larchwood.example';

let app: StartedStanceline;
let browser: Browser;
let demo: DemoApp | undefined;

beforeAll(async () => {
  demo = await startDemoApp('server-analysis', { ANALYSIS_WORKERS: '1' });
  ({ app, browser } = demo);
}, 180_000);
afterAll(async () => {
  await demo?.close();
});

/** The demo clip seeded for the server to analyse (the one whose clip reports a server analysis). */
async function clipLeftForServer(): Promise<string> {
  const { clips } = await getAs<{ clips: ClipDto[] }>(app.url, COACH, '/api/clips');
  const clip = clips.find((c) => c.serverAnalysis && c.athletes.some((a) => a.name === 'Finn Marrow'));
  expect(clip, 'the demo clip left for the server').toBeDefined();
  return clip!.id;
}

describe('analysis on the server', () => {
  it(
    'the clip left for the server shows its progress, then its stored analysis',
    { timeout: 180_000 },
    async () => {
      const page = await (await browser.newContext({ viewport: { width: 1400, height: 1000 } })).newPage();
      await signIn(page, app.url, COACH);
      await page.getByRole('link', { name: 'Athletes' }).click();
      await page.getByRole('link', { name: 'Finn Marrow', exact: true }).click();
      const clipId = await clipLeftForServer();
      const row = page
        .getByRole('region', { name: 'Clips', exact: true })
        .locator(`a[href$="/clips/${clipId}"]`);
      // Queued, analysing or already analysed, depending on how far the server got.
      await expect
        .poll(async () => (await row.textContent()) ?? '', { timeout: 30_000 })
        .toMatch(/Queued for analysis|Analysing \d+ %|Analysed/);
      await page.screenshot({ path: screenshotPath('server-analysis-athlete'), fullPage: true });
      await row.click();
      const status = page.getByTestId('server-analysis');
      await status.waitFor();
      await page.getByTestId('server-analysis-done').waitFor({ timeout: 120_000 });
      await expect
        .poll(async () => (await status.textContent()) ?? '')
        .toMatch(/Analysed on the server with Lightning/);
      // The stored frames appear without a reload: every frame of the clip.
      const stored = page.getByTestId('stored-analysis');
      await expect
        .poll(async () => (await stored.textContent()) ?? '', { timeout: 30_000 })
        .toMatch(/^(\d+) of \1 frames analysed with Lightning/);
      await page.screenshot({ path: screenshotPath('server-analysis-clip'), fullPage: true });
    },
  );

  it(
    'a clip this browser cannot decode is handed to the server with a message, not an error',
    { timeout: 180_000 },
    async () => {
      const context = await browser.newContext({ viewport: { width: 1400, height: 1000 } });
      const page = await context.newPage();
      await signIn(page, app.url, COACH);
      await page.getByRole('link', { name: 'Athletes' }).click();
      await page.getByRole('link', { name: 'Elsie Marrow', exact: true }).click();
      await page
        .getByRole('link', { name: /phantom-side-run\.mp4/ })
        .first()
        .click();
      await page.getByRole('button', { name: 'Analyze whole clip' }).waitFor();
      // From now on the clip's video answers with bytes no decoder can read.
      await context.route(/\/api\/clips\/[^/]+\/media/, (route) =>
        route.fulfill({ status: 200, contentType: 'video/mp4', body: Buffer.alloc(4096, 7) }),
      );
      await page.getByRole('button', { name: 'Analyze whole clip' }).click();
      const handed = page.getByTestId('handed-over');
      await handed.waitFor({ timeout: 60_000 });
      await expect
        .poll(async () => (await handed.textContent()) ?? '')
        .toMatch(/cannot decode this clip.*handed to the server/s);
      expect(await page.getByRole('alert').count()).toBe(0);
      await page.getByTestId('server-analysis-done').waitFor({ timeout: 120_000 });
      await page.screenshot({ path: screenshotPath('server-analysis-handed-over'), fullPage: true });
    },
  );
});
