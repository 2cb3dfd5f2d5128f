import { useCallback, useEffect, useRef, useState } from 'react';
import { getPoseClient, type PoseFrameResult, type QueuedFrame } from './pose-client';

export interface PoseAnalysisState {
  running: boolean;
  done: number;
  total: number;
  results: PoseFrameResult[] | null;
  error: Error | null;
}

const IDLE: PoseAnalysisState = { running: false, done: 0, total: 0, results: null, error: null };

/**
 * Runs a queue of frames through the pose worker with progress and cancellation. Unmounting cancels a
 * running analysis; a cancelled run ends with `error` unset and `results` null.
 */
export function usePoseAnalysis() {
  const [state, setState] = useState<PoseAnalysisState>(IDLE);
  const controller = useRef<AbortController | null>(null);

  const run = useCallback(
    async (frames: AsyncIterable<QueuedFrame> | Iterable<QueuedFrame>, total?: number) => {
      controller.current?.abort();
      const abort = new AbortController();
      controller.current = abort;
      setState({ ...IDLE, running: true, total: total ?? 0 });
      try {
        const results = await getPoseClient().analyzeQueue(frames, {
          signal: abort.signal,
          total,
          onProgress: (done, all) => setState((s) => ({ ...s, done, total: all })),
        });
        if (controller.current === abort) setState((s) => ({ ...s, running: false, results }));
        return results;
      } catch (error) {
        const cancelled = error instanceof DOMException && error.name === 'AbortError';
        if (controller.current === abort) {
          setState((s) => ({ ...s, running: false, error: cancelled ? null : (error as Error) }));
        }
        return null;
      } finally {
        if (controller.current === abort) controller.current = null;
      }
    },
    [],
  );

  const cancel = useCallback(() => controller.current?.abort(), []);
  useEffect(() => () => controller.current?.abort(), []);
  return { ...state, run, cancel };
}
