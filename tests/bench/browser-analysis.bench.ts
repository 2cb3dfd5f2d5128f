// Analysis speed in headless Chromium (Debian's, software rendering), measured side by side in one run:
//  - whole-clip throughput on a 60 fps phantom clip with Lightning: frames decoded in order with
//    WebCodecs against the older seeking of a hidden video, frames per second;
//  - readouts latency: a frame step (→) to the readouts showing that frame's numbers, live detection
//    (no stored analysis yet) and from the stored analysis, median and 95th percentile;
//  - the pose backend the browser chose (WebGL where the machine offers it, else WASM).
//
//   npx tsx tests/bench/browser-analysis.bench.ts [--frames 240] [--steps 40] [--write docs/benchmarks.md]
import { mkdirSync } from 'node:fs';
import { cpus } from 'node:os';
import { join } from 'node:path';
import { parseArgs } from 'node:util';
import type { Page } from 'playwright-core';
import { encodeClip, frontTurnsClip } from '../../fixtures/phantom/phantom-clip';
import { bearerFor, signIn, startDemoApp } from '../e2e/browser';
import { writeDocSection } from '../pose/doc-section';

const { values } = parseArgs({
  options: {
    frames: { type: 'string', default: '240' },
    steps: { type: 'string', default: '40' },
    write: { type: 'string' },
  },
});
const FRAMES = Number(values.frames);
const STEPS = Number(values.steps);
const quantile = (v: number[], q: number) =>
  [...v].sort((a, b) => a - b)[Math.min(v.length - 1, Math.floor(v.length * q))];
const say = (text: string) => process.stderr.write(`${text}\n`);

const dir = join(process.cwd(), 'fixtures', 'generated', 'bench');
mkdirSync(dir, { recursive: true });
const clip60 = frontTurnsClip({ fps: 60 });
clip60.frames = clip60.frames.slice(0, FRAMES);
const mp4 = join(dir, `front-turns-60fps-${FRAMES}.mp4`);
await encodeClip(clip60, { mp4 });

const demo = await startDemoApp('browser-bench');
const COACH = 'coach@larchwood.example';
const rows: string[] = [];
try {
  // Upload the clip as the coach, through the API, and wait until it is ready.
  const auth = await bearerFor(demo.app.url, COACH);
  const sessions = (await (await fetch(`${demo.app.url}/api/sessions`, { headers: auth })).json()) as {
    sessions: { id: string }[];
  };
  const athletes = (await (await fetch(`${demo.app.url}/api/athletes`, { headers: auth })).json()) as {
    athletes: { id: string; firstName: string }[];
  };
  const form = new FormData();
  form.set('sessionId', sessions.sessions[0].id);
  form.set('athleteIds', athletes.athletes.find((a) => a.firstName === 'Elsie')!.id);
  form.set('view', 'front');
  form.set(
    'file',
    new Blob([await (await import('node:fs/promises')).readFile(mp4)], { type: 'video/mp4' }),
    'bench-60fps.mp4',
  );
  const created = (await (
    await fetch(`${demo.app.url}/api/clips`, { method: 'POST', headers: auth, body: form })
  ).json()) as {
    clip: { id: string };
  };
  const clipId = created.clip.id;
  for (;;) {
    const c = (await (await fetch(`${demo.app.url}/api/clips/${clipId}`, { headers: auth })).json()) as {
      clip: { status: string };
    };
    if (c.clip.status === 'ready') break;
    if (c.clip.status === 'failed') throw new Error('the bench clip did not process');
    await new Promise((r) => setTimeout(r, 300));
  }

  const page = await (await demo.browser.newContext({ viewport: { width: 1400, height: 1000 } })).newPage();
  await signIn(page, demo.app.url, COACH);
  await page.goto(`${demo.app.url}/clips/${clipId}`);
  await page.getByRole('button', { name: 'Analyze whole clip' }).waitFor();
  const backend = await page.evaluate<string>(
    `document.createElement('canvas').getContext('webgl2') ? 'WebGL 2 available' : 'no WebGL 2'`,
  );

  /** Steps one frame forward `STEPS` times; ms from the key press to the readouts showing that frame. */
  async function stepLatencies(p: Page, origin: string): Promise<number[]> {
    const times: number[] = [];
    await p
      .locator('video')
      .first()
      .click({ position: { x: 5, y: 5 } })
      .catch(() => undefined);
    for (let i = 0; i < STEPS; i++) {
      // A string, not a function: the bench runs through tsx, whose helpers do not exist in the page.
      const ms = await p.evaluate<number>(`new Promise((resolve, reject) => {
        const wanted = ${JSON.stringify(origin)};
        const region = document.querySelector('[aria-label="Readouts"]') || document.body;
        const frameOf = () => Number((/Frame (\\d+), /.exec(region.textContent || '') || [])[1] ?? -1);
        const before = frameOf();
        const start = performance.now();
        const check = () => {
          if (frameOf() === before + 1 && (region.textContent || '').includes(wanted)) {
            observer.disconnect();
            resolve(performance.now() - start);
          }
        };
        const observer = new MutationObserver(check);
        observer.observe(region, { subtree: true, childList: true, characterData: true });
        setTimeout(() => { observer.disconnect(); reject(new Error('no readouts for frame ' + (before + 1))); }, 10000);
        document.body.dispatchEvent(new KeyboardEvent('keydown', { key: 'ArrowRight', bubbles: true }));
      })`);
      times.push(ms);
    }
    return times;
  }

  say('readouts, live');
  // The first detection loads the model: not part of a step.
  await page.keyboard.press('ArrowRight');
  await page.getByText(/Frame 1, detected on this frame/).waitFor({ timeout: 60_000 });
  const live = await stepLatencies(page, 'detected on this frame');

  let workerBackend = '';
  async function wholeClip(decoder: 'webcodecs' | 'seek'): Promise<number> {
    await page.evaluate(
      decoder === 'seek'
        ? `window.localStorage.setItem('stanceline.analysis.decoder', 'seek')`
        : `window.localStorage.removeItem('stanceline.analysis.decoder')`,
    );
    await page.reload();
    await page.getByRole('button', { name: 'Analyze whole clip' }).click();
    const finished = page.getByTestId('analysis-finished');
    await finished.waitFor({ timeout: 600_000 });
    if ((await finished.getAttribute('data-decoder')) !== decoder) throw new Error(`expected ${decoder}`);
    workerBackend = (await finished.getAttribute('data-backend')) ?? '';
    const ms = Number(await finished.locator('[data-elapsed-ms]').getAttribute('data-elapsed-ms'));
    return (FRAMES * 1000) / ms;
  }
  say('whole clip, seeking');
  const seekFps = await wholeClip('seek');
  say('whole clip, WebCodecs');
  const decodedFps = await wholeClip('webcodecs');

  say('readouts, stored');
  await page.reload();
  await page.getByRole('button', { name: 'Analyze whole clip' }).waitFor();
  await page.keyboard.press('ArrowRight');
  await page.getByText(/Frame 1, from the stored analysis/).waitFor({ timeout: 60_000 });
  const stored = await stepLatencies(page, 'from the stored analysis');

  rows.push(
    `${FRAMES} frames of a 640×360 phantom clip at 60 fps, uploaded to the demo app; Lightning in the pose worker on its ${workerBackend} backend (the page reports ${backend}; the worker tries WebGL, then WASM). Whole-clip figures are the app's own timing of "Analyze whole clip" (decode, detect, post the frames).`,
    '',
    '| figure | seeking a hidden video (before) | WebCodecs in order (now) | now / before | goal |',
    '|---|---|---|---|---|',
    `| whole clip, frames per second | ${seekFps.toFixed(1)} | ${decodedFps.toFixed(1)} | ${(decodedFps / seekFps).toFixed(2)} | ≥ 15 |`,
    '',
    `| readouts after a frame step (${STEPS} steps) | median | 95th percentile | goal (95th) |`,
    '|---|---|---|---|',
    `| live detection (no stored analysis) | ${quantile(live, 0.5).toFixed(0)} ms | ${quantile(live, 0.95).toFixed(0)} ms | < 150 ms |`,
    `| from the stored analysis | ${quantile(stored, 0.5).toFixed(0)} ms | ${quantile(stored, 0.95).toFixed(0)} ms | < 150 ms |`,
  );
} finally {
  await demo.close();
}

const command = `npx tsx tests/bench/browser-analysis.bench.ts --frames ${FRAMES} --steps ${STEPS}${values.write ? ` --write ${values.write}` : ''}`;
const section = [
  '<!-- browser-analysis:start -->',
  '## Analysis speed in headless Chromium',
  '',
  `Generated by \`${command}\` on ${cpus().length} × ${cpus()[0]?.model ?? 'cpu'}, Debian's Chromium, headless, no GPU.`,
  '',
  ...rows,
  '<!-- browser-analysis:end -->',
].join('\n');
if (values.write) writeDocSection(values.write, 'browser-analysis', section);
process.stdout.write(`${section}\n`);
