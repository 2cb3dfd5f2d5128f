import fs from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ClipDto, ServerAnalysisResponse } from '@shared/schemas/clip.schema';
import type { ClipFramesResponse } from '@shared/schemas/frames.schema';
import {
  DEMO_CLIP_PLAN,
  DEMO_FOOTAGE_DIR,
  DEMO_KEYPOINTS_DIR,
  demoKeypointFileSchema,
  sha256File,
} from '@server/seed/demo-clips';
import { DEMO_PASSWORD } from '@server/seed/demo-club';
import { startStanceline, type StartedStanceline } from '@server/start';

let dataDir: string;
let app: StartedStanceline;
let auth: { authorization: string };

beforeAll(async () => {
  dataDir = await fs.mkdtemp(path.join(os.tmpdir(), 'stanceline-demo-clips-'));
  app = await startStanceline({ port: 0, dataDir, logLevel: 'silent', env: { BCRYPT_ROUNDS: '4' } });
  const login = await fetch(`${app.url}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email: 'coach@larchwood.example', password: DEMO_PASSWORD }),
  });
  auth = { authorization: `Bearer ${((await login.json()) as { accessToken: string }).accessToken}` };
});
afterAll(async () => {
  await app.close();
  await fs.rm(dataDir, { recursive: true, force: true });
});

async function get<T>(url: string): Promise<T> {
  const res = await fetch(`${app.url}${url}`, { headers: auth });
  expect(res.status, url).toBe(200);
  return (await res.json()) as T;
}

describe('demo clips', () => {
  it('the committed keypoints were detected in the committed footage', async () => {
    for (const footage of new Set(DEMO_CLIP_PLAN.map((p) => p.footage))) {
      const file = demoKeypointFileSchema.parse(
        JSON.parse(await fs.readFile(path.join(DEMO_KEYPOINTS_DIR, `${footage}.lightning.json`), 'utf8')),
      );
      // Re-rendered footage needs `npx tsx server/seed/make-demo-keypoints.ts` again.
      expect(file.sha256, footage).toBe(await sha256File(path.join(DEMO_FOOTAGE_DIR, `${footage}.mp4`)));
      expect(file.model).toBe('lightning');
    }
  });

  it('are ready on first start, front and side, in both sessions, with poster and thumbnails', async () => {
    const { clips } = await get<{ clips: ClipDto[] }>('/api/clips');
    // The coach coaches U12 and U14, which every planned demo athlete is in; Arlo's clip is hidden from
    // all but the head coach, his guardian having asked to withdraw consent (server/seed/demo-privacy.ts).
    expect(clips).toHaveLength(DEMO_CLIP_PLAN.filter((p) => p.athlete !== 'arlo').length);
    expect(DEMO_CLIP_PLAN.some((p) => p.athlete === 'arlo')).toBe(true);
    expect(clips.every((c) => c.status === 'ready')).toBe(true);
    expect(new Set(clips.map((c) => c.view))).toEqual(new Set(['front', 'side']));
    expect(new Set(clips.map((c) => c.sessionId)).size).toBe(2);
    for (const clip of clips) {
      expect(clip.posterUrl).not.toBeNull();
      expect(clip.thumbnails).not.toBeNull();
      expect(clip.ageGroup).not.toBeNull();
      const poster = await fetch(`${app.url}${clip.posterUrl}`);
      expect(poster.headers.get('content-type')).toBe('image/jpeg');
    }
  });

  it('have stored results for every frame, so curves and turns show without running a model', async () => {
    const { clips } = await get<{ clips: ClipDto[] }>('/api/clips');
    const front = clips.find((c) => c.originalName === 'phantom-front-turns.mp4')!;
    expect(front.analysis).toMatchObject({ model: 'lightning', frameCount: front.frameCount });
    const read = await get<ClipFramesResponse>(`/api/clips/${front.id}/frames?model=lightning`);
    expect(read.frames).toHaveLength(front.frameCount!);
    // The phantom's front clip is rendered with 4 transitions (its truth file lists them).
    const truth = JSON.parse(
      await fs.readFile(path.join(DEMO_FOOTAGE_DIR, 'phantom-front-turns.truth.json'), 'utf8'),
    ) as { clip: { events: { transitions: number[] } } };
    expect(read.series!.transitions).toHaveLength(truth.clip.events.transitions.length);
    const side = clips.find((c) => c.view === 'side')!;
    const sideRead = await get<ClipFramesResponse>(`/api/clips/${side.id}/frames`);
    expect(sideRead.frames).toHaveLength(side.frameCount!);
    expect(sideRead.series!.turns).toEqual([]);
  });
});

describe('the demo clip with another skier crossing', () => {
  it('keeps the coach’s pick and stores the picked athlete in every frame, not the other skier', async () => {
    const { clips } = await get<{ clips: ClipDto[] }>('/api/clips');
    const crossing = clips.find((c) => c.originalName === 'phantom-crossing-turns.mp4')!;
    const plan = DEMO_CLIP_PLAN.find((p) => p.footage === 'phantom-crossing-turns')!;
    expect(crossing.athletePick).toEqual(plan.pick);
    const truth = JSON.parse(
      await fs.readFile(path.join(DEMO_FOOTAGE_DIR, 'phantom-crossing-turns.truth.json'), 'utf8'),
    ) as { frames: { frame: number; joints: Record<string, [number, number]>; torsoLength: number }[] };
    const read = await get<ClipFramesResponse>(`/api/clips/${crossing.id}/frames?model=lightning`);
    expect(read.frames).toHaveLength(truth.frames.length);
    const hips = (points: Record<string, { x: number; y: number } | [number, number]>) => {
      const xy = (p: { x: number; y: number } | [number, number]) => (Array.isArray(p) ? p : [p.x, p.y]);
      const [lx, ly] = xy(points.left_hip);
      const [rx, ry] = xy(points.right_hip);
      return [(lx + rx) / 2, (ly + ry) / 2];
    };
    for (const frame of read.frames) {
      const want = truth.frames[frame.frameIndex];
      const got = hips(Object.fromEntries(frame.keypoints.map((k) => [k.name, k])));
      const at = hips(want.joints);
      // Within a quarter torso of the picked athlete's hips (0.16 at most, 0.043 median when made).
      expect(
        Math.hypot(got[0] - at[0], got[1] - at[1]) / want.torsoLength,
        `frame ${frame.frameIndex}`,
      ).toBeLessThan(0.25);
    }
  });
});

describe('the demo clip left for the server', () => {
  it(
    'is analysed carefully in the background after the first start: queued, then every frame stored',
    { timeout: 180_000 },
    async () => {
      const { clips } = await get<{ clips: ClipDto[] }>('/api/clips');
      const plan = DEMO_CLIP_PLAN.find((p) => p.analyseOnServer)!;
      const clip = clips.find(
        (c) => c.originalName === `${plan.footage}.mp4` && c.athletes.some((a) => a.name.startsWith('Finn')),
      )!;
      expect(clip.serverAnalysis).toMatchObject({ model: 'lightning', careful: true });
      const deadline = Date.now() + 150_000;
      let status = await get<ServerAnalysisResponse>(`/api/clips/${clip.id}/server-analysis`);
      while (status.serverAnalysis?.status !== 'done' && Date.now() < deadline) {
        expect(['queued', 'running']).toContain(status.serverAnalysis?.status);
        await new Promise((r) => setTimeout(r, 500));
        status = await get<ServerAnalysisResponse>(`/api/clips/${clip.id}/server-analysis`);
      }
      expect(status).toMatchObject({ clipStatus: 'ready', storedFrames: clip.frameCount });
      const read = await get<ClipFramesResponse>(`/api/clips/${clip.id}/frames?model=lightning`);
      expect(read.frames).toHaveLength(clip.frameCount!);
      // Found in every frame: the phantom skier is alone and large.
      expect(read.frames.filter((f) => f.keypoints.length === 0)).toEqual([]);
      // Read carefully, as the coach asked.
      expect(read.frames.every((f) => f.careful)).toBe(true);
    },
  );
});
