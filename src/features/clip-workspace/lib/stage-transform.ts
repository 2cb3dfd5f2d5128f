// The stage is the box the video sits in. The video is fitted inside it (letterboxed, like
// object-fit: contain) and then zoomed and panned: stage = pan + zoom * (fitOffset + fitScale * video).
// Overlays stay in the untransformed stage box and draw through this mapping, so lines stay sharp at
// any zoom.

export type Point = [number, number];

export interface Size {
  width: number;
  height: number;
}

export interface ViewTransform {
  /** Magnification on top of the fit; 1 = whole frame visible. */
  zoom: number;
  /** Translation in stage CSS pixels, applied after zoom. */
  panX: number;
  panY: number;
}

export const IDENTITY_VIEW: ViewTransform = { zoom: 1, panX: 0, panY: 0 };
export const MIN_ZOOM = 1;
export const MAX_ZOOM = 8;

export interface Fit {
  scale: number;
  offsetX: number;
  offsetY: number;
}

/** Scale and offset that fit a video of `video` pixels inside `stage` CSS pixels, centred. */
export function fitContain(stage: Size, video: Size): Fit {
  if (video.width <= 0 || video.height <= 0 || stage.width <= 0 || stage.height <= 0) {
    return { scale: 1, offsetX: 0, offsetY: 0 };
  }
  const scale = Math.min(stage.width / video.width, stage.height / video.height);
  return {
    scale,
    offsetX: (stage.width - video.width * scale) / 2,
    offsetY: (stage.height - video.height * scale) / 2,
  };
}

export function videoToStagePoint(p: Point, fit: Fit, view: ViewTransform): Point {
  return [
    view.panX + view.zoom * (fit.offsetX + fit.scale * p[0]),
    view.panY + view.zoom * (fit.offsetY + fit.scale * p[1]),
  ];
}

export function stageToVideoPoint(p: Point, fit: Fit, view: ViewTransform): Point {
  return [
    ((p[0] - view.panX) / view.zoom - fit.offsetX) / fit.scale,
    ((p[1] - view.panY) / view.zoom - fit.offsetY) / fit.scale,
  ];
}

/** CSS pixels on the stage per video pixel. */
export function stagePixelsPerVideoPixel(fit: Fit, view: ViewTransform): number {
  return fit.scale * view.zoom;
}

/**
 * Keeps the zoomed content covering the stage: at zoom z the content spans z times the stage, so the
 * pan may move it by at most (z - 1) * stage size, never leaving an empty band.
 */
export function clampView(view: ViewTransform, stage: Size): ViewTransform {
  const zoom = Math.min(MAX_ZOOM, Math.max(MIN_ZOOM, view.zoom));
  const minX = -(zoom - 1) * stage.width;
  const minY = -(zoom - 1) * stage.height;
  return {
    zoom,
    // "+ 0" turns -0 into 0 so an unpanned view compares equal to the identity.
    panX: Math.min(0, Math.max(minX, view.panX)) + 0,
    panY: Math.min(0, Math.max(minY, view.panY)) + 0,
  };
}

/** Zooms to `nextZoom` keeping the stage point `anchor` over the same spot of the frame. */
export function zoomAround(view: ViewTransform, nextZoom: number, anchor: Point, stage: Size): ViewTransform {
  const zoom = Math.min(MAX_ZOOM, Math.max(MIN_ZOOM, nextZoom));
  // The content point under the anchor, c = (anchor - pan) / zoom, must stay under the anchor.
  const cx = (anchor[0] - view.panX) / view.zoom;
  const cy = (anchor[1] - view.panY) / view.zoom;
  return clampView({ zoom, panX: anchor[0] - zoom * cx, panY: anchor[1] - zoom * cy }, stage);
}

/** The CSS transform that puts the video element where `videoToStagePoint` says it is. */
export function cssTransform(view: ViewTransform): string {
  return `translate(${view.panX}px, ${view.panY}px) scale(${view.zoom})`;
}
