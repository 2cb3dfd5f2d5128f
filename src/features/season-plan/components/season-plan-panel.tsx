import { useState, type DragEvent } from 'react';
import { ArrowDown, ArrowUp, Columns2, Pencil, Plus, Trash2 } from 'lucide-react';
import { describeTarget, focusLabel } from '@shared/plan';
import {
  FOCUS_STATUS_LABELS,
  type FocusPointDto,
  type FocusStatus,
  type SeasonPlanResponse,
} from '@shared/schemas/plan.schema';
import { BAND_METRICS } from '@shared/tolerance';
import { Badge } from '@/components/ui/badge';
import { Button, ButtonLink } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { EmptyState } from '@/components/ui/empty-state';
import { SelectField } from '@/components/ui/field';
import { QueryError } from '@/components/ui/query-error';
import { Spinner } from '@/components/ui/spinner';
import { useToast } from '@/components/ui/toast';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api-client';
import { useUser } from '@/lib/auth';
import { formatDay } from '@/lib/format';
import { can } from '@/lib/permissions';
import {
  useAddFocusPoint,
  useDeleteFocusPoint,
  usePlan,
  useReorderFocusPoints,
  useSetBaseline,
  useUpdateFocusPoint,
} from '../api/plan-api';
import { FocusPointForm } from './focus-point-form';
import { ProgressChart } from './progress-chart';
import { SeasonClips } from './season-clips';
import { SeasonForm } from './season-form';

const STATUS_TONES: Record<FocusStatus, 'neutral' | 'info' | 'warn' | 'good'> = {
  planned: 'neutral',
  working: 'info',
  improving: 'warn',
  reached: 'good',
};

/** "Knee separation at the apex, target 1.00 to 1.30" for a metric-tied point. */
function measuredBy(point: FocusPointDto): string | null {
  if (!point.metric) return null;
  const info = BAND_METRICS[point.metric];
  return `${focusLabel(point.metric, point.phase)}, target ${describeTarget({ min: point.targetMin, max: point.targetMax, direction: point.direction }, info)}`;
}

/** The clip pair Compare opens by default: the baseline and the latest other clip of the season. */
export function defaultComparePair(plan: SeasonPlanResponse): [string, string] | null {
  const analysed = plan.clips.filter((c) => c.status === 'ready');
  const baseline = plan.baselineClipId ?? analysed[0]?.id;
  const latest = [...analysed].reverse().find((c) => c.id !== baseline);
  return baseline && latest ? [baseline, latest.id] : null;
}

/** Moves one id of a list by `delta` places. */
function moved(ids: string[], id: string, delta: number): string[] {
  const from = ids.indexOf(id);
  const to = Math.min(ids.length - 1, Math.max(0, from + delta));
  const next = [...ids];
  next.splice(to, 0, ...next.splice(from, 1));
  return next;
}

interface SeasonPlanPanelProps {
  athleteId: string;
  firstName: string;
  /** The athlete reading their own plan: "you" instead of their name. */
  self?: boolean;
  /** The season's clips with their baseline controls; off where the page lists the clips itself. */
  listClips?: boolean;
}

/** An athlete's season plan: ranked focus points with their measured path, the baseline and the season's clips. */
export function SeasonPlanPanel({
  athleteId,
  firstName,
  self = false,
  listClips = true,
}: SeasonPlanPanelProps) {
  const who = self ? 'you' : firstName;
  const user = useUser();
  const toast = useToast();
  const [seasonId, setSeasonId] = useState<string | undefined>();
  const plan = usePlan(athleteId, seasonId);
  const add = useAddFocusPoint(athleteId);
  const update = useUpdateFocusPoint();
  const remove = useDeleteFocusPoint();
  const reorder = useReorderFocusPoints(athleteId);
  const baseline = useSetBaseline(athleteId);
  const [editing, setEditing] = useState<FocusPointDto | 'new' | null>(null);
  const [dragged, setDragged] = useState<string | null>(null);

  if (plan.isPending) return <Spinner label="Loading the season plan" />;
  if (plan.isError)
    return <QueryError error={plan.error} what="the season plan" retry={() => void plan.refetch()} />;
  const data = plan.data;
  if (!data.season) {
    return (
      <EmptyState title="No season yet">
        {can(user.role, 'seasons.create') ? (
          <div className="mt-3 space-y-3 text-left">
            <p>Add the club&apos;s season; clips then belong to it by their session date.</p>
            <SeasonForm />
          </div>
        ) : (
          'The head coach adds the club’s season; the season plan starts then.'
        )}
      </EmptyState>
    );
  }
  const season = data.season;
  const ids = data.focusPoints.map((p) => p.id);
  const pair = defaultComparePair(data);
  const progressOf = (id: string) => data.progress.find((p) => p.focusPointId === id)?.points ?? [];
  const saveOrder = (next: string[]) =>
    reorder
      .mutateAsync({ seasonId: season.id, ids: next })
      .catch((error: unknown) => toast.error(`The new order was not saved: ${errorMessage(error)}`));
  const onDrop = (event: DragEvent, targetId: string) => {
    event.preventDefault();
    if (!dragged || dragged === targetId) return;
    void saveOrder(moved(ids, dragged, ids.indexOf(targetId) - ids.indexOf(dragged)));
    setDragged(null);
  };

  return (
    <div className="space-y-5">
      <div className="flex flex-wrap items-end justify-between gap-3">
        {data.seasons.length > 1 ? (
          <SelectField
            label="Season"
            value={season.id}
            onChange={(event) => setSeasonId(event.target.value)}
            className="w-48"
          >
            {data.seasons.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}
              </option>
            ))}
          </SelectField>
        ) : (
          <p className="text-sm text-granite-600">
            Season {season.name}, {formatDay(season.startsOn)} to {formatDay(season.endsOn)}
          </p>
        )}
        <div className="flex flex-wrap gap-2">
          {pair ? (
            <ButtonLink
              to={paths.compare.href(pair[0], pair[1])}
              variant="secondary"
              icon={<Columns2 aria-hidden="true" className="h-4 w-4" />}
            >
              {data.baselineClipId ? 'Compare baseline with latest' : 'Compare first with latest'}
            </ButtonLink>
          ) : null}
          {data.canEdit ? (
            <Button icon={<Plus aria-hidden="true" className="h-4 w-4" />} onClick={() => setEditing('new')}>
              Add focus point
            </Button>
          ) : null}
        </div>
      </div>

      {data.focusPoints.length === 0 ? (
        <EmptyState title={`No focus points for ${who} in ${season.name}`}>
          {data.canEdit
            ? 'Add the few things to work on this season, each tied to a measurement or in words.'
            : `${self ? 'Your' : `${firstName}'s`} coach has not written the season plan yet.`}
        </EmptyState>
      ) : (
        <ol className="space-y-3" aria-label={`Season plan of ${who}`}>
          {data.focusPoints.map((point, index) => (
            <li
              key={point.id}
              aria-label={point.title}
              draggable={data.canEdit}
              onDragStart={() => setDragged(point.id)}
              onDragOver={(event) => event.preventDefault()}
              onDrop={(event) => onDrop(event, point.id)}
              className="rounded-lg border border-granite-200 bg-white p-4 shadow-sm"
            >
              <div className="flex flex-wrap items-start justify-between gap-3">
                <div className="min-w-0 space-y-1">
                  <h3 className="flex flex-wrap items-center gap-2 font-semibold text-granite-900">
                    <span className="font-mono text-sm text-granite-500">{index + 1}.</span>
                    {point.title}
                    <Badge tone={STATUS_TONES[point.status]}>{FOCUS_STATUS_LABELS[point.status]}</Badge>
                  </h3>
                  <p className="text-sm text-granite-700">{measuredBy(point) ?? 'In words: not measured'}</p>
                  {point.cue ? <p className="text-sm italic text-granite-700">“{point.cue}”</p> : null}
                </div>
                {data.canEdit ? (
                  <div className="flex gap-1">
                    <Button
                      size="sm"
                      variant="quiet"
                      aria-label={`Move ${point.title} up`}
                      disabled={index === 0 || reorder.isPending}
                      onClick={() => void saveOrder(moved(ids, point.id, -1))}
                      icon={<ArrowUp aria-hidden="true" className="h-4 w-4" />}
                    />
                    <Button
                      size="sm"
                      variant="quiet"
                      aria-label={`Move ${point.title} down`}
                      disabled={index === ids.length - 1 || reorder.isPending}
                      onClick={() => void saveOrder(moved(ids, point.id, 1))}
                      icon={<ArrowDown aria-hidden="true" className="h-4 w-4" />}
                    />
                    <Button
                      size="sm"
                      variant="quiet"
                      aria-label={`Edit ${point.title}`}
                      onClick={() => setEditing(point)}
                      icon={<Pencil aria-hidden="true" className="h-4 w-4" />}
                    />
                    <Button
                      size="sm"
                      variant="quiet"
                      aria-label={`Remove ${point.title}`}
                      onClick={() => {
                        if (window.confirm(`Remove “${point.title}” from the season plan?`))
                          remove
                            .mutateAsync(point.id)
                            .catch((error: unknown) => toast.error(`Not removed: ${errorMessage(error)}`));
                      }}
                      icon={<Trash2 aria-hidden="true" className="h-4 w-4" />}
                    />
                  </div>
                ) : null}
              </div>
              {point.metric ? (
                <div className="mt-3">
                  <ProgressChart point={point} values={progressOf(point.id)} />
                </div>
              ) : null}
            </li>
          ))}
        </ol>
      )}

      {listClips ? (
        <SeasonClips
          plan={data}
          who={who}
          busy={baseline.isPending}
          onMarkBaseline={(clipId) =>
            baseline
              .mutateAsync({ seasonId: season.id, clipId })
              .then(() => toast.success(clipId ? 'Baseline marked' : 'Baseline cleared'))
              .catch((error: unknown) => toast.error(`The baseline was not changed: ${errorMessage(error)}`))
          }
        />
      ) : null}

      <Dialog
        open={editing !== null}
        onClose={() => setEditing(null)}
        title={editing === 'new' ? 'New focus point' : 'Edit focus point'}
      >
        {editing !== null ? (
          <FocusPointForm
            seasonId={season.id}
            point={editing === 'new' ? null : editing}
            busy={add.isPending || update.isPending}
            error={editing === 'new' ? add.error : update.error}
            onCancel={() => setEditing(null)}
            onSubmit={async (input) => {
              if (editing === 'new') await add.mutateAsync(input);
              else await update.mutateAsync({ id: editing.id, input });
              setEditing(null);
            }}
          />
        ) : null}
      </Dialog>
      <p className="text-xs text-granite-500">
        {data.canEdit ? 'Reorder with the arrow buttons (keyboard) or by dragging a card. ' : ''}Values are 2D
        estimates from one camera: a coaching aid, not a medical assessment.
      </p>
    </div>
  );
}
