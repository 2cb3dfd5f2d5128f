import { execFile } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import ffmpeg from '@ffmpeg-installer/ffmpeg';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startStanceline, type StartedStanceline } from '@server/start';
import { launchBrowser, screenshotPath, signIn as signInAt } from './browser';

const run = promisify(execFile);

// Demo sign-ins and people come from the server's invented demo club (server/seed/demo-club.ts).
const COACH_NAV = ['Home', 'Athletes', 'Sessions', 'Upload', 'Standards', 'Exports'];
const PASSWORD = 'stanceline-demo';
const DEMO = {
  head: 'head@larchwood.example',
  coach: 'coach@larchwood.example',
  analyst: 'analyst@larchwood.example',
  athlete: 'athlete@larchwood.example',
  guardian: 'guardian@larchwood.example',
} as const;
// Elsie Marrow: U14 (coached by coach@), consent recorded, the demo athlete, child of the demo guardian.
const TAGGED_ATHLETE = 'Elsie Marrow';
const SIBLING = 'Finn Marrow';
const CLIP_NAME = 'pattern-drill.mp4';
const NEW_COACH = 'new.coach@larchwood.example';
// A ceiling for waiting while a busy CI machine renders, not a speed check.
const POLL = { timeout: 15_000 };

let app: StartedStanceline;
let browser: Browser;
let workDir: string;
let clipPath: string;
let textPath: string;

/** A 3 s H.264 clip of ffmpeg's built-in test pattern: invented content, playable by Chromium. */
async function makeClip(path: string): Promise<void> {
  await run(ffmpeg.path, [
    '-hide_banner',
    '-loglevel',
    'error',
    '-f',
    'lavfi',
    '-i',
    'testsrc=size=640x360:rate=30:duration=3',
    '-c:v',
    'libx264',
    '-pix_fmt',
    'yuv420p',
    '-movflags',
    '+faststart',
    '-y',
    path,
  ]);
}

const signIn = (page: Page, email: string) => signInAt(page, app.url, email);

async function navNames(page: Page): Promise<string[]> {
  return page.getByRole('navigation', { name: 'Main' }).getByRole('link').allInnerTexts();
}

beforeAll(async () => {
  if (!existsSync(join(process.cwd(), 'dist', 'index.html'))) {
    const { build } = await import('vite');
    await build({ root: process.cwd(), logLevel: 'warn' });
  }
  workDir = mkdtempSync(join(tmpdir(), 'stanceline-e2e-'));
  clipPath = join(workDir, CLIP_NAME);
  textPath = join(workDir, 'lap-times.txt');
  writeFileSync(textPath, 'run 1 41.2\nrun 2 40.8\n');
  await makeClip(clipPath);
  app = await startStanceline({
    port: 0,
    dataDir: join(workDir, 'data'),
    logLevel: 'warn',
    // No analysis on the server: it would take a core from the browser under test.
    env: { ANALYSIS_WORKERS: '0' },
  });
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
  await app?.close();
  if (workDir) rmSync(workDir, { recursive: true, force: true });
});

// The tests share one server and run in order: the clip uploaded first is what the athlete and
// guardian look for afterwards.
describe('foundation in a real browser', () => {
  it('a coach signs in, opens Athletes, uploads a clip and watches it play', async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 860 } });
    const page = await context.newPage();

    // A protected page sends a signed-out visitor to sign in, and back afterwards.
    await page.goto(`${app.url}/athletes`);
    await page.waitForURL(/\/login$/);
    await page.screenshot({ path: screenshotPath('foundation-01-sign-in'), fullPage: true });
    await page.getByLabel('Email').fill(DEMO.coach);
    await page.getByLabel('Password').fill(PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(/\/athletes$/);

    await expect.poll(() => navNames(page), POLL).toEqual(COACH_NAV);
    await page.getByRole('heading', { name: 'Athletes', level: 1 }).waitFor();
    await page.getByRole('link', { name: TAGGED_ATHLETE }).waitFor();
    expect(await page.getByRole('button', { name: 'Add athlete' }).count()).toBe(1);
    await page.screenshot({ path: screenshotPath('foundation-02-athletes'), fullPage: true });

    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Upload' }).click();
    await page.getByRole('heading', { name: 'Upload clips' }).waitFor();
    await page.getByText('Filming on the hill').waitFor();
    await page.getByLabel('Choose clips').setInputFiles([clipPath, textPath]);

    // The text file is refused in the browser before anything is sent.
    await page.getByText('lap-times.txt is not a video clip').waitFor();
    expect(await page.getByRole('listitem', { name: 'lap-times.txt' }).count()).toBe(0);

    const row = page.getByRole('listitem', { name: CLIP_NAME });
    await row.getByLabel(`Add athlete to ${CLIP_NAME}`).selectOption({ label: TAGGED_ATHLETE });
    await row.getByLabel(`View of ${CLIP_NAME}`).selectOption('side');
    await page.getByRole('button', { name: 'Upload clip' }).click();
    await row.getByText('Uploaded', { exact: true }).waitFor({ timeout: 30_000 });
    const progress = row.getByRole('progressbar', { name: `Upload progress of ${CLIP_NAME}` });
    expect(await progress.getAttribute('aria-valuenow')).toBe('100');
    await page.screenshot({ path: screenshotPath('foundation-03-upload'), fullPage: true });

    await row.getByRole('link', { name: 'Open clip' }).click();
    await page.waitForURL(/\/clips\/[0-9a-f-]{36}$/);
    await page.getByRole('heading', { name: CLIP_NAME }).waitFor();
    await page.getByText('2D estimates, not medical advice').waitFor();

    const video = page.locator('video');
    await page.waitForFunction(() => (document.querySelector('video')?.readyState ?? 0) >= 2, undefined, {
      timeout: 30_000,
    });
    const start = await video.evaluate(async (el: HTMLVideoElement) => {
      el.muted = true;
      await el.play();
      return el.currentTime;
    });
    await page.waitForFunction(
      (t0) => (document.querySelector('video')?.currentTime ?? 0) > t0 + 0.2,
      start,
      {
        timeout: 30_000,
      },
    );
    const state = await video.evaluate((el: HTMLVideoElement) => ({
      readyState: el.readyState,
      currentTime: el.currentTime,
      width: el.videoWidth,
      height: el.videoHeight,
    }));
    expect(state.readyState).toBeGreaterThanOrEqual(2);
    expect(state.currentTime).toBeGreaterThan(start);
    // The fixture is 640 x 360 (the ffmpeg arguments above).
    expect([state.width, state.height]).toEqual([640, 360]);
    await video.evaluate((el: HTMLVideoElement) => el.pause());
    await page.screenshot({ path: screenshotPath('foundation-04-clip'), fullPage: true });
    await context.close();
  });

  it('the head coach invites a coach who joins through the e-mailed link', async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 860 } });
    const page = await context.newPage();
    await signIn(page, DEMO.head);
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Club' }).click();
    const form = page.getByRole('form', { name: 'Invite a member' });
    await form.getByLabel('Email').fill(NEW_COACH);
    await form.getByLabel('Role').selectOption('coach');
    await form.getByLabel('U10').check();
    await form.getByRole('button', { name: 'Send invitation' }).click();
    await page.getByText(`Invitation sent to ${NEW_COACH}.`).waitFor();
    await context.close();

    const mail = (await app.mailbox.messages()).find((m) => m.to.includes(NEW_COACH));
    const link = /https?:\/\/\S+\/invite\/[\w-]+/.exec(mail?.text ?? '')?.[0];
    expect(link, 'invitation e-mail with a link').toBeTruthy();

    const invited = await (await browser.newContext({ viewport: { width: 1280, height: 860 } })).newPage();
    await invited.goto(link!);
    await invited.getByText('Larchwood Valley Ski Club').waitFor();
    expect(await invited.getByLabel('Email').inputValue()).toBe(NEW_COACH);
    await invited.getByLabel('Your name').fill('Nia Brookfield');
    await invited.getByLabel('Choose a password').fill('short');
    await invited.getByRole('button', { name: 'Join the club' }).click();
    await invited.getByText('Use at least 10 characters').waitFor();
    await invited.getByLabel('Choose a password').fill('slalom-gates-in-fog');
    await invited.getByRole('button', { name: 'Join the club' }).click();
    await expect.poll(() => navNames(invited), POLL).toEqual(COACH_NAV);
    await invited.getByText('Nia Brookfield').waitFor();
    await invited.screenshot({ path: screenshotPath('foundation-05-invited-coach'), fullPage: true });
    await invited.context().close();
  });

  it('each demo role sees only its own sections', async () => {
    const expected: Record<keyof typeof DEMO, string[]> = {
      head: ['Home', 'Athletes', 'Sessions', 'Upload', 'Standards', 'Exports', 'Club'],
      coach: COACH_NAV,
      analyst: ['Athletes', 'Sessions', 'Standards', 'Exports'],
      athlete: ['Home'],
      guardian: ['Home'],
    };
    for (const role of Object.keys(DEMO) as (keyof typeof DEMO)[]) {
      const context = await browser.newContext({ viewport: { width: 1280, height: 860 } });
      const page = await context.newPage();
      await signIn(page, DEMO[role]);
      await expect.poll(() => navNames(page), { ...POLL, message: role }).toEqual(expected[role]);
      await page.getByRole('heading', { level: 1 }).waitFor();
      // Every spinner on the page says "Loading …"; wait for the data before the screenshot.
      await page.waitForFunction(() => !document.body.innerText.includes('Loading'));
      await page.screenshot({ path: screenshotPath(`foundation-role-${role}`), fullPage: true });

      if (role === 'analyst') {
        await page.getByRole('link', { name: TAGGED_ATHLETE }).waitFor();
        expect(await page.getByRole('button', { name: 'Add athlete' }).count()).toBe(0);
        await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Sessions' }).click();
        await page.getByRole('heading', { name: 'Sessions', level: 1 }).waitFor();
        await page.getByRole('table', { name: 'Training sessions' }).waitFor();
        expect(await page.getByRole('button', { name: 'New session' }).count()).toBe(0);
        await page.goto(`${app.url}/upload`);
        await page.getByText('Not available to your role').waitFor();
      }
      if (role === 'athlete') {
        await page.getByRole('heading', { name: 'My clips' }).waitFor();
        // Her clips reach her through published reviews: the demo review's clip, not the one just uploaded.
        await page.getByRole('list', { name: 'Reviews' }).getByRole('link').first().waitFor();
        await page
          .getByRole('link', { name: /phantom-spring-turns/ })
          .first()
          .waitFor();
        expect(await page.getByRole('link', { name: new RegExp(CLIP_NAME) }).count()).toBe(0);
        await page.goto(`${app.url}/athletes`);
        await page.getByText('Not available to your role').waitFor();
      }
      if (role === 'guardian') {
        const child = page.getByRole('region', { name: TAGGED_ATHLETE });
        await child
          .getByRole('link', { name: /phantom-spring-turns/ })
          .first()
          .waitFor();
        expect(await child.getByRole('link', { name: new RegExp(CLIP_NAME) }).count()).toBe(0);
        await page.getByRole('region', { name: SIBLING }).waitFor();
        expect(await page.getByRole('button', { name: /upload|add|new/i }).count()).toBe(0);
      }
      if (role === 'head') {
        await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Club' }).click();
        await page.getByRole('heading', { name: 'Club', level: 1 }).waitFor();
        await page.getByRole('form', { name: 'Invite a member' }).waitFor();
        // Demo staff from server/seed/demo-club.ts: the coach of U12 and U14.
        const members = page.getByRole('table', { name: 'Club members' });
        await members.getByRole('row', { name: /Tomas Reinholt.*Coach.*U12, U14/ }).waitFor();
        await page.screenshot({ path: screenshotPath('foundation-06-club'), fullPage: true });
      }

      await page.getByRole('button', { name: 'Sign out' }).click();
      await page.waitForURL(/\/login$/);
      await context.close();
    }
  });
});
