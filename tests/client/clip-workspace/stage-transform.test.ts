import { describe, expect, it } from 'vitest';
import {
  clampView,
  cssTransform,
  fitContain,
  IDENTITY_VIEW,
  stageToVideoPoint,
  videoToStagePoint,
  zoomAround,
} from '@/features/clip-workspace/lib/stage-transform';

// Worked by hand: a 1920×1080 video in an 800×600 stage fits at scale min(800/1920, 600/1080) =
// min(0.41667, 0.55556) = 0.41667, drawn 800×450, letterboxed by (600 − 450)/2 = 75 px top and bottom.
const stage = { width: 800, height: 600 };
const video = { width: 1920, height: 1080 };

describe('video ↔ stage transform', () => {
  it('fits the video like object-fit: contain', () => {
    const fit = fitContain(stage, video);
    expect(fit.scale).toBeCloseTo(800 / 1920, 12);
    expect(fit.offsetX).toBeCloseTo(0, 12);
    expect(fit.offsetY).toBeCloseTo(75, 12);
    // A portrait phone clip 1080×1920 in the same stage: scale 600/1920 = 0.3125, width 337.5, offset 231.25.
    const portrait = fitContain(stage, { width: 1080, height: 1920 });
    expect(portrait.scale).toBeCloseTo(0.3125, 12);
    expect(portrait.offsetX).toBeCloseTo(231.25, 12);
    expect(portrait.offsetY).toBeCloseTo(0, 12);
  });

  it('maps corners and centre without zoom', () => {
    const fit = fitContain(stage, video);
    expect(videoToStagePoint([0, 0], fit, IDENTITY_VIEW)).toEqual([0, 75]);
    const [x, y] = videoToStagePoint([1920, 1080], fit, IDENTITY_VIEW);
    expect(x).toBeCloseTo(800, 9);
    expect(y).toBeCloseTo(525, 9);
    const [cx, cy] = videoToStagePoint([960, 540], fit, IDENTITY_VIEW);
    expect(cx).toBeCloseTo(400, 9);
    expect(cy).toBeCloseTo(300, 9);
  });

  it('applies zoom then pan, and inverts exactly', () => {
    const fit = fitContain(stage, video);
    const view = { zoom: 2, panX: -400, panY: -300 };
    // Video centre → fitted (400, 300) → zoomed (800, 600) → panned (400, 300): still the stage centre.
    const [cx, cy] = videoToStagePoint([960, 540], fit, view);
    expect(cx).toBeCloseTo(400, 9);
    expect(cy).toBeCloseTo(300, 9);
    // Video (0, 0) → fitted (0, 75) → zoomed (0, 150) → panned (−400, −150): off the stage.
    const [ox, oy] = videoToStagePoint([0, 0], fit, view);
    expect(ox).toBeCloseTo(-400, 9);
    expect(oy).toBeCloseTo(-150, 9);
    for (const p of [
      [0, 0],
      [123.4, 987.6],
      [1920, 1080],
    ] as [number, number][]) {
      const back = stageToVideoPoint(videoToStagePoint(p, fit, view), fit, view);
      expect(back[0]).toBeCloseTo(p[0], 9);
      expect(back[1]).toBeCloseTo(p[1], 9);
    }
  });

  it('zooms around the pointer so the point under it stays put', () => {
    const fit = fitContain(stage, video);
    const anchor: [number, number] = [600, 200];
    const under = stageToVideoPoint(anchor, fit, IDENTITY_VIEW);
    const zoomed = zoomAround(IDENTITY_VIEW, 3, anchor, stage);
    // pan = anchor − 3 · anchor = (−1200, −400), inside the limits (−1600, −1200).
    expect(zoomed).toEqual({ zoom: 3, panX: -1200, panY: -400 });
    const after = videoToStagePoint(under, fit, zoomed);
    expect(after[0]).toBeCloseTo(600, 9);
    expect(after[1]).toBeCloseTo(200, 9);
  });

  it('keeps the zoomed frame covering the stage', () => {
    // At zoom 2 the content is 1600×1200, so the pan is limited to [−800, 0] × [−600, 0].
    expect(clampView({ zoom: 2, panX: 50, panY: -900 }, stage)).toEqual({ zoom: 2, panX: 0, panY: -600 });
    // Zoom is held to 1..8, and at zoom 1 no pan is possible.
    expect(clampView({ zoom: 0.5, panX: -10, panY: 10 }, stage)).toEqual({ zoom: 1, panX: 0, panY: 0 });
    expect(clampView({ zoom: 20, panX: 0, panY: 0 }, stage).zoom).toBe(8);
  });

  it('writes the matching CSS transform', () => {
    expect(cssTransform({ zoom: 2, panX: -400, panY: -300 })).toBe('translate(-400px, -300px) scale(2)');
  });
});
