// Season plan and Compare end to end in Debian's headless Chromium, on the invented demo club: a coach
// marks Elsie's baseline, adds a focus point tied to knee separation and sees its value per clip, opens
// Compare (baseline left, her later clip right), syncs by turn, steps both clips to the third apex and
// reads the change in the table; then keeps a side-by-side still.
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { StartedStanceline } from '@server/start';
import { screenshotPath, signIn as signInAt, startDemoApp, type DemoApp } from './browser';

// Demo sign-ins from the server's invented demo club (server/seed/demo-club.ts).
const COACH = 'coach@larchwood.example';
const BASELINE = 'phantom-front-turns.mp4';
const LATER = 'phantom-spring-turns.mp4';

let app: StartedStanceline;
let browser: Browser;
let demo: DemoApp | undefined;

const signIn = (page: Page, email: string) => signInAt(page, app.url, email);

beforeAll(async () => {
  demo = await startDemoApp('season-plan');
  ({ app, browser } = demo);
}, 180_000);

afterAll(async () => {
  await demo?.close();
});

describe('season plan and Compare in a real browser', () => {
  it(
    'a coach marks the baseline, adds a knee-separation focus point, and compares apex on apex',
    { timeout: 240_000 },
    async () => {
      const page = await (await browser.newContext({ viewport: { width: 1400, height: 1000 } })).newPage();
      await signIn(page, COACH);
      await page.getByRole('link', { name: 'Athletes' }).click();
      await page.waitForURL('**/athletes');
      await page.getByRole('link', { name: 'Elsie Marrow', exact: true }).click();
      const plan = page.getByRole('list', { name: 'Season plan of Elsie' });
      // The demo plan: three focus points, the autumn front clip as baseline.
      await expect.poll(() => plan.getByRole('listitem').and(page.locator('li[draggable]')).count()).toBe(3);

      // Mark the baseline again from the season's clips (clear it first so the mark is this test's own).
      await page.getByRole('button', { name: `Clear ${BASELINE} as baseline` }).click();
      await page.getByRole('button', { name: `Mark ${BASELINE} as baseline` }).click();
      await page.getByRole('button', { name: `Clear ${BASELINE} as baseline` }).waitFor();

      // A focus point tied to knee separation at the apex, target 1.0 to 1.3 hip widths.
      await page.getByRole('button', { name: 'Add focus point' }).click();
      const dialog = page.getByRole('dialog');
      await dialog.getByLabel('Title').fill('Knees over the feet');
      await dialog.getByLabel('Measured by').selectOption('kneeSeparationRatio');
      await dialog.getByLabel('Lowest').fill('1');
      await dialog.getByLabel('Highest').fill('1.3');
      await dialog.getByRole('button', { name: 'Add focus point' }).click();
      const item = plan.getByRole('listitem', { name: 'Knees over the feet' });
      await item.waitFor();
      // Its path through the season: one value per clip, the baseline marked.
      const values = item.getByRole('list', { name: 'Knees over the feet: value per clip' });
      await expect.poll(() => values.getByRole('listitem').count()).toBeGreaterThanOrEqual(2);
      await values.getByText('Baseline').waitFor();
      expect(await values.getByText('Not plotted').count()).toBeGreaterThanOrEqual(1); // the side-view clip
      await page.screenshot({ path: screenshotPath('season-plan'), fullPage: true });

      // Keyboard reordering: the new point moves up one place.
      await item.getByRole('button', { name: 'Move Knees over the feet up' }).focus();
      await page.keyboard.press('Enter');
      await expect
        .poll(async () =>
          (await plan.locator('li[draggable] h3').allTextContents()).findIndex((t) =>
            t.includes('Knees over the feet'),
          ),
        )
        .toBe(2);

      await page.getByRole('link', { name: 'Compare baseline with latest' }).click();
      await page.getByRole('heading', { name: 'Compare' }).waitFor();
      const left = page.getByTestId('left-position');
      const right = page.getByTestId('right-position');
      await expect.poll(() => left.textContent()).toContain(BASELINE);
      await expect.poll(() => right.textContent()).toContain(LATER);
      await expect.poll(() => page.getByLabel('By turn (apex on apex)').isChecked()).toBe(true);

      // Step both clips to the third apex: next apex three times from the start.
      const both = page.getByRole('group', { name: 'Both clips' });
      for (let k = 0; k < 3; k++) {
        await both.getByRole('button', { name: 'Next apex' }).click();
        await expect.poll(() => left.textContent(), { timeout: 15_000 }).toContain(`apex of turn ${k + 1}`);
      }
      await expect.poll(() => right.textContent(), { timeout: 15_000 }).toContain('apex of turn 3');
      // A frame on and back: both move, and both land on the apex again.
      await both.getByRole('button', { name: 'Next frame' }).click();
      await expect.poll(() => left.textContent()).toContain('in turn 3');
      await both.getByRole('button', { name: 'Previous frame' }).click();
      await expect.poll(() => left.textContent()).toContain('apex of turn 3');
      await expect.poll(() => right.textContent(), { timeout: 15_000 }).toContain('apex of turn 3');

      // The focus-point table at the matched apex: knees wider apart in the later clip.
      const row = page.getByRole('row', { name: 'Knee separation' });
      const change = page.getByTestId('change-kneeSeparationRatio');
      await expect.poll(() => change.textContent()).toMatch(/^[+−±]\d\.\d\d$/);
      const cells = await row.getByRole('cell').allTextContents();
      const [l, r] = cells.slice(0, 2).map(Number);
      expect(Number.isFinite(l) && Number.isFinite(r)).toBe(true);
      const shown = (await change.textContent())!.replace('−', '-').replace('±', '');
      expect(Number(shown)).toBeCloseTo(r - l, 2);
      expect(r).toBeGreaterThan(l); // the spring clip's knees are 0.10 hip widths wider by construction
      await page.screenshot({ path: screenshotPath('compare-third-apex'), fullPage: true });

      // A side-by-side still kept with the pair.
      await both.getByRole('button', { name: 'Keep a side-by-side still' }).click();
      const kept = page.getByRole('region', { name: 'Stills kept with these two clips' });
      await kept.getByRole('img').waitFor({ timeout: 20_000 });
      expect(await kept.getByText('Both at the apex of turn 3').count()).toBe(1);
    },
  );

  it(
    'the athlete reads her season plan on a phone held upright, without edit controls',
    { timeout: 120_000 },
    async () => {
      const context = await browser.newContext({
        viewport: { width: 390, height: 844 },
        isMobile: true,
        hasTouch: true,
      });
      const page = await context.newPage();
      await signIn(page, 'athlete@larchwood.example');
      const plan = page.getByRole('list', { name: 'Season plan of you' });
      await plan.getByRole('listitem', { name: 'Knees apart at the apex' }).waitFor();
      await plan.getByText('Two headlights on your knees', { exact: false }).waitFor();
      expect(await page.getByRole('button', { name: 'Add focus point' }).count()).toBe(0);
      expect(await page.getByRole('button', { name: /Move .* up/ }).count()).toBe(0);
      const values = plan.getByRole('list', { name: 'Knees apart at the apex: value per clip' });
      await expect.poll(() => values.getByRole('listitem').count()).toBeGreaterThanOrEqual(2);
      // Nothing wider than the phone: no sideways scrolling.
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
      await page.screenshot({ path: screenshotPath('season-plan-phone'), fullPage: true });
      await context.close();
    },
  );
});
