import { useRef } from 'react';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { NoteListResponse } from '@shared/schemas/note.schema';
import type { CompareStillDto, SeasonPlanResponse } from '@shared/schemas/plan.schema';
import type {
  PublishReviewResponse,
  ReviewDto,
  ReviewReceiptDto,
  ReviewSummaryDto,
  UpdateReviewInput,
} from '@shared/schemas/review.schema';
import { api } from '@/lib/api-client';

export const reviewKeys = {
  all: ['reviews'] as const,
  list: (filter: { clipId?: string; athleteId?: string }) => [...reviewKeys.all, 'list', filter] as const,
  one: (id: string) => [...reviewKeys.all, 'one', id] as const,
  receipts: (id: string) => [...reviewKeys.all, 'receipts', id] as const,
};

export function useReviews(filter: { clipId?: string; athleteId?: string } = {}) {
  return useQuery({
    queryKey: reviewKeys.list(filter),
    queryFn: () => api.get<{ reviews: ReviewSummaryDto[] }>('/api/reviews', { query: filter }),
  });
}

export function useReview(id: string) {
  return useQuery({
    queryKey: reviewKeys.one(id),
    queryFn: async () =>
      (await api.get<{ review: ReviewDto }>(`/api/reviews/${encodeURIComponent(id)}`)).review,
  });
}

export function useReceipts(id: string, enabled: boolean) {
  return useQuery({
    queryKey: reviewKeys.receipts(id),
    queryFn: () =>
      api.get<{ receipts: ReviewReceiptDto[] }>(`/api/reviews/${encodeURIComponent(id)}/receipts`),
    enabled,
  });
}

/** What a review can pick from: the clip's notes, the athlete's plan, stills kept with the baseline. */
export function useReviewSources(review: ReviewDto | undefined) {
  const notes = useQuery({
    queryKey: ['reviews', 'sources', 'notes', review?.clipId],
    queryFn: () => api.get<NoteListResponse>(`/api/clips/${encodeURIComponent(review!.clipId)}/notes`),
    enabled: !!review,
  });
  const plan = useQuery({
    queryKey: ['reviews', 'sources', 'plan', review?.athlete.id],
    queryFn: () =>
      api.get<SeasonPlanResponse>(`/api/athletes/${encodeURIComponent(review!.athlete.id)}/plan`),
    enabled: !!review,
  });
  const baseline = plan.data?.baselineClipId ?? null;
  const stills = useQuery({
    queryKey: ['reviews', 'sources', 'stills', review?.clipId, baseline],
    queryFn: () =>
      api.get<{ stills: CompareStillDto[] }>('/api/compare-stills', {
        query: { a: baseline!, b: review!.clipId },
      }),
    enabled: !!review && !!baseline && baseline !== review.clipId,
  });
  return { notes, plan, stills, baseline };
}

export function useUpdateReview(id: string) {
  const queryClient = useQueryClient();
  // Saves overlap when the coach ticks quickly: only the latest one's answer (or failure) settles the
  // state, so an earlier answer arriving later cannot undo a tick made meanwhile.
  const latest = useRef(0);
  return useMutation({
    mutationFn: (input: UpdateReviewInput) =>
      api.patch<{ review: ReviewDto }>(`/api/reviews/${encodeURIComponent(id)}`, input),
    // Ticks and toggles show at once; the server's answer (or the old state, on failure) follows.
    onMutate: (input) => {
      const before = queryClient.getQueryData<ReviewDto>(reviewKeys.one(id));
      if (before) queryClient.setQueryData(reviewKeys.one(id), { ...before, ...input });
      return { before, seq: ++latest.current };
    },
    onError: async (_error, _input, context) => {
      if (context?.seq === latest.current && context.before)
        queryClient.setQueryData(reviewKeys.one(id), context.before);
      // An earlier save failed under later ones: read what is stored.
      else await queryClient.invalidateQueries({ queryKey: reviewKeys.one(id) });
    },
    onSuccess: (data, _input, context) => {
      if (context?.seq === latest.current) queryClient.setQueryData(reviewKeys.one(id), data.review);
    },
  });
}

export function usePublishReview(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<PublishReviewResponse>(`/api/reviews/${encodeURIComponent(id)}/publish`),
    onSuccess: (data) => {
      queryClient.setQueryData(reviewKeys.one(id), data.review);
      void queryClient.invalidateQueries({ queryKey: reviewKeys.all });
    },
  });
}

export function useUnpublishReview(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<{ review: ReviewDto }>(`/api/reviews/${encodeURIComponent(id)}/unpublish`),
    onSuccess: (data) => {
      queryClient.setQueryData(reviewKeys.one(id), data.review);
      void queryClient.invalidateQueries({ queryKey: reviewKeys.all });
    },
  });
}
