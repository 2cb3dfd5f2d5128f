// The clip workspace end to end in Debian's headless Chromium, on the phantom demo clips (invented
// footage with per-frame truth, fixtures/phantom/demo): step frames, read the angles of the frame on
// screen, set the snow line, analyse the whole clip into curves and turns, pin a note with a drawing,
// export, reload and find everything stored.
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { MetricKey } from '@shared/metrics';
import type { AthleteListResponse } from '@shared/schemas/athlete.schema';
import type { ClipDto, ClipResponse } from '@shared/schemas/clip.schema';
import type { ClipFramesResponse } from '@shared/schemas/frames.schema';
import type { NoteListResponse } from '@shared/schemas/note.schema';
import type { SessionListResponse } from '@shared/schemas/session.schema';
import { startStanceline, type StartedStanceline } from '@server/start';
import { METRIC_TOLERANCE } from '../pose/tolerances';
import { launchBrowser, screenshotPath } from './browser';

// Demo sign-in and athlete from the server's invented demo club (server/seed/demo-club.ts).
const PASSWORD = 'stanceline-demo';
const COACH = 'coach@larchwood.example';
const ATHLETE = 'Elsie Marrow';

const DEMO_DIR = join(process.cwd(), 'fixtures', 'phantom', 'demo');
const FRONT = 'phantom-front-turns';
const SIDE = 'phantom-side-run';

interface TruthFrame {
  frame: number;
  metrics: Record<MetricKey, number | null>;
  referenceLine: [[number, number], [number, number]];
}
interface Truth {
  clip: {
    fps: number;
    width: number;
    height: number;
    frameCount: number;
    events: {
      transitions: number[];
      apexes: number[];
      turns: { from: number; to: number; direction: 'left' | 'right'; apex: number }[];
    };
  };
  frames: TruthFrame[];
}

const readTruth = (name: string): Truth =>
  JSON.parse(readFileSync(join(DEMO_DIR, `${name}.truth.json`), 'utf8')) as Truth;

/** The detector tests' tolerances on phantom frames (tests/pose/tolerances.ts, from docs/accuracy.md). */
const tolerance = (key: MetricKey): number => {
  const entry = METRIC_TOLERANCE.find((t) => t.key === key);
  if (!entry) throw new Error(`no stated tolerance for ${key}`);
  return entry.tolerance;
};

let app: StartedStanceline;
let browser: Browser;
let workDir: string;
let token: string;
const clips: Record<string, ClipDto> = {};

async function apiJson<T>(path: string, init: RequestInit = {}): Promise<T> {
  const res = await fetch(`${app.url}${path}`, {
    ...init,
    headers: { Accept: 'application/json', Authorization: `Bearer ${token}`, ...init.headers },
  });
  const text = await res.text();
  if (!res.ok) throw new Error(`${init.method ?? 'GET'} ${path}: HTTP ${res.status} ${text}`);
  return JSON.parse(text) as T;
}

/** Uploads a demo clip through the API (the upload screen has its own test) and waits until it is ready. */
async function uploadDemoClip(name: string, view: 'front' | 'side'): Promise<ClipDto> {
  const { sessions } = await apiJson<SessionListResponse>('/api/sessions');
  const { athletes } = await apiJson<AthleteListResponse>('/api/athletes');
  const athlete = athletes.find((a) => `${a.firstName} ${a.lastName}` === ATHLETE);
  if (!athlete || !sessions[0]) throw new Error('the demo club has no session or no tagged athlete');
  const form = new FormData();
  form.set('sessionId', sessions[0].id);
  form.set('athleteIds', athlete.id);
  form.set('view', view);
  form.set(
    'file',
    new Blob([readFileSync(join(DEMO_DIR, `${name}.mp4`))], { type: 'video/mp4' }),
    `${name}.mp4`,
  );
  const { clip } = await apiJson<ClipResponse>('/api/clips', { method: 'POST', body: form });
  const deadline = Date.now() + 120_000;
  for (;;) {
    const { clip: now } = await apiJson<ClipResponse>(`/api/clips/${clip.id}`);
    if (now.status === 'ready') return now;
    if (now.status === 'failed') throw new Error(`${name} failed to process: ${now.failureReason}`);
    if (Date.now() > deadline) throw new Error(`${name} still ${now.status} after 120 s`);
    await new Promise((r) => setTimeout(r, 500));
  }
}

async function signIn(page: Page): Promise<void> {
  await page.goto(`${app.url}/login`);
  await page.getByLabel('Email').fill(COACH);
  await page.getByLabel('Password').fill(PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
}

async function openClip(page: Page, clip: ClipDto): Promise<void> {
  await page.goto(`${app.url}/clips/${clip.id}`);
  await page.getByRole('heading', { name: clip.originalName }).waitFor();
  await page.waitForFunction(() => (document.querySelector('video')?.readyState ?? 0) >= 2, undefined, {
    timeout: 30_000,
  });
}

const currentFrame = async (page: Page) => Number(await page.getByTestId('current-frame').innerText());

/** Waits until the Readouts measure `frame` and returns the value text of `metric` ("-9.4°"). */
async function readoutAt(page: Page, frame: number, metric: MetricKey): Promise<string> {
  const readouts = page.getByRole('region', { name: 'Readouts' });
  const status = new RegExp(
    `^Frame ${frame}, (detected on this frame|from the stored analysis|corrected by hand)`,
  );
  try {
    await readouts.getByText(status).waitFor({ timeout: 60_000 });
  } catch (error) {
    await page.screenshot({
      path: screenshotPath(`workspace-failed-readout-frame-${frame}`),
      fullPage: true,
    });
    throw error;
  }
  const value = readouts.locator(`[data-metric="${metric}"]`).locator('span').nth(1);
  await expect.poll(() => value.innerText(), { timeout: 30_000 }).not.toBe('—');
  return value.innerText();
}

const degrees = (text: string) => Number(/-?\d+(\.\d+)?/.exec(text.replace('−', '-'))?.[0]);

/** Angle of a line in image pixels (y down) from the image horizontal, degrees, counter-clockwise on screen. */
const lineAngle = ([a, b]: [[number, number], [number, number]]) =>
  (Math.atan2(-(b[1] - a[1]), b[0] - a[0]) * 180) / Math.PI;

/** Stage CSS position of a video pixel when the stage is not zoomed (the video fills the stage box). */
async function stagePoint(page: Page, p: [number, number], video: { width: number; height: number }) {
  const box = await page.getByTestId('stage').boundingBox();
  if (!box) throw new Error('no stage on the page');
  const scale = Math.min(box.width / video.width, box.height / video.height);
  const offX = (box.width - video.width * scale) / 2;
  const offY = (box.height - video.height * scale) / 2;
  return { x: box.x + offX + p[0] * scale, y: box.y + offY + p[1] * scale };
}

async function drag(page: Page, from: { x: number; y: number }, to: { x: number; y: number }) {
  await page.mouse.move(from.x, from.y);
  await page.mouse.down();
  await page.mouse.move(to.x, to.y, { steps: 8 });
  await page.mouse.up();
}

beforeAll(async () => {
  if (!existsSync(join(process.cwd(), 'dist', 'index.html'))) {
    const { build } = await import('vite');
    await build({ root: process.cwd(), logLevel: 'warn' });
  }
  workDir = mkdtempSync(join(tmpdir(), 'stanceline-workspace-e2e-'));
  app = await startStanceline({
    port: 0,
    dataDir: join(workDir, 'data'),
    logLevel: 'warn',
    // No analysis on the server: it would take a core from the browser under test.
    env: { ANALYSIS_WORKERS: '0' },
  });
  const login = await fetch(`${app.url}/api/auth/login`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email: COACH, password: PASSWORD }),
  });
  token = ((await login.json()) as { accessToken: string }).accessToken;
  clips.front = await uploadDemoClip(FRONT, 'front');
  clips.side = await uploadDemoClip(SIDE, 'side');
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
  await app?.close();
  if (workDir) rmSync(workDir, { recursive: true, force: true });
});

describe('clip workspace in a real browser', () => {
  it(
    'steps frames on a side clip and reads knee flexion within the truth tolerance',
    { timeout: 180_000 },
    async () => {
      const truth = readTruth(SIDE);
      const page = await (await browser.newContext({ viewport: { width: 1400, height: 1000 } })).newPage();
      await signIn(page);
      await openClip(page, clips.side);
      const start = await currentFrame(page);
      await readoutAt(page, start, 'kneeFlexionRight');
      const before = await page.getByRole('region', { name: 'Readouts' }).innerText();

      for (let i = 0; i < 10; i++) await page.getByRole('button', { name: 'Next frame' }).click();
      await expect.poll(() => currentFrame(page), { timeout: 15_000 }).toBe(start + 10);
      const frame = start + 10;
      const right = degrees(await readoutAt(page, frame, 'kneeFlexionRight'));
      const left = degrees(await readoutAt(page, frame, 'kneeFlexionLeft'));
      // The frame number stays where the steps put it: exactly ten on.
      expect(await currentFrame(page)).toBe(start + 10);
      expect(await page.getByRole('region', { name: 'Readouts' }).innerText()).not.toBe(before);

      const want = truth.frames[frame].metrics;
      expect(Math.abs(right - want.kneeFlexionRight!)).toBeLessThan(tolerance('kneeFlexionRight'));
      expect(Math.abs(left - want.kneeFlexionLeft!)).toBeLessThan(tolerance('kneeFlexionLeft'));
      console.log(
        `side clip frame ${frame}: knee flexion right ${right}° (truth ${want.kneeFlexionRight!.toFixed(1)}°), ` +
          `left ${left}° (truth ${want.kneeFlexionLeft!.toFixed(1)}°)`,
      );
      await page.screenshot({ path: screenshotPath('workspace-01-side-frame'), fullPage: true });

      // Every 2nd frame, cancelled part way: what was analysed before Cancel is stored.
      await page.getByLabel('Frames to analyse').selectOption('2');
      await page.getByRole('button', { name: 'Analyze whole clip' }).click();
      const progress = page.getByRole('progressbar', { name: 'Whole-clip analysis progress' });
      await expect
        .poll(async () => Number(await progress.getAttribute('aria-valuenow')), { timeout: 60_000 })
        .toBeGreaterThanOrEqual(20);
      await page.getByRole('button', { name: 'Cancel analysis' }).click();
      const cancelled = page.getByText(/^Cancelled after \d+ of 50 frames; those are stored/);
      await cancelled.waitFor({ timeout: 30_000 });
      const done = Number(/after (\d+) of/.exec(await cancelled.innerText())![1]);
      const kept = await apiJson<ClipFramesResponse>(`/api/clips/${clips.side.id}/frames?model=lightning`);
      expect(done).toBeGreaterThanOrEqual(10);
      expect(done).toBeLessThan(50);
      expect(kept.frames).toHaveLength(done);
      expect(kept.frames.every((f) => f.frameIndex % 2 === 0)).toBe(true);
      await page.screenshot({ path: screenshotPath('workspace-01b-side-cancelled'), fullPage: true });
      await page.context().close();
    },
  );

  it(
    'front clip: shoulder tilt, snow line, whole-clip analysis, curves, turns, a note, exports, and all of it after a reload',
    { timeout: 600_000 },
    async () => {
      const truth = readTruth(FRONT);
      const video = { width: truth.clip.width, height: truth.clip.height };
      const context = await browser.newContext({
        viewport: { width: 1400, height: 1000 },
        acceptDownloads: true,
      });
      const page = await context.newPage();
      await signIn(page);
      await openClip(page, clips.front);

      // Ten frames on; the Readouts follow and shoulder tilt is in the truth tolerance once the snow line is set.
      const start = await currentFrame(page);
      const tiltAtStart = await readoutAt(page, start, 'shoulderTilt');
      for (let i = 0; i < 10; i++) await page.getByRole('button', { name: 'Next frame' }).click();
      await expect.poll(() => currentFrame(page), { timeout: 15_000 }).toBe(start + 10);
      const frame = start + 10;
      const tiltLevel = degrees(await readoutAt(page, frame, 'shoulderTilt'));
      expect(`${tiltLevel}`).not.toBe(`${degrees(tiltAtStart)}`);
      await page.screenshot({ path: screenshotPath('workspace-02-front-frame'), fullPage: true });

      // Snow line: drag both handles onto the phantom's own snow surface line.
      const line = truth.frames[frame].referenceLine;
      await page.getByRole('button', { name: 'Set snow line' }).click();
      const overlay = page.getByTestId('pose-overlay');
      await expect.poll(() => overlay.getAttribute('data-snow-handles')).toBeTruthy();
      const handles = (await overlay.getAttribute('data-snow-handles'))!
        .split(' ')
        .map((pair) => pair.split(',').map(Number));
      const box = (await page.getByTestId('stage').boundingBox())!;
      for (const i of [0, 1] as const) {
        await drag(
          page,
          { x: box.x + handles[i][0], y: box.y + handles[i][1] },
          await stagePoint(page, line[i], video),
        );
      }
      await page.screenshot({ path: screenshotPath('workspace-03a-snow-line-dragged'), fullPage: true });
      await page.getByRole('button', { name: 'Done with snow line' }).click();
      await expect
        .poll(async () => degrees(await readoutAt(page, frame, 'shoulderTilt')), { timeout: 15_000 })
        .not.toBe(tiltLevel);
      const tiltOnLine = degrees(await readoutAt(page, frame, 'shoulderTilt'));
      const roll = lineAngle(line);
      const wantTilt = truth.frames[frame].metrics.shoulderTilt!;
      console.log(
        `front clip frame ${frame}: shoulder tilt ${tiltLevel}° against the image level, ${tiltOnLine}° against the ` +
          `snow line (truth ${wantTilt.toFixed(1)}°, snow line ${roll.toFixed(2)}° off level)`,
      );
      // Measuring against a line turned by θ turns the reading by θ: the change equals the line's angle
      // (to the readout's 0.1° and the handle placement on a scaled stage).
      expect(Math.abs(Math.abs(tiltOnLine - tiltLevel) - Math.abs(roll))).toBeLessThan(0.5);
      expect(Math.abs(tiltOnLine - wantTilt)).toBeLessThan(tolerance('shoulderTilt'));
      await page.screenshot({ path: screenshotPath('workspace-03-snow-line'), fullPage: true });

      // The stored snow line is the one dragged (video pixels, to within a pixel of the stage scale).
      const stored = (await apiJson<ClipResponse>(`/api/clips/${clips.front.id}`)).clip as ClipDto & {
        referenceLine: [[number, number], [number, number]] | null;
      };
      expect(stored.referenceLine).not.toBeNull();
      for (const i of [0, 1]) {
        expect(
          Math.hypot(stored.referenceLine![i][0] - line[i][0], stored.referenceLine![i][1] - line[i][1]),
        ).toBeLessThan(2);
      }

      // Whole clip: the empty state says what the run does; then progress, and the curves.
      const curves = page.getByRole('region', { name: 'Metric curves' });
      await curves.getByText('No curves yet').waitFor();
      await page.getByText(/No whole-clip analysis yet/).waitFor();
      const clickedAt = Date.now();
      await page.getByRole('button', { name: 'Analyze whole clip' }).click();
      await page.getByRole('button', { name: 'Cancel analysis' }).waitFor();
      await page
        .getByRole('progressbar', { name: 'Whole-clip analysis progress' })
        .waitFor({ timeout: 60_000 });
      await page.screenshot({ path: screenshotPath('workspace-04-analysing'), fullPage: true });
      const finished = page.getByTestId('analysis-finished');
      await finished.waitFor({ timeout: 480_000 });
      const wallMs = Date.now() - clickedAt;
      const elapsedMs = Number(await finished.locator('[data-elapsed-ms]').getAttribute('data-elapsed-ms'));
      const frames = truth.clip.frameCount;
      console.log(
        `whole-clip analysis of ${FRONT} (${frames} frames, ${video.width}x${video.height}, Lightning) in headless ` +
          `Chromium: ${(elapsedMs / 1000).toFixed(1)} s in the runner (${(elapsedMs / frames).toFixed(0)} ms a frame), ` +
          `${(wallMs / 1000).toFixed(1)} s from the click (model load included)`,
      );

      await curves
        .getByTestId('curves-chart')
        .locator('svg .recharts-line')
        .first()
        .waitFor({ timeout: 30_000 });
      const analysis = await apiJson<ClipFramesResponse>(
        `/api/clips/${clips.front.id}/frames?model=lightning`,
      );
      expect(analysis.frames).toHaveLength(frames);
      // The phantom's turns: each true turn has an apex inside the clip; the run's last span is cut by the
      // clip's end before its apex, so the turns compared are those whose peak is not the last frame.
      const turns = analysis.series!.turns.filter((t) => t.apexFrame !== frames - 1);
      expect(turns.map((t) => t.direction)).toEqual(truth.clip.events.turns.map((t) => t.direction));
      turns.forEach((t, i) =>
        expect(Math.abs(t.apexFrame - truth.clip.events.apexes[i])).toBeLessThanOrEqual(3),
      );
      expect(analysis.series!.transitions).toHaveLength(truth.clip.events.transitions.length);
      analysis.series!.transitions.forEach((t, i) =>
        expect(Math.abs(t.frameIndex - truth.clip.events.transitions[i])).toBeLessThanOrEqual(2),
      );
      const turnTable = page.getByRole('table', { name: /Turns of this clip/ });
      await expect.poll(() => turnTable.locator('tbody tr').count()).toBe(analysis.series!.turns.length);
      await curves.scrollIntoViewIfNeeded();
      await page.screenshot({ path: screenshotPath('workspace-05-curves'), fullPage: true });

      // Clicking the chart shows that frame: the middle of the plot is the middle of the clip.
      const plot = (await curves.locator('.recharts-cartesian-grid').boundingBox())!;
      await page.mouse.click(plot.x + plot.width / 2, plot.y + plot.height / 2);
      await expect
        .poll(async () => Math.abs((await currentFrame(page)) - frames / 2), { timeout: 15_000 })
        .toBeLessThanOrEqual(3);
      // A turn's row goes to its apex.
      const firstApex = analysis.series!.turns[0].apexFrame;
      await turnTable
        .getByRole('button', { name: /Go to the apex of turn/ })
        .first()
        .click();
      await expect.poll(() => currentFrame(page), { timeout: 15_000 }).toBe(firstApex);

      // A note on the apex with a measured angle drawn on the frame.
      const noteText = 'Apex of the first turn: inside shoulder stays level';
      await page.getByRole('button', { name: 'Draw on frame' }).click();
      await page.getByTestId('stage').scrollIntoViewIfNeeded();
      await page.getByRole('radio', { name: 'Angle' }).click();
      // Worked example for the drawn angle: arms from the vertex (320, 200) to (420, 200) and (320, 100)
      // are perpendicular, so the tool reads 90.0° (to the pixel rounding of the stage scale).
      await drag(page, await stagePoint(page, [420, 200], video), await stagePoint(page, [320, 200], video));
      const arm = await stagePoint(page, [320, 100], video);
      await page.mouse.move(arm.x, arm.y, { steps: 4 });
      await page.mouse.click(arm.x, arm.y);
      await page.screenshot({ path: screenshotPath('workspace-06a-angle'), fullPage: true });
      await page.getByText(/Measured: \d/).waitFor();
      const measured = degrees((await page.getByText(/Measured: \d/).innerText()).replace('Measured:', ''));
      expect(Math.abs(measured - 90)).toBeLessThan(1);
      // And an arrow from the hip height out to the side, dragged tail to tip.
      await page.getByRole('radio', { name: 'Arrow' }).click();
      await drag(page, await stagePoint(page, [200, 300], video), await stagePoint(page, [120, 250], video));
      await page.getByText('Drawing: 0 lines, 1 arrow, 1 angle').waitFor();
      await page.getByLabel('Note text').fill(noteText);
      await page.screenshot({ path: screenshotPath('workspace-06-drawing'), fullPage: true });
      await page.getByRole('button', { name: 'Add note' }).click();
      const noteList = page.getByRole('list', { name: 'Notes on this clip' });
      await noteList.getByText(noteText).waitFor();
      const notes = await apiJson<NoteListResponse>(`/api/clips/${clips.front.id}/notes`);
      expect(notes.notes).toHaveLength(1);
      expect(notes.notes[0].frameIndex).toBe(firstApex);
      expect(notes.notes[0].drawing?.angles).toHaveLength(1);
      expect(notes.notes[0].drawing?.arrows).toHaveLength(1);
      // Stored in video pixels, whatever the stage size: the arrow's tip is where it was dropped.
      const tip = notes.notes[0].drawing!.arrows[0].to;
      expect(Math.hypot(tip[0] - 120, tip[1] - 250)).toBeLessThan(2);

      // Exports: a full-size PNG of the frame, and the notes as WebVTT captions.
      await page.getByRole('button', { name: 'Export' }).click();
      const [still] = await Promise.all([
        page.waitForEvent('download'),
        page.getByRole('menuitem', { name: /Still image/ }).click(),
      ]);
      await still.saveAs(screenshotPath('workspace-still-export'));
      const png = readFileSync((await still.path())!);
      // PNG signature and IHDR size (PNG spec, ISO/IEC 15948: width and height at bytes 16..23).
      expect(png.subarray(1, 4).toString('latin1')).toBe('PNG');
      expect([png.readUInt32BE(16), png.readUInt32BE(20)]).toEqual([video.width, video.height]);
      await page.getByRole('button', { name: 'Export' }).click();
      const [captions] = await Promise.all([
        page.waitForEvent('download'),
        page.getByRole('menuitem', { name: /captions/ }).click(),
      ]);
      const vtt = readFileSync((await captions.path())!, 'utf8');
      expect(vtt.startsWith('WEBVTT')).toBe(true);
      expect(vtt).toContain(noteText);
      expect(captions.suggestedFilename()).toBe(`${FRONT}.notes.vtt`);

      // Reload: stored results, snow line and the note come back without running anything.
      await page.reload();
      await page.getByRole('heading', { name: clips.front.originalName }).waitFor();
      await page.getByTestId('stored-analysis').getByText(`${frames}`, { exact: true }).first().waitFor();
      await curves
        .getByTestId('curves-chart')
        .locator('svg .recharts-line')
        .first()
        .waitFor({ timeout: 30_000 });
      expect(await page.getByTestId('analysis-finished').count()).toBe(0);
      await expect.poll(() => turnTable.locator('tbody tr').count()).toBe(analysis.series!.turns.length);
      await noteList.getByText(noteText).click();
      await expect.poll(() => currentFrame(page), { timeout: 15_000 }).toBe(firstApex);
      const tiltAfterReload = degrees(await readoutAt(page, firstApex, 'shoulderTilt'));
      // The page recomputes the stored points against the stored snow line; the server did the same
      // when it stored them, so the two agree to the readout's rounding (0.05°).
      const serverTilt = analysis.frames.find((f) => f.frameIndex === firstApex)!.metrics.shoulderTilt!;
      expect(Math.abs(tiltAfterReload - serverTilt)).toBeLessThanOrEqual(0.051);
      await page.getByRole('region', { name: 'Readouts' }).getByText('from the stored analysis').waitFor();
      await page.screenshot({ path: screenshotPath('workspace-07-after-reload'), fullPage: true });
      await context.close();
    },
  );
});
