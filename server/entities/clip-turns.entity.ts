import { EntitySchema } from 'typeorm';
import type { PoseModelName } from '@shared/keypoints';
import type { TurnWindow } from '@shared/tolerance';
import { foreignKey, idColumn, timestampColumn, uuidColumn } from './columns';

/**
 * The turns last found in a clip's stored frames, kept so that flags can be judged again against new
 * bands without smoothing the whole clip again.
 */
export interface ClipTurns {
  id: string;
  clipId: string;
  model: PoseModelName;
  turns: TurnWindow[];
  /** Frames a stretch outside turns may skip and still be one stretch (a quarter second). */
  maxGapFrames: number;
  updatedAt: Date;
}

export const ClipTurnsEntity = new EntitySchema<ClipTurns>({
  name: 'ClipTurns',
  tableName: 'clip_turns',
  columns: {
    id: idColumn,
    clipId: uuidColumn,
    model: { type: 'varchar', length: 20 },
    turns: { type: 'simple-json' },
    maxGapFrames: { type: 'integer' },
    updatedAt: timestampColumn,
  },
  foreignKeys: [foreignKey('Clip', 'clipId', 'CASCADE')],
  uniques: [{ name: 'UQ_clip_turns_clip_model', columns: ['clipId', 'model'] }],
});
