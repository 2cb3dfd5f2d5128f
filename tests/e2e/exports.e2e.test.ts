// Exports end to end in Debian's headless Chromium, on the invented demo club: an analyst picks an
// age group and some metrics, sees the row count, downloads the CSV and finds every column in the
// codebook beside it.
import { readFileSync } from 'node:fs';
import Papa from 'papaparse';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { StartedStanceline } from '@server/start';
import { screenshotPath, startDemoApp, type DemoApp } from './browser';

const PASSWORD = 'stanceline-demo';
const ANALYST = 'analyst@larchwood.example';

let app: StartedStanceline;
let browser: Browser;
let demo: DemoApp | undefined;

beforeAll(async () => {
  demo = await startDemoApp('exports');
  ({ app, browser } = demo);
}, 180_000);

afterAll(async () => {
  await demo?.close();
});

describe('exports in a real browser', () => {
  it(
    'an analyst chooses U14 and two metrics, sees the row count and downloads a CSV that parses',
    { timeout: 120_000 },
    async () => {
      const context = await browser.newContext({
        viewport: { width: 1400, height: 1000 },
        acceptDownloads: true,
      });
      const page = await context.newPage();
      await page.goto(`${app.url}/login`);
      await page.getByLabel('Email').fill(ANALYST);
      await page.getByLabel('Password').fill(PASSWORD);
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Exports' }).click();
      await page.getByRole('heading', { name: 'Exports', level: 1 }).waitFor();

      await page.getByLabel('Age group').selectOption({ label: 'U14' });
      for (const label of (await page.getByRole('checkbox').all()).slice(0)) {
        const name = await label.evaluate((el) => el.parentElement?.textContent?.trim() ?? '');
        if (name !== 'Stance width' && name !== 'Shoulder tilt' && (await label.isChecked()))
          await label.uncheck();
      }
      const status = page.getByRole('status').filter({ hasText: /rows from/ });
      await expect.poll(() => status.innerText(), { timeout: 15_000 }).toMatch(/14 columns/);
      const text = await status.innerText();
      const rows = Number(/([\d,]+) rows from/.exec(text)![1].replace(/,/g, ''));
      expect(rows).toBeGreaterThan(100);
      // The codebook beside it names the chosen columns with their units.
      const codebook = page.getByRole('complementary', { name: 'Codebook' });
      await codebook.getByRole('rowheader', { name: 'stanceWidthRatio_ratio' }).waitFor();
      await page.screenshot({ path: screenshotPath('exports-analyst'), fullPage: true });

      const [download] = await Promise.all([
        page.waitForEvent('download'),
        page.getByRole('button', { name: 'Download CSV' }).click(),
      ]);
      const file = await download.path();
      const csv = readFileSync(file!, 'utf8').replace(/^\uFEFF/, '');
      const parsed = Papa.parse<Record<string, string>>(csv, { header: true, skipEmptyLines: true });
      expect(parsed.errors).toEqual([]);
      expect(parsed.meta.fields).toEqual([
        'clip_id',
        'clip_name',
        'athlete_id',
        'session_date',
        'view',
        'model',
        'frame',
        'time_ms',
        'corrected',
        'careful',
        'stanceWidthRatio_ratio',
        'stanceWidthRatio_conf',
        'shoulderTilt_deg',
        'shoulderTilt_conf',
      ]);
      expect(parsed.data).toHaveLength(rows);
      expect(parsed.data.some((r) => r.stanceWidthRatio_ratio !== '')).toBe(true);
    },
  );
});
