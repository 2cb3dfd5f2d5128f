import { execFile } from 'node:child_process';
import { diesWithParent } from './child-process';
import { FFMPEG_PATH } from './media-tools';

/** ffmpeg exited with an error; `detail` is the last lines it printed, for logs and coach-facing reasons. */
export class FfmpegError extends Error {
  override name = 'FfmpegError';
  constructor(
    message: string,
    readonly detail: string,
  ) {
    super(message);
  }
}

export class MediaJobAborted extends Error {
  override name = 'MediaJobAborted';
}

/**
 * Runs ffmpeg as a child process (the event loop stays free while it encodes). An abort signal
 * kills it; a timeout guards against inputs that make it hang.
 */
export function runFfmpeg(
  args: string[],
  opts: { signal?: AbortSignal; timeoutMs?: number } = {},
): Promise<void> {
  return new Promise((resolve, reject) => {
    if (opts.signal?.aborted) return reject(new MediaJobAborted('stopped before ffmpeg started'));
    execFile(
      ...diesWithParent(FFMPEG_PATH, ['-hide_banner', '-nostdin', '-loglevel', 'error', '-y', ...args]),
      { signal: opts.signal, timeout: opts.timeoutMs ?? 30 * 60_000, maxBuffer: 8 * 1024 * 1024 },
      (error, _stdout, stderr) => {
        if (!error) return resolve();
        if (opts.signal?.aborted) return reject(new MediaJobAborted('stopped while ffmpeg was running'));
        const detail = lastLines(String(stderr), 40) || error.message;
        reject(new FfmpegError(`ffmpeg failed: ${detail}`, detail));
      },
    );
  });
}

function lastLines(text: string, n: number): string {
  return text.trim().split('\n').slice(-n).join('\n').trim();
}
