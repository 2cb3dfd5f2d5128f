import { existsSync, mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type Browser, type Page } from 'playwright-core';
import { startStanceline, type StartedStanceline } from '@server/start';

/** Debian's Chromium; tests never download a browser. */
export const CHROMIUM_PATH = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

/** Where end-to-end tests save screenshots for a person to look at. */
export const TEST_OUTPUT_DIR = join(process.cwd(), 'test-results');

export function screenshotPath(name: string): string {
  mkdirSync(TEST_OUTPUT_DIR, { recursive: true });
  return join(TEST_OUTPUT_DIR, `${name}.png`);
}

export async function launchBrowser(): Promise<Browser> {
  if (!existsSync(CHROMIUM_PATH)) {
    throw new Error(`Chromium not found at ${CHROMIUM_PATH}: install it with "apt-get install -y chromium"`);
  }
  return chromium.launch({
    executablePath: CHROMIUM_PATH,
    headless: true,
    // Without the background-networking flags Chromium keeps dialing out on a closed network.
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--autoplay-policy=no-user-gesture-required',
    ],
  });
}

/** The whole product on the demo club in a temporary folder, and a browser: what an e2e file needs. */
export interface DemoApp {
  app: StartedStanceline;
  browser: Browser;
  close(): Promise<void>;
}

/**
 * The demo app on a fresh data folder. Server-side analysis is off unless `env` turns it on: it would
 * take a core from the browser under test (the demo's queued clip then stays queued).
 */
export async function startDemoApp(name: string, env: Record<string, string> = {}): Promise<DemoApp> {
  // A build from an earlier run is reused; a clean clone builds once here.
  if (!existsSync(join(process.cwd(), 'dist', 'index.html'))) {
    const { build } = await import('vite');
    await build({ root: process.cwd(), logLevel: 'warn' });
  }
  const workDir = mkdtempSync(join(tmpdir(), `stanceline-${name}-e2e-`));
  const app = await startStanceline({
    port: 0,
    dataDir: join(workDir, 'data'),
    logLevel: 'warn',
    env: { ANALYSIS_WORKERS: '0', ...env },
  });
  const browser = await launchBrowser();
  return {
    app,
    browser,
    async close() {
      await browser.close();
      await app.close();
      rmSync(workDir, { recursive: true, force: true });
    },
  };
}

/** The demo club's password (server/seed/demo-club.ts); the club and its people are invented. */
export const DEMO_PASSWORD = 'stanceline-demo';

/** Fills and sends the sign-in form already on the page (after a redirect to it, say). */
/** An Authorization header for a demo user, signed in over the API. */
export async function bearerFor(baseUrl: string, email: string): Promise<{ authorization: string }> {
  const login = await fetch(`${baseUrl}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password: DEMO_PASSWORD }),
  });
  const { accessToken } = (await login.json()) as { accessToken: string };
  return { authorization: `Bearer ${accessToken}` };
}

/** GET a JSON API path as a demo user. */
export async function getAs<T>(baseUrl: string, email: string, path: string): Promise<T> {
  const res = await fetch(`${baseUrl}${path}`, { headers: await bearerFor(baseUrl, email) });
  if (!res.ok) throw new Error(`GET ${path}: ${res.status}`);
  return (await res.json()) as T;
}

export async function fillSignIn(page: Page, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.getByLabel('Email').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

/** Opens the sign-in page, signs in, and waits for the app's main navigation. */
export async function signIn(page: Page, baseUrl: string, email: string): Promise<void> {
  await page.goto(`${baseUrl}/login`);
  await fillSignIn(page, email);
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
}
