import { Link, useParams } from 'react-router-dom';
import { Upload } from 'lucide-react';
import { ButtonLink } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';
import { QueryError } from '@/components/ui/query-error';
import { PageSpinner } from '@/components/ui/spinner';
import { paths } from '@/config/paths';
import { useClips } from '@/features/clips/api/get-clips';
import { ClipList } from '@/features/clips/components/clip-list';
import { useSession } from '@/features/sessions/api/get-session';
import { disciplineLabel } from '@/features/sessions/components/session-labels';
import { SessionSummary } from '@/features/sessions/components/session-summary';
import { useUser } from '@/lib/auth';
import { formatDay } from '@/lib/format';
import { can } from '@/lib/permissions';

export function SessionPage() {
  const { sessionId = '' } = useParams();
  const user = useUser();
  const session = useSession(sessionId);
  const clips = useClips({ sessionId });
  const back = (
    <Link to={paths.sessions.href()} className="text-glacier-700 hover:underline">
      ← Sessions
    </Link>
  );

  if (session.isPending) return <PageSpinner label="Loading the session" />;
  if (session.isError) {
    return <QueryError error={session.error} what="this session" retry={() => void session.refetch()} />;
  }
  const data = session.data;
  return (
    <>
      <PageHeader
        back={back}
        title={formatDay(data.date)}
        subtitle={`${disciplineLabel(data.discipline)} at ${data.venue}`}
        actions={
          can(user.role, 'clips.upload') ? (
            <ButtonLink
              to={paths.upload.href(data.id)}
              icon={<Upload aria-hidden="true" className="h-4 w-4" />}
            >
              Upload clips
            </ButtonLink>
          ) : null
        }
      />
      <div className="grid items-start gap-6 lg:grid-cols-[20rem_minmax(0,1fr)]">
        <SessionSummary session={data} />
        <section aria-labelledby="session-clips">
          <h2 id="session-clips" className="mb-3 text-base font-semibold text-granite-900">
            Clips
          </h2>
          {clips.isPending ? <PageSpinner label="Loading clips" /> : null}
          {clips.isError ? (
            <QueryError error={clips.error} what="clips" retry={() => void clips.refetch()} />
          ) : null}
          {clips.data ? (
            <ClipList clips={clips.data} emptyText="No clip was uploaded to this session yet." />
          ) : null}
        </section>
      </div>
    </>
  );
}
