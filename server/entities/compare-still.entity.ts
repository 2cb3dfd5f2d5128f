import { EntitySchema } from 'typeorm';
import { foreignKey, idColumn, nullableUuidColumn, timestampColumn, uuidColumn } from './columns';

/** A PNG of two clips' frames side by side, with overlays, kept with the pair for a review. */
export interface CompareStill {
  id: string;
  clubId: string;
  clipAId: string;
  clipBId: string;
  frameA: number;
  frameB: number;
  caption: string;
  storageKey: string;
  byteSize: number;
  createdById: string | null;
  createdAt: Date;
}

export const CompareStillEntity = new EntitySchema<CompareStill>({
  name: 'CompareStill',
  tableName: 'compare_still',
  columns: {
    id: idColumn,
    clubId: uuidColumn,
    clipAId: uuidColumn,
    clipBId: uuidColumn,
    frameA: { type: 'integer' },
    frameB: { type: 'integer' },
    caption: { type: 'varchar', length: 200, default: '' },
    storageKey: { type: 'varchar', length: 200 },
    byteSize: { type: 'integer' },
    createdById: nullableUuidColumn,
    createdAt: timestampColumn,
  },
  foreignKeys: [
    foreignKey('Club', 'clubId', 'CASCADE'),
    foreignKey('Clip', 'clipAId', 'CASCADE'),
    foreignKey('Clip', 'clipBId', 'CASCADE'),
    foreignKey('User', 'createdById', 'SET NULL'),
  ],
  indices: [{ name: 'IDX_compare_still_pair', columns: ['clipAId', 'clipBId', 'createdAt'] }],
});
