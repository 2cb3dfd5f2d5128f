import { Link, useParams } from 'react-router-dom';
import { Upload } from 'lucide-react';
import { ButtonLink } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';
import { QueryError } from '@/components/ui/query-error';
import { PageSpinner } from '@/components/ui/spinner';
import { paths } from '@/config/paths';
import { useAthlete } from '@/features/athletes/api/get-athlete';
import { AthleteProfile } from '@/features/athletes/components/athlete-profile';
import { ConsentCard } from '@/features/athletes/components/consent-card';
import { ConsentPanel } from '@/features/athletes/components/consent-panel';
import { GuardianList } from '@/features/athletes/components/guardian-list';
import { EraseAthleteButton } from '@/features/athletes/components/erase-athlete-button';
import { useClips } from '@/features/clips/api/get-clips';
import { ClipList } from '@/features/clips/components/clip-list';
import { FlagInbox } from '@/features/flags/components/flag-inbox';
import { SeasonPlanPanel } from '@/features/season-plan/components/season-plan-panel';
import { useUser } from '@/lib/auth';
import { can } from '@/lib/permissions';

export function AthletePage() {
  const { athleteId = '' } = useParams();
  const user = useUser();
  const athlete = useAthlete(athleteId);
  const clips = useClips({ athleteId });

  if (athlete.isPending) return <PageSpinner label="Loading the athlete" />;
  if (athlete.isError) {
    return <QueryError error={athlete.error} what="this athlete" retry={() => void athlete.refetch()} />;
  }

  const record = athlete.data.athlete;
  const canUpload =
    can(user.role, 'clips.upload') &&
    (record.consent.status === 'granted' || record.consent.status === 'not_required');
  return (
    <>
      <PageHeader
        back={
          <Link to={paths.athletes.href()} className="text-glacier-700 hover:underline">
            ← Athletes
          </Link>
        }
        title={`${record.firstName} ${record.lastName}`}
        subtitle={`${record.ageGroup.name} · born ${record.birthYear}`}
        actions={
          <div className="flex flex-wrap gap-2">
            {canUpload ? (
              <ButtonLink to={paths.upload.href()} icon={<Upload aria-hidden="true" className="h-4 w-4" />}>
                Upload clips
              </ButtonLink>
            ) : null}
            {can(user.role, 'athletes.erase') ? <EraseAthleteButton athlete={record} /> : null}
          </div>
        }
      />
      <div className="space-y-6">
        <ConsentPanel athlete={record} canRecord={can(user.role, 'consent.record')} />
        <div className="grid gap-6 md:grid-cols-2">
          <AthleteProfile athlete={record} />
          <GuardianList guardians={record.guardians} />
        </div>
        {can(user.role, 'consent.read') ? <ConsentCard athlete={record} user={user} /> : null}
        <section aria-labelledby="athlete-plan">
          <h2 id="athlete-plan" className="mb-3 text-base font-semibold text-granite-900">
            Season plan
          </h2>
          <SeasonPlanPanel athleteId={record.id} firstName={record.firstName} />
        </section>
        <section aria-labelledby="athlete-clips">
          <h2 id="athlete-clips" className="mb-3 text-base font-semibold text-granite-900">
            Clips
          </h2>
          {clips.isPending ? <PageSpinner label="Loading clips" /> : null}
          {clips.isError ? (
            <QueryError error={clips.error} what="clips" retry={() => void clips.refetch()} />
          ) : null}
          {clips.data ? (
            <ClipList
              clips={clips.data}
              emptyTitle={`No clips of ${record.firstName} yet`}
              emptyText={
                record.consent.status === 'missing'
                  ? 'Clips can be uploaded once a guardian’s consent is recorded.'
                  : record.consent.status === 'withdrawn'
                    ? `Consent is withdrawn: ${record.firstName}’s clips are hidden${user.role === 'head_coach' ? ' from everyone but you' : ''} until they are erased or consent is restored.`
                    : 'Upload clips from a training session and tag this athlete.'
              }
            />
          ) : null}
        </section>
        <section aria-labelledby="athlete-flags">
          <h2 id="athlete-flags" className="mb-1 text-base font-semibold text-granite-900">
            Flags of {record.firstName}
          </h2>
          <p className="mb-2 text-sm text-granite-600">
            Each habit outside the {record.ageGroup.name} band, once per turn, across all of{' '}
            {record.firstName}&apos;s analysed clips.
          </p>
          <FlagInbox
            filters={{ athleteId: record.id }}
            canReview={can(user.role, 'flags.review')}
            emptyText={`No analysed clip of ${record.firstName} has a value outside the ${record.ageGroup.name} bands.`}
          />
        </section>
      </div>
    </>
  );
}
