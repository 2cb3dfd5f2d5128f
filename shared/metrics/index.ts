export * from './definitions';
export * from './segment-table';
export { suggestView, detectFacing, FRONT_WIDTH_THRESHOLD, type Facing } from './view-detection';
export { computeFrameMetrics, emptyFrameMetrics, centreOfMass } from './frame-metrics';
export type { FrameMetrics, FrameMetricOptions } from './frame-metrics';
export { PosePoints, PointReader, MetricUnavailable } from './pose-points';
