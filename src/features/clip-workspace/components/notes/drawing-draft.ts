import { useSyncExternalStore } from 'react';
import { DRAWING_COLORS } from './draw-drawing';
import {
  appendStrokePoint,
  emptyDrawing,
  manualAngleDegrees,
  type Drawing,
  type DrawingTool,
  type VideoPoint,
} from './drawing-geometry';

/** The element under the pointer while it is being drawn. */
export type DraftElement =
  | { kind: 'stroke'; points: VideoPoint[] }
  | { kind: 'arrow'; from: VideoPoint; to: VideoPoint }
  /** Angle tool: drag the first arm to the vertex, then place the second arm's end with a click. */
  | {
      kind: 'angle';
      a: VideoPoint;
      vertex: VideoPoint;
      b: VideoPoint | null;
      phase: 'first-arm' | 'second-arm';
    };

type Part = keyof Drawing;

export interface DraftState {
  clipId: string | null;
  /** The frame the drawing is pinned to; null until the first mark. */
  frameIndex: number | null;
  tool: DrawingTool;
  color: string;
  drawing: Drawing;
  /** Which list each finished element went to, oldest first, for Undo. */
  order: Part[];
  active: DraftElement | null;
}

/** Freehand samples closer than this (video pixels) add nothing visible. */
const MIN_STROKE_STEP = 1.5;

const initial = (clipId: string | null, tool: DrawingTool, color: string): DraftState => ({
  clipId,
  frameIndex: null,
  tool,
  color,
  drawing: emptyDrawing(),
  order: [],
  active: null,
});

const same = (p: VideoPoint, q: VideoPoint) => p[0] === q[0] && p[1] === q[1];

function finish(s: DraftState, element: DraftElement): DraftState {
  const d = s.drawing;
  const done = (part: Part, drawing: Drawing): DraftState => ({
    ...s,
    active: null,
    drawing,
    order: [...s.order, part],
  });
  switch (element.kind) {
    case 'stroke':
      return done('strokes', { ...d, strokes: [...d.strokes, { points: element.points, color: s.color }] });
    case 'arrow':
      if (same(element.from, element.to)) return { ...s, active: null };
      return done('arrows', {
        ...d,
        arrows: [...d.arrows, { from: element.from, to: element.to, color: s.color }],
      });
    case 'angle': {
      const degrees = element.b ? manualAngleDegrees(element.a, element.vertex, element.b) : null;
      if (!element.b || degrees === null) return { ...s, active: null };
      const angle = {
        a: element.a,
        vertex: element.vertex,
        b: element.b,
        degrees: Math.round(degrees * 10) / 10,
      };
      return done('angles', { ...d, angles: [...d.angles, angle] });
    }
  }
}

/**
 * The note being drawn. The drawing layer (over the video) and the notes panel (beside it) are
 * mounted apart, so the draft lives in one small store both subscribe to. Transitions are plain
 * functions of the state, so the tools can be tested without a canvas.
 */
export function createDraftStore() {
  let state = initial(null, 'freehand', DRAWING_COLORS[0].value);
  const listeners = new Set<() => void>();
  const set = (next: DraftState) => {
    state = next;
    listeners.forEach((l) => l());
  };

  return {
    get: () => state,
    subscribe(listener: () => void): () => void {
      listeners.add(listener);
      return () => {
        listeners.delete(listener);
      };
    },
    /** Starts over (another clip, or the note was saved); keeps the chosen tool and colour. */
    reset(clipId: string | null) {
      set(initial(clipId, state.tool, state.color));
    },
    setTool(tool: DrawingTool) {
      set({ ...state, tool, active: null });
    },
    setColor(color: string) {
      set({ ...state, color });
    },
    /** Pointer pressed at `p` (video pixels) while frame `frameIndex` is shown. */
    press(p: VideoPoint, frameIndex: number) {
      const s = { ...state, frameIndex: state.frameIndex ?? frameIndex };
      const active = s.active;
      if (active?.kind === 'angle' && active.phase === 'second-arm') set(finish(s, { ...active, b: p }));
      else if (s.tool === 'freehand') set({ ...s, active: { kind: 'stroke', points: [p] } });
      else if (s.tool === 'arrow') set({ ...s, active: { kind: 'arrow', from: p, to: p } });
      else set({ ...s, active: { kind: 'angle', a: p, vertex: p, b: null, phase: 'first-arm' } });
    },
    /** Pointer moved, pressed or not. */
    move(p: VideoPoint) {
      const active = state.active;
      if (!active) return;
      if (active.kind === 'stroke') {
        const points = appendStrokePoint(active.points, p, MIN_STROKE_STEP);
        if (points !== active.points) set({ ...state, active: { ...active, points } });
      } else if (active.kind === 'arrow') set({ ...state, active: { ...active, to: p } });
      else if (active.phase === 'first-arm') set({ ...state, active: { ...active, vertex: p } });
      else set({ ...state, active: { ...active, b: p } });
    },
    release(p: VideoPoint) {
      const active = state.active;
      if (!active) return;
      if (active.kind === 'stroke') {
        set(finish(state, { ...active, points: appendStrokePoint(active.points, p, MIN_STROKE_STEP) }));
      } else if (active.kind === 'arrow') set(finish(state, { ...active, to: p }));
      else if (active.phase === 'first-arm') {
        // A click without a drag gives no first arm: nothing to continue.
        if (same(p, active.a)) set({ ...state, active: null });
        else set({ ...state, active: { ...active, vertex: p, b: null, phase: 'second-arm' } });
      }
    },
    cancelElement() {
      if (state.active) set({ ...state, active: null });
    },
    /** Removes the most recently finished element. */
    undo() {
      const part = state.order[state.order.length - 1];
      if (!part) return;
      const d = state.drawing;
      const drawing: Drawing = { ...d, [part]: d[part].slice(0, -1) };
      const order = state.order.slice(0, -1);
      set({ ...state, drawing, order, frameIndex: order.length === 0 ? null : state.frameIndex });
    },
    clear() {
      set({ ...state, drawing: emptyDrawing(), order: [], active: null, frameIndex: null });
    },
  };
}

export type DraftStore = ReturnType<typeof createDraftStore>;

/** The one draft of the workspace page. */
export const drawingDraft = createDraftStore();

export function useDrawingDraft(): DraftState {
  return useSyncExternalStore(drawingDraft.subscribe, drawingDraft.get, drawingDraft.get);
}
