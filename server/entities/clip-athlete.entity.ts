import { EntitySchema } from 'typeorm';
import { foreignKey, uuidColumn } from './columns';

/** The athletes seen in a clip. */
export interface ClipAthlete {
  clipId: string;
  athleteId: string;
}

export const ClipAthleteEntity = new EntitySchema<ClipAthlete>({
  name: 'ClipAthlete',
  tableName: 'clip_athlete',
  columns: {
    clipId: { ...uuidColumn, primary: true },
    athleteId: { ...uuidColumn, primary: true },
  },
  foreignKeys: [foreignKey('Clip', 'clipId', 'CASCADE'), foreignKey('Athlete', 'athleteId', 'CASCADE')],
  indices: [{ name: 'IDX_clip_athlete_athlete', columns: ['athleteId'] }],
});
