import { EntitySchema } from 'typeorm';
import { foreignKey, idColumn, nullableUuidColumn, timestampColumn, uuidColumn } from './columns';

/** The snow line a coach set on a clip: two image points in pixels, y down. */
export interface ReferenceLineRow {
  id: string;
  clipId: string;
  /** Frame it was set on; null means it holds for the whole clip. */
  frameIndex: number | null;
  x1: number;
  y1: number;
  x2: number;
  y2: number;
  createdById: string | null;
  createdAt: Date;
}

export const ReferenceLineEntity = new EntitySchema<ReferenceLineRow>({
  name: 'ReferenceLine',
  tableName: 'reference_line',
  columns: {
    id: idColumn,
    clipId: uuidColumn,
    frameIndex: { type: 'integer', nullable: true },
    x1: { type: 'real' },
    y1: { type: 'real' },
    x2: { type: 'real' },
    y2: { type: 'real' },
    createdById: nullableUuidColumn,
    createdAt: timestampColumn,
  },
  foreignKeys: [foreignKey('Clip', 'clipId', 'CASCADE'), foreignKey('User', 'createdById', 'SET NULL')],
  indices: [{ name: 'IDX_reference_line_clip', columns: ['clipId'] }],
});
