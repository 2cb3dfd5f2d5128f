import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import { MAX_CLIP_SIDE_PX } from '@shared/schemas/clip.schema';
import { diesWithParent } from './child-process';
import { FFPROBE_PATH } from './media-tools';

const run = promisify(execFile);

export interface VideoProbe {
  codec: string;
  /** Display rotation in degrees (0, 90, 180, 270); width and height below already account for it. */
  rotation: number;
  width: number;
  height: number;
  fps: number | null;
  frameCount: number | null;
  durationMs: number | null;
  /** ffprobe's pix_fmt ("yuv420p", "yuv420p10le", ...), when it reports one. */
  pixelFormat: string | null;
}

interface FfprobeStream {
  codec_type?: string;
  codec_name?: string;
  width?: number;
  height?: number;
  avg_frame_rate?: string;
  r_frame_rate?: string;
  nb_frames?: string;
  nb_read_packets?: string;
  duration?: string;
  pix_fmt?: string;
  tags?: { rotate?: string };
  side_data_list?: { rotation?: number }[];
}

interface FfprobeOutput {
  streams?: FfprobeStream[];
  format?: { duration?: string };
}

function rate(text: string | undefined): number | null {
  if (!text) return null;
  const [num, den] = text.split('/').map(Number);
  if (!Number.isFinite(num) || !Number.isFinite(den) || den === 0 || num === 0) return null;
  return num / den;
}

function positive(text: string | undefined): number | null {
  const value = Number(text);
  return Number.isFinite(value) && value > 0 ? value : null;
}

async function ffprobeJson(filePath: string, extra: string[]): Promise<FfprobeOutput> {
  const { stdout } = await run(
    ...diesWithParent(FFPROBE_PATH, [
      '-v',
      'error',
      '-select_streams',
      'v:0',
      ...extra,
      '-show_streams',
      '-show_format',
      '-of',
      'json',
      filePath,
    ]),
    { maxBuffer: 4 * 1024 * 1024, timeout: 120_000 },
  );
  return JSON.parse(stdout) as FfprobeOutput;
}

/** ffprobe's own last word on a file it could not read (its last stderr line), for messages. */
export function probeFailureText(error: unknown): string {
  const stderr = String((error as { stderr?: string })?.stderr ?? '').trim();
  return stderr.split('\n').pop() || (error instanceof Error ? error.message : String(error));
}

/**
 * Reads the first video stream's codec, size, rate and length; null when the file has none. The one
 * ffprobe wrapper of the project: the media pipeline and the analyze CLI both read files through it.
 */
export async function probeVideo(filePath: string): Promise<VideoProbe | null> {
  let output = await ffprobeJson(filePath, []);
  let stream = output.streams?.find((s) => s.codec_type === 'video');
  if (!stream || !stream.codec_name || !stream.width || !stream.height) return null;
  // Matroska/WebM headers carry no frame count; counting packets reads the file once, without decoding.
  if (!positive(stream.nb_frames)) {
    output = await ffprobeJson(filePath, ['-count_packets']);
    stream = output.streams?.find((s) => s.codec_type === 'video') ?? stream;
  }
  const duration = positive(stream.duration) ?? positive(output.format?.duration);
  // Phones store portrait video as landscape frames plus a rotation; report the size as displayed.
  const rotation = Number(
    stream.side_data_list?.find((d) => d.rotation !== undefined)?.rotation ?? stream.tags?.rotate ?? 0,
  );
  const quarterTurn = Math.abs(rotation) % 180 === 90;
  return {
    codec: stream.codec_name!,
    rotation: (((Math.round(rotation / 90) * 90) % 360) + 360) % 360,
    width: quarterTurn ? stream.height! : stream.width!,
    height: quarterTurn ? stream.width! : stream.height!,
    fps: rate(stream.avg_frame_rate) ?? rate(stream.r_frame_rate),
    frameCount: positive(stream.nb_frames) ?? positive(stream.nb_read_packets),
    durationMs: duration === null ? null : Math.round(duration * 1000),
    pixelFormat: stream.pix_fmt ?? null,
  };
}

/**
 * Video packets actually present in the file, read without decoding. A copy cut short keeps its index
 * (when the index sits at the start) and so its stated frame count, but not the packets.
 */
export async function countVideoPackets(filePath: string): Promise<number | null> {
  const output = await ffprobeJson(filePath, ['-count_packets']);
  const stream = output.streams?.find((s) => s.codec_type === 'video');
  return positive(stream?.nb_read_packets);
}

/** The reason a clip of this size is refused, or null when it is within the limit. */
export function oversizeReason(probe: Pick<VideoProbe, 'width' | 'height'>, name: string): string | null {
  if (Math.max(probe.width, probe.height) <= MAX_CLIP_SIDE_PX) return null;
  return `“${name}” is ${probe.width} × ${probe.height} pixels; Stanceline takes clips up to ${MAX_CLIP_SIDE_PX} pixels on the longer side (4K). Export it at 4K or smaller from the phone or camera and upload it again.`;
}

/** Pixel size of an image file (the thumbnail sprite), read back with ffprobe. */
export async function probeImageSize(filePath: string): Promise<{ width: number; height: number }> {
  const output = await ffprobeJson(filePath, []);
  const stream = output.streams?.[0];
  if (!stream?.width || !stream.height) throw new Error(`ffprobe found no image size in ${filePath}`);
  return { width: stream.width, height: stream.height };
}
