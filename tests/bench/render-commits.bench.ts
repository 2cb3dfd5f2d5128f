// React commits per second of playback in the clip workspace, per panel, in Debian's headless Chromium.
// The client is built in development mode (React calls Profiler onRender only there) into a temporary
// folder and served by the real app with the demo club; a coach opens the analysed demo front clip,
// plays it at normal speed, and the page's RenderProbe wrappers count commits of the chart, the
// readouts, the notes and the whole page. Printed beside the figures recorded on the commit before the
// stage was reshaped (docs/benchmarks.md), with the ratio.
import { mkdtempSync, rmSync, symlinkSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { build } from 'vite';
import type { ClipListResponse } from '@shared/schemas/clip.schema';
import { startStanceline } from '@server/start';
import { launchBrowser } from '../e2e/browser';

const ROOT = process.cwd();
const PLAY_SECONDS = 4;
const RUNS = 3;
const PANELS = ['page', 'chart', 'readouts', 'notes'] as const;

/**
 * Commits per second measured the same way at commit f9fea2f (one 60-field workspace context, before
 * the stage was reshaped): the median of three 4 s runs on this 2-core machine. See docs/benchmarks.md.
 */
const BEFORE: Record<(typeof PANELS)[number], number> = {
  page: 8.2,
  chart: 8.2,
  readouts: 5.5,
  notes: 5.5,
};
const BEFORE_SHOWN = 2.5;

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

async function main() {
  const work = mkdtempSync(join(tmpdir(), 'stanceline-render-bench-'));
  try {
    // The product build with React's profiling renderer: production speed, and Profiler reports commits.
    await build({
      root: ROOT,
      logLevel: 'warn',
      resolve: { alias: [{ find: /^react-dom\/client$/, replacement: 'react-dom/profiling' }] },
      build: { outDir: join(work, 'dist'), emptyOutDir: true, sourcemap: false },
    });
    symlinkSync(join(ROOT, 'models'), join(work, 'models'));
    symlinkSync(join(ROOT, 'node_modules'), join(work, 'node_modules'));
    const app = await startStanceline({
      port: 0,
      dataDir: join(work, 'data'),
      logLevel: 'warn',
      projectRoot: work,
    });
    const browser = await launchBrowser();
    try {
      const login = await fetch(`${app.url}/api/auth/login`, {
        method: 'POST',
        headers: { 'Content-Type': 'application/json' },
        body: JSON.stringify({ email: 'coach@larchwood.example', password: 'stanceline-demo' }),
      });
      const { accessToken } = (await login.json()) as { accessToken: string };
      const list = (await (
        await fetch(`${app.url}/api/clips`, { headers: { Authorization: `Bearer ${accessToken}` } })
      ).json()) as ClipListResponse;
      const clip = list.clips.find((c) => c.originalName.includes('front') && c.status === 'ready');
      if (!clip) throw new Error('the demo club has no ready front clip');

      const page = await (await browser.newContext({ viewport: { width: 1400, height: 1000 } })).newPage();
      await page.goto(`${app.url}/login`);
      await page.getByLabel('Email').fill('coach@larchwood.example');
      await page.getByLabel('Password').fill('stanceline-demo');
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.getByRole('navigation', { name: 'Main' }).waitFor();
      await page.goto(`${app.url}/clips/${clip.id}`);
      await page.getByTestId('curves-chart').waitFor({ timeout: 60_000 });
      await page.waitForFunction(() => (document.querySelector('video')?.readyState ?? 0) >= 2);

      const perRun: Record<string, number[]> = Object.fromEntries(PANELS.map((p) => [p, []]));
      const framesShown: number[] = [];
      for (let run = 0; run < RUNS; run++) {
        await page.evaluate(
          "(() => { const v = document.querySelector('video'); v.pause(); v.currentTime = 0; })()",
        );
        await page.waitForTimeout(500);
        // A string, not a function: tsx would wrap inner functions in a helper the page does not have.
        const result = (await page.evaluate(`(async () => {
          const video = document.querySelector('video');
          let shown = 0;
          const count = () => { shown++; video.requestVideoFrameCallback(count); };
          video.requestVideoFrameCallback(count);
          window.__renderCommits = {};
          await video.play();
          const started = performance.now();
          await new Promise((r) => setTimeout(r, ${PLAY_SECONDS * 1000}));
          const elapsed = (performance.now() - started) / 1000;
          const commits = { ...window.__renderCommits };
          const advanced = video.currentTime;
          const quality = video.getVideoPlaybackQuality();
          video.pause();
          window.__renderCommits = undefined;
          return { commits, elapsed, shown, advanced, total: quality.totalVideoFrames, dropped: quality.droppedVideoFrames };
        })()`)) as { commits: Record<string, number>; elapsed: number; shown: number };
        for (const p of PANELS) perRun[p].push((result.commits[p] ?? 0) / result.elapsed);
        framesShown.push(result.shown / result.elapsed);
      }

      console.log(
        `clip workspace playback, ${clip.originalName} at 1x, ${RUNS} runs of ${PLAY_SECONDS} s (median)`,
      );
      const shownNow = median(framesShown);
      console.log(
        `video frames presented: ${shownNow.toFixed(1)} per second (before: ${Number.isFinite(BEFORE_SHOWN) ? BEFORE_SHOWN.toFixed(1) : 'n/a'})`,
      );
      console.log('panel      commits/s now   before (f9fea2f)   now/before   commits per frame presented');
      for (const p of PANELS) {
        const now = median(perRun[p]);
        const before = BEFORE[p];
        const ratio = Number.isFinite(before) && before > 0 ? (now / before).toFixed(3) : 'n/a';
        console.log(
          `${p.padEnd(10)} ${now.toFixed(1).padStart(13)}   ${(Number.isFinite(before) ? before.toFixed(1) : 'n/a').padStart(16)}   ${ratio.padStart(10)}   ${(now / shownNow).toFixed(2).padStart(27)}`,
        );
      }
    } finally {
      await browser.close();
      await app.close();
    }
  } finally {
    rmSync(work, { recursive: true, force: true });
  }
}

await main();
