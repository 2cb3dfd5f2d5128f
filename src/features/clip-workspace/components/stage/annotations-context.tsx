import { createContext, useCallback, useContext, useMemo, useState, type ReactNode } from 'react';
import type { ReferenceLine } from '@shared/keypoints';
import { useToast } from '@/components/ui/toast';
import { errorMessage } from '@/lib/api-client';
import { clipExtras } from '../../api/clip-contract';
import { useUpdateClip } from '../../api/update-clip';
import { useStage, useStageClock } from './stage-context';

/** Overlays a coach can switch on and off. */
export type OverlayKey = 'skeleton' | 'angleArcs' | 'tiltGauge' | 'widthBars';
export type OverlayToggles = Record<OverlayKey, boolean>;
export const ALL_OVERLAYS: OverlayToggles = {
  skeleton: true,
  angleArcs: true,
  tiltGauge: true,
  widthBars: true,
};

/** What is drawn over the frame besides the pose: the snow line, the overlay choice, drawing mode. */
export interface AnnotationsState {
  referenceLine: ReferenceLine | null;
  /** Persists via PATCH /api/clips/:id. */
  setReferenceLine(line: ReferenceLine | null): void;
  /** A line being dragged: metrics follow it at once, nothing is saved. Null ends the preview. */
  linePreview: ReferenceLine | null;
  previewReferenceLine(line: ReferenceLine | null): void;
  /** Lines set on single frames; each replaces the clip's line for its own frame. */
  frameReferenceLines: ReadonlyMap<number, ReferenceLine>;
  /** Sets (or, with null, removes) one frame's own snow line; persists via PATCH frameReferenceLines. */
  setFrameReferenceLine(frameIndex: number, line: ReferenceLine | null): void;
  overlays: OverlayToggles;
  setOverlay(key: OverlayKey, on: boolean): void;
  /** While on, the snow line's two handles can be dragged on the stage. */
  snowLineEditing: boolean;
  setSnowLineEditing(on: boolean): void;
  /** What a dragged snow line is saved for: the whole clip, or only the frame on screen. */
  snowLineScope: 'clip' | 'frame';
  setSnowLineScope(scope: 'clip' | 'frame'): void;
  /** Draw-on-frame mode: while active, the pose overlay ignores pointer input. */
  drawingActive: boolean;
  setDrawingActive(v: boolean): void;
}

const AnnotationsContext = createContext<AnnotationsState | null>(null);

export function useAnnotations(): AnnotationsState {
  const state = useContext(AnnotationsContext);
  if (!state) throw new Error('useAnnotations must be used inside a clip stage (<ClipStageProvider>)');
  return state;
}

/** The snow line of one frame: the preview while dragging, else the frame's own, else the clip's. */
export function lineInForce(a: AnnotationsState, frame: number): ReferenceLine | null {
  return a.linePreview ?? a.frameReferenceLines.get(frame) ?? a.referenceLine;
}

/** The line the numbers on screen use; re-renders only when the line in force changes. */
export function useEffectiveReferenceLine(): ReferenceLine | null {
  const annotations = useAnnotations();
  return useStageClock((s) => lineInForce(annotations, s.frame));
}

/** Whether the frame on screen has a snow line of its own. */
export function useFrameHasOwnLine(): boolean {
  const { frameReferenceLines } = useAnnotations();
  return useStageClock((s) => frameReferenceLines.has(s.frame));
}

interface AnnotationsProviderProps {
  /** Overlays shown at first; a read-only page may show fewer. */
  initialOverlays?: OverlayToggles;
  children: ReactNode;
}

export function AnnotationsProvider({ initialOverlays = ALL_OVERLAYS, children }: AnnotationsProviderProps) {
  const { clip } = useStage();
  const toast = useToast();
  const { mutate: patchClip } = useUpdateClip(clip.id);
  const [referenceLine, setReferenceLineState] = useState<ReferenceLine | null>(
    clipExtras(clip).referenceLine ?? null,
  );
  const [frameReferenceLines, setFrameLines] = useState<ReadonlyMap<number, ReferenceLine>>(
    () => new Map((clip.frameReferenceLines ?? []).map((f) => [f.frameIndex, f.referenceLine])),
  );
  const [linePreview, previewReferenceLine] = useState<ReferenceLine | null>(null);
  const [overlays, setOverlays] = useState<OverlayToggles>(initialOverlays);
  const [snowLineEditing, setSnowLineEditing] = useState(false);
  const [snowLineScope, setSnowLineScope] = useState<'clip' | 'frame'>('clip');
  const [drawingActive, setDrawingActive] = useState(false);

  const setOverlay = useCallback(
    (key: OverlayKey, on: boolean) => setOverlays((all) => ({ ...all, [key]: on })),
    [],
  );

  const setReferenceLine = useCallback(
    (line: ReferenceLine | null) => {
      setReferenceLineState(line);
      patchClip(
        { referenceLine: line },
        {
          // The line stays on screen so the coach's work is not lost; the message says it is not stored.
          onError: (error) =>
            toast.error(
              `The snow line was not saved: ${errorMessage(error)}. It is used on this page only; move a handle to try again.`,
            ),
        },
      );
    },
    [patchClip, toast],
  );

  const setFrameReferenceLine = useCallback(
    (frameIndex: number, line: ReferenceLine | null) => {
      setFrameLines((all) => {
        const next = new Map(all);
        if (line) next.set(frameIndex, line);
        else next.delete(frameIndex);
        return next;
      });
      patchClip(
        { frameReferenceLines: [{ frameIndex, referenceLine: line }] },
        {
          onError: (error) =>
            toast.error(
              `The snow line of frame ${frameIndex} was not saved: ${errorMessage(error)}. It is used on this page only; move a handle to try again.`,
            ),
        },
      );
    },
    [patchClip, toast],
  );

  const value = useMemo<AnnotationsState>(
    () => ({
      referenceLine,
      setReferenceLine,
      linePreview,
      previewReferenceLine,
      frameReferenceLines,
      setFrameReferenceLine,
      overlays,
      setOverlay,
      snowLineEditing,
      setSnowLineEditing,
      snowLineScope,
      setSnowLineScope,
      drawingActive,
      setDrawingActive,
    }),
    [
      referenceLine,
      setReferenceLine,
      linePreview,
      frameReferenceLines,
      setFrameReferenceLine,
      overlays,
      setOverlay,
      snowLineEditing,
      snowLineScope,
      drawingActive,
    ],
  );

  return <AnnotationsContext.Provider value={value}>{children}</AnnotationsContext.Provider>;
}
