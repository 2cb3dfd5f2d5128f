import * as poseDetection from '@tensorflow-models/pose-detection';
import type * as tfc from '@tensorflow/tfjs-core';
import type { Keypoint, PoseModelName } from '../keypoints';
import { mapKeypoints, swapLeftRight } from './keypoint-mapping';
import { POSE_MODEL_INFO, type ModelDir } from './pose-models';

/** The tfjs-core namespace the caller has registered its backends on. */
export type TfCore = typeof tfc;

/** Where a model's graph comes from: a URL on the app's origin (browser) or an IOHandler (Node). */
export type ModelSource = (dir: ModelDir) => string | tfc.io.IOHandler;

/** Pixels of one frame, RGB or RGBA, row-major, 0..255. */
export interface PixelFrame {
  data: Uint8Array | Uint8ClampedArray;
  width: number;
  height: number;
  channels: 3 | 4;
}

export type PoseImage = PixelFrame | tfc.Tensor3D;

export interface PoseDetectorOptions {
  tf: TfCore;
  model: PoseModelName;
  source: ModelSource;
  /** Backends to try in order; the first that initialises is used (browser: webgl, wasm, cpu). */
  backends: readonly string[];
  /** Run one blank frame after loading so the first real frame is not slowed by shader/kernel setup. */
  warmup?: boolean;
  /**
   * When the detector has no tracking state (first frame, after reset, after a lost skier) run the
   * frame twice: the first pass finds the skier in the whole frame, the second looks again at the
   * crop/region the first pass produced. Small skiers in wide frames gain the most. Default true.
   */
  refineColdStart?: boolean;
  /** MoveNet: below this mean joint score the frame counts as "no skier found" (library default 0.25). */
  minPoseScore?: number;
}

export interface DetectOptions {
  /** Frame time in a clip (ms). Null or absent for a still image: no temporal smoothing. */
  timeMs?: number | null;
  /**
   * Look only here (image pixels): the crop around a followed athlete, read at the model's input size,
   * so other people outside it are never taken and a small skier is seen large. Tracking state is not
   * carried into or out of a region read (each crop is a fresh image to the model).
   */
  region?: PixelBox | null;
  /**
   * Careful reading: read the frame (or the region) and its mirror image, swap the mirror's left and
   * right back, and average each point weighted by score (test-time flipping; docs/accuracy.md). Twice
   * the passes; on a whole frame each read starts afresh (no tracking state kept between frames).
   */
  flipAverage?: boolean;
}

/** A box in image pixels, y down. */
export interface PixelBox {
  x: number;
  y: number;
  width: number;
  height: number;
}

export interface PoseDetection {
  /** Image pixels of the given frame, y down; empty when no skier was found. */
  keypoints: Keypoint[];
  /** The model's pose score, 0..1, or null when no skier was found. */
  score: number | null;
  width: number;
  height: number;
  timings: { detectMs: number; passes: number };
}

export interface PoseDetector {
  readonly model: PoseModelName;
  readonly backend: string;
  /** Model fetch/parse time and warm-up time, ms. */
  readonly loadMs: number;
  readonly warmupMs: number;
  detect(image: PoseImage, options?: DetectOptions): Promise<PoseDetection>;
  /** Forget tracking state; call between unrelated images or clips. */
  reset(): void;
  dispose(): void;
}

// A global in browsers, workers and Node alike; shared/ compiles without DOM or Node types, so it is named here.
const now = (): number => (globalThis as unknown as { performance: { now(): number } }).performance.now();

/** Selects the first backend in `backends` that initialises, and returns its name. */
export async function selectBackend(tf: TfCore, backends: readonly string[]): Promise<string> {
  const failures: string[] = [];
  for (const name of backends) {
    if (tf.findBackendFactory(name) == null) {
      failures.push(`${name}: not registered`);
      continue;
    }
    try {
      if (await tf.setBackend(name)) {
        await tf.ready();
        return tf.getBackend();
      }
      failures.push(`${name}: failed to initialise`);
    } catch (error) {
      failures.push(`${name}: ${error instanceof Error ? error.message : String(error)}`);
    }
  }
  throw new Error(`no TensorFlow.js backend could start (${failures.join('; ')})`);
}

/** The pose-detection library's own detector for a model, configured as the product uses it (benchmarks compare with it). */
export async function loadModel(
  model: PoseModelName,
  source: ModelSource,
  minPoseScore: number | undefined,
): Promise<poseDetection.PoseDetector> {
  if (model === 'blazepose') {
    return poseDetection.createDetector(poseDetection.SupportedModels.BlazePose, {
      runtime: 'tfjs',
      modelType: 'full',
      enableSmoothing: true,
      enableSegmentation: false,
      detectorModelUrl: source('blazepose-detector'),
      landmarkModelUrl: source('blazepose-full'),
    });
  }
  return poseDetection.createDetector(poseDetection.SupportedModels.MoveNet, {
    modelType:
      model === 'thunder'
        ? poseDetection.movenet.modelType.SINGLEPOSE_THUNDER
        : poseDetection.movenet.modelType.SINGLEPOSE_LIGHTNING,
    enableSmoothing: true,
    minPoseScore,
    modelUrl: source(model === 'thunder' ? 'movenet-thunder' : 'movenet-lightning'),
  });
}

/** Each point as the score-weighted mean of two reads of it; a point only one read has is kept as is. */
export function averageKeypoints(a: readonly Keypoint[], b: readonly Keypoint[]): Keypoint[] {
  const other = new Map(b.map((k) => [k.name, k]));
  return a.map((k) => {
    const o = other.get(k.name);
    if (!o) return k;
    const w = k.score + o.score;
    if (w === 0) return k;
    return {
      name: k.name,
      x: (k.x * k.score + o.x * o.score) / w,
      y: (k.y * k.score + o.y * o.score) / w,
      score: (k.score + o.score) / 2,
    };
  });
}

function toTensor(tf: TfCore, image: PoseImage): { tensor: tfc.Tensor3D; owned: boolean } {
  if (image instanceof tf.Tensor) return { tensor: image, owned: false };
  const { data, width, height, channels } = image;
  if (data.length !== width * height * channels) {
    throw new Error(`frame has ${data.length} bytes, expected ${width}×${height}×${channels}`);
  }
  const tensor = tf.tidy(() => {
    const all = tf.tensor3d(Int32Array.from(data), [height, width, channels], 'int32');
    return channels === 3 ? all : tf.slice(all, [0, 0, 0], [height, width, 3]);
  });
  return { tensor, owned: true };
}

/**
 * The one pose detector used by the browser worker, the server and the command line. It loads the
 * chosen model from `source`, picks a backend, warms up, and maps the model's output to the project's
 * keypoint names in pixels of the frame it was given. Tracking state (MoveNet's crop region,
 * BlazePose's region of interest, their smoothing filters) lives across `detect` calls until `reset`.
 */
export async function createPoseDetector(options: PoseDetectorOptions): Promise<PoseDetector> {
  const { tf, model, source } = options;
  const refine = options.refineColdStart ?? true;
  const backend = await selectBackend(tf, options.backends);
  const loadStart = now();
  const inner = await loadModel(model, source, options.minPoseScore);
  const loadMs = now() - loadStart;

  // After a reset or a lost skier the next frame starts from the whole image again.
  let cold = true;

  async function estimate(tensor: tfc.Tensor3D, timeMs: number | null) {
    const poses = await inner.estimatePoses(
      tensor,
      { maxPoses: 1, flipHorizontal: false },
      timeMs ?? undefined,
    );
    return poses[0];
  }

  /**
   * One fresh pass on the crop `box` of `tensor`, keypoints moved back to the whole image. `mirrored`
   * reads the crop's mirror image instead, its points put back where they are in the unmirrored crop
   * (their left and right labels are the mirror's: the caller swaps them).
   */
  async function detectIn(
    tensor: tfc.Tensor3D,
    box: PixelBox,
    mirrored = false,
  ): Promise<poseDetection.Pose | undefined> {
    const [height, width] = tensor.shape;
    const x0 = Math.max(0, Math.min(width - 1, Math.floor(box.x)));
    const y0 = Math.max(0, Math.min(height - 1, Math.floor(box.y)));
    const x1 = Math.max(x0 + 1, Math.min(width, Math.ceil(box.x + box.width)));
    const y1 = Math.max(y0 + 1, Math.min(height, Math.ceil(box.y + box.height)));
    const crop = tf.tidy(() => {
      const part = tf.slice(tensor, [y0, x0, 0], [y1 - y0, x1 - x0, 3]);
      return mirrored ? (tf.reverse(part, 1) as tfc.Tensor3D) : part;
    });
    try {
      inner.reset();
      const pose = await estimate(crop, null);
      inner.reset();
      cold = true;
      if (!pose) return undefined;
      const side = x1 - x0;
      return {
        ...pose,
        keypoints: pose.keypoints.map((k) => ({ ...k, x: (mirrored ? side - k.x : k.x) + x0, y: k.y + y0 })),
      };
    } finally {
      crop.dispose();
    }
  }

  async function detect(image: PoseImage, opts: DetectOptions = {}): Promise<PoseDetection> {
    const start = now();
    const timeMs = opts.timeMs ?? null;
    const { tensor, owned } = toTensor(tf, image);
    const [height, width] = tensor.shape;
    let passes = 0;
    if (opts.region) {
      try {
        const pose = await detectIn(tensor, opts.region);
        let keypoints = pose ? mapKeypoints(pose.keypoints) : [];
        if (opts.flipAverage && keypoints.length > 0) {
          const flipped = await detectIn(tensor, opts.region, true);
          passes += 1;
          if (flipped && flipped.keypoints.length > 0)
            keypoints = averageKeypoints(keypoints, swapLeftRight(mapKeypoints(flipped.keypoints)));
        }
        return {
          keypoints,
          score: keypoints.length > 0 ? (pose?.score ?? null) : null,
          width,
          height,
          timings: { detectMs: now() - start, passes: passes + 1 },
        };
      } finally {
        if (owned) tensor.dispose();
      }
    }
    try {
      let pose: poseDetection.Pose | undefined;
      if (cold && refine) {
        // No timestamp on the first pass: it must not feed the temporal filters.
        pose = await estimate(tensor, null);
        passes += 1;
      }
      if (!cold || !refine || (pose !== undefined && pose.keypoints.length > 0)) {
        pose = await estimate(tensor, timeMs);
        passes += 1;
      }
      let keypoints = pose ? mapKeypoints(pose.keypoints) : [];
      if (opts.flipAverage && keypoints.length > 0) {
        // The mirror image is a fresh still: no tracking state in or out.
        const mirror = tf.reverse(tensor, 1) as tfc.Tensor3D;
        try {
          inner.reset();
          let flipped = await estimate(mirror, null);
          if (refine && flipped && flipped.keypoints.length > 0) flipped = await estimate(mirror, null);
          passes += refine ? 2 : 1;
          inner.reset();
          if (flipped && flipped.keypoints.length > 0) {
            const back = swapLeftRight(
              mapKeypoints(flipped.keypoints).map((k) => ({ ...k, x: width - k.x })),
            );
            keypoints = averageKeypoints(keypoints, back);
          }
        } finally {
          mirror.dispose();
        }
      }
      cold = keypoints.length === 0 || opts.flipAverage === true;
      return {
        keypoints,
        score: keypoints.length > 0 ? (pose?.score ?? null) : null,
        width,
        height,
        timings: { detectMs: now() - start, passes },
      };
    } finally {
      if (owned) tensor.dispose();
    }
  }

  function reset(): void {
    inner.reset();
    cold = true;
  }

  let warmupMs = 0;
  if (options.warmup ?? true) {
    const warmStart = now();
    const blank = tf.zeros([POSE_MODEL_INFO[model].inputSize, POSE_MODEL_INFO[model].inputSize, 3], 'int32');
    try {
      await inner.estimatePoses(blank as tfc.Tensor3D);
    } finally {
      blank.dispose();
      reset();
    }
    warmupMs = now() - warmStart;
  }

  return {
    model,
    backend,
    loadMs,
    warmupMs,
    detect,
    reset,
    dispose: () => inner.dispose(),
  };
}
