// Standards and flags end to end in Debian's headless Chromium, on the invented demo club: a coach
// lowers a band of a group they coach, the re-check runs in the background with its progress on the
// page, the new flags appear on the coach's Home, one opens its clip at its frame with the metric's
// readout in view, and it is marked reviewed. The athlete sees the band as her target range on a phone.
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { StartedStanceline } from '@server/start';
import { screenshotPath, signIn as signInAt, startDemoApp, type DemoApp } from './browser';

// Demo sign-ins from the server's invented demo club (server/seed/demo-club.ts).
const COACH = 'coach@larchwood.example';
const ATHLETE = 'athlete@larchwood.example';

let app: StartedStanceline;
let browser: Browser;
let demo: DemoApp | undefined;

const signIn = (page: Page, email: string) => signInAt(page, app.url, email);

beforeAll(async () => {
  demo = await startDemoApp('standards');
  ({ app, browser } = demo);
}, 180_000);

afterAll(async () => {
  await demo?.close();
});

describe('standards and the flag inbox in a real browser', () => {
  it(
    'a coach lowers a band, the re-check finishes, new flags reach Home and one opens its clip at its frame',
    { timeout: 180_000 },
    async () => {
      const page = await (await browser.newContext({ viewport: { width: 1400, height: 1000 } })).newPage();
      await signIn(page, COACH);
      // Coaches land on their Home: the flag inbox of the groups they coach.
      await page.getByRole('heading', { name: 'Flags to review' }).waitFor();
      expect(new URL(page.url()).pathname).toBe('/');
      const inbox = page.getByRole('region', { name: 'Flags' });
      await inbox.locator('li[data-flag]').first().waitFor();
      const stanceBefore = await inbox.locator('li[data-flag]', { hasText: 'against 0.80 to 1.10' }).count();
      expect(stanceBefore).toBe(0);

      // Standards: U14 (a group this coach coaches), stance width at most 1.10 instead of 1.30.
      await page.getByRole('link', { name: 'Standards' }).click();
      await page.getByRole('heading', { name: 'Tolerance bands' }).waitFor();
      await page
        .getByRole('navigation', { name: 'Age groups' })
        .getByRole('button', { name: /^U14/ })
        .click();
      await page.getByRole('button', { name: 'Edit Stance width for U14' }).click();
      const dialog = page.getByRole('dialog');
      await dialog.getByLabel('Highest').fill('0.7');
      await dialog.getByRole('button', { name: 'Save band' }).click();
      // The shared schema refuses a highest value under the lowest, beside the field, before any request.
      await dialog.getByText('The lowest value is above the highest; swap them').waitFor();
      await dialog.getByLabel('Highest').fill('1.1');
      await expect
        .poll(() => dialog.getByText(/Flagged when: Feet closer together than 0\.80/).count())
        .toBe(1);
      await dialog.getByRole('button', { name: 'Save band' }).click();
      await page
        .getByRole('status')
        .filter({ hasText: /Last check of stored frames \(U14 stance width changed\)/ })
        .waitFor({ timeout: 60_000 });
      const row = page.locator('tr[data-metric="stanceWidthRatio"]');
      await expect.poll(() => row.innerText()).toContain('0.80 to 1.10');
      await expect.poll(() => row.innerText()).toContain('Tomas Reinholt');
      await page
        .getByRole('list', { name: 'Band changes' })
        .getByText(/U14 stance width: 0\.80 to 1\.30 \(common practice\) → 0\.80 to 1\.10/)
        .waitFor();
      await page.screenshot({ path: screenshotPath('standards-after-change'), fullPage: true });

      // Home: the new flags, judged against the new band, newest first.
      await page.getByRole('link', { name: 'Home' }).click();
      const fresh = inbox.locator('li[data-flag]', { hasText: 'against 0.80 to 1.10' });
      await fresh.first().waitFor({ timeout: 15_000 });
      expect(await fresh.count()).toBeGreaterThan(0);
      await page.screenshot({ path: screenshotPath('coach-home-inbox'), fullPage: true });

      const first = fresh.first();
      const flagId = await first.getAttribute('data-flag');
      await first.getByRole('link', { name: 'Open at this frame' }).click();
      await page.waitForURL(/\/clips\/[^?]+\?frame=\d+&metric=stanceWidthRatio/);
      const frame = Number(new URL(page.url()).searchParams.get('frame'));
      await expect
        .poll(() => page.getByTestId('current-frame').innerText(), { timeout: 30_000 })
        .toBe(String(frame));
      const readout = page.locator('li[data-metric="stanceWidthRatio"][aria-current="true"]');
      await readout.waitFor();
      expect(await readout.isVisible()).toBe(true);
      await page.screenshot({ path: screenshotPath('flag-opened-at-frame') });

      // Back on Home, the flag is marked reviewed with a comment; it leaves the list to review.
      await page.goto(`${app.url}/`);
      const item = inbox.locator(`li[data-flag="${flagId}"]`);
      await item.getByRole('button', { name: 'Add a comment' }).click();
      await item.getByLabel('Comment for the other coaches').fill('Feet under the hips: drill on Saturday');
      await item.getByRole('button', { name: 'Mark reviewed' }).click();
      await expect.poll(() => inbox.locator(`li[data-flag="${flagId}"]`).count()).toBe(0);
      await inbox.getByRole('tab', { name: /Reviewed/ }).click();
      await inbox
        .locator(`li[data-flag="${flagId}"]`)
        .getByText(/Reviewed by Tomas Reinholt.*Feet under the hips/)
        .waitFor();
    },
  );

  it(
    'the athlete reads her band as a target range on a phone, without alarms',
    { timeout: 120_000 },
    async () => {
      const context = await browser.newContext({
        viewport: { width: 390, height: 844 },
        isMobile: true,
        hasTouch: true,
      });
      const page = await context.newPage();
      await signIn(page, ATHLETE);
      await page
        .getByRole('link', { name: /phantom-front-turns/ })
        .first()
        .click();
      const readouts = page.getByRole('region', { name: 'Readouts' });
      await readouts
        .getByText(/target range for U14/)
        .first()
        .waitFor({ timeout: 30_000 });
      expect(await readouts.getByLabel('outside band').count()).toBe(0);
      expect(await readouts.getByText(/outside U14 band/).count()).toBe(0);
      await page.screenshot({ path: screenshotPath('athlete-target-range-phone'), fullPage: true });
    },
  );
});
