import { EntitySchema } from 'typeorm';
import { idColumn, timestampColumn } from './columns';

export interface Club {
  id: string;
  name: string;
  createdAt: Date;
}

export const ClubEntity = new EntitySchema<Club>({
  name: 'Club',
  tableName: 'club',
  columns: {
    id: idColumn,
    name: { type: 'varchar', length: 120 },
    createdAt: timestampColumn,
  },
});
