import { In, IsNull, Not, type EntityManager } from 'typeorm';
import type { ReferenceLine } from '@shared/keypoints';
import { ReferenceLineEntity, type ReferenceLineRow } from '../entities/reference-line.entity';

export const toReferenceLine = (row: ReferenceLineRow): ReferenceLine => [
  [row.x1, row.y1],
  [row.x2, row.y2],
];

export class ReferenceLineRepository {
  constructor(private readonly manager: EntityManager) {}

  /** The snow line set for the whole clip (frameIndex null), if any. */
  async forClip(clipId: string): Promise<ReferenceLine | null> {
    const row = await this.manager.findOneBy(ReferenceLineEntity, { clipId, frameIndex: IsNull() });
    return row ? toReferenceLine(row) : null;
  }

  /** Lines set on single frames of the clip, by frame index. */
  async forFrames(clipId: string): Promise<Map<number, ReferenceLine>> {
    const rows = await this.manager.findBy(ReferenceLineEntity, { clipId, frameIndex: Not(IsNull()) });
    return new Map(rows.map((row) => [row.frameIndex as number, toReferenceLine(row)]));
  }

  async framesForClips(
    clipIds: string[],
  ): Promise<Map<string, { frameIndex: number; referenceLine: ReferenceLine }[]>> {
    const result = new Map<string, { frameIndex: number; referenceLine: ReferenceLine }[]>();
    if (clipIds.length === 0) return result;
    const rows = await this.manager.find(ReferenceLineEntity, {
      where: { clipId: In(clipIds), frameIndex: Not(IsNull()) },
      order: { frameIndex: 'ASC' },
    });
    for (const row of rows) {
      const list = result.get(row.clipId) ?? [];
      list.push({ frameIndex: row.frameIndex as number, referenceLine: toReferenceLine(row) });
      result.set(row.clipId, list);
    }
    return result;
  }

  /** Sets (or with null removes) the line of one frame. */
  async setForFrame(
    clipId: string,
    frameIndex: number,
    line: ReferenceLine | null,
    by: { id: string; userId: string | null; at: Date },
  ): Promise<void> {
    await this.manager.delete(ReferenceLineEntity, { clipId, frameIndex });
    if (!line) return;
    await this.manager.insert(ReferenceLineEntity, {
      id: by.id,
      clipId,
      frameIndex,
      x1: line[0][0],
      y1: line[0][1],
      x2: line[1][0],
      y2: line[1][1],
      createdById: by.userId,
      createdAt: by.at,
    });
  }

  async forClips(clipIds: string[]): Promise<Map<string, ReferenceLine>> {
    const result = new Map<string, ReferenceLine>();
    if (clipIds.length === 0) return result;
    const rows = await this.manager.findBy(ReferenceLineEntity, {
      clipId: In(clipIds),
      frameIndex: IsNull(),
    });
    for (const row of rows) result.set(row.clipId, toReferenceLine(row));
    return result;
  }

  /** Replaces the whole-clip line; null removes it (back to the image horizontal). */
  async setForClip(
    clipId: string,
    line: ReferenceLine | null,
    by: { id: string; userId: string | null; at: Date },
  ): Promise<void> {
    await this.manager.delete(ReferenceLineEntity, { clipId, frameIndex: IsNull() });
    if (!line) return;
    await this.manager.insert(ReferenceLineEntity, {
      id: by.id,
      clipId,
      frameIndex: null,
      x1: line[0][0],
      y1: line[0][1],
      x2: line[1][0],
      y2: line[1][1],
      createdById: by.userId,
      createdAt: by.at,
    });
  }
}
