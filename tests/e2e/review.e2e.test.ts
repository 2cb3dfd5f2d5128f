// A review end to end in Debian's headless Chromium, on the invented demo club: a coach starts a review
// from Elsie's later clip, chooses two notes and a focus point, writes a summary and publishes it; Elsie
// opens the e-mailed link on a phone held upright (390 × 844), signs in, plays her run with the tilt
// gauge drawn on her, taps a note and lands on its frame. Her guardian reads it without edit controls;
// a teammate who opens the same link gets the not-found page.
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { StartedStanceline } from '@server/start';
import { DEMO_PASSWORD, fillSignIn, screenshotPath, startDemoApp, type DemoApp } from './browser';

// Demo sign-ins from the server's invented demo club (server/seed/demo-club.ts).
const PHONE = { viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true };

let app: StartedStanceline;
let browser: Browser;
let demo: DemoApp | undefined;
let reviewLink = '';

/** Signs in on the form a link redirected to (the page asked for opens afterwards). */
const signIn = fillSignIn;

async function api<T>(path: string, init: { token?: string; body?: unknown } = {}): Promise<T> {
  const res = await fetch(`${app.url}${path}`, {
    method: init.body === undefined ? 'GET' : 'POST',
    headers: {
      'content-type': 'application/json',
      ...(init.token ? { authorization: `Bearer ${init.token}` } : {}),
    },
    body: init.body === undefined ? undefined : JSON.stringify(init.body),
  });
  if (!res.ok) throw new Error(`${path}: ${res.status} ${await res.text()}`);
  return (await res.json()) as T;
}

beforeAll(async () => {
  demo = await startDemoApp('review');
  ({ app, browser } = demo);
}, 180_000);

afterAll(async () => {
  await demo?.close();
});

describe('a review read on a phone', () => {
  it('a coach composes and publishes a review from a clip', { timeout: 180_000 }, async () => {
    const page = await (await browser.newContext({ viewport: { width: 1400, height: 1000 } })).newPage();
    await page.goto(`${app.url}/login`);
    await signIn(page, 'coach@larchwood.example');
    await page.getByRole('navigation', { name: 'Main' }).waitFor();
    await page.goto(`${app.url}/athletes`);
    await page.getByRole('link', { name: 'Elsie Marrow', exact: true }).click();
    await page.getByRole('link', { name: 'phantom-spring-turns.mp4', exact: true }).first().click();
    await page.getByRole('button', { name: 'Start a review for Elsie Marrow' }).click();
    await page.waitForURL(/\/reviews\/[0-9a-f-]+\/edit$/);
    const summary = 'Knees apart at the apex, Elsie. Watch the two moments, then keep the headlights on.';
    await page.getByLabel('Summary').fill(summary);
    const notes = page.getByRole('list', { name: 'Notes to share' }).getByRole('checkbox');
    await expect.poll(() => notes.count()).toBe(2); // the demo's two notes on this clip
    for (const note of await notes.all()) await note.check();
    await page
      .getByRole('list', { name: 'Focus points to share' })
      .getByLabel(/Knees apart at the apex/)
      .check();
    await page.getByText('All changes saved').waitFor();
    await page.getByRole('button', { name: 'Publish', exact: true }).click();
    await page.getByText(/Published: e-mailed to/).waitFor();
    await page.screenshot({ path: screenshotPath('review-editor'), fullPage: true });
    const reviewId = /\/reviews\/([0-9a-f-]+)\/edit/.exec(page.url())![1];

    const mail = (await app.mailbox.messages()).filter((m) => m.to === 'athlete@larchwood.example').at(-1);
    expect(mail?.text).toContain(summary);
    reviewLink = /https?:\/\/\S+\/reviews\/[0-9a-f-]+/.exec(mail?.text ?? '')?.[0] ?? '';
    expect(reviewLink).toContain(reviewId);
    const guardianMail = (await app.mailbox.messages())
      .filter((m) => m.to === 'guardian@larchwood.example')
      .at(-1);
    expect(guardianMail?.html).toContain('Knees apart at the apex, Elsie.');
    await page.context().close();
  });

  it(
    'the athlete signs in from the e-mailed link, plays her run with the tilt gauge, and taps a note',
    { timeout: 120_000 },
    async () => {
      const context = await browser.newContext(PHONE);
      const page = await context.newPage();
      await page.goto(reviewLink.replace(/^https?:\/\/[^/]+/, app.url));
      await signIn(page, 'athlete@larchwood.example');
      await page
        .getByRole('heading', { name: 'Free skiing on the lower pitch' })
        .or(page.getByRole('heading', { name: /Elsie: / }))
        .first()
        .waitFor();
      expect(new URL(page.url()).pathname).toMatch(/^\/reviews\//);
      await page.getByText('Knees apart at the apex, Elsie.').waitFor();
      // No flag chips, no model picker, no curves: the coach's page is not hers.
      expect(await page.getByText(/against 0\.\d\d to/).count()).toBe(0);
      expect(await page.getByLabel('Model').count()).toBe(0);

      // The tilt gauge is drawn on her: the overlay canvas has coloured pixels once the pose is shown.
      const video = page.locator('video').first();
      await expect
        .poll(() => video.evaluate((el: HTMLVideoElement) => el.readyState), { timeout: 20_000 })
        .toBeGreaterThanOrEqual(2);
      const inked = () =>
        page.evaluate(() => {
          const canvas = [...document.querySelectorAll('canvas')].find((c) => c.width > 0 && c.height > 0);
          const ctx = canvas?.getContext('2d');
          if (!canvas || !ctx) return 0;
          const data = ctx.getImageData(0, 0, canvas.width, canvas.height).data;
          let n = 0;
          for (let i = 3; i < data.length; i += 4) if (data[i] > 0) n++;
          return n;
        });
      await page.getByRole('button', { name: 'Next frame' }).tap();
      await expect.poll(inked, { timeout: 20_000 }).toBeGreaterThan(50);

      await page.getByRole('button', { name: 'Play' }).tap();
      const frameText = page.getByTestId('review-frame');
      const before = await frameText.textContent();
      await expect.poll(() => frameText.textContent(), { timeout: 10_000 }).not.toBe(before);
      await page.getByRole('button', { name: 'Pause' }).tap();

      // A note seeks to its moment.
      const notes = page.getByRole('region', { name: /Your coach.s notes/ });
      await notes.getByRole('button', { name: /Inside hand forward/ }).tap();
      await expect.poll(() => frameText.textContent(), { timeout: 10_000 }).toMatch(/^frame 63 /);
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
      await page.screenshot({ path: screenshotPath('review-phone-athlete'), fullPage: true });
      await context.close();
    },
  );

  it(
    'the guardian reads it without edit controls; a teammate gets the not-found page',
    { timeout: 120_000 },
    async () => {
      const guardian = await (await browser.newContext(PHONE)).newPage();
      const path = new URL(reviewLink).pathname;
      await guardian.goto(`${app.url}${path}`);
      await signIn(guardian, 'guardian@larchwood.example');
      await guardian.getByText('Knees apart at the apex, Elsie.').waitFor();
      expect(await guardian.getByRole('button', { name: /Unpublish|Publish|Start a review/ }).count()).toBe(
        0,
      );
      expect(await guardian.getByText('Preview').count()).toBe(0);
      await guardian.screenshot({ path: screenshotPath('review-phone-guardian'), fullPage: true });
      await guardian.context().close();

      // Kit, Elsie's U14 teammate, joins as an athlete through an invitation, then tries the link.
      const { accessToken } = await api<{ accessToken: string }>('/api/auth/login', {
        body: { email: 'head@larchwood.example', password: DEMO_PASSWORD },
      });
      const { athletes } = await api<{ athletes: { id: string; firstName: string }[] }>('/api/athletes', {
        token: accessToken,
      });
      const kit = athletes.find((a) => a.firstName === 'Kit')!;
      await api('/api/invitations', {
        token: accessToken,
        body: { email: 'kit@larchwood.example', role: 'athlete', athleteId: kit.id },
      });
      const invite = (await app.mailbox.messages()).filter((m) => m.to === 'kit@larchwood.example').at(-1);
      const token = /\/invite\/([\w-]+)/.exec(invite?.text ?? '')![1];
      await api('/api/invitations/accept', {
        body: { token, name: 'Kit Ashby', password: 'teammate-on-the-tbar' },
      });
      const teammate = await (await browser.newContext(PHONE)).newPage();
      await teammate.goto(`${app.url}${path}`);
      await signIn(teammate, 'kit@larchwood.example', 'teammate-on-the-tbar');
      await teammate.getByRole('heading', { name: 'Review not found' }).waitFor();
      expect(await teammate.getByRole('button', { name: /Try again|Retry/ }).count()).toBe(0);
      await teammate.screenshot({ path: screenshotPath('review-phone-teammate'), fullPage: true });
      await teammate.context().close();
    },
  );

  it(
    'the head coach deletes the clip on request; the review goes with it',
    { timeout: 120_000 },
    async () => {
      const reviewPath = new URL(reviewLink).pathname;
      const page = await (await browser.newContext({ viewport: { width: 1280, height: 900 } })).newPage();
      await page.goto(`${app.url}/login`);
      await signIn(page, 'head@larchwood.example');
      await page.getByRole('navigation', { name: 'Main' }).waitFor();
      await page.goto(`${app.url}${reviewPath}`);
      await page.getByText('Knees apart at the apex, Elsie.').waitFor();
      await page.goto(`${app.url}/athletes`);
      await page.getByRole('link', { name: 'Elsie Marrow', exact: true }).click();
      await page.getByRole('link', { name: 'phantom-spring-turns.mp4', exact: true }).first().click();
      await page.getByRole('button', { name: 'Delete clip' }).click();
      await page.getByRole('dialog').getByRole('button', { name: 'Delete the clip' }).click();
      await page.waitForURL(/\/sessions\//);
      await page.getByText('phantom-spring-turns.mp4 was deleted').waitFor();
      await page.context().close();

      const athlete = await (await browser.newContext(PHONE)).newPage();
      await athlete.goto(`${app.url}${reviewPath}`);
      await signIn(athlete, 'athlete@larchwood.example');
      await athlete.getByRole('heading', { name: 'Review not found' }).waitFor();
      await athlete.context().close();
    },
  );
});
