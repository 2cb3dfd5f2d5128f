// Runs the series analysis (smoothing, turns, summary) of one clip off the main thread, so the API keeps
// answering while a long clip is analysed. Messages: { id, frames, options } in, { id, result | error } out.
import { parentPort } from 'node:worker_threads';
import { analyzeSeries, type SeriesFrameInput, type SeriesOptions } from '../../shared/series';

interface Job {
  id: number;
  frames: SeriesFrameInput[];
  options: SeriesOptions;
  withFrames?: boolean;
}

parentPort?.on('message', (job: Job) => {
  try {
    // Per-frame values stay here unless asked for (an export of smoothed values): the store needs
    // turns, transitions, summary and filter only.
    const result = analyzeSeries(job.frames, job.options);
    parentPort?.postMessage({ id: job.id, result: job.withFrames ? result : { ...result, frames: [] } });
  } catch (error) {
    parentPort?.postMessage({ id: job.id, error: error instanceof Error ? error.message : String(error) });
  }
});
