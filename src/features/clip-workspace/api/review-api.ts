import { useQuery } from '@tanstack/react-query';
import type { ReviewViewResponse } from '@shared/schemas/review.schema';
import { api } from '@/lib/api-client';
import { clipWorkspaceKeys } from './keys';

export const reviewViewKey = (reviewId: string) =>
  [...clipWorkspaceKeys.all, 'review-view', reviewId] as const;

/** The review page's data, exactly as the athlete sees it (a coach gets the same, marked preview). */
export function useReviewView(reviewId: string) {
  return useQuery({
    queryKey: reviewViewKey(reviewId),
    queryFn: () => api.get<ReviewViewResponse>(`/api/reviews/${encodeURIComponent(reviewId)}/view`),
    // The clip's media link inside is signed for a while; the page renews it on a media error.
    staleTime: 60_000,
  });
}
