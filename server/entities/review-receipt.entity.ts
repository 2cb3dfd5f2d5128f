import { EntitySchema } from 'typeorm';
import { foreignKey, idColumn, timestampColumn, uuidColumn } from './columns';

/** Who opened a published review, first and last time: the coach's read receipts. */
export interface ReviewReceipt {
  id: string;
  reviewId: string;
  userId: string;
  firstOpenedAt: Date;
  lastOpenedAt: Date;
  opens: number;
}

export const ReviewReceiptEntity = new EntitySchema<ReviewReceipt>({
  name: 'ReviewReceipt',
  tableName: 'review_receipt',
  columns: {
    id: idColumn,
    reviewId: uuidColumn,
    userId: uuidColumn,
    firstOpenedAt: timestampColumn,
    lastOpenedAt: timestampColumn,
    opens: { type: 'integer', default: 1 },
  },
  foreignKeys: [foreignKey('Review', 'reviewId', 'CASCADE'), foreignKey('User', 'userId', 'CASCADE')],
  uniques: [{ name: 'UQ_review_receipt_user', columns: ['reviewId', 'userId'] }],
});
