import { EntitySchema } from 'typeorm';
import { foreignKey, idColumn, nullableUuidColumn, timestampColumn, uuidColumn } from './columns';

/** The clip an athlete's later clips of a season are compared with (one per athlete and season). */
export interface SeasonBaseline {
  id: string;
  athleteId: string;
  seasonId: string;
  clipId: string;
  setById: string | null;
  setAt: Date;
}

export const SeasonBaselineEntity = new EntitySchema<SeasonBaseline>({
  name: 'SeasonBaseline',
  tableName: 'season_baseline',
  columns: {
    id: idColumn,
    athleteId: uuidColumn,
    seasonId: uuidColumn,
    clipId: uuidColumn,
    setById: nullableUuidColumn,
    setAt: timestampColumn,
  },
  foreignKeys: [
    foreignKey('Athlete', 'athleteId', 'CASCADE'),
    foreignKey('Season', 'seasonId', 'CASCADE'),
    foreignKey('Clip', 'clipId', 'CASCADE'),
    foreignKey('User', 'setById', 'SET NULL'),
  ],
  uniques: [{ name: 'UQ_season_baseline_athlete_season', columns: ['athleteId', 'seasonId'] }],
});
