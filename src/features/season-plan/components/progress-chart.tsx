import { Link, useNavigate } from 'react-router-dom';
import {
  CartesianGrid,
  ErrorBar,
  Line,
  LineChart,
  ReferenceArea,
  ResponsiveContainer,
  Tooltip,
  XAxis,
  YAxis,
} from 'recharts';
import { focusLabel } from '@shared/plan';
import type { FocusPointDto, ProgressPoint } from '@shared/schemas/plan.schema';
import { BAND_METRICS, formatUnitValue, type BandMetricKey } from '@shared/tolerance';
import { paths } from '@/config/paths';
import { formatDay } from '@/lib/format';

const LINE_COLOR = '#245178';
const BASELINE_COLOR = '#c47610';
const TARGET_FILL = '#3fae8a';

interface ChartRow {
  clipId: string;
  label: string;
  median: number;
  spread: [number, number];
  baseline: boolean;
}

interface DotProps {
  cx?: number;
  cy?: number;
  payload?: ChartRow;
}

/**
 * A focus point's path through the season: one value per clip (median over its turns, whiskers from
 * the lowest to the highest turn), the target range shaded, the baseline in its own colour. Clips that
 * cannot give a value are listed under the chart with the reason.
 */
export function ProgressChart({ point, values }: { point: FocusPointDto; values: ProgressPoint[] }) {
  const navigate = useNavigate();
  const info = BAND_METRICS[point.metric as BandMetricKey];
  const plotted = values.filter((v) => v.median !== null);
  const rows: ChartRow[] = plotted.map((v) => ({
    clipId: v.clipId,
    label: formatDay(v.sessionDate),
    median: v.median!,
    spread: [v.median! - (v.min ?? v.median!), (v.max ?? v.median!) - v.median!],
    baseline: v.baseline,
  }));
  const format = (value: number) => formatUnitValue(value, info.unit);
  const Dot = ({ cx, cy, payload }: DotProps) => {
    if (cx === undefined || cy === undefined || !payload) return null;
    return (
      <circle
        cx={cx}
        cy={cy}
        r={payload.baseline ? 7 : 5}
        fill={payload.baseline ? BASELINE_COLOR : LINE_COLOR}
        stroke="#fff"
        strokeWidth={2}
        style={{ cursor: 'pointer' }}
        onClick={() => void navigate(paths.clip.href(payload.clipId))}
      />
    );
  };

  return (
    <figure className="space-y-2">
      <figcaption className="text-xs text-granite-600">
        {focusLabel(point.metric as BandMetricKey, point.phase)}: median over each clip&apos;s turns, whiskers
        from its lowest to its highest turn. The baseline is the larger orange point.
      </figcaption>
      {rows.length > 0 ? (
        <div className="h-48 w-full">
          <ResponsiveContainer width="100%" height="100%">
            <LineChart data={rows} margin={{ top: 8, right: 12, bottom: 4, left: 4 }}>
              <CartesianGrid stroke="#e3e7ec" vertical={false} />
              <XAxis dataKey="label" tick={{ fontSize: 11 }} />
              <YAxis tick={{ fontSize: 11 }} width={48} domain={['auto', 'auto']} tickFormatter={format} />
              {point.targetMin !== null || point.targetMax !== null ? (
                <ReferenceArea
                  y1={point.targetMin ?? undefined}
                  y2={point.targetMax ?? undefined}
                  fill={TARGET_FILL}
                  fillOpacity={0.15}
                  ifOverflow="extendDomain"
                />
              ) : null}
              <Tooltip formatter={(value) => (typeof value === 'number' ? format(value) : String(value))} />
              <Line
                dataKey="median"
                name={info.label}
                stroke={LINE_COLOR}
                strokeWidth={2}
                dot={<Dot />}
                activeDot={false}
                isAnimationActive={false}
              >
                <ErrorBar dataKey="spread" width={6} stroke={LINE_COLOR} />
              </Line>
            </LineChart>
          </ResponsiveContainer>
        </div>
      ) : null}
      <ol className="space-y-1 text-sm" aria-label={`${point.title}: value per clip`}>
        {values.map((v) => (
          <li key={v.clipId} className="flex flex-wrap items-baseline gap-x-2">
            <Link to={paths.clip.href(v.clipId)} className="text-glacier-700 hover:underline">
              {formatDay(v.sessionDate)}
            </Link>
            {v.baseline ? <span className="text-xs font-semibold text-signal-700">Baseline</span> : null}
            {v.median !== null ? (
              <span className="font-mono tabular-nums text-granite-900">
                {format(v.median)}
                <span className="text-granite-500">
                  {' '}
                  ({v.count} {v.over === 'turns' ? (v.count === 1 ? 'turn' : 'turns') : 'frames'},{' '}
                  {format(v.min!)} to {format(v.max!)})
                </span>
              </span>
            ) : (
              <span className="text-granite-600">Not plotted: {v.reason}</span>
            )}
          </li>
        ))}
      </ol>
    </figure>
  );
}
