import type { Keypoint, PoseModelName, ReferenceLine, View } from '@shared/keypoints';
import {
  computeFrameMetrics,
  emptyFrameMetrics,
  METRIC_DEFINITIONS,
  METRIC_KEYS,
  suggestView,
  type MetricKey,
} from '@shared/metrics';

/** One output line of the command-line contract (docs/metrics.md). */
export interface FrameReport {
  file: string;
  frame: number | null;
  timeMs: number | null;
  width: number | null;
  height: number | null;
  model: PoseModelName | null;
  view: View;
  keypoints: { name: string; x: number; y: number; score: number }[];
  metrics: Record<MetricKey, number | null>;
  reasons: Partial<Record<MetricKey, string>>;
}

export interface FrameSource {
  file: string;
  frame: number | null;
  timeMs: number | null;
  width: number | null;
  height: number | null;
  model: PoseModelName | null;
  keypoints: Keypoint[];
  /** View in force: from --view, else the file, else suggested from the points. */
  view: View | null;
  referenceLine: ReferenceLine | null;
  /** Following a picked athlete: why this frame has no points (lost, or swapped for someone else). */
  lostReason?: string | null;
}

export function reportFrame(source: FrameSource): FrameReport {
  const view = source.view ?? suggestView(source.keypoints).view;
  const m =
    source.keypoints.length === 0
      ? emptyFrameMetrics(source.lostReason ?? 'no skier found')
      : computeFrameMetrics({ keypoints: source.keypoints, view, referenceLine: source.referenceLine });
  return {
    file: source.file,
    frame: source.frame,
    timeMs: source.timeMs,
    width: source.width,
    height: source.height,
    model: source.model,
    view,
    keypoints: source.keypoints.map(({ name, x, y, score }) => ({ name, x, y, score })),
    metrics: m.metrics,
    reasons: m.reasons,
  };
}

export function toJsonLine(report: FrameReport): string {
  return JSON.stringify(report);
}

const UNIT_SHORT: Record<string, string> = {
  deg: '°',
  ratio: '',
  'shin lengths': ' shin',
  'hip widths': ' hip w',
};

/** A readable block for one frame. */
export function toTable(report: FrameReport): string {
  const head = [
    report.file,
    report.frame === null ? null : `frame ${report.frame}`,
    report.timeMs === null ? null : `${report.timeMs} ms`,
    `view ${report.view}`,
    report.model ? `model ${report.model}` : null,
  ]
    .filter(Boolean)
    .join('  ');
  const width = Math.max(...METRIC_KEYS.map((k) => k.length));
  const rows = METRIC_KEYS.map((key) => {
    const value = report.metrics[key];
    const unit = UNIT_SHORT[METRIC_DEFINITIONS[key].unit];
    const shown =
      value === null ? '—' : `${value.toFixed(METRIC_DEFINITIONS[key].unit === 'deg' ? 1 : 3)}${unit}`;
    return `  ${key.padEnd(width)}  ${shown.padStart(11)}  ${value === null ? (report.reasons[key] ?? '') : ''}`.trimEnd();
  });
  return [head, ...rows].join('\n');
}
