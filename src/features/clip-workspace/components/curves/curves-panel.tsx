import { useEffect, useId, useMemo, useRef, useState, type MouseEvent, type RefObject } from 'react';
import {
  CartesianGrid,
  Legend,
  Line,
  LineChart,
  ReferenceArea,
  ReferenceDot,
  ReferenceLine,
  ResponsiveContainer,
  Tooltip,
  XAxis,
  YAxis,
} from 'recharts';
import { Flag } from 'lucide-react';
import type { View } from '@shared/keypoints';
import { METRIC_DEFINITIONS, type MetricKey } from '@shared/metrics';
import { BAND_METRICS, isBandMetricKey } from '@shared/tolerance';
import { useUser } from '@/lib/auth';
import { readsBandsAsTarget } from '@/lib/permissions';
import { EmptyState } from '@/components/ui/empty-state';
import { Notice } from '@/components/ui/notice';
import { Spinner } from '@/components/ui/spinner';
import { cn } from '@/lib/format';
import { clipExtras } from '../../api/clip-contract';
import { useClipFrames } from '../../api/get-clip-frames';
import { formatClipTime } from '../../lib/frame-time';
import { formatMetricValue } from '../../lib/metric-format';
import { useAnalysis } from '../stage/analysis-context';
import { useStage, useStageClock } from '../stage/stage-context';
import {
  CURSOR_COLOR,
  FLAG_COLOR,
  SERIES_STYLES,
  TARGET_COLOR,
  TURN_FILL,
  TURN_FILL_OPACITY,
} from './curve-colors';
import {
  axisFor,
  chartRows,
  defaultChartMetrics,
  flagMarkers,
  flagSpans,
  metricsForView,
  nearestFrame,
  turnShading,
  type FlagSpan,
} from './curve-data';

const CHART_HEIGHT = 300;
const MAX_FLAG_CHIPS = 40;

/** Clip time (s) under the pointer, from the plot area's box (the grid) and the fixed time axis. */
function timeAtPointer(
  event: MouseEvent | undefined,
  box: HTMLElement | null,
  durationS: number,
): number | null {
  const grid = box?.querySelector('.recharts-cartesian-grid');
  if (!event || !grid) return null;
  const rect = grid.getBoundingClientRect();
  if (rect.width <= 0) return null;
  const f = (event.clientX - rect.left) / rect.width;
  return Math.min(1, Math.max(0, f)) * durationS;
}

function metricLabel(metric: string): string {
  return isBandMetricKey(metric) ? BAND_METRICS[metric].label : metric;
}

function metricValue(metric: string, value: number): string {
  return isBandMetricKey(metric) ? formatMetricValue(value, BAND_METRICS[metric].unit) : value.toFixed(2);
}

const STATUS_WORDS = { unreviewed: null, reviewed: 'reviewed', dismissed: 'dismissed' } as const;

/**
 * The clip's curves. Nothing here reads the frame on screen: while the clip plays, the cursor moves by
 * itself (FrameCursor) and the flag list re-renders only when the frame enters or leaves a flag.
 */
export function CurvesPanel() {
  const stage = useStage();
  const { model, bands } = useAnalysis();
  const { role } = useUser();
  const forAthlete = readsBandsAsTarget(role);
  const { clip, fps, frameCount, seekToFrame } = stage;
  const view = clip.view;
  const query = useClipFrames(clip.id, model);
  const available = useMemo(() => metricsForView(view), [view]);
  // A choice per view, so changing the clip's view shows that view's metrics.
  const [chosenByView, setChosenByView] = useState<Record<View, MetricKey[]>>(() => ({
    front: defaultChartMetrics('front'),
    side: defaultChartMetrics('side'),
  }));
  const chosen = chosenByView[view];
  const titleId = useId();
  const chartBox = useRef<HTMLDivElement | null>(null);

  const data = query.data;
  const frames = useMemo(() => data?.frames ?? [], [data]);
  const rows = useMemo(() => chartRows(frames, chosen), [frames, chosen]);
  const turns = useMemo(() => data?.series?.turns ?? [], [data]);
  const shades = useMemo(() => turnShading(turns), [turns]);
  const transitions = data?.series?.transitions ?? [];
  const flags = useMemo(() => data?.flags ?? [], [data]);
  const markers = useMemo(() => flagMarkers(flags, frames, chosen), [flags, frames, chosen]);
  const spans = useMemo(() => flagSpans(flags), [flags]);

  const hasDeg = chosen.some((k) => METRIC_DEFINITIONS[k].unit === 'deg');
  const hasRatio = chosen.some((k) => METRIC_DEFINITIONS[k].unit !== 'deg');
  const durationS = frameCount / fps;

  const toggle = (key: MetricKey) =>
    setChosenByView((all) => {
      const list = all[view];
      const next = list.includes(key)
        ? list.filter((k) => k !== key)
        : available.filter((k) => k === key || list.includes(k));
      return { ...all, [view]: next };
    });

  return (
    <section
      aria-label="Metric curves"
      aria-describedby={titleId}
      className="rounded-lg border border-granite-200 bg-white p-4"
    >
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <h2 className="font-semibold text-granite-900">Curves</h2>
          <p id={titleId} className="text-sm text-granite-600">
            Chosen metrics over the clip. Click the chart to show that frame.
          </p>
        </div>
        <details className="relative">
          <summary className="flex h-8 cursor-pointer list-none items-center rounded-md border border-granite-200 px-3 text-sm text-granite-800 hover:bg-glacier-50">
            Metrics ({chosen.length})
          </summary>
          <fieldset className="absolute right-0 z-20 mt-1 w-64 space-y-1 rounded-md border border-granite-200 bg-white p-3 shadow-lg">
            <legend className="sr-only">Metrics on the chart</legend>
            {available.map((key) => (
              <label key={key} className="flex items-center gap-2 text-sm text-granite-800">
                <input type="checkbox" checked={chosen.includes(key)} onChange={() => toggle(key)} />
                {METRIC_DEFINITIONS[key].label}
                <span className="ml-auto text-xs text-granite-400">{METRIC_DEFINITIONS[key].unit}</span>
              </label>
            ))}
          </fieldset>
        </details>
      </div>

      {query.isPending ? (
        <div className="flex h-40 items-center justify-center">
          <Spinner label="Loading stored results" />
        </div>
      ) : query.isError ? (
        <Notice tone="error" title="The curves could not be loaded" className="mt-3">
          <p>{query.error.message}</p>
        </Notice>
      ) : frames.length === 0 ? (
        <div className="mt-3">
          <EmptyState title="No curves yet">
            Run <strong className="font-medium">Analyze whole clip</strong> above: the chosen metrics appear
            here frame by frame, with turns, transitions, apexes and flagged moments marked.
          </EmptyState>
        </div>
      ) : (
        <>
          <TurnLegend hasTurns={shades.length > 0} view={view} forAthlete={forAthlete} />
          <div className="relative mt-2 cursor-crosshair" data-testid="curves-chart" ref={chartBox}>
            <ResponsiveContainer width="100%" height={CHART_HEIGHT}>
              <LineChart
                data={rows}
                margin={{ top: 18, right: hasRatio ? 8 : 24, bottom: 4, left: 0 }}
                onClick={(state, event) => {
                  // The tooltip's label is the time under the pointer; without a hover first (touch,
                  // a quick click) it is unset, so the pointer's place over the plot area decides.
                  const label = Number(state?.activeLabel ?? NaN);
                  const t = Number.isFinite(label)
                    ? label
                    : timeAtPointer(event, chartBox.current, durationS);
                  const frame = t === null ? null : nearestFrame(rows, t);
                  if (frame !== null) seekToFrame(frame);
                }}
              >
                <CartesianGrid stroke="#eceef1" strokeDasharray="3 3" />
                <XAxis
                  dataKey="t"
                  type="number"
                  domain={[0, Number(durationS.toFixed(3))]}
                  tickFormatter={(t: number) => `${t.toFixed(1)} s`}
                  tick={{ fontSize: 12, fontFamily: 'IBM Plex Mono, monospace' }}
                />
                <YAxis
                  yAxisId="deg"
                  hide={!hasDeg}
                  width={48}
                  tickFormatter={(v: number) => `${v}°`}
                  tick={{ fontSize: 12, fontFamily: 'IBM Plex Mono, monospace' }}
                />
                <YAxis
                  yAxisId="ratio"
                  orientation="right"
                  hide={!hasRatio}
                  width={44}
                  tick={{ fontSize: 12, fontFamily: 'IBM Plex Mono, monospace' }}
                />
                {shades.map((s) => (
                  <ReferenceArea
                    key={s.key}
                    yAxisId="deg"
                    x1={s.x1}
                    x2={s.x2}
                    fill={TURN_FILL[s.direction]}
                    fillOpacity={TURN_FILL_OPACITY[s.direction]}
                    stroke="none"
                    ifOverflow="hidden"
                    label={{ value: s.label, position: 'insideTop', fontSize: 11, fill: '#4f5968' }}
                  />
                ))}
                {transitions.map((t) => (
                  <ReferenceLine
                    key={`tr-${t.frameIndex}`}
                    yAxisId="deg"
                    x={t.timeMs / 1000}
                    stroke="#4f5968"
                    strokeDasharray="5 4"
                  />
                ))}
                {turns.map((t) => (
                  <ReferenceLine
                    key={`apex-${t.index}`}
                    yAxisId="deg"
                    x={t.apexMs / 1000}
                    stroke="#8b94a3"
                    strokeDasharray="1 3"
                    label={{ value: 'apex', position: 'insideBottom', fontSize: 10, fill: '#4f5968' }}
                  />
                ))}
                {chosen.map((key, i) => {
                  const style = SERIES_STYLES[i % SERIES_STYLES.length];
                  return (
                    <Line
                      key={key}
                      yAxisId={axisFor(METRIC_DEFINITIONS[key].unit)}
                      dataKey={key}
                      name={METRIC_DEFINITIONS[key].label}
                      stroke={style.stroke}
                      strokeDasharray={style.dash}
                      strokeWidth={1.75}
                      dot={false}
                      isAnimationActive={false}
                      connectNulls={false}
                    />
                  );
                })}
                {markers.map((m) => (
                  <ReferenceDot
                    key={m.key}
                    yAxisId={axisFor(METRIC_DEFINITIONS[m.metric].unit)}
                    x={m.t}
                    y={m.value}
                    r={3.5}
                    fill={forAthlete ? TARGET_COLOR : FLAG_COLOR}
                    stroke="#ffffff"
                    strokeWidth={1}
                    ifOverflow="extendDomain"
                  />
                ))}
                <Tooltip
                  isAnimationActive={false}
                  labelFormatter={(t) =>
                    `${formatClipTime(Number(t) * 1000)} · frame ${nearestFrame(rows, Number(t)) ?? ''}`
                  }
                  formatter={(value, name, item) => {
                    const key = item.dataKey as MetricKey;
                    return [
                      typeof value === 'number'
                        ? formatMetricValue(value, METRIC_DEFINITIONS[key].unit)
                        : '—',
                      name,
                    ];
                  }}
                  contentStyle={{ fontSize: 12 }}
                />
                <Legend wrapperStyle={{ fontSize: 12 }} />
              </LineChart>
            </ResponsiveContainer>
            <FrameCursor box={chartBox} durationS={durationS} fps={fps} />
          </div>
          <FlagList
            spans={spans}
            fps={fps}
            bandsCount={bands.length}
            onSeek={seekToFrame}
            ageGroup={clipExtras(clip).ageGroup?.name ?? null}
          />
        </>
      )}
    </section>
  );
}

interface FlagListProps {
  spans: FlagSpan[];
  fps: number;
  bandsCount: number;
  ageGroup: string | null;
  onSeek(frameIndex: number): void;
}

/**
 * The clip's flags, one per habit and turn. Coaches read them as coaching points with their review
 * state; athletes and guardians read the same moments as their target range, without alarm colours.
 */
function FlagList({ spans, fps, bandsCount, ageGroup, onSeek }: FlagListProps) {
  const { role } = useUser();
  const forAthlete = readsBandsAsTarget(role);
  // The flag holding the frame on screen; the list re-renders only when that changes.
  const activeKey = useStageClock(
    (s) => spans.find((span) => s.frame >= span.firstFrame && s.frame <= span.lastFrame)?.key ?? null,
  );
  const range = ageGroup ? `the target range for ${ageGroup}` : 'the age-group target range';
  if (spans.length === 0) {
    return (
      <p className="mt-2 text-sm text-spruce-700">
        {forAthlete
          ? `Every measured value of this clip is inside ${range}.`
          : `No value of this clip is outside its age-group band${bandsCount === 0 ? ' (no bands set)' : ''}.`}
      </p>
    );
  }
  return (
    <div className="mt-3">
      <h3 className="text-sm font-medium text-granite-800">
        {forAthlete ? `Moments outside ${range}` : 'Outside the age-group band'}{' '}
        <span className="font-mono text-granite-600">({spans.length})</span>
      </h3>
      {forAthlete ? (
        <p className="text-xs text-granite-600">
          Something to work on with your coach, one per turn; not a mark of anything wrong with your body.
        </p>
      ) : null}
      <ul className="mt-1 flex flex-wrap gap-1.5" aria-label="Flagged moments">
        {spans.slice(0, MAX_FLAG_CHIPS).map((s) => (
          <li key={s.key}>
            <button
              type="button"
              onClick={() => onSeek(s.worstFrame)}
              title={`${s.count} ${s.count === 1 ? 'frame' : 'frames'} outside, frames ${s.firstFrame}–${s.lastFrame}`}
              className={cn(
                'inline-flex items-center gap-1 rounded border px-2 py-0.5 text-xs text-granite-800',
                forAthlete
                  ? 'border-glacier-300 bg-glacier-50 hover:bg-glacier-100'
                  : 'border-alarm-500/40 bg-alarm-500/5 hover:bg-alarm-500/10',
                s.status !== 'unreviewed' &&
                  !forAthlete &&
                  'border-granite-200 bg-granite-50 text-granite-600',
                s.key === activeKey && 'ring-2 ring-glacier-500/50',
              )}
            >
              {forAthlete ? null : <Flag aria-hidden="true" className="h-3 w-3 text-alarm-600" />}
              {metricLabel(s.metric)}{' '}
              <span className="font-mono tabular-nums">{metricValue(s.metric, s.worstValue)}</span>
              <span className="text-granite-600">
                {s.turnIndex === null ? '' : `turn ${s.turnIndex + 1}`}
              </span>
              <span className="font-mono text-granite-600 tabular-nums">
                {formatClipTime((s.worstFrame / fps) * 1000)}
              </span>
              {!forAthlete && STATUS_WORDS[s.status] ? (
                <span className="text-granite-600">· {STATUS_WORDS[s.status]}</span>
              ) : null}
            </button>
          </li>
        ))}
      </ul>
      {spans.length > MAX_FLAG_CHIPS ? (
        <p className="mt-1 text-xs text-granite-600">
          The first {MAX_FLAG_CHIPS} of {spans.length} are listed; put a metric on the chart to see all of its
          flags.
        </p>
      ) : null}
    </div>
  );
}

function TurnLegend({
  hasTurns,
  view,
  forAthlete,
}: {
  hasTurns: boolean;
  view: 'front' | 'side';
  forAthlete: boolean;
}) {
  if (!hasTurns) {
    return (
      <p className="mt-2 text-xs text-granite-600">
        {view === 'side'
          ? 'Turns are found from inclination, which only a front view shows; the curves cover every analysed frame.'
          : 'No turns found: inclination does not swing from side to side in this clip.'}
      </p>
    );
  }
  return (
    <p className="mt-2 flex flex-wrap items-center gap-x-4 gap-y-1 text-xs text-granite-600">
      <span className="inline-flex items-center gap-1">
        <span aria-hidden="true" className="inline-block h-3 w-4 rounded-sm bg-glacier-300/60" /> left turn
      </span>
      <span className="inline-flex items-center gap-1">
        <span aria-hidden="true" className="inline-block h-3 w-4 rounded-sm bg-signal-400/40" /> right turn
      </span>
      <span className="inline-flex items-center gap-1">
        <span aria-hidden="true" className="inline-block w-4 border-t-2 border-dashed border-granite-600" />{' '}
        transition
      </span>
      <span className="inline-flex items-center gap-1">
        <span aria-hidden="true" className="inline-block w-4 border-t-2 border-dotted border-granite-400" />{' '}
        apex
      </span>
      <span className="inline-flex items-center gap-1">
        <span
          aria-hidden="true"
          className={cn(
            'inline-block h-2.5 w-2.5 rounded-full',
            forAthlete ? 'bg-glacier-700' : 'bg-alarm-600',
          )}
        />{' '}
        {forAthlete ? 'outside the target range' : 'outside band'}
      </span>
      <span className="inline-flex items-center gap-1">
        <span aria-hidden="true" className="inline-block h-3 border-l-2 border-glacier-950" /> frame on screen
      </span>
    </p>
  );
}

/**
 * The frame-on-screen line over the chart, moved by a clock subscription that writes its position
 * straight to the element: the chart itself never re-renders for it. The plot area is the chart's grid.
 */
interface FrameCursorProps {
  box: RefObject<HTMLDivElement | null>;
  durationS: number;
  fps: number;
}

function FrameCursor({ box, durationS, fps }: FrameCursorProps) {
  const { clock } = useStage();
  const lineRef = useRef<HTMLDivElement | null>(null);

  useEffect(() => {
    let retry = 0;
    let tries = 0;
    const place = () => {
      const line = lineRef.current;
      const grid = box.current?.querySelector('.recharts-cartesian-grid');
      const outer = box.current?.getBoundingClientRect();
      if (!line || !outer || durationS <= 0) return;
      // The chart draws its grid a moment after it mounts (it measures its box first).
      if (!grid) {
        if (tries++ < 120) retry = requestAnimationFrame(place);
        return;
      }
      const plot = grid.getBoundingClientRect();
      const f = Math.min(1, Math.max(0, clock.get().frame / fps / durationS));
      line.style.left = `${plot.left - outer.left + f * plot.width}px`;
      line.style.top = `${plot.top - outer.top}px`;
      line.style.height = `${plot.height}px`;
      line.style.visibility = 'visible';
    };
    place();
    const stop = clock.subscribe(place);
    // The plot area moves when the chart is resized or its axes change width.
    const observer = new ResizeObserver(place);
    if (box.current) observer.observe(box.current);
    return () => {
      stop();
      observer.disconnect();
      cancelAnimationFrame(retry);
    };
  }, [box, clock, durationS, fps]);

  return (
    <div
      ref={lineRef}
      data-testid="curves-cursor"
      aria-hidden="true"
      className="pointer-events-none absolute w-0 border-l-[1.5px]"
      style={{ borderColor: CURSOR_COLOR, visibility: 'hidden' }}
    />
  );
}
