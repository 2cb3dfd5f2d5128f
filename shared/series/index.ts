export * from './analyze-series';
export * from './filters';
export { fillGaps, runsOf } from './gap-fill';
export { segmentTurns, type Crossing, type TurnSpan } from './turns';
export { estimateFrameRate, type TimedFrame } from './frame-rate';
