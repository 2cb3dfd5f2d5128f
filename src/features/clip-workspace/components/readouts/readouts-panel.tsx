import { METRIC_DEFINITIONS, METRIC_KEYS, type MetricDefinition } from '@shared/metrics';
import { POSE_MODEL_INFO } from '@shared/pose/pose-models';
import { POSE_MODELS, type PoseModelName } from '@shared/keypoints';
import { useEffect, useRef } from 'react';
import { useSearchParams } from 'react-router-dom';
import { AthletePickControl } from './athlete-pick-control';
import { FacingControl } from './facing-control';
import { Spinner } from '@/components/ui/spinner';
import { useUser } from '@/lib/auth';
import { readsBandsAsTarget } from '@/lib/permissions';
import { cn } from '@/lib/format';
import { clipExtras } from '../../api/clip-contract';
import {
  checkMetricBands,
  describeReason,
  formatBandRange,
  formatMetricValue,
} from '../../lib/metric-format';
import {
  useAnalysis,
  useCurrentPose,
  useFramePoseState,
  type PoseFrameResult,
  type PoseStatus,
} from '../stage/analysis-context';
import { useAnnotations, useFrameHasOwnLine } from '../stage/annotations-context';
import { useStage } from '../stage/stage-context';

const MODEL_SHORT: Record<PoseModelName, string> = {
  lightning: 'Lightning (fast)',
  thunder: 'Thunder (accurate)',
  blazepose: 'BlazePose (feet)',
};

const ORIGIN_TEXT: Record<PoseFrameResult['origin'], string> = {
  live: 'detected on this frame',
  stored: 'from the stored analysis',
  corrected: 'corrected by hand',
};

function StatusLine({ pose, status }: { pose: PoseFrameResult | null; status: PoseStatus }) {
  const { canEdit } = useStage();
  if (status.state === 'detecting') {
    return (
      <p className="flex items-center gap-2 text-xs text-granite-600">
        <Spinner size="sm" label="" /> Finding the skier in frame {status.frameIndex}…
      </p>
    );
  }
  if (status.state === 'error') {
    return (
      <p role="alert" className="text-xs text-alarm-600">
        Frame {status.frameIndex}: {status.message}
      </p>
    );
  }
  if (!pose) return <p className="text-xs text-granite-600">Pause or step to measure the frame on screen.</p>;
  const read = pose.origin === 'live' ? pose.liveRead : undefined;
  const lost = read && read.how !== 'whole-frame' ? read.lost : null;
  return (
    <div className="space-y-0.5 text-xs text-granite-600" data-live-read={read?.how}>
      <p>
        Frame <span className="font-mono tabular-nums">{pose.frameIndex}</span>, {ORIGIN_TEXT[pose.origin]}
        {read?.how === 'pick' ? ' at the athlete you picked' : null}
        {read?.how === 'followed' ? ` around the athlete as found in frame ${read.fromFrame}` : null}
        {pose.keypoints.length === 0 ? `: ${lost ?? 'no skier found'}` : null}
      </p>
      {read?.how === 'whole-frame' ? (
        <p className="text-signal-700">
          Read in the whole picture, so another person may be measured: no frame near this one is read yet.
          Step here from the picked frame ({read.pickFrame}){canEdit ? ' or analyse the whole clip' : ''} to
          follow the athlete.
        </p>
      ) : null}
      {lost ? (
        <p>Step back to a frame where the athlete is found{canEdit ? ', or pick them again' : ''}.</p>
      ) : null}
    </div>
  );
}

/** Which snow line the tilts and leans are measured against on this frame. */
function LineInForce() {
  const { referenceLine } = useAnnotations();
  const text = useFrameHasOwnLine()
    ? 'this frame’s own snow line'
    : referenceLine
      ? 'the clip’s snow line'
      : 'the image level (no snow line set)';
  return <p className="text-xs text-granite-400">Tilts and leans against {text}</p>;
}

interface MetricRowProps {
  definition: MetricDefinition;
  pose: PoseFrameResult | null;
  /** Athletes and guardians read bands as their target range, not as alarms. */
  forAthlete: boolean;
  /** The metric a flag opened the clip for: kept in view and marked. */
  focused: boolean;
}

function MetricRow({ definition, pose, forAthlete, focused }: MetricRowProps) {
  const { bands } = useAnalysis();
  const { clip } = useStage();
  const value = pose?.metrics[definition.key] ?? null;
  const confidence = pose?.confidence[definition.key];
  const check = value === null ? null : checkMetricBands(definition.key, value, bands);
  const outside = check?.state === 'outside' && !forAthlete;
  const ageGroup = clipExtras(clip).ageGroup?.name;
  const row = useRef<HTMLLIElement>(null);
  useEffect(() => {
    if (focused) row.current?.scrollIntoView({ block: 'nearest' });
  }, [focused]);

  return (
    <li
      ref={row}
      className={cn(
        'grid grid-cols-[1fr_auto] gap-x-3 gap-y-0.5 border-b border-granite-100 px-3 py-2 last:border-b-0',
        outside && 'bg-alarm-500/5',
        focused && 'ring-2 ring-glacier-500 ring-inset',
      )}
      data-metric={definition.key}
      aria-current={focused ? 'true' : undefined}
    >
      <span className="text-sm text-granite-800" title={definition.description}>
        {definition.label}
      </span>
      <span
        className={cn(
          'text-right font-mono text-sm tabular-nums',
          value === null ? 'text-granite-400' : outside ? 'font-semibold text-alarm-600' : 'text-granite-900',
        )}
      >
        {value === null ? '—' : formatMetricValue(value, definition.unit)}
        {outside ? (
          <span className="ml-1" aria-label="outside band" title="Outside the age-group band">
            ▲
          </span>
        ) : null}
      </span>
      <span className="col-span-2 text-xs text-granite-400">
        {value === null ? (
          pose ? (
            <>No value: {describeReason(pose.reasons[definition.key])}</>
          ) : (
            'Not measured yet'
          )
        ) : (
          <>
            {confidence !== undefined ? (
              <span className={cn(confidence < 0.5 && 'text-signal-700')}>
                points {Math.round(confidence * 100)}% sure
              </span>
            ) : null}
            {check && check.state !== 'none' && forAthlete ? (
              <span className="ml-2 text-glacier-700">
                target range for {ageGroup ?? 'the age group'} {formatBandRange(check.band, definition.unit)}
              </span>
            ) : null}
            {check && check.state !== 'none' && !forAthlete ? (
              <span className={cn('ml-2', outside ? 'text-alarm-600' : 'text-spruce-600')}>
                {outside ? 'outside' : 'within'} {ageGroup ?? 'age-group'} band{' '}
                {formatBandRange(check.band, definition.unit)}
                {check.band.source === 'common practice' ? ' (common practice)' : ''}
              </span>
            ) : null}
          </>
        )}
      </span>
    </li>
  );
}

/** Every metric of the clip's view for the frame on screen, with units, confidence and band marks. */
export function ReadoutsPanel() {
  const { view } = useStage().clip;
  const { role } = useUser();
  const forAthlete = readsBandsAsTarget(role);
  const [params] = useSearchParams();
  const focusedMetric = params.get('metric');
  const { model, setModel } = useAnalysis();
  const currentPose = useCurrentPose();
  const { poseStatus } = useFramePoseState();
  const definitions = METRIC_KEYS.map((key) => METRIC_DEFINITIONS[key]).filter((d) => d.views.includes(view));

  return (
    <section aria-label="Readouts" className="rounded-lg border border-granite-200 bg-white">
      <header className="space-y-2 border-b border-granite-200 px-3 py-2.5">
        <div className="flex items-center justify-between gap-2">
          <h2 className="text-sm font-semibold text-granite-900">Readouts</h2>
          <label className="flex items-center gap-1.5 text-xs text-granite-600">
            Pose model
            <select
              value={model}
              onChange={(event) => setModel(event.target.value as PoseModelName)}
              className="rounded border border-granite-200 bg-white px-1.5 py-1 text-xs text-granite-800"
            >
              {POSE_MODELS.map((name) => (
                <option key={name} value={name} title={POSE_MODEL_INFO[name].label}>
                  {MODEL_SHORT[name]}
                </option>
              ))}
            </select>
          </label>
        </div>
        <StatusLine pose={currentPose} status={poseStatus} />
        <LineInForce />
        <FacingControl />
        <AthletePickControl />
      </header>
      <ul>
        {definitions.map((definition) => (
          <MetricRow
            key={definition.key}
            definition={definition}
            pose={currentPose}
            forAthlete={forAthlete}
            focused={definition.key === focusedMetric}
          />
        ))}
      </ul>
    </section>
  );
}
