import { EntitySchema } from 'typeorm';
import { foreignKey, idColumn, timestampColumn, uuidColumn } from './columns';

/** A club's season; a clip belongs to the season that holds its session's date. */
export interface Season {
  id: string;
  clubId: string;
  name: string;
  /** Calendar dates, YYYY-MM-DD, both inclusive. */
  startsOn: string;
  endsOn: string;
  createdAt: Date;
}

export const SeasonEntity = new EntitySchema<Season>({
  name: 'Season',
  tableName: 'season',
  columns: {
    id: idColumn,
    clubId: uuidColumn,
    name: { type: 'varchar', length: 40 },
    startsOn: { type: 'varchar', length: 10 },
    endsOn: { type: 'varchar', length: 10 },
    createdAt: timestampColumn,
  },
  foreignKeys: [foreignKey('Club', 'clubId', 'CASCADE')],
  uniques: [{ name: 'UQ_season_club_name', columns: ['clubId', 'name'] }],
});
