import { In, type EntityManager } from 'typeorm';
import type { ReviewItemKind } from '@shared/schemas/review.schema';
import { ReviewItemEntity, type ReviewItem } from '../entities/review-item.entity';
import { ReviewReceiptEntity, type ReviewReceipt } from '../entities/review-receipt.entity';
import { ReviewEntity, type Review } from '../entities/review.entity';

export class ReviewRepository {
  constructor(private readonly manager: EntityManager) {}

  findById(id: string): Promise<Review | null> {
    return this.manager.findOneBy(ReviewEntity, { id });
  }

  async insert(review: Review): Promise<void> {
    await this.manager.insert(ReviewEntity, review);
  }

  async update(id: string, patch: Partial<Review>): Promise<void> {
    await this.manager.update(ReviewEntity, { id }, patch);
  }

  /** Newest first; `publishedOnly` for what athletes and guardians may read. */
  list(filter: {
    clubId: string;
    clipId?: string;
    athleteIds?: string[];
    publishedOnly?: boolean;
  }): Promise<Review[]> {
    if (filter.athleteIds && filter.athleteIds.length === 0) return Promise.resolve([]);
    return this.manager.find(ReviewEntity, {
      where: {
        clubId: filter.clubId,
        ...(filter.clipId ? { clipId: filter.clipId } : {}),
        ...(filter.athleteIds ? { athleteId: In(filter.athleteIds) } : {}),
        ...(filter.publishedOnly ? { status: 'published' as const } : {}),
      },
      order: { updatedAt: 'DESC' },
    });
  }

  /** Clips with a published review of one of these athletes: what athletes and guardians may open. */
  async publishedClipIds(athleteIds: string[]): Promise<string[]> {
    if (athleteIds.length === 0) return [];
    const rows = await this.manager.find(ReviewEntity, {
      select: { clipId: true, compareClipId: true },
      where: { athleteId: In(athleteIds), status: 'published' },
    });
    return [...new Set(rows.flatMap((r) => (r.compareClipId ? [r.clipId, r.compareClipId] : [r.clipId])))];
  }

  items(reviewIds: string[]): Promise<ReviewItem[]> {
    if (reviewIds.length === 0) return Promise.resolve([]);
    return this.manager.find(ReviewItemEntity, {
      where: { reviewId: In(reviewIds) },
      order: { rank: 'ASC' },
    });
  }

  /** Replaces the items of one kind with these references, in this order. */
  async setItems(
    reviewId: string,
    kind: ReviewItemKind,
    refIds: string[],
    makeId: () => string,
  ): Promise<void> {
    await this.manager.delete(ReviewItemEntity, { reviewId, kind });
    if (refIds.length === 0) return;
    await this.manager.insert(
      ReviewItemEntity,
      refIds.map((refId, rank) => ({ id: makeId(), reviewId, kind, refId, rank })),
    );
  }

  receipts(reviewIds: string[]): Promise<ReviewReceipt[]> {
    if (reviewIds.length === 0) return Promise.resolve([]);
    return this.manager.find(ReviewReceiptEntity, {
      where: { reviewId: In(reviewIds) },
      order: { firstOpenedAt: 'ASC' },
    });
  }

  async recordOpen(reviewId: string, userId: string, at: Date, makeId: () => string): Promise<void> {
    const existing = await this.manager.findOneBy(ReviewReceiptEntity, { reviewId, userId });
    if (existing)
      await this.manager.update(
        ReviewReceiptEntity,
        { id: existing.id },
        { lastOpenedAt: at, opens: existing.opens + 1 },
      );
    else
      await this.manager.insert(ReviewReceiptEntity, {
        id: makeId(),
        reviewId,
        userId,
        firstOpenedAt: at,
        lastOpenedAt: at,
        opens: 1,
      });
  }
}
