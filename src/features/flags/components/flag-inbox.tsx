import { useState } from 'react';
import { Link } from 'react-router-dom';
import { FLAG_STATUSES, type FlagDto, type FlagStatus } from '@shared/schemas/flag.schema';
import { BAND_METRIC_KEYS, BAND_METRICS, formatBandRange, formatUnitValue } from '@shared/tolerance';
import { Button } from '@/components/ui/button';
import { EmptyState } from '@/components/ui/empty-state';
import { FormError } from '@/components/ui/field';
import { QueryError } from '@/components/ui/query-error';
import { PageSpinner } from '@/components/ui/spinner';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api-client';
import { cn, formatDateTime, formatDay } from '@/lib/format';
import { useFlags, type FlagFilters } from '../api/get-flags';
import { useUpdateFlag } from '../api/update-flag';
import { FlagThumbnail } from './flag-thumbnail';

const STATUS_TABS: Record<FlagStatus, string> = {
  unreviewed: 'To review',
  reviewed: 'Reviewed',
  dismissed: 'Dismissed',
};

const PAGE_SIZE = 10;

function clipTime(ms: number): string {
  const s = ms / 1000;
  return `${Math.floor(s / 60)}:${(s % 60).toFixed(1).padStart(4, '0')}`;
}

function ReviewControls({ flag }: { flag: FlagDto }) {
  const update = useUpdateFlag();
  const [commenting, setCommenting] = useState(false);
  const [comment, setComment] = useState(flag.comment ?? '');
  const commentId = `flag-comment-${flag.id}`;
  const set = (status: FlagStatus) =>
    update.mutate({ flagId: flag.id, input: { status, comment: comment.trim() || null } });
  const busy = (status: FlagStatus) => update.isPending && update.variables?.input.status === status;
  if (flag.status !== 'unreviewed') {
    return (
      <div className="mt-1 flex flex-wrap items-center gap-2">
        <Button size="sm" variant="quiet" busy={busy('unreviewed')} onClick={() => set('unreviewed')}>
          Back to review
        </Button>
        <FormError message={update.isError ? errorMessage(update.error) : null} />
      </div>
    );
  }
  return (
    <div className="mt-1 space-y-2">
      {commenting ? (
        <div>
          <label htmlFor={commentId} className="sr-only">
            Comment for the other coaches
          </label>
          <textarea
            id={commentId}
            rows={2}
            maxLength={1000}
            value={comment}
            autoFocus
            onChange={(event) => setComment(event.target.value)}
            placeholder="What you saw, what you will work on (other coaches read it)"
            className="block w-full rounded-md border border-granite-200 px-2 py-1 text-sm"
          />
        </div>
      ) : null}
      <div className="flex flex-wrap gap-2">
        <Button size="sm" busy={busy('reviewed')} onClick={() => set('reviewed')}>
          Mark reviewed
        </Button>
        <Button size="sm" variant="secondary" busy={busy('dismissed')} onClick={() => set('dismissed')}>
          Dismiss
        </Button>
        {commenting ? null : (
          <Button size="sm" variant="quiet" onClick={() => setCommenting(true)}>
            Add a comment
          </Button>
        )}
      </div>
      <FormError message={update.isError ? errorMessage(update.error) : null} />
    </div>
  );
}

function FlagItem({ flag, canReview }: { flag: FlagDto; canReview: boolean }) {
  const info = BAND_METRICS[flag.metric];
  const distance = formatUnitValue(flag.distance, info.unit);
  const where = [
    flag.turnIndex !== null ? `turn ${flag.turnIndex + 1}` : 'between turns',
    flag.timeMs !== null ? clipTime(flag.timeMs) : `frame ${flag.frameIndex}`,
    flag.frameCount > 1 ? `${flag.frameCount} frames outside` : null,
  ]
    .filter(Boolean)
    .join(' · ');
  return (
    <li className="flex gap-3 py-3" data-flag={flag.id}>
      <Link
        to={paths.clip.href(flag.clipId, { frame: flag.frameIndex, metric: info.readout })}
        aria-label={`Open the clip at this frame: ${info.label}, ${flag.athlete?.name ?? 'athlete'}`}
      >
        <FlagThumbnail strip={flag.thumbnails} timeMs={flag.timeMs} />
      </Link>
      <div className="min-w-0 flex-1">
        <p className="text-sm text-granite-900">
          <span className="font-medium">{flag.athlete?.name ?? 'Untagged clip'}</span>
          {flag.ageGroup ? <span className="text-granite-600"> · {flag.ageGroup.name}</span> : null}
          {' · '}
          <span className="font-medium">{info.label}</span>{' '}
          <span className="font-mono text-alarm-600 tabular-nums">
            {formatUnitValue(flag.value, info.unit)}
          </span>
          <span className="text-granite-600">
            {' '}
            against {formatBandRange(flag, info.unit)} ({distance} {flag.side === 'below' ? 'under' : 'over'})
          </span>
        </p>
        <p className="text-xs text-granite-600">
          {where}
          {flag.sessionDate ? ` · ${formatDay(flag.sessionDate)}` : ''} · {flag.clipName} · band v
          {flag.bandVersion}
        </p>
        <Link
          to={paths.clip.href(flag.clipId, { frame: flag.frameIndex, metric: info.readout })}
          className="text-xs font-medium text-glacier-700 hover:underline"
        >
          Open at this frame
        </Link>
        {flag.status !== 'unreviewed' ? (
          <p className="mt-1 text-xs text-granite-700">
            {flag.status === 'reviewed' ? 'Reviewed' : 'Dismissed'} by {flag.statusBy ?? 'a coach'}
            {flag.statusAt ? `, ${formatDateTime(flag.statusAt)}` : ''}
            {flag.comment ? `: “${flag.comment}”` : ''}
          </p>
        ) : null}
        {canReview ? <ReviewControls flag={flag} /> : null}
      </div>
    </li>
  );
}

interface FlagInboxProps {
  /** Filters every tab shares (an age group, an athlete). */
  filters?: Omit<FlagFilters, 'status' | 'page' | 'pageSize'>;
  canReview: boolean;
  emptyText: string;
}

/**
 * Flags to work through, newest first: one per habit and turn, with its athlete, value against the
 * band, turn and frame. Reviewing or dismissing one is kept and seen by the other coaches.
 */
export function FlagInbox({ filters = {}, canReview, emptyText }: FlagInboxProps) {
  const [status, setStatus] = useState<FlagStatus>('unreviewed');
  const [metric, setMetric] = useState('');
  const [page, setPage] = useState(1);
  const flags = useFlags({ ...filters, metric: metric || undefined, status, page, pageSize: PAGE_SIZE });
  const pages = flags.data ? Math.max(1, Math.ceil(flags.data.total / PAGE_SIZE)) : 1;
  const metricId = `flag-metric-${filters.athleteId ?? 'all'}`;
  return (
    <section aria-label="Flags" className="space-y-2">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <div role="tablist" aria-label="Flag state" className="flex flex-wrap gap-1">
          {FLAG_STATUSES.map((s) => (
            <button
              key={s}
              type="button"
              role="tab"
              aria-selected={s === status}
              onClick={() => {
                setStatus(s);
                setPage(1);
              }}
              className={cn(
                'rounded-md px-3 py-1 text-sm font-medium',
                s === status ? 'bg-glacier-100 text-glacier-900' : 'text-granite-600 hover:bg-granite-50',
              )}
            >
              {STATUS_TABS[s]}
              {s === status && flags.data ? (
                <span className="ml-1 font-mono tabular-nums">({flags.data.total})</span>
              ) : null}
            </button>
          ))}
        </div>
        <label htmlFor={metricId} className="flex items-center gap-1.5 text-xs text-granite-600">
          Habit
          <select
            id={metricId}
            value={metric}
            onChange={(event) => {
              setMetric(event.target.value);
              setPage(1);
            }}
            className="rounded border border-granite-200 bg-white px-1.5 py-1 text-xs text-granite-800"
          >
            <option value="">Every habit</option>
            {BAND_METRIC_KEYS.map((key) => (
              <option key={key} value={key}>
                {BAND_METRICS[key].label}
              </option>
            ))}
          </select>
        </label>
      </div>
      {flags.isPending ? <PageSpinner label="Loading flags" /> : null}
      {flags.isError ? (
        <QueryError error={flags.error} what="the flags" retry={() => void flags.refetch()} />
      ) : null}
      {flags.data && flags.data.flags.length === 0 ? (
        <EmptyState
          title={
            status === 'unreviewed' ? 'Nothing to review' : `No ${STATUS_TABS[status].toLowerCase()} flags`
          }
        >
          {status === 'unreviewed'
            ? emptyText
            : 'Flags you review or dismiss are kept here for the other coaches.'}
        </EmptyState>
      ) : null}
      {flags.data && flags.data.flags.length > 0 ? (
        <>
          <ul className={cn('divide-y divide-granite-100', flags.isPlaceholderData && 'opacity-60')}>
            {flags.data.flags.map((flag) => (
              <FlagItem key={flag.id} flag={flag} canReview={canReview} />
            ))}
          </ul>
          {pages > 1 ? (
            <nav
              aria-label="Flag pages"
              className="flex items-center justify-between gap-2 text-sm text-granite-600"
            >
              <Button
                size="sm"
                variant="secondary"
                disabled={page <= 1}
                onClick={() => setPage((p) => p - 1)}
              >
                Newer
              </Button>
              <span>
                Page {page} of {pages}
              </span>
              <Button
                size="sm"
                variant="secondary"
                disabled={page >= pages}
                onClick={() => setPage((p) => p + 1)}
              >
                Older
              </Button>
            </nav>
          ) : null}
        </>
      ) : null}
    </section>
  );
}
