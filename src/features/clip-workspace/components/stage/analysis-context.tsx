import { createContext, useCallback, useContext, useMemo, useState, type ReactNode } from 'react';
import type { Keypoint, KeypointName, PoseModelName, ReferenceLine, View } from '@shared/keypoints';
import { computeFrameMetrics, type MetricKey } from '@shared/metrics';
import { useToast } from '@/components/ui/toast';
import { errorMessage } from '@/lib/api-client';
import { clipExtras } from '../../api/clip-contract';
import { useToleranceBands, type ToleranceBandDto } from '../../api/get-tolerance-bands';
import { useUpdateClip } from '../../api/update-clip';
import { ExternalStore, useStoreSlice } from '../../lib/external-store';
import { useEffectiveReferenceLine } from './annotations-context';
import { useStage, useStageClock } from './stage-context';

export type { ToleranceBandDto };

/** Where the keypoints of the frame on screen came from. */
export type PoseOrigin = 'live' | 'stored' | 'corrected';

/** Keypoints of one frame before metrics: what detection, the stored analysis or a correction gives. */
export interface FrameKeypoints {
  frameIndex: number;
  timeMs: number;
  model: PoseModelName;
  keypoints: Keypoint[];
  /** Video pixels of the frame the keypoints were found in. */
  width: number;
  height: number;
  origin: PoseOrigin;
  /** Points the coach moved by hand; drawn differently from detected points. */
  correctedPoints: readonly KeypointName[];
  /** Live reads only: where the picked athlete was looked for, and why they were not found. */
  liveRead?: LiveRead;
}

/**
 * Where a live read looked for the athlete when the coach has picked one: at the pick (its frame),
 * around the athlete of a known frame close by, or in the whole picture (no known frame close enough,
 * so someone else may be measured). `lost` says why the athlete was not found in the box.
 */
export type LiveRead =
  | { how: 'pick'; lost: string | null }
  | { how: 'followed'; fromFrame: number; lost: string | null }
  | { how: 'whole-frame'; pickFrame: number };

/**
 * The pose of the frame on screen with its metrics, recomputed in the browser from the keypoints with
 * the clip's view and the current snow line, so a moved point or a new snow line shows at once.
 */
export interface PoseFrameResult extends FrameKeypoints {
  metrics: Record<MetricKey, number | null>;
  reasons: Partial<Record<MetricKey, string>>;
  /** Lowest score among the points each metric used. */
  confidence: Partial<Record<MetricKey, number>>;
}

export type PoseStatus =
  | { state: 'idle' }
  | { state: 'detecting'; frameIndex: number }
  | { state: 'error'; frameIndex: number; message: string };

/** The keypoints behind the frame on screen and how finding them goes; changes per frame in playback. */
export interface FramePoseState {
  frameKeypoints: FrameKeypoints | null;
  poseStatus: PoseStatus;
}

export const correctionKey = (model: PoseModelName, frameIndex: number) => `${model}:${frameIndex}`;

/** Metrics of `keypoints` when they belong to `frame`; null when they are of another frame. */
export function poseResultFor(
  keypoints: FrameKeypoints | null,
  frame: number,
  view: View,
  referenceLine: ReferenceLine | null,
): PoseFrameResult | null {
  if (!keypoints || keypoints.frameIndex !== frame) return null;
  const computed = computeFrameMetrics({
    keypoints: keypoints.keypoints,
    view,
    referenceLine,
    width: keypoints.width,
    height: keypoints.height,
  });
  return {
    ...keypoints,
    metrics: computed.metrics,
    reasons: computed.reasons,
    confidence: computed.confidence,
  };
}

/** The model, the age group's bands, corrections, and the pose of the frame on screen. */
export interface AnalysisState {
  model: PoseModelName;
  setModel(m: PoseModelName): void;
  bands: ToleranceBandDto[];
  /** Corrections made on this page, by correctionKey(model, frame); they win over detection and storage. */
  corrections: ReadonlyMap<string, FrameKeypoints>;
  /** Shows corrected keypoints at once and remembers them for the frame (saving is the caller's). */
  applyCorrection(next: FrameKeypoints): void;
  /** The pose of the frame on screen, outside React state; read it with useFramePose*. */
  framePose: ExternalStore<FramePoseState>;
  setFrameKeypoints(next: FrameKeypoints | null): void;
  setPoseStatus(status: PoseStatus): void;
}

const AnalysisContext = createContext<AnalysisState | null>(null);

export function useAnalysis(): AnalysisState {
  const state = useContext(AnalysisContext);
  if (!state) throw new Error('useAnalysis must be used inside a clip stage (<ClipStageProvider>)');
  return state;
}

/** The keypoints and detection status of the frame on screen. */
export function useFramePoseState(): FramePoseState {
  return useStoreSlice(useAnalysis().framePose, (s) => s);
}

/** The frame on screen measured: keypoints with metrics against the snow line in force, or null. */
export function useCurrentPose(): PoseFrameResult | null {
  const { clip } = useStage();
  const { frameKeypoints } = useFramePoseState();
  const line = useEffectiveReferenceLine();
  // True while the keypoints are of the frame on screen; flips only when that changes.
  const current = useStageClock((s) => frameKeypoints !== null && frameKeypoints.frameIndex === s.frame);
  return useMemo(
    () =>
      current && frameKeypoints
        ? poseResultFor(frameKeypoints, frameKeypoints.frameIndex, clip.view, line)
        : null,
    [current, frameKeypoints, clip.view, line],
  );
}

export function AnalysisProvider({ children }: { children: ReactNode }) {
  const { clip, canEdit } = useStage();
  const toast = useToast();
  const { mutate: patchClip } = useUpdateClip(clip.id);
  const extras = clipExtras(clip);
  const [model, setModelState] = useState<PoseModelName>(extras.defaultModel ?? 'lightning');
  const [corrections, setCorrections] = useState<ReadonlyMap<string, FrameKeypoints>>(new Map());
  const [framePose] = useState(
    () => new ExternalStore<FramePoseState>({ frameKeypoints: null, poseStatus: { state: 'idle' } }),
  );

  const setFrameKeypoints = useCallback(
    (next: FrameKeypoints | null) => framePose.set({ frameKeypoints: next }),
    [framePose],
  );
  const setPoseStatus = useCallback(
    (status: PoseStatus) => {
      const now = framePose.get().poseStatus;
      // An equal status is no change (idle after idle is the common case in playback).
      if (JSON.stringify(now) !== JSON.stringify(status)) framePose.set({ poseStatus: status });
    },
    [framePose],
  );
  const applyCorrection = useCallback(
    (next: FrameKeypoints) => {
      setCorrections((all) => new Map(all).set(correctionKey(next.model, next.frameIndex), next));
      framePose.set({ frameKeypoints: next });
    },
    [framePose],
  );

  const setModel = useCallback(
    (next: PoseModelName) => {
      setModelState(next);
      // A viewer may look through another model on this page; only an editor's choice is stored.
      if (!canEdit) return;
      patchClip(
        { defaultModel: next },
        { onError: (error) => toast.error(`The model choice was not saved: ${errorMessage(error)}`) },
      );
    },
    [canEdit, patchClip, toast],
  );

  const bandsQuery = useToleranceBands(extras.ageGroup?.id ?? null);
  const bands = useMemo(() => bandsQuery.data?.bands ?? [], [bandsQuery.data]);

  const value = useMemo<AnalysisState>(
    () => ({
      model,
      setModel,
      bands,
      corrections,
      applyCorrection,
      framePose,
      setFrameKeypoints,
      setPoseStatus,
    }),
    [model, setModel, bands, corrections, applyCorrection, framePose, setFrameKeypoints, setPoseStatus],
  );

  return <AnalysisContext.Provider value={value}>{children}</AnalysisContext.Provider>;
}
