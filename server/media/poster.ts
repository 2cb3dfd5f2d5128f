import fs from 'node:fs/promises';
import { runFfmpeg, FfmpegError } from './ffmpeg-run';

export const POSTER_MAX_WIDTH = 1280;

/** A JPEG still from the first second (halfway through clips shorter than two seconds). */
export async function makePoster(
  input: string,
  output: string,
  durationMs: number | null,
  signal?: AbortSignal,
): Promise<void> {
  const at = durationMs !== null && durationMs < 2000 ? durationMs / 2000 : 1;
  const still = (seconds: number) =>
    runFfmpeg(
      [
        '-i',
        input,
        // After -i: decode up to the moment, so the still is that exact frame, not the keyframe before it.
        '-ss',
        seconds.toFixed(3),
        '-frames:v',
        '1',
        '-vf',
        `scale='min(${POSTER_MAX_WIDTH},iw)':-2`,
        '-q:v',
        '3',
        '-f',
        'image2',
        output,
      ],
      { signal },
    );
  await still(at);
  if (!(await nonEmpty(output))) {
    // The duration in the header can be longer than the decodable video; take the first frame.
    await still(0);
    if (!(await nonEmpty(output)))
      throw new FfmpegError('no frame could be decoded', 'no frame could be decoded');
  }
}

export async function nonEmpty(file: string): Promise<boolean> {
  try {
    return (await fs.stat(file)).size > 0;
  } catch {
    return false;
  }
}
