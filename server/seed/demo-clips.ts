import { createHash, randomUUID } from 'node:crypto';
import { createReadStream } from 'node:fs';
import fs from 'node:fs/promises';
import path from 'node:path';
import type { Logger } from 'pino';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import type { AthletePick, View } from '@shared/keypoints';
import {
  frameBatchSchema,
  keypointSchema,
  MAX_FRAMES_PER_BATCH,
  poseModelSchema,
} from '@shared/schemas/frames.schema';
import type { Clip } from '../entities/clip.entity';
import { processClip } from '../media/clip-processor';
import type { FrameStore } from '../services/frame-store';
import { systemClock, type Clock } from '../services/principal';
import type { ObjectStorage } from '../storage/object-storage';
import { DEMO_ATHLETES } from './demo-club';
import { repositoriesFor, UnitOfWork } from '../repositories/unit-of-work';
import { queueClipAnalysis } from '../services/job-queue';

/** The phantom skier's clips (rendered by fixtures/phantom, so the true angles are known). */
export const DEMO_FOOTAGE_DIR = path.join('fixtures', 'phantom', 'demo');
/** Keypoints the analyze CLI found in that footage (server/seed/make-demo-keypoints.ts). */
export const DEMO_KEYPOINTS_DIR = path.join('fixtures', 'media', 'demo');

/** Which demo athlete appears in which clip of which session (0 = the earlier, baseline session). */
export const DEMO_CLIP_PLAN: {
  footage: string;
  view: View;
  athlete: string;
  session: 0 | 1;
  /** The athlete the coach picked among several people (frame 0: the athlete's hips in the truth file). */
  pick?: AthletePick;
  /** Seeded without stored results and queued for analysis on the server: it is read after first start. */
  analyseOnServer?: boolean;
  /** With analyseOnServer: the coach asked for a careful reading (each frame with its mirror image too). */
  careful?: boolean;
}[] = [
  { footage: 'phantom-front-turns', view: 'front', athlete: 'elsie', session: 0 },
  { footage: 'phantom-side-run', view: 'side', athlete: 'elsie', session: 0 },
  { footage: 'phantom-front-turns', view: 'front', athlete: 'finn', session: 0 },
  { footage: 'phantom-spring-turns', view: 'front', athlete: 'elsie', session: 1 },
  { footage: 'phantom-side-run', view: 'side', athlete: 'arlo', session: 1 },
  // Another skier crosses behind Kit: the coach picked Kit, and the stored frames follow Kit.
  {
    footage: 'phantom-crossing-turns',
    view: 'front',
    athlete: 'kit',
    session: 1,
    pick: { frameIndex: 0, x: 282, y: 251 },
  },
  // Uploaded at the end of the training day and left for the server, which analyses it in the
  // background after the first start (the clip page shows its progress), read carefully.
  {
    footage: 'phantom-spring-turns',
    view: 'front',
    athlete: 'finn',
    session: 1,
    analyseOnServer: true,
    careful: true,
  },
];

export const demoKeypointFileSchema = z.object({
  footage: z.string(),
  /** SHA-256 of the footage the keypoints were detected in; a re-rendered clip makes them stale. */
  sha256: z.string().regex(/^[0-9a-f]{64}$/),
  model: poseModelSchema,
  view: z.enum(['front', 'side']),
  madeWith: z.string(),
  frames: z.array(
    z.object({
      frameIndex: z.number().int().min(0),
      timeMs: z.number().min(0),
      keypoints: z.array(keypointSchema),
    }),
  ),
});
export type DemoKeypointFile = z.infer<typeof demoKeypointFileSchema>;

export async function sha256File(file: string): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of createReadStream(file)) hash.update(chunk as Buffer);
  return hash.digest('hex');
}

export interface DemoClipDeps {
  dataSource: DataSource;
  storage: ObjectStorage;
  frames: FrameStore;
  logger: Logger;
  workDir: string;
  clock?: Clock;
  /** Folder holding fixtures/ (defaults to the working directory, the checkout). */
  projectRoot?: string;
}

async function readKeypoints(file: string, sha256: string, logger: Logger): Promise<DemoKeypointFile | null> {
  let parsed: DemoKeypointFile;
  try {
    parsed = demoKeypointFileSchema.parse(JSON.parse(await fs.readFile(file, 'utf8')));
  } catch (error) {
    logger.warn({ err: error, file }, 'demo keypoints not usable; the demo clip is seeded without results');
    return null;
  }
  if (parsed.sha256 !== sha256) {
    logger.warn({ file }, 'demo keypoints were detected in other footage; seeding the clip without results');
    return null;
  }
  return parsed;
}

/**
 * Puts the phantom clips into the demo club's two sessions, processed (poster, thumbnails) and
 * with the stored pose results, so the workspace shows curves on first start. Returns the clip ids.
 */
export async function seedDemoClips(deps: DemoClipDeps, clubId: string): Promise<string[]> {
  const root = deps.projectRoot ?? process.cwd();
  const clock = deps.clock ?? systemClock;
  const manager = deps.dataSource.manager;
  // Oldest first: the first session holds the baseline clips.
  const sessions = (await repositoriesFor(manager).sessions.list(clubId, null)).reverse();
  const coach = await repositoriesFor(manager).users.findByEmail('coach@larchwood.example');
  const athletes = await repositoriesFor(manager).athletes.list({ clubId, athleteIds: null });
  const ids: string[] = [];
  const stop = new AbortController();

  for (const plan of DEMO_CLIP_PLAN) {
    const who = DEMO_ATHLETES.find((a) => a.key === plan.athlete);
    const athlete = athletes.find((a) => a.firstName === who?.firstName && a.lastName === who?.lastName);
    const session = sessions[plan.session];
    if (!athlete || !session) continue;
    const file = path.join(root, DEMO_FOOTAGE_DIR, `${plan.footage}.mp4`);
    const stat = await fs.stat(file).catch(() => null);
    if (!stat) {
      deps.logger.warn({ file }, 'demo footage missing; skipped');
      continue;
    }
    const sha256 = await sha256File(file);
    const id = randomUUID();
    const key = `clubs/${clubId}/clips/${id}/original.mp4`;
    await deps.storage.putFile(key, file, 'video/mp4');
    const clip: Clip = {
      id,
      clubId,
      sessionId: session.id,
      uploadedById: coach?.id ?? null,
      view: plan.view,
      facing: 'toward',
      athletePick: plan.pick ?? null,
      status: 'uploaded',
      failureReason: null,
      originalName: `${plan.footage}.mp4`,
      mimeType: 'video/mp4',
      sizeBytes: stat.size,
      sha256,
      storageKey: key,
      proxyKey: null,
      proxySizeBytes: null,
      posterKey: null,
      thumbnailsKey: null,
      thumbnails: null,
      rotation: 0,
      defaultModel: 'lightning',
      codec: null,
      width: null,
      height: null,
      fps: null,
      frameCount: null,
      durationMs: null,
      processingStarts: 0,
      createdAt: clock.now(),
    };
    await repositoriesFor(manager).clips.insert(clip, [athlete.id]);
    // The same pipeline as an upload, run here and awaited, so the clip is ready before the first request.
    await processClip(deps, id, stop.signal);
    const ready = await repositoriesFor(manager).clips.findById(id);
    if (ready?.status !== 'ready') {
      deps.logger.warn({ clipId: id, reason: ready?.failureReason }, 'demo clip did not process');
      continue;
    }
    ids.push(id);
    if (plan.analyseOnServer) {
      const uow = new UnitOfWork(deps.dataSource);
      await uow.transaction((m) =>
        queueClipAnalysis(uow, m, {
          clip: ready,
          model: ready.defaultModel,
          createdById: coach?.id ?? null,
          now: clock.now(),
          careful: plan.careful,
        }),
      );
      continue;
    }

    const keypoints = await readKeypoints(
      path.join(root, DEMO_KEYPOINTS_DIR, `${plan.footage}.${'lightning'}.json`),
      sha256,
      deps.logger,
    );
    if (!keypoints) continue;
    // Through the same store as POST /api/clips/:id/frames: validated, measured and flagged alike.
    for (let i = 0; i < keypoints.frames.length; i += MAX_FRAMES_PER_BATCH) {
      const batch = frameBatchSchema.parse({
        model: keypoints.model,
        frames: keypoints.frames.slice(i, i + MAX_FRAMES_PER_BATCH),
      });
      await deps.frames.storeBatch(ready, batch);
    }
    // Turns and flags are found in the background after the last batch; the demo opens with them.
    await deps.frames.seriesSettled(id, keypoints.model);
  }
  return ids;
}
