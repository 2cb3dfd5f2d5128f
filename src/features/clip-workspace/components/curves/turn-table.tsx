import { useMemo } from 'react';
import { Flag } from 'lucide-react';
import { useUser } from '@/lib/auth';
import { readsBandsAsTarget } from '@/lib/permissions';
import type { View } from '@shared/keypoints';
import { METRIC_DEFINITIONS, type MetricKey } from '@shared/metrics';
import type { Turn } from '@shared/series';
import { cn } from '@/lib/format';
import { useClipFrames, type ClipFlagDto } from '../../api/get-clip-frames';
import { formatMetricValue } from '../../lib/metric-format';
import { useAnalysis } from '../stage/analysis-context';
import { useStage, useStageClock } from '../stage/stage-context';

/** Apex columns per view: what a coach compares turn to turn. */
const APEX_METRICS: Record<View, MetricKey[]> = {
  front: ['inclination', 'angulation', 'shoulderTilt', 'kneeSeparationRatio', 'stanceWidthRatio'],
  side: ['kneeFlexionLeft', 'kneeFlexionRight', 'shinTorsoMismatch'],
};

const unitShort = (key: MetricKey) =>
  METRIC_DEFINITIONS[key].unit === 'deg' ? '(°)' : `(${METRIC_DEFINITIONS[key].unit})`;

/** Fixed decimals without a "-0.00" for values that round to zero. */
export function signedFixed(value: number, digits: number): string {
  const text = value.toFixed(digits);
  return Number(text) === 0 ? (0).toFixed(digits) : text;
}

/** The flags of a turn: one per habit outside its band somewhere in the turn (and its per-turn values). */
export function flagsInTurn(turn: Turn, flags: readonly ClipFlagDto[]): ClipFlagDto[] {
  return flags.filter((f) => f.turnIndex === turn.index);
}

export function TurnTable() {
  const { clip, seekToFrame } = useStage();
  const { role } = useUser();
  // Athletes and guardians read the same marks as their target range, not as alarms.
  const forAthlete = readsBandsAsTarget(role);
  const markClass = forAthlete ? 'text-glacier-700' : 'text-alarm-600';
  const markText = forAthlete ? ' (outside the target range)' : ' (outside band)';
  const { model } = useAnalysis();
  const query = useClipFrames(clip.id, model);
  const turns = useMemo(() => query.data?.series?.turns ?? [], [query.data]);
  const flags = useMemo(() => query.data?.flags ?? [], [query.data]);
  const columns = APEX_METRICS[clip.view];
  // The turn holding the frame on screen: the table re-renders when the frame enters another turn.
  const currentTurn = useStageClock(
    (s) => turns.find((t) => s.frame >= t.startFrame && s.frame < t.endFrame)?.index ?? null,
  );

  if (!query.data || query.data.frames.length === 0) return null;

  return (
    <section aria-labelledby="turn-table-title" className="rounded-lg border border-granite-200 bg-white p-4">
      <h2 id="turn-table-title" className="font-semibold text-granite-900">
        Turns <span className="font-mono text-sm font-normal text-granite-600">({turns.length})</span>
      </h2>
      {turns.length === 0 ? (
        <p className="mt-1 text-sm text-granite-600">
          {clip.view === 'side'
            ? 'Turns are found from inclination, which a front view shows. This clip is filmed from the side.'
            : 'No turns were found: the inclination never swung past 3° to each side.'}
        </p>
      ) : (
        <div className="mt-2 overflow-x-auto">
          <table className="w-full text-sm whitespace-nowrap">
            <caption className="sr-only">
              Turns of this clip with direction, duration and the values at each apex
            </caption>
            <thead className="text-xs text-granite-600">
              <tr>
                <th scope="col" rowSpan={2} className="py-1 pr-3 text-left align-bottom font-medium">
                  Turn
                </th>
                <th scope="col" rowSpan={2} className="py-1 pr-3 text-left align-bottom font-medium">
                  Direction
                </th>
                <th scope="col" rowSpan={2} className="py-1 pr-3 text-right align-bottom font-medium">
                  Duration
                </th>
                <th scope="col" rowSpan={2} className="py-1 pr-3 text-left align-bottom font-medium">
                  Inside
                </th>
                <th
                  scope="colgroup"
                  colSpan={columns.length}
                  className="border-b border-granite-100 py-1 pr-3 text-center font-medium"
                >
                  At the apex
                </th>
                <th scope="col" rowSpan={2} className="py-1 pr-3 text-right align-bottom font-medium">
                  Transition rise <span className="text-granite-400">(ratio)</span>
                </th>
                <th scope="col" rowSpan={2} className="py-1 text-left align-bottom font-medium">
                  Flags
                </th>
              </tr>
              <tr className="border-b border-granite-200">
                {columns.map((key) => (
                  <th key={key} scope="col" className="py-1 pr-3 text-right font-medium">
                    {METRIC_DEFINITIONS[key].label} <span className="text-granite-400">{unitShort(key)}</span>
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {turns.map((turn) => {
                const own = flagsInTurn(turn, flags);
                const here = turn.index === currentTurn;
                const name = `${turn.direction === 'left' ? 'L' : 'R'}${turn.index + 1}`;
                const riseFlag = own.find((f) => f.metric === 'transitionRise');
                return (
                  <tr
                    key={turn.index}
                    className={cn('border-b border-granite-100 last:border-0', here && 'bg-glacier-50')}
                    aria-current={here ? 'true' : undefined}
                  >
                    <th scope="row" className="py-1.5 pr-3 text-left font-medium">
                      <button
                        type="button"
                        className="font-mono text-glacier-700 hover:underline"
                        aria-label={`Go to the apex of turn ${name}`}
                        onClick={() => seekToFrame(turn.apexFrame)}
                      >
                        {name}
                      </button>
                      {turn.complete ? null : (
                        <span
                          className="ml-1 text-xs font-normal text-granite-400"
                          title="Cut by the start or end of the clip"
                        >
                          partial
                        </span>
                      )}
                    </th>
                    <td className="py-1.5 pr-3">{turn.direction === 'left' ? 'Left' : 'Right'}</td>
                    <td className="py-1.5 pr-3 text-right font-mono tabular-nums">
                      {(turn.durationMs / 1000).toFixed(2)} s
                    </td>
                    <td className="py-1.5 pr-3">{turn.insideSide === 'left' ? 'Left leg' : 'Right leg'}</td>
                    {columns.map((key) => {
                      const value = turn.apexValues[key];
                      // Red when the value at the apex itself is the turn's worst outside its band.
                      const flagged = own.some((f) => f.metric === key && f.frameIndex === turn.apexFrame);
                      return (
                        <td
                          key={key}
                          className={cn(
                            'py-1.5 pr-3 text-right font-mono tabular-nums',
                            flagged && markClass,
                          )}
                        >
                          {value === null ? '—' : formatMetricValue(value, METRIC_DEFINITIONS[key].unit)}
                          {flagged ? <span className="sr-only">{markText}</span> : null}
                        </td>
                      );
                    })}
                    <td
                      className={cn('py-1.5 pr-3 text-right font-mono tabular-nums', riseFlag && markClass)}
                    >
                      {turn.transitionRise === null ? '—' : signedFixed(turn.transitionRise, 2)}
                      {riseFlag ? <span className="sr-only">{markText}</span> : null}
                    </td>
                    <td className="py-1.5">
                      {own.length > 0 ? (
                        <span className={cn('inline-flex items-center gap-1', markClass)}>
                          <Flag aria-hidden="true" className="h-3.5 w-3.5" />
                          <span className="font-mono tabular-nums">
                            {new Set(own.map((f) => f.metric)).size}
                          </span>
                          <span className="sr-only">
                            {forAthlete ? 'metrics outside the target range' : 'metrics outside band'}
                          </span>
                        </span>
                      ) : (
                        <span className="text-granite-400">none</span>
                      )}
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
