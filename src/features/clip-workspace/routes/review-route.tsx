import { useCallback, useEffect, type ReactNode } from 'react';
import { Link, useParams } from 'react-router-dom';
import { useQueryClient } from '@tanstack/react-query';
import { ChevronLeft, ChevronRight, Columns2, Pause, Play } from 'lucide-react';
import { FOCUS_STATUS_LABELS } from '@shared/schemas/plan.schema';
import type { ReviewViewResponse } from '@shared/schemas/review.schema';
import { ButtonLink } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { QueryError } from '@/components/ui/query-error';
import { PageSpinner } from '@/components/ui/spinner';
import { paths } from '@/config/paths';
import { ApiError } from '@/lib/api-client';
import { cn, formatDay } from '@/lib/format';
import { useStillImageUrl } from '../components/compare/compare-stills';
import { clipWorkspaceKeys } from '../api/keys';
import { useReviewView } from '../api/review-api';
import { CurvesPanel } from '../components/curves';
import { noteFrame } from '../components/notes/note-frame';
import { ClipStageProvider, StageView } from '../components/stage/clip-stage';
import { useStage, useStageClock } from '../components/stage/stage-context';
import { formatClipTime } from '../lib/frame-time';

/** `/reviews/:reviewId`: the review as the athlete reads it, designed for a phone held upright first. */
export function ReviewRoute() {
  const { reviewId = '' } = useParams();
  const view = useReviewView(reviewId);
  const queryClient = useQueryClient();
  const { refetch } = view;
  const renewMedia = useCallback(async () => (await refetch()).data?.clip.mediaUrl ?? null, [refetch]);

  // The review carries the notes it shares: the stage draws their drawings from the clip's note list.
  const data = view.data;
  useEffect(() => {
    if (data) queryClient.setQueryData(clipWorkspaceKeys.notes(data.clip.id), { notes: data.notes });
  }, [data, queryClient]);

  if (view.isPending) return <PageSpinner label="Opening the review" />;
  if (view.isError) {
    const error = view.error;
    if (error instanceof ApiError && error.status === 410)
      return (
        <ReviewGone title="This review was withdrawn">
          Your coach has taken this review back, usually to correct it. A corrected review arrives by e-mail
          when it is ready.
        </ReviewGone>
      );
    if (error instanceof ApiError && error.status === 404)
      return (
        <ReviewGone title="Review not found">
          There is no review at this address for your account. It may belong to someone else, or the link was
          copied only in part.
        </ReviewGone>
      );
    return <QueryError error={error} what="this review" retry={() => void refetch()} />;
  }
  const { review, clip } = view.data;
  return (
    <article className="mx-auto max-w-3xl space-y-5" aria-labelledby="review-title">
      {view.data.preview ? (
        <Notice tone="info" title="Preview">
          This is the review exactly as {review.athlete.name} and their guardians see it
          {review.status === 'published' ? '' : ' once it is published'}.
          <Link to={paths.reviewEdit.href(review.id)} className="ml-1 font-medium text-glacier-700 underline">
            Back to editing
          </Link>
        </Notice>
      ) : null}
      <header className="space-y-1">
        <h1 id="review-title" className="text-xl font-semibold text-granite-900">
          {review.title}
        </h1>
        <p className="text-sm text-granite-600">
          {review.author ? `From ${review.author}` : 'From your coach'}
          {review.publishedAt ? ` · ${formatDay(review.publishedAt)}` : ''}
        </p>
      </header>
      {review.summary ? (
        <p className="whitespace-pre-line rounded-lg bg-white p-4 text-base leading-relaxed text-granite-900 shadow-sm">
          {review.summary}
        </p>
      ) : null}
      {clip.status === 'ready' ? (
        <ClipStageProvider
          key={clip.id}
          clip={clip}
          renewMedia={renewMedia}
          readOnly
          overlays={review.overlays}
        >
          <ReviewPlayer data={view.data} />
          {/* Curves only when the coach chose them for this review. */}
          {review.showCurves ? <CurvesPanel /> : null}
        </ClipStageProvider>
      ) : (
        <Notice tone="info" title="The clip is being prepared">
          It plays here once the server has made a playable copy.
        </Notice>
      )}
      <FocusPoints data={view.data} />
      {view.data.stills.length > 0 ? <Stills data={view.data} /> : null}
      {review.compareClipId ? (
        <ButtonLink
          to={paths.compare.href(review.compareClipId, clip.id)}
          variant="secondary"
          icon={<Columns2 aria-hidden="true" className="h-4 w-4" />}
        >
          Play beside your baseline, turn by turn
        </ButtonLink>
      ) : null}
      <Notice tone="info" title="2D estimates, not medical advice">
        The numbers come from one camera and depend on where it stood. They are a coaching aid, not a medical
        or injury assessment: pain or injury goes to a licensed professional.
      </Notice>
    </article>
  );
}

/** A full page for a review that cannot be shown: why, and the way home (no retry that cannot help). */
function ReviewGone({ title, children }: { title: string; children: ReactNode }) {
  return (
    <section className="mx-auto max-w-lg space-y-3 rounded-lg border border-granite-200 bg-white p-6 text-center shadow-sm">
      <h1 className="text-lg font-semibold text-granite-900">{title}</h1>
      <p className="text-sm text-granite-700">{children}</p>
      <Link to={paths.home.href()} className="inline-block font-medium text-glacier-700 underline">
        Back to Home
      </Link>
    </section>
  );
}

/** The clip with the chosen overlays, big thumb-sized controls, and the coach's notes as moments. */
function ReviewPlayer({ data }: { data: ReviewViewResponse }) {
  const ws = useStage();
  const playing = useStageClock((s) => s.playing);
  const frame = useStageClock((s) => s.frame);
  const round = 'inline-flex items-center justify-center rounded-full border shadow-sm';
  const big = `${round} h-14 w-14 border-granite-200 bg-white text-granite-900 active:bg-glacier-50`;
  const main = `${round} h-16 w-16 border-glacier-700 bg-glacier-700 text-white active:bg-glacier-800`;
  return (
    <section aria-label="Your run" className="space-y-3">
      <StageView />
      <div className="flex items-center justify-center gap-5" role="group" aria-label="Playback">
        <button type="button" className={big} aria-label="Previous frame" onClick={() => ws.stepFrames(-1)}>
          <ChevronLeft aria-hidden="true" className="h-7 w-7" />
        </button>
        <button
          type="button"
          className={main}
          aria-label={playing ? 'Pause' : 'Play'}
          onClick={ws.togglePlay}
        >
          {playing ? (
            <Pause aria-hidden="true" className="h-8 w-8" />
          ) : (
            <Play aria-hidden="true" className="h-8 w-8" />
          )}
        </button>
        <button type="button" className={big} aria-label="Next frame" onClick={() => ws.stepFrames(1)}>
          <ChevronRight aria-hidden="true" className="h-7 w-7" />
        </button>
      </div>
      <p className="text-center font-mono text-xs text-granite-600" data-testid="review-frame">
        frame {frame} · {formatClipTime((frame / ws.fps) * 1000)}
      </p>
      {data.notes.length > 0 ? (
        <section aria-labelledby="coach-notes" className="space-y-2">
          <h2 id="coach-notes" className="text-base font-semibold text-granite-900">
            Your coach&apos;s notes
          </h2>
          <ol className="space-y-2">
            {data.notes.map((note) => {
              const at = noteFrame(note, ws.fps, ws.frameCount);
              return (
                <li key={note.id}>
                  <button
                    type="button"
                    onClick={() => ws.seekToFrame(at)}
                    aria-current={frame === at ? 'true' : undefined}
                    className={cn(
                      'flex w-full items-start gap-3 rounded-lg border bg-white p-3 text-left shadow-sm',
                      frame === at ? 'border-glacier-500 ring-2 ring-glacier-200' : 'border-granite-200',
                    )}
                  >
                    <span className="mt-0.5 shrink-0 rounded bg-glacier-100 px-2 py-0.5 font-mono text-xs text-glacier-800">
                      {formatClipTime(note.timeMs)}
                    </span>
                    <span className="text-base text-granite-900">{note.text}</span>
                  </button>
                </li>
              );
            })}
          </ol>
        </section>
      ) : null}
    </section>
  );
}

function FocusPoints({ data }: { data: ReviewViewResponse }) {
  if (data.focusPoints.length === 0) return null;
  return (
    <section aria-labelledby="focus-points" className="space-y-2">
      <h2 id="focus-points" className="text-base font-semibold text-granite-900">
        What to work on
      </h2>
      <ol className="space-y-2">
        {data.focusPoints.map(({ point, words }) => (
          <li key={point.id} className="rounded-lg border border-granite-200 bg-white p-3 shadow-sm">
            <p className="font-medium text-granite-900">
              {point.title}{' '}
              <span className="text-xs font-normal text-granite-600">
                ({FOCUS_STATUS_LABELS[point.status]})
              </span>
            </p>
            {point.metric ? <p className="text-sm text-granite-800">{words}</p> : null}
            {point.cue ? <p className="text-sm italic text-granite-700">“{point.cue}”</p> : null}
          </li>
        ))}
      </ol>
    </section>
  );
}

function StillImage({ id, alt }: { id: string; alt: string }) {
  const { url } = useStillImageUrl(id);
  return url ? (
    <img src={url} alt={alt} className="w-full rounded" />
  ) : (
    <div className="aspect-video rounded bg-granite-100" />
  );
}

function Stills({ data }: { data: ReviewViewResponse }) {
  return (
    <section aria-labelledby="review-stills" className="space-y-2">
      <h2 id="review-stills" className="text-base font-semibold text-granite-900">
        Side by side
      </h2>
      {data.stills.map((still) => (
        <figure key={still.id} className="space-y-1">
          <StillImage id={still.id} alt={still.caption || 'Two runs side by side'} />
          {still.caption ? (
            <figcaption className="text-sm text-granite-700">{still.caption}</figcaption>
          ) : null}
        </figure>
      ))}
    </section>
  );
}
