import { useMemo, useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { useQueryClient } from '@tanstack/react-query';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { QueryError } from '@/components/ui/query-error';
import { PageSpinner } from '@/components/ui/spinner';
import { paths } from '@/config/paths';
import { athleteKeys } from '@/features/athletes/api/athlete-keys';
import { useAthletes } from '@/features/athletes/api/get-athletes';
import { clipKeys } from '@/features/clips/api/clip-keys';
import { sessionKeys } from '@/features/sessions/api/session-keys';
import { useSessions } from '@/features/sessions/api/get-sessions';
import { FilmingCaution } from '@/features/sessions/components/filming-caution';
import { disciplineLabel } from '@/features/sessions/components/session-labels';
import type { AthleteOption } from '@/features/upload/components/athlete-picker';
import { UploadWorkspace } from '@/features/upload/components/upload-workspace';
import {
  BackgroundClipStatus,
  BackgroundQueueControls,
} from '@/features/clip-workspace/background/background-status';
import { backgroundAnalysis } from '@/features/clip-workspace/background/background-analysis';
import { formatDay } from '@/lib/format';

export function UploadPage() {
  const queryClient = useQueryClient();
  const [params, setParams] = useSearchParams();
  const sessions = useSessions();
  const athletes = useAthletes();

  const sessionOptions = useMemo(
    () =>
      (sessions.data ?? []).map((s) => ({
        id: s.id,
        label: `${formatDay(s.date)} · ${s.venue} · ${disciplineLabel(s.discipline)}`,
      })),
    [sessions.data],
  );
  const athleteOptions = useMemo<AthleteOption[]>(
    () =>
      [...(athletes.data?.athletes ?? [])]
        .sort((a, b) => a.lastName.localeCompare(b.lastName) || a.firstName.localeCompare(b.firstName))
        .map((a) => ({
          id: a.id,
          name: `${a.firstName} ${a.lastName}`,
          blockedReason: a.consent.status === 'missing' ? 'consent missing' : null,
        })),
    [athletes.data],
  );

  const [analyseHere, setAnalyseHere] = useAnalyseHere();
  const requested = params.get('session');
  const sessionId = requested ?? sessions.data?.[0]?.id ?? '';

  // Counts on athlete, session and clip lists change with every upload.
  const onUploaded = () =>
    Promise.all([
      queryClient.invalidateQueries({ queryKey: clipKeys.all }),
      queryClient.invalidateQueries({ queryKey: sessionKeys.all }),
      queryClient.invalidateQueries({ queryKey: athleteKeys.lists() }),
    ]);

  return (
    <>
      <PageHeader
        title="Upload clips"
        subtitle="Add the clips of a training day; tag each with its athletes and view."
      />
      <FilmingCaution />
      <div className="mt-6">
        {sessions.isPending || athletes.isPending ? (
          <PageSpinner label="Loading sessions and athletes" />
        ) : null}
        {sessions.isError ? (
          <QueryError error={sessions.error} what="sessions" retry={() => void sessions.refetch()} />
        ) : null}
        {athletes.isError ? (
          <QueryError error={athletes.error} what="athletes" retry={() => void athletes.refetch()} />
        ) : null}
        {sessions.data && athletes.data ? (
          sessions.data.length === 0 ? (
            <EmptyState title="Create a session first">
              Clips belong to a training session.{' '}
              <Link className="font-medium text-glacier-700 underline" to={paths.sessions.href()}>
                Create one on the Sessions page
              </Link>
              , then come back.
            </EmptyState>
          ) : (
            <UploadWorkspace
              sessions={sessionOptions}
              sessionId={sessionId}
              onSessionChange={(id) => setParams(id ? { session: id } : {}, { replace: true })}
              athletes={athleteOptions}
              onUploaded={onUploaded}
              onClipUploaded={
                analyseHere ? (clipId, file) => backgroundAnalysis.add(clipId, file) : undefined
              }
              renderClipStatus={(clipId) => <BackgroundClipStatus clipId={clipId} />}
              analysisControls={
                <div className="space-y-3">
                  <label className="flex items-start gap-2 text-sm text-granite-800">
                    <input
                      type="checkbox"
                      className="mt-0.5"
                      checked={analyseHere}
                      onChange={(event) => setAnalyseHere(event.target.checked)}
                    />
                    <span>
                      Analyse the clips on this computer as they upload, from the files here (quicker; the
                      server analyses whatever this computer leaves, also when the tab is closed).
                    </span>
                  </label>
                  <BackgroundQueueControls />
                </div>
              }
            />
          )
        ) : null}
      </div>
    </>
  );
}

const ANALYSE_HERE_KEY = 'stanceline.upload.analyse-here';

/** Whether uploads are analysed on this computer too; remembered per browser, on unless turned off. */
function useAnalyseHere(): [boolean, (value: boolean) => void] {
  const [value, setValue] = useState(() => {
    try {
      return window.localStorage.getItem(ANALYSE_HERE_KEY) !== 'off';
    } catch {
      return true;
    }
  });
  return [
    value,
    (next) => {
      setValue(next);
      try {
        window.localStorage.setItem(ANALYSE_HERE_KEY, next ? 'on' : 'off');
      } catch {
        // Private windows may refuse storage; the choice then lasts for this page.
      }
    },
  ];
}
