import { useSyncExternalStore } from 'react';
import { Link } from 'react-router-dom';
import { Pause, Play, X } from 'lucide-react';
import { Button } from '@/components/ui/button';
import { ProgressBar } from '@/components/ui/progress-bar';
import { backgroundAnalysis, type BackgroundItem } from './background-analysis';

export function useBackgroundAnalysis() {
  return useSyncExternalStore(backgroundAnalysis.subscribe, backgroundAnalysis.getSnapshot);
}

const percent = (item: BackgroundItem) => (item.total > 0 ? Math.round((item.done / item.total) * 100) : 0);

function describe(item: BackgroundItem): string {
  switch (item.state) {
    case 'waiting':
      return 'Waiting to be analysed here';
    case 'preparing':
      return 'Waiting for the server to prepare the clip…';
    case 'analysing':
      return `Analysing here ${percent(item)} % (${item.done} of ${item.total} frames)`;
    case 'paused':
      return `Paused at ${percent(item)} %; frames done are kept`;
    case 'done':
      return 'Analysed here';
    case 'cancelled':
    case 'server':
      return item.message ?? 'Left to the server';
    case 'failed':
      return `Could not analyse it here: ${item.message ?? 'unknown error'}; the server will`;
  }
}

/** One uploaded clip's analysis in this browser, with its own stop button (Upload page). */
export function BackgroundClipStatus({ clipId }: { clipId: string }) {
  const { items } = useBackgroundAnalysis();
  const item = items.find((i) => i.clipId === clipId);
  if (!item) return null;
  const active = item.state === 'analysing' || item.state === 'waiting' || item.state === 'preparing';
  return (
    <div className="mt-1 space-y-1" data-testid="background-analysis" data-state={item.state}>
      {item.state === 'analysing' ? (
        <ProgressBar
          value={item.total ? item.done / item.total : 0}
          label={`Analysis of ${item.name} here`}
        />
      ) : null}
      <p className="flex items-center gap-2 text-xs text-granite-600" aria-live="polite">
        <span>{describe(item)}</span>
        {active ? (
          <Button
            variant="quiet"
            size="sm"
            icon={<X aria-hidden="true" className="h-3.5 w-3.5" />}
            onClick={() => backgroundAnalysis.cancel(clipId)}
            aria-label={`Leave ${item.name} to the server`}
          >
            Leave to the server
          </Button>
        ) : null}
      </p>
    </div>
  );
}

/** Pause and resume for the whole queue (Upload page). */
export function BackgroundQueueControls() {
  const { items, paused } = useBackgroundAnalysis();
  const open = items.filter((i) => ['waiting', 'preparing', 'analysing', 'paused'].includes(i.state));
  if (open.length === 0) return null;
  return (
    <div className="flex flex-wrap items-center gap-3 rounded-lg border border-glacier-200 bg-glacier-50 px-4 py-3">
      <p className="text-sm text-granite-800">
        {paused
          ? `Analysis here is paused: ${open.length} clip${open.length === 1 ? '' : 's'} waiting.`
          : `Analysing ${open.length} clip${open.length === 1 ? '' : 's'} on this computer, one at a time. You can go on in the app; keep this tab open. Clips left undone are analysed on the server.`}
      </p>
      {paused ? (
        <Button
          size="sm"
          icon={<Play aria-hidden="true" className="h-4 w-4" />}
          onClick={() => backgroundAnalysis.resume()}
        >
          Resume analysis
        </Button>
      ) : (
        <Button
          variant="secondary"
          size="sm"
          icon={<Pause aria-hidden="true" className="h-4 w-4" />}
          onClick={() => backgroundAnalysis.pause()}
        >
          Pause analysis
        </Button>
      )}
    </div>
  );
}

/** A small indicator for the page header while clips are analysed here; links to the Upload page. */
export function BackgroundIndicator({ uploadHref }: { uploadHref: string }) {
  const { items, paused } = useBackgroundAnalysis();
  const open = items.filter((i) => ['waiting', 'preparing', 'analysing', 'paused'].includes(i.state));
  if (open.length === 0) return null;
  const now = open.find((i) => i.state === 'analysing');
  return (
    <Link
      to={uploadHref}
      className="rounded px-2 py-1 text-xs text-glacier-100 hover:bg-glacier-800"
      data-testid="background-indicator"
    >
      {paused
        ? `Analysis paused (${open.length})`
        : now
          ? `Analysing ${open.length} clip${open.length === 1 ? '' : 's'} · ${percent(now)} %`
          : `${open.length} clip${open.length === 1 ? '' : 's'} to analyse`}
    </Link>
  );
}
