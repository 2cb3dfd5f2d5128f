// Consent and data end to end in Debian's headless Chromium, on the invented demo club: the demo
// guardian, on a phone held upright (390 × 844), downloads all of her daughter's data as one zip,
// withdraws consent and sees the erasure date while the reviews disappear, then restores it. The head
// coach finds Arlo's withdrawal (seeded) on the Club page and on his athlete page, and changes the
// grace period.
import { readFile } from 'node:fs/promises';
import type { Browser, Page } from 'playwright-core';
import { unzipSync, strFromU8 } from 'fflate';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { StartedStanceline } from '@server/start';
import { screenshotPath, signIn as signInAt, startDemoApp, type DemoApp } from './browser';

// Demo sign-ins from the server's invented demo club (server/seed/demo-club.ts).
const GUARDIAN = 'guardian@larchwood.example';
const HEAD = 'head@larchwood.example';
const PHONE = { viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true };

let app: StartedStanceline;
let browser: Browser;
let demo: DemoApp | undefined;

const signIn = (page: Page, email: string) => signInAt(page, app.url, email);

beforeAll(async () => {
  demo = await startDemoApp('privacy');
  ({ app, browser } = demo);
}, 180_000);

afterAll(async () => {
  await demo?.close();
});

describe('consent and data in a real browser', () => {
  it(
    'a guardian on a phone downloads her daughter’s data, withdraws consent and restores it',
    { timeout: 180_000 },
    async () => {
      const page = await (await browser.newContext({ ...PHONE, acceptDownloads: true })).newPage();
      await signIn(page, GUARDIAN);
      const elsie = page.getByRole('region', { name: 'Elsie Marrow' });
      await elsie
        .getByRole('link', { name: /Free skiing on the lower pitch/ })
        .first()
        .waitFor();
      const card = elsie.locator('section', { has: page.getByRole('heading', { name: 'Consent and data' }) });
      await card.getByText('Clips are stored and reviews are sent by e-mail.').waitFor();

      // The whole of her data, as one zip the browser saves.
      const [download] = await Promise.all([
        page.waitForEvent('download'),
        card.getByRole('button', { name: 'Download all data' }).click(),
      ]);
      expect(download.suggestedFilename()).toMatch(/^stanceline-elsie-marrow-\d{4}-\d{2}-\d{2}\.zip$/);
      const files = unzipSync(new Uint8Array(await readFile((await download.path())!)));
      const records = JSON.parse(strFromU8(files['athlete.json'])) as {
        athlete: { firstName: string };
        clips: unknown[];
      };
      expect(records.athlete.firstName).toBe('Elsie');
      expect(records.clips.length).toBeGreaterThanOrEqual(3);
      expect(Object.keys(files).some((name) => name.endsWith('/original.mp4'))).toBe(true);
      await card
        .getByRole('status')
        .getByText(/Your download has started/)
        .waitFor();

      await card.getByRole('button', { name: 'Withdraw consent' }).click();
      const dialog = page.getByRole('dialog', { name: 'Withdraw consent for Elsie?' });
      await dialog.getByText(/erased for good when the club’s grace period ends/).waitFor();
      await dialog.getByRole('button', { name: 'Withdraw consent' }).click();
      await card.getByText(/will be erased on/).waitFor();
      // The club's 30-day grace period, shown as the day it ends.
      const due = new Intl.DateTimeFormat('en-GB', {
        weekday: 'short',
        day: 'numeric',
        month: 'short',
        year: 'numeric',
        timeZone: 'UTC',
      }).format(new Date(Date.now() + 30 * 86_400_000));
      expect(await card.textContent()).toContain(
        `hidden from everyone but the head coach and will be erased on ${due}`,
      );
      // Her shared review and clips are gone from the page at once.
      await elsie.getByText('No review shared yet.').waitFor();
      await page.screenshot({ path: screenshotPath('privacy-guardian-withdrawn'), fullPage: true });
      const box = await card.getByRole('button', { name: 'Restore consent' }).boundingBox();
      expect(box!.width).toBeGreaterThan(300); // a full-width button on a phone

      await card.getByRole('button', { name: 'Restore consent' }).click();
      await page
        .getByRole('dialog', { name: 'Restore consent for Elsie?' })
        .getByRole('button', { name: 'Restore consent' })
        .click();
      await elsie
        .getByRole('link', { name: /Free skiing on the lower pitch/ })
        .first()
        .waitFor();
      await card.locator('summary', { hasText: 'Consent record' }).click();
      const record = card.getByRole('list', { name: 'Consent record' });
      await record.getByText('Consent restored').waitFor();
      await record.getByText('Consent withdrawn').waitFor();
    },
  );

  it(
    'the head coach sees the seeded withdrawal and sets the grace period',
    { timeout: 180_000 },
    async () => {
      const page = await (await browser.newContext({ viewport: { width: 1400, height: 1000 } })).newPage();
      await signIn(page, HEAD);
      await page.goto(`${app.url}/club`);
      const privacy = page.locator('#privacy');
      const pending = privacy.getByRole('listitem').filter({ hasText: 'Arlo Eskdale' });
      await pending.getByText(/1 clip, erased on/).waitFor();
      await privacy
        .getByRole('cell', { name: /^20\d\d-\d\d \(ends/ })
        .first()
        .waitFor();
      const grace = privacy.getByLabel('Grace period after consent is withdrawn (days)');
      await grace.fill('-3');
      await privacy.getByRole('button', { name: 'Save privacy settings' }).click();
      await privacy.getByText('The grace period cannot be negative').waitFor();
      await grace.fill('14');
      await privacy.getByRole('button', { name: 'Save privacy settings' }).click();
      await page.getByText('Privacy settings saved').waitFor();
      await page.screenshot({ path: screenshotPath('privacy-club-settings'), fullPage: true });

      await pending.getByRole('link', { name: 'Arlo Eskdale' }).click();
      await page.getByRole('heading', { name: 'Arlo Eskdale' }).waitFor();
      const card = page.locator('section', { has: page.getByRole('heading', { name: 'Consent and data' }) });
      await card.getByText(/will be erased on/).waitFor();
      await card.locator('summary', { hasText: 'Consent record' }).click();
      await card
        .getByRole('list', { name: 'Consent record' })
        .getByText(/Jo Eskdale, e-mail/)
        .waitFor();
      // The head coach still sees his clip, to answer questions before it goes.
      await page.getByText('phantom-side-run.mp4').first().waitFor();
      await page.screenshot({ path: screenshotPath('privacy-athlete-withdrawn'), fullPage: true });
    },
  );
});
