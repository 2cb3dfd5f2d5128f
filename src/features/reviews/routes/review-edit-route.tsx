import { useEffect, useRef, useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { Eye, Send, Undo2 } from 'lucide-react';
import { focusLabel } from '@shared/plan';
import type {
  ReviewDto,
  ReviewOverlays,
  ReviewRecipientDto,
  UpdateReviewInput,
} from '@shared/schemas/review.schema';
import { Badge } from '@/components/ui/badge';
import { Button, ButtonLink } from '@/components/ui/button';
import { FormError, TextAreaField, TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { Card, PageHeader } from '@/components/ui/page-header';
import { QueryError } from '@/components/ui/query-error';
import { PageSpinner, Spinner } from '@/components/ui/spinner';
import { useToast } from '@/components/ui/toast';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api-client';
import { fieldIssues } from '@/lib/form-errors';
import { formatDay } from '@/lib/format';
import { useDebouncedValue } from '@/lib/use-debounced-value';
import {
  usePublishReview,
  useReceipts,
  useReview,
  useReviewSources,
  useUnpublishReview,
  useUpdateReview,
} from '../api/reviews-api';

const OVERLAY_LABELS: Record<keyof ReviewOverlays, string> = {
  tiltGauge: 'Tilt gauge (shoulders against the snow line)',
  skeleton: 'Skeleton',
  angleArcs: 'Angle arcs',
  widthBars: 'Width bars',
};
const STATUS_WORDS = { draft: 'Draft', published: 'Published', withdrawn: 'Withdrawn' } as const;

const toggle = (ids: string[], id: string) => (ids.includes(id) ? ids.filter((x) => x !== id) : [...ids, id]);

/** `/reviews/:id/edit`: the coach writes the review; every change is saved as it is made. */
export function ReviewEditRoute() {
  const { reviewId = '' } = useParams();
  const review = useReview(reviewId);
  if (review.isPending) return <PageSpinner label="Loading the review" />;
  if (review.isError)
    return <QueryError error={review.error} what="this review" retry={() => void review.refetch()} />;
  return <ReviewEditor key={review.data.id} review={review.data} />;
}

function ReviewEditor({ review }: { review: ReviewDto }) {
  const toast = useToast();
  const save = useUpdateReview(review.id);
  const publish = usePublishReview(review.id);
  const unpublish = useUnpublishReview(review.id);
  const receipts = useReceipts(review.id, review.status !== 'draft');
  const { notes, plan, stills, baseline } = useReviewSources(review);
  const editable = review.status !== 'published';

  // Title and summary save once typing pauses; choices save at once.
  const [title, setTitle] = useState(review.title);
  const [summary, setSummary] = useState(review.summary);
  const settledTitle = useDebouncedValue(title, 600);
  const settledSummary = useDebouncedValue(summary, 600);
  const saved = useRef({ title: review.title, summary: review.summary });
  const { mutate } = save;
  useEffect(() => {
    const patch: UpdateReviewInput = {};
    if (settledTitle.trim() && settledTitle !== saved.current.title) patch.title = settledTitle;
    if (settledSummary !== saved.current.summary) patch.summary = settledSummary;
    if (Object.keys(patch).length === 0) return;
    saved.current = { title: settledTitle, summary: settledSummary };
    mutate(patch);
  }, [settledTitle, settledSummary, mutate]);
  const change = (patch: UpdateReviewInput) =>
    save.mutate(patch, { onError: (error) => toast.error(`Not saved: ${errorMessage(error)}`) });

  const summaryIssue = fieldIssues(publish.error).find((i) => i.field === 'summary')?.message;
  const saving = save.isPending || title !== settledTitle || summary !== settledSummary;

  return (
    <>
      <PageHeader
        title="Review"
        back={
          <Link to={paths.clip.href(review.clipId)} className="text-glacier-700 hover:underline">
            ← {review.clipName}
          </Link>
        }
        subtitle={
          <span className="inline-flex flex-wrap items-center gap-2">
            For {review.athlete.name} and their guardians
            <Badge
              tone={
                review.status === 'published' ? 'good' : review.status === 'withdrawn' ? 'warn' : 'neutral'
              }
            >
              {STATUS_WORDS[review.status]}
            </Badge>
            <span className="text-xs text-granite-500" aria-live="polite">
              {saving ? 'Saving…' : save.isError ? 'Not saved' : 'All changes saved'}
            </span>
          </span>
        }
        actions={
          <div className="flex flex-wrap gap-2">
            <ButtonLink
              to={paths.review.href(review.id)}
              variant="secondary"
              icon={<Eye aria-hidden="true" className="h-4 w-4" />}
            >
              Preview as the athlete
            </ButtonLink>
            {review.status === 'published' ? (
              <Button
                variant="secondary"
                busy={unpublish.isPending}
                icon={<Undo2 aria-hidden="true" className="h-4 w-4" />}
                onClick={() =>
                  unpublish.mutate(undefined, {
                    onSuccess: () =>
                      toast.success('Withdrawn: the athlete and guardians can no longer open it'),
                    onError: (error) => toast.error(errorMessage(error)),
                  })
                }
              >
                Unpublish
              </Button>
            ) : (
              <Button
                busy={publish.isPending}
                disabled={saving}
                icon={<Send aria-hidden="true" className="h-4 w-4" />}
                onClick={() =>
                  publish.mutate(undefined, {
                    onSuccess: (data) => toast.success(publishedMessage(data.recipients)),
                  })
                }
              >
                {review.status === 'withdrawn' ? 'Publish again' : 'Publish'}
              </Button>
            )}
          </div>
        }
      />
      {review.status === 'published' ? (
        <Notice
          tone="info"
          title={`Published ${review.publishedAt ? formatDay(review.publishedAt) : ''}`}
          className="mb-4"
        >
          {review.athlete.name} and their guardians can read it. To correct it, unpublish it (they lose access
          at once), change it, and publish again.
        </Notice>
      ) : null}
      <FormError message={publish.isError && !summaryIssue ? errorMessage(publish.error) : null} />
      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_20rem]">
        <div className="space-y-6">
          <Card title="What you want them to know">
            <div className="space-y-4">
              <TextField
                label="Title"
                value={title}
                disabled={!editable}
                onChange={(e) => setTitle(e.target.value)}
              />
              <TextAreaField
                label="Summary"
                hint="A few sentences; the e-mail quotes it."
                value={summary}
                disabled={!editable}
                error={summaryIssue}
                rows={5}
                onChange={(e) => setSummary(e.target.value)}
              />
            </div>
          </Card>
          <Card title="Notes from the clip">
            {notes.isPending ? <Spinner size="sm" label="Loading notes" /> : null}
            {notes.data && notes.data.notes.length === 0 ? (
              <p className="text-sm text-granite-600">
                This clip has no notes yet. Pin notes to moments in the clip, then choose them here.
              </p>
            ) : null}
            <ul className="space-y-2" aria-label="Notes to share">
              {(notes.data?.notes ?? []).map((note) => (
                <li key={note.id}>
                  <label className="flex items-start gap-2 text-sm">
                    <input
                      type="checkbox"
                      className="mt-1"
                      disabled={!editable}
                      checked={review.noteIds.includes(note.id)}
                      onChange={() => change({ noteIds: toggle(review.noteIds, note.id) })}
                    />
                    <span>
                      <span className="font-mono text-xs text-granite-500">
                        {(note.timeMs / 1000).toFixed(1)} s
                      </span>{' '}
                      {note.text}
                      {note.drawing ? (
                        <span className="text-xs text-granite-500"> (with a drawing)</span>
                      ) : null}
                    </span>
                  </label>
                </li>
              ))}
            </ul>
          </Card>
          <Card title="Focus points of the season plan">
            {plan.isPending ? <Spinner size="sm" label="Loading the season plan" /> : null}
            {plan.data && plan.data.focusPoints.length === 0 ? (
              <p className="text-sm text-granite-600">
                The season plan has no focus points yet; add them on{' '}
                <Link to={paths.athlete.href(review.athlete.id)} className="text-glacier-700 underline">
                  the athlete&apos;s page
                </Link>
                .
              </p>
            ) : null}
            <ul className="space-y-2" aria-label="Focus points to share">
              {(plan.data?.focusPoints ?? []).map((point) => (
                <li key={point.id}>
                  <label className="flex items-start gap-2 text-sm">
                    <input
                      type="checkbox"
                      className="mt-1"
                      disabled={!editable}
                      checked={review.focusPointIds.includes(point.id)}
                      onChange={() => change({ focusPointIds: toggle(review.focusPointIds, point.id) })}
                    />
                    <span>
                      {point.title}
                      {point.metric ? (
                        <span className="text-granite-600"> · {focusLabel(point.metric, point.phase)}</span>
                      ) : null}
                    </span>
                  </label>
                </li>
              ))}
            </ul>
          </Card>
        </div>
        <aside className="space-y-6">
          <Card title="On the clip">
            <fieldset className="space-y-2 text-sm" disabled={!editable}>
              <legend className="sr-only">Overlays the athlete sees</legend>
              {(Object.keys(OVERLAY_LABELS) as (keyof ReviewOverlays)[]).map((key) => (
                <label key={key} className="flex items-center gap-2">
                  <input
                    type="checkbox"
                    checked={review.overlays[key]}
                    onChange={() =>
                      change({ overlays: { ...review.overlays, [key]: !review.overlays[key] } })
                    }
                  />
                  {OVERLAY_LABELS[key]}
                </label>
              ))}
              <label className="flex items-center gap-2">
                <input
                  type="checkbox"
                  checked={review.showCurves}
                  onChange={() => change({ showCurves: !review.showCurves })}
                />
                Curves of the whole clip
              </label>
            </fieldset>
          </Card>
          <Card title="Beside the baseline">
            {baseline && baseline !== review.clipId ? (
              <div className="space-y-3 text-sm">
                <label className="flex items-center gap-2">
                  <input
                    type="checkbox"
                    disabled={!editable}
                    checked={review.compareClipId === baseline}
                    onChange={() => change({ compareClipId: review.compareClipId ? null : baseline })}
                  />
                  Let them play it beside the baseline, turn by turn
                </label>
                {(stills.data?.stills ?? []).map((still) => (
                  <label key={still.id} className="flex items-center gap-2">
                    <input
                      type="checkbox"
                      disabled={!editable}
                      checked={review.stillIds.includes(still.id)}
                      onChange={() => change({ stillIds: toggle(review.stillIds, still.id) })}
                    />
                    Side-by-side still{still.caption ? `: ${still.caption}` : ''}
                  </label>
                ))}
              </div>
            ) : (
              <p className="text-sm text-granite-600">No baseline of this season to compare with.</p>
            )}
          </Card>
          {review.status !== 'draft' ? (
            <Card title="Opened by">
              {receipts.data && receipts.data.receipts.length === 0 ? (
                <p className="text-sm text-granite-600">Nobody has opened it yet.</p>
              ) : null}
              <ul className="space-y-1 text-sm">
                {(receipts.data?.receipts ?? []).map((r) => (
                  <li key={`${r.name}-${r.firstOpenedAt}`}>
                    {r.name} ({r.role}) · first {formatDay(r.firstOpenedAt)}, {r.opens}{' '}
                    {r.opens === 1 ? 'time' : 'times'}
                  </li>
                ))}
              </ul>
            </Card>
          ) : null}
        </aside>
      </div>
    </>
  );
}

/** Who was told how: by e-mail, or (without consent to e-mail) on their Home page only. */
function publishedMessage(recipients: ReviewRecipientDto[]): string {
  const names = (list: ReviewRecipientDto[]) => list.map((r) => r.name).join(', ');
  const mailed = recipients.filter((r) => r.emailed);
  const inApp = recipients.filter((r) => !r.emailed);
  const parts = [
    mailed.length > 0 ? `e-mailed to ${names(mailed)}` : '',
    inApp.length > 0 ? `on the Home page of ${names(inApp)} (consent does not cover e-mail)` : '',
  ].filter(Boolean);
  return `Published: ${parts.join('; ')}`;
}
