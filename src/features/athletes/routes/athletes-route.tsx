import { useEffect, useState } from 'react';
import { useNavigate, useSearchParams } from 'react-router-dom';
import { UserPlus } from 'lucide-react';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { QueryError } from '@/components/ui/query-error';
import { PageSpinner } from '@/components/ui/spinner';
import { useToast } from '@/components/ui/toast';
import { paths } from '@/config/paths';
import { useUser } from '@/lib/auth';
import { can } from '@/lib/permissions';
import { useDebouncedValue } from '@/lib/use-debounced-value';
import { useAgeGroups } from '../api/get-age-groups';
import { useAthletes } from '../api/get-athletes';
import { AthleteFilters } from '../components/athlete-filters';
import { AthletesTable } from '../components/athletes-table';
import { CreateAthleteForm } from '../components/create-athlete-form';

export function AthletesRoute() {
  const user = useUser();
  const toast = useToast();
  const navigate = useNavigate();
  const [params, setParams] = useSearchParams();
  const [searchText, setSearchText] = useState(params.get('q') ?? '');
  const search = useDebouncedValue(searchText.trim(), 300);
  const ageGroupId = params.get('group') ?? '';
  const [creating, setCreating] = useState(false);

  // The filters live in the URL so a filtered list can be bookmarked and survives going back.
  useEffect(() => {
    setParams(
      (prev) => {
        const next = new URLSearchParams(prev);
        if (search) next.set('q', search);
        else next.delete('q');
        return next;
      },
      { replace: true },
    );
  }, [search, setParams]);

  const ageGroups = useAgeGroups();
  const athletes = useAthletes({ search: search || undefined, ageGroupId: ageGroupId || undefined });
  const canCreate = can(user.role, 'athletes.create');
  // A coach sees and adds athletes only in the groups they coach; the server applies the same rule.
  const ownGroups = (ageGroups.data ?? []).filter(
    (group) => user.role !== 'coach' || user.coachedAgeGroupIds.includes(group.id),
  );
  const filtered = Boolean(search || ageGroupId);

  return (
    <>
      <PageHeader
        title="Athletes"
        subtitle={
          user.role === 'coach'
            ? 'Athletes of the age groups you coach.'
            : user.role === 'analyst'
              ? 'All athletes of the club, read-only.'
              : 'All athletes of the club.'
        }
        actions={
          canCreate ? (
            <Button
              icon={<UserPlus aria-hidden="true" className="h-4 w-4" />}
              onClick={() => setCreating(true)}
            >
              Add athlete
            </Button>
          ) : null
        }
      />
      <AthleteFilters
        search={searchText}
        onSearchChange={setSearchText}
        ageGroupId={ageGroupId}
        onAgeGroupChange={(value) =>
          setParams(
            (prev) => {
              const next = new URLSearchParams(prev);
              if (value) next.set('group', value);
              else next.delete('group');
              return next;
            },
            { replace: true },
          )
        }
        ageGroups={ownGroups}
      />
      {athletes.isPending ? <PageSpinner label="Loading athletes" /> : null}
      {athletes.isError ? (
        <QueryError error={athletes.error} what="athletes" retry={() => void athletes.refetch()} />
      ) : null}
      {athletes.data ? (
        athletes.data.athletes.length === 0 ? (
          <EmptyState title={filtered ? 'No athlete matches' : 'No athletes yet'}>
            {filtered
              ? 'Try another name or pick "All groups".'
              : canCreate
                ? 'Add the athletes of your groups to start tagging clips.'
                : 'Athletes appear here once a coach adds them.'}
          </EmptyState>
        ) : (
          <AthletesTable athletes={athletes.data.athletes} />
        )
      ) : null}
      {canCreate ? (
        <Dialog open={creating} onClose={() => setCreating(false)} title="Add athlete">
          {ownGroups.length === 0 ? (
            <p className="text-sm text-granite-600">
              You do not coach any age group yet. Ask your head coach to assign you one.
            </p>
          ) : (
            <CreateAthleteForm
              ageGroups={ownGroups}
              onCancel={() => setCreating(false)}
              onCreated={(athlete) => {
                setCreating(false);
                toast.success(`${athlete.firstName} ${athlete.lastName} added.`);
                navigate(paths.athlete.href(athlete.id));
              }}
            />
          )}
        </Dialog>
      ) : null}
    </>
  );
}
