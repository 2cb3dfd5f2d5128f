import {
  BLAZEPOSE33_NAMES,
  COCO17_NAMES,
  type Keypoint,
  type KeypointName,
  type SkierFacing,
} from '../keypoints';

/** What pose-detection returns for one point (image pixels of the tensor it was given). */
export interface RawKeypoint {
  x: number;
  y: number;
  score?: number;
  name?: string;
}

/**
 * Maps a model's points to the project's names (shared/keypoints.ts) by output index, so a renamed
 * label upstream cannot silently shift a joint. MoveNet emits the 17 COCO points, BlazePose the 33
 * GHUM points; both orders are fixed by the models (docs/metrics.md, Sources §5).
 * `scaleX`/`scaleY` take points from the detector's input back to the original frame's pixels.
 */
export function mapKeypoints(raw: readonly RawKeypoint[], scaleX = 1, scaleY = 1): Keypoint[] {
  const names: readonly KeypointName[] =
    raw.length === COCO17_NAMES.length
      ? COCO17_NAMES
      : raw.length === BLAZEPOSE33_NAMES.length
        ? BLAZEPOSE33_NAMES
        : [];
  if (names.length === 0) throw new Error(`unexpected keypoint count ${raw.length} (expected 17 or 33)`);
  const out: Keypoint[] = [];
  raw.forEach((point, i) => {
    const name = names[i];
    if (point.name !== undefined && point.name !== name) {
      throw new Error(`keypoint ${i} is "${point.name}", expected "${name}"`);
    }
    const x = point.x * scaleX;
    const y = point.y * scaleY;
    if (!Number.isFinite(x) || !Number.isFinite(y)) return;
    const score = Number.isFinite(point.score) ? Math.min(1, Math.max(0, point.score as number)) : 0;
    out.push({ name, x, y, score });
  });
  return out;
}

/** Scales points detected on a downsized copy back to the source frame. */
export function scaleKeypoints(keypoints: readonly Keypoint[], scaleX: number, scaleY: number): Keypoint[] {
  return keypoints.map((k) => ({ ...k, x: k.x * scaleX, y: k.y * scaleY }));
}

/**
 * The keypoints with the skier's own left and right: as the model gave them for a skier facing the
 * camera, swapped for one filmed from behind. Every path (browser, server, CLI) calls this once, right
 * after detection, so stored points, metrics, overlays, flags and exports all carry the skier's sides.
 */
export function orientKeypoints(
  keypoints: readonly Keypoint[],
  facing: SkierFacing | null | undefined,
): Keypoint[] {
  return facing === 'away' ? swapLeftRight(keypoints) : [...keypoints];
}

/**
 * Swaps the skier's left and right labels. From behind, the models read the skier as facing the
 * camera and swap the sides on most frames (docs/accuracy.md); a clip marked "filmed from behind"
 * runs its keypoints through this before any metric.
 */
export function swapLeftRight(keypoints: readonly Keypoint[]): Keypoint[] {
  return keypoints.map((k) => {
    const name = k.name.startsWith('left_')
      ? `right_${k.name.slice(5)}`
      : k.name.startsWith('right_')
        ? `left_${k.name.slice(6)}`
        : k.name;
    return { ...k, name: name as Keypoint['name'] };
  });
}
