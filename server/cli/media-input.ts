import type { Keypoint, PoseModelName } from '@shared/keypoints';

/** The contract of server/pose/analyze-media (written separately); mirrored here so this file compiles alone. */
export interface MediaFrame {
  frame: number | null;
  timeMs: number | null;
  width: number;
  height: number;
  model: PoseModelName;
  keypoints: Keypoint[];
}

export interface MediaModule {
  MediaInputError: new (...args: never[]) => Error;
  analyzeMediaFile(
    path: string,
    opts: { model: PoseModelName; every: number; onProgress?: (done: number, total: number | null) => void },
  ): AsyncGenerator<MediaFrame>;
}

export class PosePipelineMissingError extends Error {
  override name = 'PosePipelineMissingError';
}

const MEDIA_MODULE = '../pose/analyze-media';

/** Loads the pose pipeline lazily, so keypoint JSON files never pay for the model runtime. */
export async function loadMediaModule(): Promise<MediaModule> {
  try {
    // A non-literal specifier keeps type checking independent of whether the module exists yet.
    const specifier: string = MEDIA_MODULE;
    return (await import(specifier)) as MediaModule;
  } catch (error) {
    const e = error as { code?: string; message?: string };
    const notFound = e?.code === 'ERR_MODULE_NOT_FOUND' || e?.code === 'MODULE_NOT_FOUND';
    if (notFound && String(e.message).includes('analyze-media')) {
      throw new PosePipelineMissingError(
        'images and videos need the pose pipeline (server/pose/analyze-media), which is not installed',
      );
    }
    throw error;
  }
}
