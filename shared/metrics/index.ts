export * from './definitions';
export * from './segment-table';
export {
  suggestView,
  suggestFacing,
  detectFacing,
  bodyWidthRatio,
  FRONT_WIDTH_THRESHOLD,
  FRONT_TRUST_MIN_WIDTH,
  SIDE_TRUST_MAX_WIDTH,
  type Facing,
} from './view-detection';
export { computeFrameMetrics, emptyFrameMetrics, centreOfMass } from './frame-metrics';
export type { FrameMetrics, FrameMetricOptions } from './frame-metrics';
export { PosePoints, PointReader, MetricUnavailable } from './pose-points';
