import { In, IsNull, Not, type EntityManager } from 'typeorm';
import type { PoseModelName } from '@shared/keypoints';
import { FlagEntity, type Flag } from '../entities/flag.entity';

const CHUNK = 500;

export class FlagRepository {
  constructor(private readonly manager: EntityManager) {}

  list(clipId: string, model: PoseModelName): Promise<Flag[]> {
    return this.manager.find(FlagEntity, {
      where: { clipId, model },
      order: { frameIndex: 'ASC', metric: 'ASC' },
    });
  }

  count(clipId: string, model: PoseModelName): Promise<number> {
    return this.manager.countBy(FlagEntity, { clipId, model });
  }

  /** Removes the per-frame flags of these frames (turn flags are replaced separately). */
  async deleteFrameFlags(clipId: string, model: PoseModelName, frameIndices: number[]): Promise<void> {
    for (let i = 0; i < frameIndices.length; i += CHUNK) {
      await this.manager.delete(FlagEntity, {
        clipId,
        model,
        turnIndex: IsNull(),
        frameIndex: In(frameIndices.slice(i, i + CHUNK)),
      });
    }
  }

  async deleteTurnFlags(clipId: string, model: PoseModelName): Promise<void> {
    await this.manager.delete(FlagEntity, { clipId, model, turnIndex: Not(IsNull()) });
  }

  async deleteAll(clipId: string, model?: PoseModelName): Promise<void> {
    await this.manager.delete(FlagEntity, model ? { clipId, model } : { clipId });
  }

  async insertMany(rows: Flag[]): Promise<void> {
    for (let i = 0; i < rows.length; i += 100) await this.manager.insert(FlagEntity, rows.slice(i, i + 100));
  }
}
