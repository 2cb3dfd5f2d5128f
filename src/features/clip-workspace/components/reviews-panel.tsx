import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { Link, useNavigate } from 'react-router-dom';
import { MessageSquarePlus } from 'lucide-react';
import type { ReviewDto, ReviewSummaryDto } from '@shared/schemas/review.schema';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { useToast } from '@/components/ui/toast';
import { paths } from '@/config/paths';
import { api, errorMessage } from '@/lib/api-client';
import { useStage } from './stage/stage-context';

const STATUS = { draft: 'Draft', published: 'Published', withdrawn: 'Withdrawn' } as const;

/** The clip's reviews, and a new one for its athlete: what the athlete will read of this clip. */
export function ReviewsPanel() {
  const { clip } = useStage();
  const navigate = useNavigate();
  const toast = useToast();
  const queryClient = useQueryClient();
  const reviews = useQuery({
    queryKey: ['reviews', 'list', { clipId: clip.id }],
    queryFn: () => api.get<{ reviews: ReviewSummaryDto[] }>('/api/reviews', { query: { clipId: clip.id } }),
  });
  const create = useMutation({
    mutationFn: (athleteId: string) =>
      api.post<{ review: ReviewDto }>('/api/reviews', { clipId: clip.id, athleteId }),
    onSuccess: (data) => {
      void queryClient.invalidateQueries({ queryKey: ['reviews'] });
      void navigate(paths.reviewEdit.href(data.review.id));
    },
    onError: (error) => toast.error(`The review was not started: ${errorMessage(error)}`),
  });
  return (
    <section
      aria-labelledby="clip-reviews"
      className="space-y-2 rounded-lg border border-granite-200 bg-white p-4"
    >
      <h2 id="clip-reviews" className="text-sm font-semibold text-granite-900">
        Reviews
      </h2>
      {(reviews.data?.reviews ?? []).length === 0 ? (
        <p className="text-sm text-granite-600">
          A review shares chosen notes and focus points of this clip with the athlete and their guardians.
        </p>
      ) : (
        <ul className="space-y-1 text-sm">
          {reviews.data!.reviews.map((r) => (
            <li key={r.id} className="flex items-center justify-between gap-2">
              <Link to={paths.reviewEdit.href(r.id)} className="truncate text-glacier-700 hover:underline">
                {r.title}
              </Link>
              <Badge tone={r.status === 'published' ? 'good' : 'neutral'}>{STATUS[r.status]}</Badge>
            </li>
          ))}
        </ul>
      )}
      {clip.athletes.map((athlete) => (
        <Button
          key={athlete.id}
          size="sm"
          variant="secondary"
          busy={create.isPending}
          icon={<MessageSquarePlus aria-hidden="true" className="h-4 w-4" />}
          onClick={() => create.mutate(athlete.id)}
        >
          Start a review for {athlete.name}
        </Button>
      ))}
    </section>
  );
}
