import { Link } from 'react-router-dom';
import { Badge } from '@/components/ui/badge';
import { QueryError } from '@/components/ui/query-error';
import { Spinner } from '@/components/ui/spinner';
import { paths } from '@/config/paths';
import { formatDay } from '@/lib/format';
import { useReviews } from '../api/reviews-api';

/** Published reviews newest first, unread ones marked: an athlete's (or a child's) Home. */
export function ReviewList({ athleteId, emptyText }: { athleteId?: string; emptyText: string }) {
  const reviews = useReviews(athleteId ? { athleteId } : {});
  if (reviews.isPending) return <Spinner size="sm" label="Loading reviews" />;
  if (reviews.isError)
    return <QueryError error={reviews.error} what="reviews" retry={() => void reviews.refetch()} />;
  const list = reviews.data.reviews;
  if (list.length === 0) return <p className="text-sm text-granite-600">{emptyText}</p>;
  return (
    <ul
      className="divide-y divide-granite-100 rounded-lg border border-granite-200 bg-white"
      aria-label="Reviews"
    >
      {list.map((review) => (
        <li key={review.id}>
          <Link
            to={paths.review.href(review.id)}
            className="flex items-center justify-between gap-3 px-4 py-3 hover:bg-glacier-50/60"
          >
            <span className="min-w-0">
              <span
                className={review.unread ? 'block font-semibold text-granite-900' : 'block text-granite-900'}
              >
                {review.title}
              </span>
              <span className="block text-xs text-granite-600">
                {review.author ? `${review.author} · ` : ''}
                {review.publishedAt ? formatDay(review.publishedAt) : ''}
              </span>
            </span>
            {review.unread ? <Badge tone="info">New</Badge> : null}
          </Link>
        </li>
      ))}
    </ul>
  );
}
