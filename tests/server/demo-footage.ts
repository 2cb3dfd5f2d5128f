// The demo club's phantom footage as the analyze CLI read it (the committed keypoints in
// fixtures/media/demo, made by server/seed/make-demo-keypoints.ts), for tests that compare what the
// server stored of the same footage.
import fs from 'node:fs/promises';
import path from 'node:path';
import { expect } from 'vitest';
import type { Keypoint } from '@shared/keypoints';
import { swapLeftRight } from '@shared/pose/keypoint-mapping';
import type { ClipDto } from '@shared/schemas/clip.schema';
import type { ClipFramesResponse } from '@shared/schemas/frames.schema';
import { DEMO_FOOTAGE_DIR, DEMO_KEYPOINTS_DIR } from '@server/seed/demo-clips';
import type { TestServer } from '../helpers/server-harness';
import { uploadClip } from './clip-fixtures';

interface Committed {
  frames: { frameIndex: number; keypoints: Keypoint[] }[];
}
interface Truth {
  frames: { frame: number; torsoLength: number }[];
}

/** The CLI's Lightning points of the footage, and each frame's true torso length. */
export async function committed(
  footage: string,
): Promise<{ frames: Committed['frames']; torso: Map<number, number> }> {
  const stored = JSON.parse(
    await fs.readFile(path.join(DEMO_KEYPOINTS_DIR, `${footage}.lightning.json`), 'utf8'),
  ) as Committed;
  const truth = JSON.parse(
    await fs.readFile(path.join(DEMO_FOOTAGE_DIR, `${footage}.truth.json`), 'utf8'),
  ) as Truth;
  return { frames: stored.frames, torso: new Map(truth.frames.map((f) => [f.frame, f.torsoLength])) };
}

/**
 * Largest distance of a joint between the clip's stored Lightning frames and the CLI's points of the
 * footage, in torso lengths; `swapSides` compares with the CLI's points with left and right swapped.
 */
export async function worstGapToCommitted(
  server: TestServer,
  clipId: string,
  footage: string,
  options: { swapSides?: boolean } = {},
): Promise<{ worst: number; compared: number }> {
  const res = await server.http
    .get(`/api/clips/${clipId}/frames?model=lightning`)
    .set(await server.bearer('head'));
  expect(res.status).toBe(200);
  const read = res.body as ClipFramesResponse;
  const cli = await committed(footage);
  const byIndex = new Map(read.frames.map((f) => [f.frameIndex, f.keypoints]));
  let worst = 0;
  let compared = 0;
  for (const want of cli.frames) {
    const got = byIndex.get(want.frameIndex);
    expect(got, `frame ${want.frameIndex} stored`).toBeDefined();
    const torso = cli.torso.get(want.frameIndex)!;
    for (const k of options.swapSides ? swapLeftRight(want.keypoints) : want.keypoints) {
      const g = got!.find((p) => p.name === k.name);
      expect(g, `${k.name} in frame ${want.frameIndex}`).toBeDefined();
      worst = Math.max(worst, Math.hypot(g!.x - k.x, g!.y - k.y) / torso);
      compared += 1;
    }
  }
  return { worst, compared };
}

/** Uploads one demo footage file as a coach, tagged with the athlete, in the first session. */
export async function uploadDemoFootage(
  server: TestServer,
  footage: string,
  fields: { athlete: string; view: 'front' | 'side' },
): Promise<ClipDto> {
  const [sessionId] = await server.sessionIds();
  return uploadClip(server, path.join(DEMO_FOOTAGE_DIR, `${footage}.mp4`), {
    sessionId,
    athleteIds: await server.athleteId(fields.athlete),
    view: fields.view,
  });
}
