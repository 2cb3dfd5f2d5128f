import * as tf from '@tensorflow/tfjs-core';
import '@tensorflow/tfjs-backend-wasm';
import { createPoseDetector, type PoseDetector } from '@shared/pose/pose-detector';
import type { PoseModelName } from '@shared/keypoints';
import { defaultModelsDir, fileModelSource } from './model-files';

// In Node the WASM backend finds its .wasm files next to its own module; no network, no native build.
export const NODE_BACKENDS = ['wasm'] as const;

export interface NodeDetectorOptions {
  modelsDir?: string;
  warmup?: boolean;
  refineColdStart?: boolean;
  minPoseScore?: number;
}

/** The shared detector on the WASM backend with model files read from disk. */
export function createNodePoseDetector(
  model: PoseModelName,
  options: NodeDetectorOptions = {},
): Promise<PoseDetector> {
  return createPoseDetector({
    tf,
    model,
    source: fileModelSource(options.modelsDir ?? defaultModelsDir()),
    backends: NODE_BACKENDS,
    warmup: options.warmup,
    refineColdStart: options.refineColdStart,
    minPoseScore: options.minPoseScore,
  });
}

const cache = new Map<PoseModelName, Promise<PoseDetector>>();

/** One loaded detector per model for the life of the process (loading costs 0.1–0.5 s). */
export function getNodePoseDetector(model: PoseModelName): Promise<PoseDetector> {
  let detector = cache.get(model);
  if (!detector) {
    detector = createNodePoseDetector(model);
    detector.catch(() => cache.delete(model));
    cache.set(model, detector);
  }
  return detector;
}

export { tf };
