import { useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import type { ToleranceBandDto } from '@shared/schemas/tolerance.schema';
import { AGE_GROUPS, BAND_METRICS, type BandMetricKey } from '@shared/tolerance';
import { Card, PageHeader } from '@/components/ui/page-header';
import { Dialog } from '@/components/ui/dialog';
import { Notice } from '@/components/ui/notice';
import { QueryError } from '@/components/ui/query-error';
import { PageSpinner } from '@/components/ui/spinner';
import { useToast } from '@/components/ui/toast';
import { errorMessage } from '@/lib/api-client';
import { useUser } from '@/lib/auth';
import { cn } from '@/lib/format';
import { useChangeBand } from '../api/change-band';
import { useBands } from '../api/get-bands';
import { useBandHistory } from '../api/get-history';
import { BandForm } from '../components/band-form';
import { BandHistory } from '../components/band-history';
import { BandTable } from '../components/band-table';
import { JobProgress } from '../components/job-progress';

interface GroupTab {
  id: string;
  name: string;
}

/** The club's age groups in the usual order (U8 … U18, Masters), groups the club added after them. */
function groupsOf(bands: ToleranceBandDto[]): GroupTab[] {
  const groups = new Map(bands.map((b) => [b.ageGroupId, b.ageGroup]));
  const rank = (name: string) => {
    const i = (AGE_GROUPS as readonly string[]).indexOf(name);
    return i === -1 ? AGE_GROUPS.length : i;
  };
  return [...groups.entries()]
    .map(([id, name]) => ({ id, name }))
    .sort((a, b) => rank(a.name) - rank(b.name) || a.name.localeCompare(b.name));
}

export function TolerancesRoute() {
  const user = useUser();
  const toast = useToast();
  const [params, setParams] = useSearchParams();
  const bands = useBands();
  const change = useChangeBand();
  const [editing, setEditing] = useState<BandMetricKey | null>(null);
  const groups = groupsOf(bands.data?.bands ?? []);
  const own = groups.find((g) => user.coachedAgeGroupIds.includes(g.id));
  const selected = groups.find((g) => g.id === params.get('group')) ?? own ?? groups[0] ?? null;
  const history = useBandHistory(selected?.id ?? null);

  if (bands.isPending) return <PageSpinner label="Loading tolerance bands" />;
  if (bands.isError)
    return <QueryError error={bands.error} what="the tolerance bands" retry={() => void bands.refetch()} />;

  const editable = selected !== null && bands.data.editableAgeGroupIds.includes(selected.id);
  // The job this page's last change queued, or the club's newest one if another coach changed a band since.
  const job =
    [change.data?.job, bands.data.job]
      .filter((j): j is NonNullable<typeof j> => Boolean(j))
      .sort((a, b) => b.createdAt.localeCompare(a.createdAt))[0] ?? null;
  const shown = bands.data.bands.filter((b) => b.ageGroupId === selected?.id);
  const editingBand = editing ? (shown.find((b) => b.metric === editing) ?? null) : null;
  const save = (metric: BandMetricKey, input: Parameters<typeof change.mutateAsync>[0]['input']) =>
    change.mutateAsync(
      { ageGroupId: selected!.id, metric, input },
      {
        onSuccess: () => {
          setEditing(null);
          toast.success(
            `${selected!.name} ${BAND_METRICS[metric].label.toLowerCase()} ${input === 'reset' ? 'reset to the default' : 'saved'}; checking stored frames.`,
          );
        },
        onError: (error) => {
          if (input === 'reset') toast.error(errorMessage(error));
        },
      },
    );

  return (
    <>
      <PageHeader
        title="Tolerance bands"
        subtitle={
          editable
            ? 'The standard each age group is judged against. A value outside its band becomes a flag, one per habit and turn.'
            : 'The standard each age group is judged against. Only the head coach and the coaches of a group change its bands.'
        }
      />
      <div className="space-y-5">
        <JobProgress key={job?.id ?? 'none'} job={job} />
        <nav aria-label="Age groups">
          <ul className="flex flex-wrap gap-1.5">
            {groups.map((group) => (
              <li key={group.id}>
                <button
                  type="button"
                  aria-current={group.id === selected?.id ? 'page' : undefined}
                  onClick={() => setParams({ group: group.id }, { replace: true })}
                  className={cn(
                    'rounded-md border px-3 py-1.5 text-sm font-medium',
                    group.id === selected?.id
                      ? 'border-glacier-700 bg-glacier-700 text-white'
                      : 'border-granite-200 bg-white text-granite-800 hover:border-glacier-300',
                  )}
                >
                  {group.name}
                  {bands.data.editableAgeGroupIds.includes(group.id) && user.role === 'coach'
                    ? ' · yours'
                    : ''}
                </button>
              </li>
            ))}
          </ul>
        </nav>
        {selected ? (
          <BandTable
            ageGroupName={selected.name}
            bands={shown}
            editable={editable}
            busyMetric={
              change.isPending && change.variables?.input === 'reset' ? change.variables.metric : null
            }
            onEdit={(metric) => {
              change.reset();
              setEditing(metric);
            }}
            onReset={(metric) => void save(metric, 'reset').catch(() => undefined)}
          />
        ) : (
          <Notice tone="info" title="No age groups yet">
            The club has no age groups, so there are no bands to set.
          </Notice>
        )}
        <Notice tone="info" title="Common practice, not a medical standard">
          Bands marked “common practice” are coaching rules of thumb, not published norms. Set them to what
          your club teaches each age group; defer to certified coaching standards and local rules. Angles come
          from a single camera and are 2D estimates, not medical advice.
        </Notice>
        <Card title={`Changes${selected ? ` to ${selected.name}` : ''}`}>
          {history.isPending ? <PageSpinner label="Loading the history" /> : null}
          {history.isError ? <QueryError error={history.error} what="the history of changes" /> : null}
          {history.data ? <BandHistory changes={history.data.changes} /> : null}
        </Card>
      </div>
      <Dialog
        open={editing !== null && selected !== null}
        onClose={() => setEditing(null)}
        title={editing && selected ? `${BAND_METRICS[editing].label}, ${selected.name}` : 'Band'}
      >
        {editing && selected ? (
          <BandForm
            key={`${selected.id}-${editing}`}
            metric={editing}
            ageGroupName={selected.name}
            band={editingBand}
            busy={change.isPending}
            error={change.isError ? change.error : null}
            onSubmit={(input) => save(editing, input)}
            onCancel={() => setEditing(null)}
          />
        ) : null}
      </Dialog>
    </>
  );
}
