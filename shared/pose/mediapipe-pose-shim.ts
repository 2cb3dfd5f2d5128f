// Stand-in for '@mediapipe/pose' in browser bundles (aliased in vite.config.ts). pose-detection's ES
// bundle imports `Pose` from it for its "mediapipe" runtime, but that package is a plain script, not an
// ES module, so production builds fail on the import. Stanceline uses only the "tfjs" runtime with
// the models in models/, so the MediaPipe runtime is never constructed.
export class Pose {
  constructor() {
    throw new Error('the MediaPipe pose runtime is not bundled; use the tfjs runtime');
  }
}
