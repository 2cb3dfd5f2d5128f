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
  /** When the head coach was told that this season's clips are due for erasure (once per due date). */
  retentionNoticeSentAt: Date | null;
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
    retentionNoticeSentAt: { type: 'datetime', nullable: true },
    createdAt: timestampColumn,
  },
  foreignKeys: [foreignKey('Club', 'clubId', 'CASCADE')],
  uniques: [{ name: 'UQ_season_club_name', columns: ['clubId', 'name'] }],
});
