import { EntitySchema } from 'typeorm';
import type { ReviewItemKind } from '@shared/schemas/review.schema';
import { foreignKey, idColumn, uuidColumn } from './columns';

/** A note, focus point or side-by-side still chosen for a review, in the coach's order. */
export interface ReviewItem {
  id: string;
  reviewId: string;
  kind: ReviewItemKind;
  refId: string;
  rank: number;
}

export const ReviewItemEntity = new EntitySchema<ReviewItem>({
  name: 'ReviewItem',
  tableName: 'review_item',
  columns: {
    id: idColumn,
    reviewId: uuidColumn,
    kind: { type: 'varchar', length: 12 },
    refId: uuidColumn,
    rank: { type: 'integer' },
  },
  foreignKeys: [foreignKey('Review', 'reviewId', 'CASCADE')],
  uniques: [{ name: 'UQ_review_item_ref', columns: ['reviewId', 'kind', 'refId'] }],
});
