import type { DataSource, EntityManager } from 'typeorm';
import { describe, expect, it } from 'vitest';
import type { Keypoint, PoseModelName } from '@shared/keypoints';
import { computeFrameMetrics } from '@shared/metrics';
import type { Clip } from '@server/entities/clip.entity';
import type { Flag } from '@server/entities/flag.entity';
import type { FrameResult } from '@server/entities/frame-result.entity';
import { UnitOfWork, type Repositories } from '@server/repositories/unit-of-work';
import { FrameStore } from '@server/services/frame-store';

// The FrameStore through its unit of work, with repositories that keep rows in arrays: no database,
// so this shows the seam a service has for tests, and the store's own rules in isolation.

class FakeFrames {
  rows: FrameResult[] = [];
  async findByFrames(clipId: string, model: PoseModelName, frames: number[]) {
    return this.rows.filter((r) => r.clipId === clipId && r.model === model && frames.includes(r.frameIndex));
  }
  async findOne(clipId: string, model: PoseModelName, frameIndex: number) {
    return (
      this.rows.find((r) => r.clipId === clipId && r.model === model && r.frameIndex === frameIndex) ?? null
    );
  }
  async listByClip(clipId: string, model?: PoseModelName) {
    return this.rows
      .filter((r) => r.clipId === clipId && (!model || r.model === model))
      .sort((a, b) => a.frameIndex - b.frameIndex);
  }
  async insertMany(rows: FrameResult[]) {
    this.rows.push(...rows.map((r) => ({ ...r })));
  }
  async upsertMany(rows: FrameResult[]) {
    for (const r of rows) {
      const at = this.rows.findIndex(
        (x) => x.clipId === r.clipId && x.model === r.model && x.frameIndex === r.frameIndex,
      );
      if (at >= 0) this.rows[at] = { ...r };
      else this.rows.push({ ...r });
    }
  }
  async update(id: string, patch: Partial<FrameResult>) {
    const row = this.rows.find((r) => r.id === id);
    if (row) Object.assign(row, patch);
  }
}

class FakeFlags {
  rows: Flag[] = [];
  async count(clipId: string, model: PoseModelName) {
    return this.rows.filter((r) => r.clipId === clipId && r.model === model).length;
  }
  async list(clipId: string, model: PoseModelName) {
    return this.rows.filter((r) => r.clipId === clipId && r.model === model);
  }
  async deleteFrameFlags(clipId: string, model: PoseModelName, frames: number[]) {
    this.rows = this.rows.filter(
      (r) =>
        !(r.clipId === clipId && r.model === model && r.turnIndex === null && frames.includes(r.frameIndex)),
    );
  }
  async deleteTurnFlags(clipId: string, model: PoseModelName) {
    this.rows = this.rows.filter((r) => !(r.clipId === clipId && r.model === model && r.turnIndex !== null));
  }
  async deleteAll(clipId: string) {
    this.rows = this.rows.filter((r) => r.clipId !== clipId);
  }
  async insertMany(rows: Flag[]) {
    this.rows.push(...rows);
  }
}

const clip: Clip = {
  id: 'c1',
  clubId: 'club',
  sessionId: 's1',
  uploadedById: null,
  view: 'side',
  facing: 'toward',
  athletePick: null,
  status: 'ready',
  failureReason: null,
  originalName: 'side.mp4',
  mimeType: 'video/mp4',
  sizeBytes: 1,
  sha256: '0'.repeat(64),
  storageKey: 'k',
  proxyKey: null,
  proxySizeBytes: null,
  posterKey: null,
  thumbnailsKey: null,
  thumbnails: null,
  rotation: 0,
  defaultModel: 'lightning',
  codec: 'h264',
  width: 640,
  height: 360,
  fps: 30,
  frameCount: 10,
  durationMs: 333,
  processingStarts: 0,
  createdAt: new Date(0),
};

// A side view of a flexed leg (pixels, y down): knee ahead of hip and ankle.
const leg: Keypoint[] = [
  { name: 'left_shoulder', x: 80, y: 30, score: 0.9 },
  { name: 'left_hip', x: 78, y: 60, score: 0.9 },
  { name: 'left_knee', x: 86, y: 85, score: 0.9 },
  { name: 'left_ankle', x: 80, y: 110, score: 0.9 },
];
const straighter = leg.map((k) => (k.name === 'left_knee' ? { ...k, x: 80 } : k));

function storeWithFakes() {
  const frames = new FakeFrames();
  const flags = new FakeFlags();
  const repos = {
    manager: {} as EntityManager,
    frames,
    flags,
    referenceLines: { forClip: async () => null, forFrames: async () => new Map() },
    clips: { athleteIdsByClip: async () => new Map([[clip.id, []]]) },
    athletes: { findByIds: async () => [] },
  } as unknown as Repositories;
  // The real UnitOfWork class over a stand-in data source whose transaction just runs the work.
  const dataSource = {
    manager: repos.manager,
    transaction: (work: (m: EntityManager) => unknown) => work(repos.manager),
  };
  const uow = new UnitOfWork(dataSource as unknown as DataSource, () => repos);
  const store = new FrameStore(uow, { forAgeGroup: async () => [] }, { now: () => new Date(1000) });
  return { store, frames, flags };
}

describe('frame store with fake repositories', () => {
  it('stores metrics it computes itself from the keypoints (the same shared code as the browser)', async () => {
    const { store, frames } = storeWithFakes();
    const answer = await store.storeBatch(clip, {
      model: 'lightning',
      frames: [{ frameIndex: 2, timeMs: 66.7, keypoints: leg }],
    });
    expect(answer.stored).toBe(1);
    expect(frames.rows).toHaveLength(1);
    const expected = computeFrameMetrics({ keypoints: leg, view: 'side', referenceLine: null }).metrics;
    expect(frames.rows[0].metrics).toEqual(expected);
    expect(frames.rows[0].metrics.kneeFlexionLeft).toBeGreaterThan(10);
  });

  it('keeps a coach’s correction when a later detection of the same frame arrives', async () => {
    const { store, frames } = storeWithFakes();
    await store.correct(clip, 3, { model: 'lightning', keypoints: straighter }, async () => undefined);
    const corrected = frames.rows[0].metrics.kneeFlexionLeft;
    const answer = await store.storeBatch(clip, {
      model: 'lightning',
      frames: [{ frameIndex: 3, timeMs: 100, keypoints: leg }],
    });
    expect(answer.stored).toBe(0);
    expect(frames.rows).toHaveLength(1);
    expect(frames.rows[0].corrected).toBe(true);
    expect(frames.rows[0].metrics.kneeFlexionLeft).toBe(corrected);
  });

  it('refuses a frame past the clip’s end before anything is written', async () => {
    const { store, frames } = storeWithFakes();
    await expect(
      store.storeBatch(clip, {
        model: 'lightning',
        frames: [{ frameIndex: 10, timeMs: 333, keypoints: leg }],
      }),
    ).rejects.toMatchObject({ status: 400 });
    expect(frames.rows).toHaveLength(0);
  });
});
