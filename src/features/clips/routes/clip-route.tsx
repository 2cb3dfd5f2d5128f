import { useParams } from 'react-router-dom';
import { PageHeader } from '@/components/ui/page-header';
import { QueryError } from '@/components/ui/query-error';
import { PageSpinner } from '@/components/ui/spinner';
import { useUser } from '@/lib/auth';
import { can } from '@/lib/permissions';
import { useClip } from '../api/get-clip';
import { AnalysisCaution } from '../components/analysis-caution';
import { ClipDetails } from '../components/clip-details';
import { ClipPlayer } from '../components/clip-player';

export function ClipRoute() {
  const { clipId = '' } = useParams();
  const user = useUser();
  const clip = useClip(clipId);

  if (clip.isPending) return <PageSpinner label="Loading the clip" />;
  if (clip.isError)
    return <QueryError error={clip.error} what="this clip" retry={() => void clip.refetch()} />;

  const data = clip.data.clip;
  return (
    <>
      <PageHeader
        title={data.originalName}
        subtitle={`${data.athletes.map((a) => a.name).join(', ') || 'No athlete tagged'} · ${
          data.view === 'front' ? 'front view' : 'side view'
        }`}
      />
      <div className="grid items-start gap-6 lg:grid-cols-[minmax(0,1fr)_20rem]">
        <div className="space-y-4">
          <ClipPlayer clip={data} onRenewUrl={() => clip.refetch()} />
          <AnalysisCaution />
        </div>
        <ClipDetails
          clip={data}
          linkAthletes={can(user.role, 'athletes.view')}
          linkSession={can(user.role, 'sessions.view')}
        />
      </div>
    </>
  );
}
