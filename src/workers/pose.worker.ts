/// <reference lib="webworker" />
// Pose worker: ImageBitmaps in, keypoints + metrics + timings out. Speaks the discriminated-union
// protocol declared in src/lib/pose-client.ts; only src/lib/pose-client.ts talks to it.
// Frames are handled one at a time in arrival order; a cancelled queue's waiting frames are dropped.

import * as tf from '@tensorflow/tfjs-core';
import '@tensorflow/tfjs-backend-cpu';
import '@tensorflow/tfjs-backend-webgl';
import { setWasmPaths } from '@tensorflow/tfjs-backend-wasm';
import type { Keypoint, PoseModelName } from '@shared/keypoints';
import { computeFrameMetrics, emptyFrameMetrics } from '@shared/metrics';
import { orientKeypoints, scaleKeypoints } from '@shared/pose/keypoint-mapping';
import { AthleteFollower } from '@shared/pose/follow';
import { createPoseDetector, type PixelBox, type PoseDetector } from '@shared/pose/pose-detector';
import { modelUrl } from '@shared/pose/pose-models';
import type { PoseFrameResult, WorkerConfig, WorkerRequest, WorkerResponse } from '@/lib/pose-client';

const scope = self as unknown as DedicatedWorkerGlobalScope;

let config: WorkerConfig = {
  modelBase: '/models',
  wasmBase: '/wasm/',
  backends: ['webgl', 'wasm', 'cpu'],
  allowSoftwareWebgl: false,
  maxSide: 1280,
};
const detectors = new Map<PoseModelName, Promise<PoseDetector>>();
const cancelledQueues = new Set<string>();
let chain: Promise<void> = Promise.resolve();
let canvas: OffscreenCanvas | null = null;
/** The athlete being followed through a clip's frames (a pick starts it, `reset` ends it). */
let follower: AthleteFollower | null = null;

function post(message: WorkerResponse, transfer: Transferable[] = []): void {
  scope.postMessage(message, transfer);
}

/**
 * WebGL drawn in software (SwiftShader, llvmpipe: a browser without a usable GPU) runs these models
 * 15-50 times slower than WASM (measured in headless Chromium), so it is skipped unless the
 * configuration allows it.
 */
function softwareWebgl(): string | null {
  try {
    const gl =
      new OffscreenCanvas(1, 1).getContext('webgl2') ?? new OffscreenCanvas(1, 1).getContext('webgl');
    if (!gl) return null;
    const info = gl.getExtension('WEBGL_debug_renderer_info');
    const renderer = String(gl.getParameter(info ? info.UNMASKED_RENDERER_WEBGL : gl.RENDERER));
    gl.getExtension('WEBGL_lose_context')?.loseContext();
    return /swiftshader|llvmpipe|softpipe|software/i.test(renderer) ? renderer : null;
  } catch {
    return null;
  }
}

function backendOrder(): string[] {
  if (config.allowSoftwareWebgl || !config.backends.includes('webgl') || softwareWebgl() === null) {
    return config.backends;
  }
  return config.backends.filter((b) => b !== 'webgl');
}

function detectorFor(model: PoseModelName): Promise<PoseDetector> {
  let detector = detectors.get(model);
  if (!detector) {
    setWasmPaths(config.wasmBase);
    detector = createPoseDetector({
      tf,
      model,
      source: (dir) => modelUrl(dir, config.modelBase),
      backends: backendOrder(),
    });
    detector.catch(() => detectors.delete(model));
    detectors.set(model, detector);
  }
  return detector;
}

/** Draws the bitmap (downscaled when large) and reads RGBA, the same pixel path as the Node side. */
function pixelsOf(bitmap: ImageBitmap): { data: Uint8ClampedArray; width: number; height: number } {
  const scale = Math.min(1, config.maxSide / Math.max(bitmap.width, bitmap.height));
  const width = Math.max(1, Math.round(bitmap.width * scale));
  const height = Math.max(1, Math.round(bitmap.height * scale));
  canvas ??= new OffscreenCanvas(width, height);
  if (canvas.width !== width || canvas.height !== height) {
    canvas.width = width;
    canvas.height = height;
  }
  const ctx = canvas.getContext('2d', { willReadFrequently: true });
  if (!ctx) throw new Error('OffscreenCanvas 2D is not available in this browser');
  ctx.drawImage(bitmap, 0, 0, width, height);
  return { data: ctx.getImageData(0, 0, width, height).data, width, height };
}

async function handleDetect(message: Extract<WorkerRequest, { type: 'detect' }>): Promise<void> {
  const { id, bitmap, req, queueId } = message;
  if (queueId && cancelledQueues.has(queueId)) {
    bitmap.close();
    post({ type: 'cancelled', id });
    return;
  }
  const start = performance.now();
  try {
    const detector = await detectorFor(req.model);
    const sourceWidth = bitmap.width;
    const sourceHeight = bitmap.height;
    const pixels = pixelsOf(bitmap);
    bitmap.close();
    // A still is unrelated to whatever came before: no tracking state carried into it.
    if (req.still) detector.reset();
    const image = { ...pixels, channels: 4 as const };
    let found: { keypoints: Keypoint[]; score: number | null; timings: { detectMs: number; passes: number } };
    let followed: PoseFrameResult['followed'];
    if (req.follow) {
      // Read only around the picked athlete (shared/pose/follow.ts), in the downscaled frame's pixels.
      let detectMs = 0;
      let passes = 0;
      const read = async (region: PixelBox) => {
        const r = await detector.detect(image, { region, flipAverage: req.careful });
        detectMs += r.timings.detectMs;
        passes += r.timings.passes;
        return r.keypoints;
      };
      const size = { width: pixels.width, height: pixels.height };
      let result;
      if ('pick' in req.follow) {
        follower = new AthleteFollower(size);
        const s = pixels.width / sourceWidth;
        result = await follower.pick({ x: req.follow.pick.x * s, y: req.follow.pick.y * s }, read);
        if (!follower.following) follower = null;
      } else if ('near' in req.follow) {
        // A one-off read around a known frame's athlete; the clip run's follower is left as it is.
        const near = new AthleteFollower(size);
        const s = pixels.width / sourceWidth;
        const known = req.follow.near.keypoints.map((k) => ({ ...k, x: k.x * s, y: k.y * s }));
        result = near.start(known, req.follow.near.framesApart)
          ? await near.next(read)
          : { keypoints: [], state: 'lost' as const, reason: 'the known frame does not outline the athlete' };
      } else if (follower) {
        result = await follower.next(read);
      } else {
        result = { keypoints: [], state: 'lost' as const, reason: 'pick the athlete first' };
      }
      found = { keypoints: result.keypoints, score: null, timings: { detectMs, passes } };
      followed = { state: result.state, reason: result.reason };
    } else {
      found = await detector.detect(image, {
        timeMs: req.still ? null : req.timeMs,
        flipAverage: req.careful,
      });
    }
    // The skier's own left and right, whichever way they face the camera (filmed from behind: swapped).
    const keypoints = orientKeypoints(
      pixels.width === sourceWidth
        ? found.keypoints
        : scaleKeypoints(found.keypoints, sourceWidth / pixels.width, sourceHeight / pixels.height),
      req.facing,
    );
    const computed =
      keypoints.length > 0
        ? computeFrameMetrics({
            keypoints,
            view: req.view,
            referenceLine: req.referenceLine ?? null,
            width: sourceWidth,
            height: sourceHeight,
          })
        : emptyFrameMetrics(followed?.reason ?? 'no skier found');
    const result: PoseFrameResult = {
      ...req,
      keypoints,
      score: found.score,
      metrics: computed.metrics,
      reasons: computed.reasons,
      confidence: computed.confidence,
      width: sourceWidth,
      height: sourceHeight,
      timings: {
        detectMs: found.timings.detectMs,
        totalMs: performance.now() - start,
        passes: found.timings.passes,
      },
      backend: detector.backend,
      followed,
    };
    // Progress first: the client's queue promise may settle as soon as the last result arrives.
    if (queueId) post({ type: 'progress', queueId, id });
    post({ type: 'result', id, result });
  } catch (error) {
    post({ type: 'error', id, message: error instanceof Error ? error.message : String(error) });
  } finally {
    bitmap.close();
  }
}

scope.onmessage = (event: MessageEvent<WorkerRequest>) => {
  const message = event.data;
  switch (message.type) {
    case 'configure':
      config = { ...config, ...message.config };
      post({ type: 'done', id: message.id });
      break;
    case 'load':
      chain = chain.then(async () => {
        try {
          const d = await detectorFor(message.model);
          post({
            type: 'loaded',
            id: message.id,
            model: d.model,
            backend: d.backend,
            loadMs: d.loadMs,
            warmupMs: d.warmupMs,
          });
        } catch (error) {
          post({
            type: 'error',
            id: message.id,
            message: error instanceof Error ? error.message : String(error),
          });
        }
      });
      break;
    case 'detect':
      chain = chain.then(() => handleDetect(message));
      break;
    case 'cancel':
      cancelledQueues.add(message.queueId);
      post({ type: 'done', id: message.id });
      break;
    case 'reset':
      chain = chain.then(async () => {
        follower = null;
        for (const d of detectors.values()) (await d.catch(() => null))?.reset();
        post({ type: 'done', id: message.id });
      });
      break;
  }
};
