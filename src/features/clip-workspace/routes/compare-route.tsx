import { useEffect } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import type { ClipDto } from '@shared/schemas/clip.schema';
import { EmptyState } from '@/components/ui/empty-state';
import { SelectField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { QueryError } from '@/components/ui/query-error';
import { PageSpinner } from '@/components/ui/spinner';
import { paths } from '@/config/paths';
import { formatDay } from '@/lib/format';
import { useAthleteClips, useComparePlan } from '../api/compare-api';
import { useWorkspaceClip } from '../api/get-workspace-clip';
import { CompareView } from '../components/compare/compare-view';

/** `/compare?a=&b=`: a on the left (the baseline by default), b on the right. */
export function CompareRoute() {
  const [params] = useSearchParams();
  const a = params.get('a');
  const b = params.get('b');
  if (!a && !b) {
    return (
      <>
        <PageHeader title="Compare" />
        <EmptyState title="Choose two clips to compare">
          Open Compare from an athlete&apos;s season plan (the baseline with the latest clip) or from a clip,
          then choose the other side here.
        </EmptyState>
      </>
    );
  }
  if (!a || !b) return <CompleteThePair given={(a ?? b)!} givenSide={a ? 'a' : 'b'} />;
  return <ComparePair a={a} b={b} />;
}

/** One clip given (from a clip page): the other side is the athlete's baseline, or their latest other clip. */
function CompleteThePair({ given, givenSide }: { given: string; givenSide: 'a' | 'b' }) {
  const navigate = useNavigate();
  const clip = useWorkspaceClip(given);
  const athleteId = clip.data?.clip.athletes[0]?.id ?? null;
  const plan = useComparePlan(athleteId);
  const clips = useAthleteClips(athleteId);
  const baseline = plan.data?.baselineClipId ?? null;
  const others = (clips.data?.clips ?? []).filter((c) => c.id !== given && c.status === 'ready');
  const other = baseline && baseline !== given ? baseline : (others[0]?.id ?? null);
  const settled = !!clip.data && (!athleteId || (!plan.isPending && !clips.isPending));
  useEffect(() => {
    if (!settled || !other) return;
    const [left, right] = givenSide === 'a' || other === baseline ? [other, given] : [given, other];
    void navigate(paths.compare.href(left, right), { replace: true });
  }, [settled, other, given, givenSide, baseline, navigate]);
  if (clip.isError)
    return <QueryError error={clip.error} what="this clip" retry={() => void clip.refetch()} />;
  if (!settled || other) return <PageSpinner label="Finding the clip to compare with" />;
  return (
    <>
      <PageHeader title="Compare" />
      <EmptyState title="No other clip to compare with">
        {clip.data.clip.athletes.length === 0
          ? 'This clip has no athlete tagged, so there is nothing to pair it with.'
          : `There is no other clip of ${clip.data.clip.athletes[0].name} yet. Upload a later run and come back.`}
      </EmptyState>
    </>
  );
}

function ClipPicker({
  label,
  value,
  clips,
  onChange,
}: {
  label: string;
  value: string;
  clips: ClipDto[];
  onChange(id: string): void;
}) {
  return (
    <SelectField
      label={label}
      value={value}
      onChange={(event) => onChange(event.target.value)}
      className="min-w-64"
    >
      {clips.some((c) => c.id === value) ? null : <option value={value}>This clip</option>}
      {clips.map((c) => (
        <option key={c.id} value={c.id}>
          {c.originalName} · {c.view} · {formatDay(c.createdAt)}
        </option>
      ))}
    </SelectField>
  );
}

function ComparePair({ a, b }: { a: string; b: string }) {
  const navigate = useNavigate();
  const left = useWorkspaceClip(a);
  const right = useWorkspaceClip(b);
  const athleteId = left.data?.clip.athletes[0]?.id ?? right.data?.clip.athletes[0]?.id ?? null;
  const plan = useComparePlan(athleteId);
  const clips = useAthleteClips(athleteId);

  if (left.isPending || right.isPending) return <PageSpinner label="Loading both clips" />;
  if (left.isError)
    return <QueryError error={left.error} what="the left clip" retry={() => void left.refetch()} />;
  if (right.isError)
    return <QueryError error={right.error} what="the right clip" retry={() => void right.refetch()} />;
  const athlete = left.data.clip.athletes[0] ?? right.data.clip.athletes[0];
  const choices = (clips.data?.clips ?? []).filter((c) => c.status === 'ready');
  const baselineId = plan.data?.baselineClipId ?? null;

  return (
    <>
      <PageHeader
        title="Compare"
        back={
          athlete ? (
            <Link to={paths.athlete.href(athlete.id)} className="text-glacier-700 hover:underline">
              ← {athlete.name}
            </Link>
          ) : undefined
        }
        subtitle={
          baselineId === a
            ? 'The season’s baseline on the left, a later clip on the right'
            : 'Two clips side by side'
        }
      />
      {a === b ? (
        <Notice tone="info" title="The same clip on both sides">
          Choose another clip for one side to see what changed.
        </Notice>
      ) : null}
      <div className="mb-4 flex flex-wrap gap-3">
        <ClipPicker
          label="Left clip"
          value={a}
          clips={choices}
          onChange={(id) => void navigate(paths.compare.href(id, b))}
        />
        <ClipPicker
          label="Right clip"
          value={b}
          clips={choices}
          onChange={(id) => void navigate(paths.compare.href(a, id))}
        />
      </div>
      <CompareView
        key={`${a}:${b}`}
        left={left.data.clip}
        right={right.data.clip}
        focusPoints={plan.data?.focusPoints ?? []}
      />
    </>
  );
}
