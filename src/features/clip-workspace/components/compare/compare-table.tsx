import { useState } from 'react';
import type { FocusTarget, TargetChange } from '@shared/plan';
import type { ClipDto } from '@shared/schemas/clip.schema';
import type { ClipFramesResponse } from '@shared/schemas/frames.schema';
import type { FocusPointDto } from '@shared/schemas/plan.schema';
import { BAND_METRICS, BAND_METRIC_KEYS, formatUnitValue, type BandMetricKey } from '@shared/tolerance';
import { SelectField } from '@/components/ui/field';
import { cn } from '@/lib/format';
import { compareRow, valueAt, type SideValue } from '../../lib/compare-values';
import { useClock, type StageClock } from '../../lib/stage-clock';

const CHANGE_WORDS: Record<TargetChange, string> = {
  toward: 'Toward the target',
  away: 'Away from the target',
  unchanged: 'No change',
  inside: 'Inside the target both times',
  'no target': '—',
};
const CHANGE_TONES: Record<TargetChange, string> = {
  toward: 'text-spruce-700 font-medium',
  away: 'text-signal-700 font-medium',
  unchanged: 'text-granite-700',
  inside: 'text-spruce-700',
  'no target': 'text-granite-500',
};

interface Side {
  clip: ClipDto;
  clock: StageClock;
  stored: ClipFramesResponse | undefined;
}

function Cell({ side, metric }: { side: SideValue; metric: BandMetricKey }) {
  if (side.value === null) return <span className="text-xs text-granite-600">{side.reason}</span>;
  return (
    <span className="font-mono tabular-nums">{formatUnitValue(side.value, BAND_METRICS[metric].unit)}</span>
  );
}

/**
 * The focus-point metrics (and one metric of the coach's choice) at the two frames shown: left, right,
 * the change and whether it goes toward the focus point's target.
 */
export function CompareTable({
  left,
  right,
  focusPoints,
}: {
  left: Side;
  right: Side;
  focusPoints: FocusPointDto[];
}) {
  const [extra, setExtra] = useState<BandMetricKey | ''>('');
  const leftFrame = useClock(left.clock, (s) => s.frame);
  const rightFrame = useClock(right.clock, (s) => s.frame);
  const targets = new Map<BandMetricKey, { title: string; target: FocusTarget }>();
  for (const p of focusPoints) {
    if (p.metric && !targets.has(p.metric))
      targets.set(p.metric, {
        title: p.title,
        target: { min: p.targetMin, max: p.targetMax, direction: p.direction },
      });
  }
  const metrics = [...targets.keys()];
  if (extra && !targets.has(extra)) metrics.push(extra);
  const rows = metrics.map((metric) =>
    compareRow(
      metric,
      valueAt(metric, left.clip.view, left.stored, leftFrame),
      valueAt(metric, right.clip.view, right.stored, rightFrame),
      targets.get(metric)?.target ?? null,
    ),
  );

  return (
    <section aria-labelledby="compare-table" className="space-y-3">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <h2 id="compare-table" className="text-base font-semibold text-granite-900">
          Measured at the frames shown
        </h2>
        <SelectField
          label="Add a metric"
          value={extra}
          onChange={(event) => setExtra(event.target.value as BandMetricKey | '')}
          className="w-64"
        >
          <option value="">None</option>
          {BAND_METRIC_KEYS.map((key) => (
            <option key={key} value={key}>
              {BAND_METRICS[key].label}
            </option>
          ))}
        </SelectField>
      </div>
      {rows.length === 0 ? (
        <p className="text-sm text-granite-600">
          No focus point of this athlete is tied to a metric; choose one above to compare it.
        </p>
      ) : (
        <div className="overflow-x-auto rounded-lg border border-granite-200 bg-white">
          <table className="w-full text-sm">
            <caption className="sr-only">Metrics of the left and right clip at the frames shown</caption>
            <thead className="bg-granite-50 text-left text-xs uppercase tracking-wide text-granite-600">
              <tr>
                <th scope="col" className="px-3 py-2">
                  Metric
                </th>
                <th scope="col" className="px-3 py-2">
                  Left (frame {leftFrame})
                </th>
                <th scope="col" className="px-3 py-2">
                  Right (frame {rightFrame})
                </th>
                <th scope="col" className="px-3 py-2">
                  Change
                </th>
                <th scope="col" className="px-3 py-2">
                  Toward the target?
                </th>
              </tr>
            </thead>
            <tbody className="divide-y divide-granite-100">
              {rows.map((row) => {
                const info = BAND_METRICS[row.metric];
                const focus = targets.get(row.metric);
                return (
                  <tr key={row.metric} aria-label={info.label}>
                    <th scope="row" className="px-3 py-2 text-left font-medium text-granite-900">
                      {info.label}
                      {focus ? (
                        <span className="block text-xs font-normal text-granite-600">{focus.title}</span>
                      ) : null}
                    </th>
                    <td className="px-3 py-2">
                      <Cell side={row.left} metric={row.metric} />
                    </td>
                    <td className="px-3 py-2">
                      <Cell side={row.right} metric={row.metric} />
                    </td>
                    <td className="px-3 py-2 font-mono tabular-nums" data-testid={`change-${row.metric}`}>
                      {row.change === null
                        ? '—'
                        : `${row.change > 0 ? '+' : row.change < 0 ? '−' : '±'}${formatUnitValue(Math.abs(row.change), info.unit)}`}
                    </td>
                    <td className={cn('px-3 py-2', CHANGE_TONES[row.toward])}>{CHANGE_WORDS[row.toward]}</td>
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
