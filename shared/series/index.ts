export * from './analyze-series';
export * from './filters';
export { fillGaps, runsOf } from './gap-fill';
export { segmentTurns, type Crossing, type TurnSpan } from './turns';
export {
  estimateFrameRate,
  frameStep,
  stretchGapFrames,
  FLAG_STRETCH_GAP_S,
  type TimedFrame,
} from './frame-rate';
