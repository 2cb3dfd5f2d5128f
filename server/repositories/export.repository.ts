import type { EntityManager } from 'typeorm';
import type { PoseModelName, View } from '@shared/keypoints';

/** A clip an export covers, with what every row of it repeats. */
export interface ExportClip {
  id: string;
  originalName: string;
  view: View;
  model: PoseModelName;
  sessionDate: string;
  width: number | null;
  height: number | null;
  fps: number | null;
  frameCount: number | null;
  durationMs: number | null;
  status: string;
  clubId: string;
}

export interface ExportClipFilter {
  clubId: string;
  /** Null: every athlete of the club. */
  visibleAthleteIds: string[] | null;
  clipId?: string;
  athleteId?: string;
  sessionId?: string;
  ageGroupId?: string;
  from?: string;
  to?: string;
  view?: View;
}

/** One stored frame as the frames and keypoints exports read it (JSON columns still text). */
export interface ExportFrameRow {
  frameIndex: number;
  timeMs: number;
  keypoints: string;
  metrics: string;
  corrected: number;
  careful: number;
}

/**
 * Reads for the CSV exports: raw rows in pages by frame (a keyset cursor), so a download of millions of
 * rows never holds more than one page, and the single database connection is free between pages.
 */
export class ExportRepository {
  constructor(private readonly manager: EntityManager) {}

  /** The ready clips the filter covers, in session-date order. */
  async clips(filter: ExportClipFilter): Promise<ExportClip[]> {
    if (filter.visibleAthleteIds !== null && filter.visibleAthleteIds.length === 0) return [];
    const where: string[] = [`c."clubId" = ?`, `c."status" = 'ready'`];
    const params: unknown[] = [filter.clubId];
    const tagged = (condition: string, values: unknown[]) => {
      where.push(
        `EXISTS (SELECT 1 FROM clip_athlete ca JOIN athlete a ON a.id = ca."athleteId" WHERE ca."clipId" = c.id AND ${condition})`,
      );
      params.push(...values);
    };
    if (filter.visibleAthleteIds !== null)
      tagged(`a.id IN (${filter.visibleAthleteIds.map(() => '?').join(', ')})`, filter.visibleAthleteIds);
    if (filter.athleteId) tagged('a.id = ?', [filter.athleteId]);
    if (filter.ageGroupId) tagged('a."ageGroupId" = ?', [filter.ageGroupId]);
    const equal = (column: string, value: string | undefined, op = '=') => {
      if (value === undefined) return;
      where.push(`${column} ${op} ?`);
      params.push(value);
    };
    equal('c.id', filter.clipId);
    equal('c."sessionId"', filter.sessionId);
    equal('c."view"', filter.view);
    equal('s."date"', filter.from, '>=');
    equal('s."date"', filter.to, '<=');
    return (await this.manager.query(
      `SELECT c.id, c."originalName", c."view", c."defaultModel" AS model, s."date" AS "sessionDate", c."width",
              c."height", c."fps", c."frameCount", c."durationMs", c."status", c."clubId"
         FROM clip c JOIN training_session s ON s.id = c."sessionId"
        WHERE ${where.join(' AND ')}
        ORDER BY s."date", c."createdAt", c.id`,
      params,
    )) as ExportClip[];
  }

  /** Stored frames and keypoints per clip (its model), for the row count shown before a download. */
  async sizes(
    clips: ExportClip[],
  ): Promise<Map<string, { frames: number; keypoints: number; turns: number }>> {
    const out = new Map<string, { frames: number; keypoints: number; turns: number }>();
    for (const clip of clips) {
      const [row] = (await this.manager.query(
        `SELECT COUNT(*) AS frames, COALESCE(SUM(json_array_length("keypoints")), 0) AS keypoints
           FROM frame_result WHERE "clipId" = ? AND "model" = ?`,
        [clip.id, clip.model],
      )) as { frames: number; keypoints: number }[];
      const [turns] = (await this.manager.query(
        `SELECT COALESCE(json_array_length("turns"), 0) AS turns FROM clip_turns WHERE "clipId" = ? AND "model" = ?`,
        [clip.id, clip.model],
      )) as { turns: number }[];
      out.set(clip.id, {
        frames: Number(row.frames),
        keypoints: Number(row.keypoints),
        turns: Number(turns?.turns ?? 0),
      });
    }
    return out;
  }

  /** One page of a clip's stored frames after `afterFrame`, in frame order. */
  framesPage(
    clipId: string,
    model: PoseModelName,
    afterFrame: number,
    limit: number,
  ): Promise<ExportFrameRow[]> {
    return this.manager.query(
      `SELECT "frameIndex", "timeMs", "keypoints", "metrics", "corrected", "careful" FROM frame_result
        WHERE "clipId" = ? AND "model" = ? AND "frameIndex" > ? ORDER BY "frameIndex" LIMIT ?`,
      [clipId, model, afterFrame, limit],
    ) as Promise<ExportFrameRow[]>;
  }
}
