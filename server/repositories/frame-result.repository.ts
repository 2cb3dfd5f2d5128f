import { In, type EntityManager } from 'typeorm';
import type { PoseModelName } from '@shared/keypoints';
import { FrameResultEntity, type FrameResult } from '../entities/frame-result.entity';

export interface AnalysisInfo {
  clipId: string;
  model: PoseModelName;
  frameCount: number;
  updatedAt: Date;
}

// SQLite allows 32,766 bound parameters; frame batches stay far below this per statement.
const CHUNK = 500;

export class FrameResultRepository {
  constructor(private readonly manager: EntityManager) {}

  listByClip(clipId: string, model?: PoseModelName): Promise<FrameResult[]> {
    return this.manager.find(FrameResultEntity, {
      where: model ? { clipId, model } : { clipId },
      order: { model: 'ASC', frameIndex: 'ASC' },
    });
  }

  /**
   * Frame indices and metrics only (no keypoints), in frame order from `afterFrame`: what judging
   * against bands reads. Read raw, as entity hydration of thousands of rows would hold the event loop
   * many times longer.
   */
  async listMetrics(
    clipId: string,
    model: PoseModelName,
    page: { afterFrame: number; limit: number } = { afterFrame: -1, limit: 1_000_000 },
  ): Promise<{ frameIndex: number; metrics: FrameResult['metrics'] }[]> {
    const rows = (await this.manager.query(
      `SELECT "frameIndex", "metrics" FROM "frame_result" WHERE "clipId" = ? AND "model" = ? AND "frameIndex" > ?
       ORDER BY "frameIndex" LIMIT ?`,
      [clipId, model, page.afterFrame, page.limit],
    )) as { frameIndex: number; metrics: string }[];
    return rows.map((r) => ({
      frameIndex: r.frameIndex,
      metrics: JSON.parse(r.metrics) as FrameResult['metrics'],
    }));
  }

  /** (clip, model, stored frames) of every clip with frames among these, in clip id then model order. */
  async framesPerClipModel(
    clipIds: string[],
  ): Promise<{ clipId: string; model: PoseModelName; frames: number }[]> {
    const out: { clipId: string; model: PoseModelName; frames: number }[] = [];
    for (let i = 0; i < clipIds.length; i += CHUNK) {
      const rows = await this.manager
        .createQueryBuilder(FrameResultEntity, 'f')
        .select('f.clipId', 'clipId')
        .addSelect('f.model', 'model')
        .addSelect('COUNT(*)', 'frames')
        .where('f.clipId IN (:...ids)', { ids: clipIds.slice(i, i + CHUNK) })
        .groupBy('f.clipId')
        .addGroupBy('f.model')
        .getRawMany<{ clipId: string; model: PoseModelName; frames: number | string }>();
      out.push(...rows.map((r) => ({ clipId: r.clipId, model: r.model, frames: Number(r.frames) })));
    }
    return out.sort((a, b) => a.clipId.localeCompare(b.clipId) || a.model.localeCompare(b.model));
  }

  /** The stored frame of this model with the highest index (where a resumed analysis goes on). */
  last(clipId: string, model: PoseModelName): Promise<FrameResult | null> {
    return this.manager.findOne(FrameResultEntity, {
      where: { clipId, model },
      order: { frameIndex: 'DESC' },
    });
  }

  findOne(clipId: string, model: PoseModelName, frameIndex: number): Promise<FrameResult | null> {
    return this.manager.findOneBy(FrameResultEntity, { clipId, model, frameIndex });
  }

  async findByFrames(clipId: string, model: PoseModelName, frameIndices: number[]): Promise<FrameResult[]> {
    const rows: FrameResult[] = [];
    for (let i = 0; i < frameIndices.length; i += CHUNK) {
      rows.push(
        ...(await this.manager.findBy(FrameResultEntity, {
          clipId,
          model,
          frameIndex: In(frameIndices.slice(i, i + CHUNK)),
        })),
      );
    }
    return rows;
  }

  async insertMany(rows: FrameResult[]): Promise<void> {
    // Keypoint JSON makes rows wide; small chunks keep each statement well inside SQLite's limits.
    for (let i = 0; i < rows.length; i += 50)
      await this.manager.insert(FrameResultEntity, rows.slice(i, i + 50));
  }

  /** Inserts, or replaces the frame of the same clip, model and index (its id stays). */
  async upsertMany(rows: FrameResult[]): Promise<void> {
    for (let i = 0; i < rows.length; i += 50) {
      await this.manager.upsert(FrameResultEntity, rows.slice(i, i + 50), {
        conflictPaths: ['clipId', 'model', 'frameIndex'],
      });
    }
  }

  async update(
    id: string,
    patch: Partial<
      Pick<FrameResult, 'timeMs' | 'keypoints' | 'metrics' | 'reasons' | 'corrected' | 'updatedAt'>
    >,
  ): Promise<void> {
    await this.manager.update(FrameResultEntity, { id }, patch);
  }

  /** Per clip, the stored frame count and latest write of each model. */
  async analysisByClip(clipIds: string[]): Promise<Map<string, AnalysisInfo[]>> {
    const result = new Map<string, AnalysisInfo[]>();
    if (clipIds.length === 0) return result;
    const rows: { clipId: string; model: PoseModelName; n: number; updatedAt: string | Date }[] =
      await this.manager
        .createQueryBuilder(FrameResultEntity, 'f')
        .select('f.clipId', 'clipId')
        .addSelect('f.model', 'model')
        .addSelect('COUNT(*)', 'n')
        .addSelect('MAX(f.updatedAt)', 'updatedAt')
        .where('f.clipId IN (:...clipIds)', { clipIds })
        .groupBy('f.clipId')
        .addGroupBy('f.model')
        .getRawMany();
    for (const row of rows) {
      const list = result.get(row.clipId) ?? [];
      list.push({
        clipId: row.clipId,
        model: row.model,
        frameCount: Number(row.n),
        updatedAt: toDate(row.updatedAt),
      });
      result.set(row.clipId, list);
    }
    return result;
  }
}

/** SQLite hands aggregate datetimes back as text in UTC ("2026-12-01 22:30:10.123"). */
function toDate(value: string | Date): Date {
  if (value instanceof Date) return value;
  return new Date(/[zZ]|[+-]\d\d:?\d\d$/.test(value) ? value : `${value.replace(' ', 'T')}Z`);
}
