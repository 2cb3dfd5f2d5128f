import { describe, expect, it } from 'vitest';
import { createDraftStore } from '@/features/clip-workspace/components/notes/drawing-draft';

describe('drawing draft', () => {
  it('draws a freehand stroke in the chosen colour and pins the draft to the frame of the first mark', () => {
    const draft = createDraftStore();
    draft.reset('clip-1');
    draft.setColor('#d8452f');
    draft.press([10, 10], 42);
    draft.move([10.5, 10]); // 0.5 px: below the 1.5 px step, dropped
    draft.move([20, 10]);
    draft.release([30, 10]);
    const s = draft.get();
    expect(s.frameIndex).toBe(42);
    expect(s.drawing.strokes).toEqual([
      {
        points: [
          [10, 10],
          [20, 10],
          [30, 10],
        ],
        color: '#d8452f',
      },
    ]);
    // Marks on a later frame still belong to the frame the drawing started on.
    draft.press([1, 1], 50);
    expect(draft.get().frameIndex).toBe(42);
  });

  it('draws an arrow by dragging and ignores one of zero length', () => {
    const draft = createDraftStore();
    draft.setTool('arrow');
    draft.press([0, 0], 3);
    draft.release([0, 0]);
    expect(draft.get().drawing.arrows).toEqual([]);
    draft.press([0, 0], 3);
    draft.move([5, 5]);
    draft.release([40, 30]);
    expect(draft.get().drawing.arrows).toEqual([{ from: [0, 0], to: [40, 30], color: '#f5b443' }]);
  });

  it('measures an angle: drag the first arm to the vertex, then click the second arm', () => {
    const draft = createDraftStore();
    draft.setTool('angle');
    // First arm from (200, 100) to the vertex (100, 100); second arm to (100, 0).
    draft.press([200, 100], 7);
    draft.move([150, 100]);
    draft.release([100, 100]);
    expect(draft.get().active).toMatchObject({ kind: 'angle', phase: 'second-arm', vertex: [100, 100] });
    draft.move([100, 20]);
    draft.press([100, 0], 7);
    // Worked example: arms (+100, 0) and (0, −100) from the vertex are perpendicular: 90°.
    expect(draft.get().drawing.angles).toEqual([
      { a: [200, 100], vertex: [100, 100], b: [100, 0], degrees: 90 },
    ]);
    expect(draft.get().active).toBeNull();
  });

  it('rounds the angle to tenths of a degree', () => {
    const draft = createDraftStore();
    draft.setTool('angle');
    // Arms (1, 0) and (1, 2): atan(2) = 63.4349…° → 63.4.
    draft.press([11, 10], 0);
    draft.release([10, 10]);
    draft.press([11, 12], 0);
    expect(draft.get().drawing.angles[0].degrees).toBe(63.4);
  });

  it('undoes the newest element first, across kinds, and unpins an empty draft', () => {
    const draft = createDraftStore();
    draft.press([0, 0], 9);
    draft.release([10, 0]);
    draft.setTool('arrow');
    draft.press([0, 0], 9);
    draft.release([10, 10]);
    draft.undo();
    expect(draft.get().drawing.arrows).toHaveLength(0);
    expect(draft.get().drawing.strokes).toHaveLength(1);
    draft.undo();
    expect(draft.get().drawing.strokes).toHaveLength(0);
    expect(draft.get().frameIndex).toBeNull();
    draft.undo();
    expect(draft.get().order).toEqual([]);
  });

  it('tells subscribers about changes and keeps tool and colour over a reset', () => {
    const draft = createDraftStore();
    let calls = 0;
    const stop = draft.subscribe(() => calls++);
    draft.setTool('angle');
    draft.setColor('#ffffff');
    draft.reset('clip-2');
    stop();
    draft.setTool('freehand');
    expect(calls).toBe(3);
    expect(draft.get()).toMatchObject({
      clipId: 'clip-2',
      tool: 'freehand',
      color: '#ffffff',
      frameIndex: null,
    });
  });
});
