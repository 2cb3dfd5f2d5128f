import { EntitySchema } from 'typeorm';
import { foreignKey, idColumn, uuidColumn } from './columns';

export interface AgeGroup {
  id: string;
  clubId: string;
  /** "U10", "U12", ... */
  name: string;
  /** Inclusive age range in years, age = season year - birth year. */
  minAge: number;
  maxAge: number;
}

export const AgeGroupEntity = new EntitySchema<AgeGroup>({
  name: 'AgeGroup',
  tableName: 'age_group',
  columns: {
    id: idColumn,
    clubId: uuidColumn,
    name: { type: 'varchar', length: 20 },
    minAge: { type: 'integer' },
    maxAge: { type: 'integer' },
  },
  foreignKeys: [foreignKey('Club', 'clubId', 'CASCADE')],
  uniques: [{ name: 'UQ_age_group_club_name', columns: ['clubId', 'name'] }],
});
