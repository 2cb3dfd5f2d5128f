import type { VideoProbe } from './probe';
import { runFfmpeg } from './ffmpeg-run';

/** What Debian's Chromium (and current desktop and phone browsers) decode natively. */
const PLAYABLE_CODECS = new Set(['h264', 'vp8', 'vp9', 'av1']);
const PLAYABLE_CONTAINERS = new Set(['video/mp4', 'video/webm']);
/** 10-bit and 4:4:4 H.264 do not play in browsers even in an MP4. */
const PLAYABLE_PIXEL_FORMATS = new Set(['yuv420p', 'yuvj420p']);

/** Keyframes at least every half second: a seek decodes at most this much video before showing a frame. */
export const PROXY_KEYFRAME_SECONDS = 0.5;

/** Why the original needs a playable copy, or null when browsers play it as stored. */
export function proxyReason(probe: VideoProbe, containerMime: string): string | null {
  if (!PLAYABLE_CODECS.has(probe.codec)) return `codec ${probe.codec}`;
  if (!PLAYABLE_CONTAINERS.has(containerMime)) return `container ${containerMime}`;
  if (probe.rotation !== 0) return `rotation ${probe.rotation}°`;
  if (probe.pixelFormat && !PLAYABLE_PIXEL_FORMATS.has(probe.pixelFormat))
    return `pixel format ${probe.pixelFormat}`;
  return null;
}

/** The keyframe interval in frames for a clip's rate (unknown rate: assume 30 fps). */
export function keyframeInterval(fps: number | null): number {
  return Math.max(1, Math.round((fps ?? 30) * PROXY_KEYFRAME_SECONDS));
}

/**
 * An H.264 yuv420p MP4 with the moov atom first (+faststart) and a short keyframe interval.
 * Every source frame is kept with its timestamp (-vsync passthrough), so frame N of the proxy is
 * frame N of the original and per-frame results line up. ffmpeg applies the display rotation
 * while decoding, so the proxy is stored upright.
 */
export async function makeProxy(
  input: string,
  output: string,
  probe: VideoProbe,
  signal?: AbortSignal,
): Promise<void> {
  const gop = String(keyframeInterval(probe.fps));
  await runFfmpeg(
    [
      '-i',
      input,
      '-map',
      '0:v:0',
      '-map',
      '0:a:0?',
      '-vf',
      // yuv420p needs even dimensions.
      'scale=trunc(iw/2)*2:trunc(ih/2)*2',
      '-c:v',
      'libx264',
      '-preset',
      'veryfast',
      '-crf',
      '20',
      '-pix_fmt',
      'yuv420p',
      '-g',
      gop,
      '-keyint_min',
      gop,
      '-sc_threshold',
      '0',
      '-vsync',
      'passthrough',
      '-c:a',
      'aac',
      '-b:a',
      '128k',
      '-movflags',
      '+faststart',
      '-f',
      'mp4',
      output,
    ],
    { signal },
  );
}
