import type { EntityManager } from 'typeorm';
import type { PoseModelName } from '@shared/keypoints';
import { ClipTurnsEntity, type ClipTurns } from '../entities/clip-turns.entity';

export class ClipTurnsRepository {
  constructor(private readonly manager: EntityManager) {}

  find(clipId: string, model: PoseModelName): Promise<ClipTurns | null> {
    return this.manager.findOneBy(ClipTurnsEntity, { clipId, model });
  }

  async save(row: ClipTurns): Promise<void> {
    await this.manager.upsert(ClipTurnsEntity, row, { conflictPaths: ['clipId', 'model'] });
  }
}
