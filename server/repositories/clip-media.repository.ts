import { In, type EntityManager } from 'typeorm';
import type { ClipStatus } from '@shared/schemas/clip.schema';
import { ClipEntity, type Clip } from '../entities/clip.entity';

/** Clip writes of the media pipeline and the workspace settings (the upload path owns inserts). */
export class ClipMediaRepository {
  constructor(private readonly manager: EntityManager) {}

  /** Clips a processing run must still pick up, oldest first. */
  async idsWithStatus(statuses: ClipStatus[]): Promise<string[]> {
    const rows = await this.manager.find(ClipEntity, {
      select: { id: true },
      where: { status: In(statuses) },
      order: { createdAt: 'ASC' },
    });
    return rows.map((r) => r.id);
  }

  async update(
    id: string,
    patch: Partial<Omit<Clip, 'id' | 'clubId' | 'sessionId' | 'createdAt' | 'sha256' | 'storageKey'>>,
  ): Promise<void> {
    await this.manager.update(ClipEntity, { id }, patch);
  }
}
