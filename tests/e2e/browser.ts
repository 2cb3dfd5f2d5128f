import { existsSync, mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { chromium, type Browser } from 'playwright-core';

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
