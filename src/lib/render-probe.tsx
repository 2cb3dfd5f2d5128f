import { Profiler, type ReactNode } from 'react';

/** Where a benchmark collects commit counts: set `window.__renderCommits = {}` before the page renders. */
declare global {
  interface Window {
    __renderCommits?: Record<string, number>;
  }
}

function countCommit(id: string) {
  const sink = typeof window === 'undefined' ? undefined : window.__renderCommits;
  if (sink) sink[id] = (sink[id] ?? 0) + 1;
}

/**
 * Counts React commits of a part of a page for the render benchmark (tests/bench). React calls
 * onRender only in development and profiling builds, so in the product build this costs nothing.
 */
export function RenderProbe({ id, children }: { id: string; children: ReactNode }) {
  return (
    <Profiler id={id} onRender={countCommit}>
      {children}
    </Profiler>
  );
}
