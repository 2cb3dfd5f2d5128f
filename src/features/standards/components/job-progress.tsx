import { useEffect, useRef } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import type { JobDto } from '@shared/schemas/tolerance.schema';
import { ProgressBar } from '@/components/ui/progress-bar';
import { formatDateTime } from '@/lib/format';
import { useJob } from '../api/get-job';

const count = (n: number) => n.toLocaleString('en-GB');

/** The re-evaluation a band change started: a progress bar while it runs, then when it finished. */
export function JobProgress({ job: initial }: { job: JobDto | null }) {
  const job = useJob(initial).data ?? initial;
  const queryClient = useQueryClient();
  const wasRunning = useRef(false);
  const running = job?.status === 'queued' || job?.status === 'running';
  useEffect(() => {
    // The flags changed once a run finishes: lists anywhere in the app are read again.
    if (wasRunning.current && !running) void queryClient.invalidateQueries();
    wasRunning.current = running;
  }, [running, queryClient]);
  if (!job) return null;
  if (running) {
    return (
      <div role="status" className="space-y-1.5 rounded-lg border border-glacier-200 bg-glacier-50 px-4 py-3">
        <p className="text-sm text-granite-800">
          Checking stored frames against the new band ({job.label}):{' '}
          <span className="font-mono tabular-nums">
            {count(job.done)} of {job.total > 0 ? count(job.total) : '…'}
          </span>{' '}
          frames. Flags update as it goes; you can leave this page.
        </p>
        <ProgressBar value={job.total > 0 ? job.done / job.total : 0} label="Frames checked" />
      </div>
    );
  }
  if (job.status === 'failed') {
    return (
      <p
        role="alert"
        className="rounded-lg border border-alarm-500/40 bg-alarm-500/5 px-4 py-3 text-sm text-alarm-600"
      >
        Checking the stored frames stopped ({job.error ?? 'no reason recorded'}). It starts again when the
        server restarts; if it stops again, tell whoever runs your Stanceline server.
      </p>
    );
  }
  return (
    <p role="status" className="text-sm text-granite-600">
      Last check of stored frames ({job.label}): {count(job.total)} frames
      {job.finishedAt ? `, finished ${formatDateTime(job.finishedAt)}` : ''}.
    </p>
  );
}
