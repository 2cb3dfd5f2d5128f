// Images and videos -> keypoints, frame by frame, for the analyze CLI and tests.
// Contract (server/cli/analyze.ts imports this lazily):
//   analyzeMediaFile(path, { model, every, onProgress, pick, careful }) yields one MediaFrame per image, or one
//   per kept video frame with its index and time; MediaInputError says what is wrong and what to do.

import { access, open } from 'node:fs/promises';
import { fileTypeFromFile } from 'file-type';
import type { Keypoint, PoseModelName } from '@shared/keypoints';
import { scaleKeypoints } from '@shared/pose/keypoint-mapping';
import { AthleteFollower } from '@shared/pose/follow';
import type { PixelBox } from '@shared/pose/pose-detector';
import { decodeImageFile } from './image-decode';
import { getNodePoseDetector } from './node-detector';
import { probeFailureText, probeVideo } from '../media/probe';
import { decodeVideoFrames, VideoDecodeError } from './video-frames';

export interface MediaFrame {
  frame: number | null;
  timeMs: number | null;
  width: number;
  height: number;
  model: PoseModelName;
  /** Image pixels of the original frame; empty when no skier was found. */
  keypoints: Keypoint[];
  /** Following a picked athlete: why this frame has no points. */
  lostReason?: string | null;
}

/** The file cannot be analysed; the message says what is wrong and what to do. */
export class MediaInputError extends Error {
  override name = 'MediaInputError';
}

export interface AnalyzeMediaOptions {
  model: PoseModelName;
  every: number;
  onProgress?: (done: number, total: number | null) => void;
  /**
   * Follow the athlete at this point (pixels of the original frame) from this frame on: frames before
   * it are skipped, and each later frame is read only around the athlete (shared/pose/follow.ts).
   */
  pick?: { x: number; y: number; frame: number } | null;
  /** Videos: start at this frame (a resumed analysis); the frames before it are not read. */
  fromFrame?: number;
  /** Careful reading: each frame (or followed region) read with its mirror image too, averaged. */
  careful?: boolean;
}

const IMAGE_TYPES = new Set(['image/png', 'image/jpeg', 'image/webp', 'image/gif', 'image/bmp']);

type Kind = 'image' | 'video';

async function classify(path: string): Promise<Kind> {
  try {
    await access(path);
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    throw new MediaInputError(
      code === 'ENOENT'
        ? 'file not found; check the path'
        : `cannot open the file (${code ?? 'unknown error'})`,
    );
  }
  const handle = await open(path, 'r');
  const { size } = await handle.stat();
  await handle.close();
  if (size === 0) throw new MediaInputError('the file is empty; export the image or video again');
  const type = await fileTypeFromFile(path);
  if (type && IMAGE_TYPES.has(type.mime)) return 'image';
  if (type?.mime.startsWith('image/')) {
    throw new MediaInputError(`${type.mime} images are not supported; convert it to PNG or JPEG`);
  }
  return 'video';
}

async function* analyzeImage(path: string, opts: AnalyzeMediaOptions): AsyncGenerator<MediaFrame> {
  let pixels;
  try {
    pixels = await decodeImageFile(path);
  } catch (error) {
    throw new MediaInputError(
      `the image cannot be decoded (${(error as Error).message}); it may be damaged, save it again as PNG or JPEG`,
    );
  }
  const detector = await getNodePoseDetector(opts.model);
  detector.reset();
  let keypoints: Keypoint[];
  let lostReason: string | null = null;
  if (opts.pick) {
    const picked = await new AthleteFollower(pixels).pick(
      opts.pick,
      async (region) => (await detector.detect(pixels, { region, flipAverage: opts.careful })).keypoints,
    );
    keypoints = picked.keypoints;
    lostReason = picked.reason;
  } else keypoints = (await detector.detect(pixels, { flipAverage: opts.careful })).keypoints;
  opts.onProgress?.(1, 1);
  yield {
    frame: null,
    timeMs: null,
    width: pixels.width,
    height: pixels.height,
    model: opts.model,
    keypoints,
    lostReason,
  };
}

async function* analyzeVideo(path: string, opts: AnalyzeMediaOptions): AsyncGenerator<MediaFrame> {
  let info;
  let why = 'no video stream';
  try {
    info = await probeVideo(path);
  } catch (error) {
    why = probeFailureText(error);
  }
  if (!info) {
    throw new MediaInputError(
      `not an image or a video that can be read (${why}); use a PNG/JPEG image or a video file such as MP4, MOV or WebM`,
    );
  }
  const detector = await getNodePoseDetector(opts.model);
  // Tracking state is kept across the frames of this video only.
  detector.reset();
  const total = info.frameCount === null ? null : Math.ceil(info.frameCount / opts.every);
  let done = 0;
  let follower: AthleteFollower | null = null;
  try {
    const from = Math.max(opts.fromFrame ?? 0, opts.pick?.frame ?? 0);
    for await (const f of decodeVideoFrames(path, { every: opts.every, from })) {
      if (opts.pick && f.index < opts.pick.frame) continue;
      const timeMs = Number.isFinite(f.timeMs) ? f.timeMs : info.fps ? (f.index / info.fps) * 1000 : null;
      const image = { data: f.rgb, width: f.width, height: f.height, channels: 3 as const };
      let found: Keypoint[];
      let lostReason: string | null = null;
      if (opts.pick) {
        // Read only around the picked athlete, as the browser does (decoded frames may be downsized).
        const read = async (region: PixelBox) =>
          (await detector.detect(image, { region, flipAverage: opts.careful })).keypoints;
        const sx = f.width / f.sourceWidth;
        const sy = f.height / f.sourceHeight;
        const result = follower
          ? await follower.next(read)
          : await (follower = new AthleteFollower({ width: f.width, height: f.height })).pick(
              { x: opts.pick.x * sx, y: opts.pick.y * sy },
              read,
            );
        found = result.keypoints;
        lostReason = result.reason;
        if (!follower.following) follower = null;
      } else {
        found = (await detector.detect(image, { timeMs: timeMs ?? f.index, flipAverage: opts.careful }))
          .keypoints;
      }
      const keypoints =
        f.width === f.sourceWidth && f.height === f.sourceHeight
          ? found
          : scaleKeypoints(found, f.sourceWidth / f.width, f.sourceHeight / f.height);
      done++;
      opts.onProgress?.(done, total);
      yield {
        frame: f.index,
        timeMs,
        width: f.sourceWidth,
        height: f.sourceHeight,
        model: opts.model,
        keypoints,
        lostReason,
      };
    }
  } catch (error) {
    if (error instanceof VideoDecodeError) {
      throw new MediaInputError(
        error.framesDecoded === 0
          ? `the video cannot be decoded (${error.message}); it may be damaged or incomplete, export it again`
          : `decoding stopped after ${error.framesDecoded} frames (${error.message}); the rest of the file may be damaged`,
      );
    }
    throw error;
  }
  if (done === 0) throw new MediaInputError('the video has no frames to analyse');
}

export async function* analyzeMediaFile(path: string, opts: AnalyzeMediaOptions): AsyncGenerator<MediaFrame> {
  if (!Number.isInteger(opts.every) || opts.every < 1)
    throw new MediaInputError('--every must be a whole number of at least 1');
  const kind = await classify(path);
  yield* kind === 'image' ? analyzeImage(path, opts) : analyzeVideo(path, opts);
}
