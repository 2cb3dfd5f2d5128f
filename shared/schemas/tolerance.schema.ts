import { z } from 'zod';
import type { View } from '../keypoints';
import type { BandMetricKey, ToleranceBand } from '../tolerance';

export const toleranceBandQuerySchema = z.object({
  ageGroupId: z.string().uuid('Choose an age group').optional(),
});

/** A stored band: the shared ToleranceBand plus its row id, age group id and camera view. */
export interface ToleranceBandDto extends ToleranceBand {
  id: string;
  ageGroupId: string;
  metric: BandMetricKey;
  /** The view the metric is measured in ("both" for metrics of either view). */
  view: View | 'both';
  updatedAt: string;
}

export interface ToleranceBandListResponse {
  bands: ToleranceBandDto[];
}
