import { useMemo } from 'react';
import { Card, PageHeader } from '@/components/ui/page-header';
import { QueryError } from '@/components/ui/query-error';
import { PageSpinner } from '@/components/ui/spinner';
import { useAgeGroups } from '@/features/athletes/api/get-age-groups';
import { useAthletes } from '@/features/athletes/api/get-athletes';
import { useMe } from '@/features/auth/api/get-me';
import { useMembers } from '@/features/club/api/get-members';
import { InviteForm } from '@/features/club/components/invite-form';
import { MemberList } from '@/features/club/components/member-list';
import { PrivacySettingsCard } from '@/features/club/components/privacy-settings';

export function ClubPage() {
  const me = useMe();
  const members = useMembers();
  const athletes = useAthletes();
  const ageGroups = useAgeGroups();

  const athleteOptions = useMemo(
    () =>
      (athletes.data?.athletes ?? [])
        .map((a) => ({ id: a.id, label: `${a.firstName} ${a.lastName} (${a.ageGroup.name})` }))
        .sort((a, b) => a.label.localeCompare(b.label)),
    [athletes.data],
  );
  const groupOptions = useMemo(
    () => (ageGroups.data ?? []).map((g) => ({ id: g.id, label: g.name })),
    [ageGroups.data],
  );

  return (
    <>
      <PageHeader title="Club" subtitle={me.data ? me.data.club.name : undefined} />
      <div className="grid items-start gap-6 lg:grid-cols-[minmax(0,1fr)_24rem]">
        <Card title="Members">
          {members.isPending ? <PageSpinner label="Loading members" /> : null}
          {members.isError ? (
            <QueryError error={members.error} what="the member list" retry={() => void members.refetch()} />
          ) : null}
          {members.data ? <MemberList data={members.data} /> : null}
        </Card>
        <Card title="Invite someone">
          <p className="mb-4 text-sm text-granite-600">
            They get an e-mail with a link to set their name and password. Athletes and guardians are linked
            to an athlete record; coaches to the age groups they coach.
          </p>
          <InviteForm athletes={athleteOptions} ageGroups={groupOptions} />
        </Card>
      </div>
      <div className="mt-6">
        <PrivacySettingsCard />
      </div>
    </>
  );
}
