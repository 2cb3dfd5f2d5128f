import { useCallback, useEffect, useRef, useState } from 'react';
import type { PoseModelName } from '@shared/keypoints';
import { getPoseClient } from '@/lib/pose-client';
import { useAnalysisUpload } from '../../api/post-clip-frames';
import { useQueueServerAnalysis } from '../../api/server-analysis';
import { useAnalysis } from '../stage/analysis-context';
import { useAnnotations } from '../stage/annotations-context';
import { useStage } from '../stage/stage-context';
import { framesToAnalyze } from './analysis-plan';
import { DecodedFrameSource, WebCodecsUnavailableError } from './decoded-frames';
import { FrameGrabber, VideoUndecodableError, type FrameSource } from './frame-grabber';
import {
  runWholeClip,
  WholeClipError,
  type WholeClipOutcome,
  type WholeClipProgress,
} from './run-whole-clip';

export type AnalysisRun =
  | { state: 'idle' }
  | { state: 'loading'; model: PoseModelName }
  | { state: 'running'; model: PoseModelName; progress: WholeClipProgress }
  | { state: 'cancelling'; model: PoseModelName; progress: WholeClipProgress }
  | {
      state: 'done';
      model: PoseModelName;
      outcome: WholeClipOutcome;
      mismatches: number;
      /** How the frames were decoded: WebCodecs in order, or seeking a hidden video. */
      decoder: FrameSource['kind'];
      /** The pose worker's TensorFlow.js backend (webgl, wasm or cpu). */
      backend: string;
      careful: boolean;
    }
  | { state: 'failed'; model: PoseModelName; message: string; stored: number }
  /** This browser cannot decode the clip: the whole clip went to the server instead. */
  | { state: 'handed-over'; model: PoseModelName; reason: string; queued: boolean; message?: string };

const RATE_KEY = (model: PoseModelName, careful: boolean) =>
  `stanceline.analysis.ms-per-frame.${model}${careful ? '.careful' : ''}`;
/** 'seek' forces the seek-based grabbing (for comparing the two decoders); anything else: WebCodecs first. */
const DECODER_KEY = 'stanceline.analysis.decoder';

function preferredDecoder(): FrameSource['kind'] {
  try {
    return window.localStorage.getItem(DECODER_KEY) === 'seek' ? 'seek' : 'webcodecs';
  } catch {
    return 'webcodecs';
  }
}

/** The last measured whole-clip pace on this computer, for the estimate before a run. */
export function rememberedMsPerFrame(model: PoseModelName, careful = false): number | null {
  try {
    const value = Number(window.localStorage.getItem(RATE_KEY(model, careful)));
    return Number.isFinite(value) && value > 0 ? value : null;
  } catch {
    return null;
  }
}

function remember(model: PoseModelName, careful: boolean, msPerFrame: number): void {
  try {
    window.localStorage.setItem(RATE_KEY(model, careful), String(Math.round(msPerFrame)));
  } catch {
    // Private windows may refuse storage; the estimate then falls back to the published figures.
  }
}

function describe(error: unknown): string {
  if (error instanceof WholeClipError) return error.message;
  const text = error instanceof Error ? error.message : String(error);
  return `The analysis could not start: ${text}. Check that the clip plays above, then try again.`;
}

/** Whole-clip analysis of the workspace's clip with the workspace's model, view and snow line. */
export function useWholeClipAnalysis() {
  const { clip, fps, frameCount, mediaSrc } = useStage();
  const { model: chosenModel } = useAnalysis();
  const { referenceLine } = useAnnotations();
  const upload = useAnalysisUpload(clip.id);
  const queueServer = useQueueServerAnalysis(clip.id);
  const [run, setRun] = useState<AnalysisRun>({ state: 'idle' });
  const controller = useRef<AbortController | null>(null);

  // Leaving the page stops the run; what was posted stays stored.
  useEffect(() => () => controller.current?.abort(), []);

  const start = useCallback(
    async (everyNth: number, careful = false) => {
      controller.current?.abort();
      const abort = new AbortController();
      controller.current = abort;
      const model = chosenModel;
      // With a picked athlete the run starts at the pick and follows them: earlier frames are left out.
      const pick = clip.athletePick ?? null;
      const every = framesToAnalyze(frameCount, everyNth);
      const plan = {
        frames: pick ? [pick.frameIndex, ...every.filter((f) => f > pick.frameIndex)] : every,
        pick,
        fps: fps,
        model,
        view: clip.view,
        facing: clip.facing,
        referenceLine: referenceLine,
        careful,
      };
      let grabber: FrameSource =
        preferredDecoder() === 'seek' ? new FrameGrabber(mediaSrc, fps) : new DecodedFrameSource(mediaSrc);
      const pose = getPoseClient();
      setRun({ state: 'loading', model });
      try {
        const opened = grabber.open(abort.signal).catch(async (error: unknown) => {
          // WebCodecs cannot read this file here: grab the frames by seeking a hidden video instead.
          if (!(error instanceof WebCodecsUnavailableError)) throw error;
          grabber.close();
          grabber = new FrameGrabber(mediaSrc, fps);
          await grabber.open(abort.signal);
        });
        const [, loaded] = await Promise.all([opened, pose.load(model)]);
        // A whole clip is one sequence: start tracking afresh, then keep it frame to frame.
        await pose.reset();
        const outcome = await runWholeClip(
          plan,
          {
            grab: (i, signal) => grabber.grab(i, signal),
            detect: (bitmap, req) => pose.detect(bitmap, req),
            postBatch: upload.postBatch,
            now: () => performance.now(),
            discard: (bitmap) => bitmap.close(),
          },
          {
            signal: abort.signal,
            onProgress: (progress) =>
              setRun((r) =>
                r.state === 'cancelling' ? { ...r, progress } : { state: 'running', model, progress },
              ),
          },
        );
        if (outcome.done > 0 && outcome.status === 'finished')
          remember(model, careful, outcome.elapsedMs / outcome.done);
        setRun({
          state: 'done',
          model,
          outcome,
          mismatches: grabber.mismatches,
          decoder: grabber.kind,
          backend: loaded.backend,
          careful,
        });
      } catch (error) {
        if (error instanceof DOMException && error.name === 'AbortError') {
          setRun({ state: 'idle' });
        } else if (error instanceof VideoUndecodableError) {
          // Not an error for the coach: the server reads the same file with its own decoder.
          setRun({ state: 'handed-over', model, reason: error.message, queued: false });
          try {
            await queueServer.mutateAsync({ model });
            setRun({ state: 'handed-over', model, reason: error.message, queued: true });
          } catch (queueError) {
            setRun({
              state: 'handed-over',
              model,
              reason: error.message,
              queued: false,
              message: queueError instanceof Error ? queueError.message : String(queueError),
            });
          }
        } else {
          setRun({
            state: 'failed',
            model,
            message: describe(error),
            stored: error instanceof WholeClipError ? error.stored : 0,
          });
        }
      } finally {
        grabber.close();
        // The detector followed this clip's frames; the player's next single frame starts fresh.
        await pose.reset().catch(() => undefined);
        await upload.finish();
        if (controller.current === abort) controller.current = null;
      }
    },
    [
      upload,
      queueServer,
      mediaSrc,
      fps,
      frameCount,
      chosenModel,
      referenceLine,
      clip.view,
      clip.facing,
      clip.athletePick,
    ],
  );

  const cancel = useCallback(() => {
    controller.current?.abort();
    setRun((r) => (r.state === 'running' ? { ...r, state: 'cancelling' } : r));
  }, []);

  return { run, start, cancel };
}
