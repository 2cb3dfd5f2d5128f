/**
 * Loads the pose pipeline lazily, so keypoint JSON files never pay for the model runtime
 * (tfjs, the WASM backend and the model weights load only when an image or video is given).
 */
export function loadMediaModule() {
  return import('../pose/analyze-media');
}
