import { useId, useState } from 'react';
import { Activity, Server, X } from 'lucide-react';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { ProgressBar } from '@/components/ui/progress-bar';
import { formatDateTime } from '@/lib/format';
import { clipExtras } from '../../api/clip-contract';
import { useClipFrames } from '../../api/get-clip-frames';
import { isServerAnalysisActive, useQueueServerAnalysis, useServerAnalysis } from '../../api/server-analysis';
import { useAnalysis } from '../stage/analysis-context';
import { useStage } from '../stage/stage-context';
import {
  carefulPasses,
  EVERY_NTH_CHOICES,
  formatRoughDuration,
  formatTimeLeft,
  framesToAnalyze,
  roughDurationMs,
} from './analysis-plan';
import { rememberedMsPerFrame, useWholeClipAnalysis, type AnalysisRun } from './use-whole-clip-analysis';

const MODEL_NAMES = { lightning: 'Lightning', thunder: 'Thunder', blazepose: 'BlazePose' } as const;

const everyLabel = (n: number) =>
  n === 1 ? 'Every frame' : `Every ${n}${n === 2 ? 'nd' : n === 3 ? 'rd' : 'th'} frame`;

export function AnalysisPanel() {
  const { clip, frameCount, canEdit } = useStage();
  const { model } = useAnalysis();
  const stored = useClipFrames(clip.id, model);
  const { run, start, cancel } = useWholeClipAnalysis();
  const [everyNth, setEveryNth] = useState(1);
  const [careful, setCareful] = useState(false);
  const selectId = useId();
  const passes = careful ? carefulPasses(clip.athletePick != null) : 1;

  const busy = run.state === 'loading' || run.state === 'running' || run.state === 'cancelling';
  const planned = framesToAnalyze(frameCount, everyNth).length;
  const measured = rememberedMsPerFrame(model, careful);
  const estimate = formatRoughDuration(roughDurationMs(planned, model, measured, passes));
  const carefulFrames = stored.data?.frames.filter((f) => f.careful).length ?? 0;
  const storedFrames = stored.data?.frames.length ?? 0;
  const lastStored = stored.data?.frames.length
    ? Math.max(...stored.data.frames.map((f) => f.frameIndex))
    : null;

  return (
    <section
      aria-labelledby={`${selectId}-title`}
      className="rounded-lg border border-granite-200 bg-white p-4"
    >
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h2 id={`${selectId}-title`} className="font-semibold text-granite-900">
            Whole-clip analysis
          </h2>
          <StoredSummary
            loading={stored.isPending}
            storedFrames={storedFrames}
            frameCount={frameCount}
            model={MODEL_NAMES[model]}
            lastFrame={lastStored}
            carefulFrames={carefulFrames}
          />
        </div>
        <div className={canEdit ? 'flex flex-wrap items-end gap-2' : 'hidden'}>
          <label htmlFor={selectId} className="text-sm text-granite-700">
            <span className="block text-xs font-medium text-granite-600">Frames to analyse</span>
            <select
              id={selectId}
              value={everyNth}
              disabled={busy}
              onChange={(e) => setEveryNth(Number(e.target.value))}
              className="mt-1 h-8 rounded-md border border-granite-200 bg-white px-2 text-sm"
            >
              {EVERY_NTH_CHOICES.map((n) => (
                <option key={n} value={n}>
                  {everyLabel(n)}
                </option>
              ))}
            </select>
          </label>
          <label
            className="flex h-8 items-center gap-1.5 text-sm text-granite-700"
            title="Each frame is read a second time as its mirror image, and the two reads are averaged"
          >
            <input
              type="checkbox"
              checked={careful}
              disabled={busy}
              onChange={(e) => setCareful(e.target.checked)}
              className="h-4 w-4 rounded border-granite-200"
            />
            Careful reading
          </label>
          {!canEdit ? null : busy ? (
            <Button
              variant="secondary"
              size="sm"
              icon={<X aria-hidden="true" className="h-4 w-4" />}
              onClick={cancel}
              disabled={run.state === 'cancelling'}
            >
              Cancel analysis
            </Button>
          ) : (
            <Button
              size="sm"
              icon={<Activity aria-hidden="true" className="h-4 w-4" />}
              onClick={() => void start(everyNth, careful)}
            >
              Analyze whole clip
            </Button>
          )}
        </div>
      </div>

      {!canEdit && storedFrames === 0 && stored.isSuccess ? (
        <p className="mt-3 text-sm text-granite-600">
          No whole-clip analysis yet. A coach of this athlete can run one; the curves and turns then appear
          below.
        </p>
      ) : null}

      {canEdit && !busy && storedFrames === 0 && run.state !== 'failed' && stored.isSuccess ? (
        <p className="mt-3 text-sm text-granite-600">
          No whole-clip analysis yet. <strong className="font-medium">Analyze whole clip</strong> runs the{' '}
          {MODEL_NAMES[model]} model on {planned === frameCount ? 'all' : planned} of the clip&rsquo;s{' '}
          {frameCount} frames on this computer, stores the points and draws the curves and turns below:{' '}
          {estimate}
          {measured ? ' at the pace of the last run here' : ''}. You can cancel at any time and keep what is
          done.
        </p>
      ) : null}

      {canEdit && careful && !busy ? (
        <p className="mt-3 text-sm text-granite-600" data-testid="careful-note">
          <strong className="font-medium">Careful reading</strong> reads each frame a second time as its
          mirror image and averages the two reads, with left and right put back. On test clips it brings the
          points about 7 % nearer the truth with every model, though not every angle gains. It takes about{' '}
          {passes} times as long{clip.athletePick ? ' while following the picked athlete' : ''}: {estimate}{' '}
          for this clip. The frames it stores say they were read carefully.
        </p>
      ) : null}

      {stored.isError ? (
        <Notice tone="error" title="Stored results could not be loaded" className="mt-3">
          <p>{stored.error.message}</p>
          <Button variant="secondary" size="sm" className="mt-2" onClick={() => void stored.refetch()}>
            Try again
          </Button>
        </Notice>
      ) : null}

      <RunStatus run={run} />
      <ServerAnalysisStatus
        canEdit={canEdit}
        complete={frameCount > 0 && storedFrames >= frameCount}
        localBusy={busy}
        careful={careful}
      />
    </section>
  );
}

/**
 * The clip's analysis on the server: queued, running with its progress, done, or failed with why; and
 * for the coach, the button that hands the whole clip to the server instead of this computer.
 */
function ServerAnalysisStatus(props: {
  canEdit: boolean;
  complete: boolean;
  localBusy: boolean;
  careful: boolean;
}) {
  const { clip } = useStage();
  const { model } = useAnalysis();
  const status = useServerAnalysis(clip.id, clip.serverAnalysis);
  const queue = useQueueServerAnalysis(clip.id);
  const current = status.data.serverAnalysis;
  const active = isServerAnalysisActive(current);
  const name =
    (current ? MODEL_NAMES[current.model] : MODEL_NAMES[model]) + (current?.careful ? ', carefully' : '');
  const percent = current && current.total > 0 ? Math.round((current.done / current.total) * 100) : 0;
  return (
    <div className="mt-3 space-y-2" data-testid="server-analysis">
      {current?.status === 'queued' ? (
        <p role="status" className="text-sm text-granite-700">
          {current.heldUntil && Date.parse(current.heldUntil) > Date.now()
            ? `A coach's computer is analysing this clip from the uploaded file; the server waits and reads whatever is left.`
            : `Queued for analysis on the server with ${name}. It runs in the background: you can leave this page, the curves appear here when it is done.`}
        </p>
      ) : null}
      {current?.status === 'running' ? (
        <div className="space-y-1.5">
          <ProgressBar value={percent / 100} label="Analysis on the server" />
          <p role="status" className="text-sm text-granite-700">
            Analysing on the server with {name}: <span className="font-mono tabular-nums">{percent} %</span> (
            <span className="font-mono tabular-nums">
              {current.done} of {current.total}
            </span>{' '}
            frames). The curves fill in as frames are stored.
          </p>
        </div>
      ) : null}
      {current?.status === 'done' ? (
        <p className="text-sm text-granite-600" data-testid="server-analysis-done">
          Analysed on the server with {name} · {formatDateTime(current.updatedAt)}
        </p>
      ) : null}
      {current?.status === 'failed' ? (
        <Notice tone="error" title="The server could not analyse this clip">
          <p>{current.error ?? 'The analysis stopped.'}</p>
          <p className="mt-1">
            Try again below; if it fails again, export the clip from the phone again and upload the new file.
          </p>
        </Notice>
      ) : null}
      {queue.isError ? (
        <Notice tone="error" title="The clip could not be queued">
          <p>{queue.error.message}</p>
        </Notice>
      ) : null}
      {props.canEdit && !active ? (
        <Button
          variant="secondary"
          size="sm"
          icon={<Server aria-hidden="true" className="h-4 w-4" />}
          disabled={queue.isPending || props.localBusy}
          onClick={() =>
            queue.mutate({ model, fromStart: props.complete, ...(props.careful ? { careful: true } : {}) })
          }
        >
          {props.complete ? 'Analyse again on the server' : 'Analyse on the server'}
          {props.careful ? ', carefully' : ''}
        </Button>
      ) : null}
    </div>
  );
}

function StoredSummary(props: {
  loading: boolean;
  storedFrames: number;
  frameCount: number;
  model: string;
  lastFrame: number | null;
  carefulFrames: number;
}) {
  const { clip } = useStage();
  const info = clipExtras(clip).analysis;
  if (props.loading) return <p className="text-sm text-granite-600">Looking for stored results…</p>;
  if (props.storedFrames === 0) return <p className="text-sm text-granite-600">Model: {props.model}</p>;
  return (
    <p className="text-sm text-granite-600" data-testid="stored-analysis">
      <span className="font-mono tabular-nums">{props.storedFrames}</span> of{' '}
      <span className="font-mono tabular-nums">{props.frameCount}</span> frames analysed with {props.model}
      {props.carefulFrames === 0
        ? null
        : props.carefulFrames === props.storedFrames
          ? ', read carefully'
          : `, ${props.carefulFrames} of them read carefully`}
      {info?.updatedAt ? ` · ${formatDateTime(info.updatedAt)}` : ''}
    </p>
  );
}

function RunStatus({ run }: { run: AnalysisRun }) {
  switch (run.state) {
    case 'idle':
      return null;
    case 'loading':
      return (
        <p role="status" className="mt-3 text-sm text-granite-700">
          Loading the {MODEL_NAMES[run.model]} model and opening the video…
        </p>
      );
    case 'running':
    case 'cancelling': {
      const { done, total, remainingMs } = run.progress;
      return (
        <div className="mt-3 space-y-1.5">
          <ProgressBar value={total ? done / total : 0} label="Whole-clip analysis progress" />
          <p role="status" className="flex justify-between text-sm text-granite-700">
            <span>
              <span className="font-mono tabular-nums">
                {done} / {total}
              </span>{' '}
              frames
            </span>
            <span>
              {run.state === 'cancelling'
                ? 'Stopping; keeping the frames done…'
                : formatTimeLeft(remainingMs)}
            </span>
          </p>
        </div>
      );
    }
    case 'done': {
      const { outcome } = run;
      const perFrame = outcome.done ? outcome.elapsedMs / outcome.done : 0;
      return (
        <div className="mt-3 space-y-1.5">
          {outcome.status === 'finished' ? (
            <p
              role="status"
              className="text-sm text-spruce-700"
              data-testid="analysis-finished"
              data-decoder={run.decoder}
              data-backend={run.backend}
            >
              Analysed <span className="font-mono tabular-nums">{outcome.done}</span> frames in{' '}
              <span className="font-mono tabular-nums" data-elapsed-ms={Math.round(outcome.elapsedMs)}>
                {(outcome.elapsedMs / 1000).toFixed(1)}
              </span>{' '}
              s (<span className="font-mono tabular-nums">{Math.round(perFrame)}</span> ms a frame
              {run.decoder === 'webcodecs' ? ', decoded in order' : ', by seeking the video'}
              {run.careful ? ', read carefully' : ''}).
            </p>
          ) : (
            <p role="status" className="text-sm text-granite-700">
              Cancelled after <span className="font-mono tabular-nums">{outcome.done}</span> of{' '}
              <span className="font-mono tabular-nums">{outcome.total}</span> frames; those are stored. Run
              the analysis again to cover the whole clip.
            </p>
          )}
          {outcome.emptyFrames > 0 ? (
            <p className="text-sm text-signal-700">
              No skier was found in {outcome.emptyFrames} frame{outcome.emptyFrames === 1 ? '' : 's'}: the
              curves have gaps there. A closer or larger view of the athlete helps.
            </p>
          ) : null}
        </div>
      );
    }
    case 'failed':
      return (
        <Notice tone="error" title="The analysis stopped" className="mt-3">
          <p>{run.message}</p>
        </Notice>
      );
    case 'handed-over':
      return (
        <Notice tone="info" title="Analysed on the server instead" className="mt-3">
          <p data-testid="handed-over">
            This browser cannot decode this clip&rsquo;s video, so the whole clip{' '}
            {run.queued
              ? 'was handed to the server, which reads it with its own decoder. Its progress shows below and the curves appear here when it is done; you can leave this page meanwhile.'
              : run.message
                ? `could not be handed to the server: ${run.message}`
                : 'is being handed to the server…'}
          </p>
          <p className="mt-1 text-xs text-granite-600">The browser said: {run.reason}</p>
        </Notice>
      );
  }
}
