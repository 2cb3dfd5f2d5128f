import { useCallback, useEffect, useRef, useState } from 'react';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import { Columns2 } from 'lucide-react';
import { ButtonLink } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { QueryError } from '@/components/ui/query-error';
import { PageSpinner, Spinner } from '@/components/ui/spinner';
import { paths } from '@/config/paths';
import { useUser } from '@/lib/auth';
import { can } from '@/lib/permissions';
import { RenderProbe } from '@/lib/render-probe';
import type { ClipDto } from '@shared/schemas/clip.schema';
import { clipExtras } from '../api/clip-contract';
import { useWorkspaceClip } from '../api/get-workspace-clip';
import { AnalysisPanel } from '../components/analysis';
import { CurvesPanel, TurnTable } from '../components/curves';
import { ExportMenu } from '../components/export';
import { NotesPanel } from '../components/notes';
import { OverlayToolbar } from '../components/overlays/overlay-toolbar';
import { ScrubBar } from '../components/player/scrub-bar';
import { ReadoutsPanel } from '../components/readouts/readouts-panel';
import { ReviewsPanel } from '../components/reviews-panel';
import { DeleteClipButton } from '../components/delete-clip-button';
import { TransportBar } from '../components/player/transport-bar';
import { ClipStageProvider, StageView } from '../components/stage/clip-stage';
import { useStage, useStageClock } from '../components/stage/stage-context';
import { useWorkspaceKeys } from '../hooks/use-workspace-keys';

export function ClipWorkspaceRoute() {
  const { clipId = '' } = useParams();
  const user = useUser();
  const query = useWorkspaceClip(clipId);
  const { refetch } = query;
  const renewMedia = useCallback(async () => (await refetch()).data?.clip.mediaUrl ?? null, [refetch]);

  if (query.isPending) return <PageSpinner label="Loading the clip" />;
  if (query.isError)
    return <QueryError error={query.error} what="this clip" retry={() => void query.refetch()} />;

  const clip = query.data.clip;
  return (
    <>
      <ClipHeader clip={clip} />
      {clip.status === 'failed' ? (
        <Notice tone="error" title="This clip could not be prepared">
          <p>{clip.failureReason ?? 'The server could not read the video.'}</p>
          <p className="mt-1">Upload the clip again, or try another file from the phone.</p>
        </Notice>
      ) : clip.status !== 'ready' ? (
        <Notice tone="info" title="Preparing the clip">
          <p className="flex items-center gap-2">
            <Spinner size="sm" label="" />
            The server is making a playable copy, a poster and the thumbnail strip. This page opens the
            workspace by itself when it is done.
          </p>
        </Notice>
      ) : (
        <ClipStageProvider
          key={clip.id}
          clip={clip}
          renewMedia={renewMedia}
          readOnly={!can(user.role, 'clips.analyse')}
        >
          <Workspace />
        </ClipStageProvider>
      )}
    </>
  );
}

function ClipHeader({ clip }: { clip: ClipDto }) {
  const user = useUser();
  const ageGroup = clipExtras(clip).ageGroup?.name;
  const linkAthletes = can(user.role, 'athletes.view');
  return (
    <PageHeader
      title={clip.originalName}
      actions={
        <div className="flex flex-wrap gap-2">
          {clip.athletes.length > 0 && clip.status === 'ready' ? (
            <ButtonLink
              to={paths.compare.href(null, clip.id)}
              variant="secondary"
              icon={<Columns2 aria-hidden="true" className="h-4 w-4" />}
            >
              Compare
            </ButtonLink>
          ) : null}
          {/* Coaches see it; the server lets the head coach and the uploading coach through. */}
          {can(user.role, 'clips.erase') && clip.status !== 'processing' && clip.status !== 'uploaded' ? (
            <DeleteClipButton clip={clip} />
          ) : null}
        </div>
      }
      back={
        can(user.role, 'sessions.view') ? (
          <Link to={paths.session.href(clip.sessionId)} className="text-glacier-700 hover:underline">
            ← Training session
          </Link>
        ) : undefined
      }
      subtitle={
        <>
          {clip.athletes.length === 0
            ? 'No athlete tagged'
            : clip.athletes.map((athlete, i) => (
                <span key={athlete.id}>
                  {i > 0 ? ', ' : null}
                  {linkAthletes ? (
                    <Link to={paths.athlete.href(athlete.id)} className="text-glacier-700 hover:underline">
                      {athlete.name}
                    </Link>
                  ) : (
                    athlete.name
                  )}
                </span>
              ))}
          {` · ${clip.view === 'front' ? 'front view' : 'side view'}`}
          {ageGroup ? ` · age group ${ageGroup}` : null}
        </>
      }
    />
  );
}

/** `?frame=N` (a flag, a shared link): seeks there once the video can show a frame. */
function OpenAtFrame() {
  const [params] = useSearchParams();
  const { seekToFrame } = useStage();
  const ready = useStageClock((s) => s.mediaReady);
  const done = useRef(false);
  const frame = Number(params.get('frame'));
  useEffect(() => {
    if (done.current || !ready || !params.has('frame') || !Number.isInteger(frame) || frame < 0) return;
    done.current = true;
    seekToFrame(frame);
  }, [ready, frame, params, seekToFrame]);
  return null;
}

function Workspace() {
  const user = useUser();
  const [helpOpen, setHelpOpen] = useState(false);
  const toggleHelp = useCallback(() => setHelpOpen((open) => !open), []);
  useWorkspaceKeys({ toggleHelp });

  return (
    <RenderProbe id="page">
      <OpenAtFrame />
      <div className="grid gap-6 xl:grid-cols-[minmax(0,1fr)_23rem]">
        <div className="min-w-0 space-y-3">
          <OverlayToolbar />
          <StageView />
          <ScrubBar />
          <TransportBar helpOpen={helpOpen} onHelpOpenChange={setHelpOpen} extra={<ExportMenu />} />
          <AnalysisPanel />
        </div>
        <aside className="space-y-4">
          <RenderProbe id="readouts">
            <ReadoutsPanel />
          </RenderProbe>
          {/* Notes reach athletes and guardians with a published review, not from the workspace. */}
          {can(user.role, 'notes.read') ? (
            <RenderProbe id="notes">
              <NotesPanel />
            </RenderProbe>
          ) : null}
          {/* Chosen notes reach the athlete through a review; below the notes, so they stay in view. */}
          {can(user.role, 'reviews.write') ? <ReviewsPanel /> : null}
          <Notice tone="info" title="2D estimates, not medical advice">
            Angles come from one camera and depend on where it stood and how sure the pose model is of each
            joint. They are a coaching aid, not a medical or injury assessment: pain or injury goes to a
            licensed professional. Defer to certified coaching standards and local rules.
          </Notice>
        </aside>
        <div className="min-w-0 space-y-4 xl:col-span-2">
          <RenderProbe id="chart">
            <CurvesPanel />
          </RenderProbe>
          <TurnTable />
        </div>
      </div>
    </RenderProbe>
  );
}
