// @vitest-environment happy-dom
import { act, renderHook, waitFor } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { PoseFrameResult, QueuedFrame } from '@/lib/pose-client';

const analyzeQueue = vi.fn();
vi.mock('@/lib/pose-client', () => ({ getPoseClient: () => ({ analyzeQueue }) }));
const { usePoseAnalysis } = await import('@/lib/use-pose');

const result = (frameIndex: number) => ({ frameIndex }) as PoseFrameResult;
const frames: QueuedFrame[] = [];

afterEach(() => analyzeQueue.mockReset());

describe('usePoseAnalysis', () => {
  it('reports progress and the results of a run', async () => {
    analyzeQueue.mockImplementation(async (_f, opts: { onProgress(d: number, t: number): void }) => {
      opts.onProgress(1, 2);
      opts.onProgress(2, 2);
      return [result(0), result(1)];
    });
    const { result: hook } = renderHook(() => usePoseAnalysis());
    await act(() => hook.current.run(frames, 2));
    expect(hook.current).toMatchObject({ running: false, done: 2, total: 2, error: null });
    expect(hook.current.results?.map((r) => r.frameIndex)).toEqual([0, 1]);
  });

  it('cancels through its AbortSignal and ends without an error', async () => {
    analyzeQueue.mockImplementation(
      (_f, opts: { signal: AbortSignal }) =>
        new Promise((_, reject) =>
          opts.signal.addEventListener('abort', () => reject(new DOMException('cancelled', 'AbortError'))),
        ),
    );
    const { result: hook } = renderHook(() => usePoseAnalysis());
    let run!: Promise<unknown>;
    act(() => {
      run = hook.current.run(frames, 5);
    });
    await waitFor(() => expect(hook.current.running).toBe(true));
    act(() => hook.current.cancel());
    await act(() => run);
    expect(hook.current).toMatchObject({ running: false, results: null, error: null });
  });

  it('keeps the error of a failed run', async () => {
    analyzeQueue.mockRejectedValue(new Error('pose worker failed: out of memory'));
    const { result: hook } = renderHook(() => usePoseAnalysis());
    await act(() => hook.current.run(frames));
    expect(hook.current.error?.message).toBe('pose worker failed: out of memory');
  });

  it('aborts a running analysis when the component unmounts', async () => {
    let signal: AbortSignal | undefined;
    analyzeQueue.mockImplementation((_f, opts: { signal: AbortSignal }) => {
      signal = opts.signal;
      return new Promise(() => undefined);
    });
    const { result: hook, unmount } = renderHook(() => usePoseAnalysis());
    act(() => {
      void hook.current.run(frames);
    });
    await waitFor(() => expect(signal).toBeDefined());
    unmount();
    expect(signal?.aborted).toBe(true);
  });
});
