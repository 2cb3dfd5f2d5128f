import { spawn } from 'node:child_process';
import { diesWithParent } from '../media/child-process';
import { FFMPEG_PATH } from '../media/media-tools';

export interface DecodedFrame {
  /** Index in the source video (0-based, counting every decoded frame). */
  index: number;
  timeMs: number;
  /** Packed RGB of the (possibly downscaled) frame. */
  rgb: Uint8Array;
  width: number;
  height: number;
  /** Size of the frame as decoded (after the container's rotation), before downscaling. */
  sourceWidth: number;
  sourceHeight: number;
}

export interface DecodeOptions {
  /** Keep frames 0, N, 2N, ... */
  every: number;
  /** Skip the frames before this one (not scaled or piped; a resumed analysis starts here). */
  from?: number;
  /** Downscale so the long side is at most this many pixels (the detector crops to 192–256 anyway). */
  maxSide?: number;
}

interface ShowInfo {
  n: number;
  ptsTime: number;
  width: number;
  height: number;
}

const SHOWINFO =
  /\[Parsed_showinfo_(\d+)[^\]]*\]\s+n:\s*(\d+).*?pts_time:\s*(-?[\d.e+-]+|NOPTS).*?\bs:(\d+)x(\d+)/;

/** Decodes a video with ffmpeg into raw RGB frames piped through stdout, one at a time. */
export async function* decodeVideoFrames(path: string, options: DecodeOptions): AsyncGenerator<DecodedFrame> {
  const every = Math.max(1, Math.floor(options.every));
  const maxSide = options.maxSide ?? 1280;
  // The first kept frame at or after `from`; frame k out of the decoder is then start + k * every.
  const start = Math.ceil(Math.max(0, options.from ?? 0) / every) * every;
  // showinfo before and after the scaler: source size and timing, then the size of the piped bytes.
  const filter = [
    start > 0 ? `select='gte(n\\,${start})*not(mod(n\\,${every}))'` : `select='not(mod(n\\,${every}))'`,
    'showinfo',
    `scale='if(gt(iw,ih),min(${maxSide},iw),-2)':'if(gt(iw,ih),-2,min(${maxSide},ih))'`,
    'showinfo',
  ].join(',');
  const child = spawn(
    ...diesWithParent(FFMPEG_PATH, [
      '-hide_banner',
      '-nostdin',
      '-nostats',
      '-v',
      'info',
      '-i',
      path,
      '-an',
      '-sn',
      '-dn',
      '-vf',
      filter,
      '-vsync',
      '0',
      '-f',
      'rawvideo',
      '-pix_fmt',
      'rgb24',
      'pipe:1',
    ]),
    { stdio: ['ignore', 'pipe', 'pipe'] },
  );
  const before: ShowInfo[] = [];
  const after: ShowInfo[] = [];
  const errorLines: string[] = [];
  let wake: (() => void) | null = null;
  let stderrDone = false;
  let rest = '';
  child.stderr.setEncoding('utf8');
  child.stderr.on('data', (text: string) => {
    const lines = (rest + text).split('\n');
    rest = lines.pop() ?? '';
    for (const line of lines) {
      const m = SHOWINFO.exec(line);
      if (m) {
        const info = {
          n: Number(m[2]),
          ptsTime: m[3] === 'NOPTS' ? NaN : Number(m[3]),
          width: Number(m[4]),
          height: Number(m[5]),
        };
        (Number(m[1]) < 2 ? before : after).push(info);
      } else if (line.trim() && !line.startsWith(' ') && !/^(Input|Output|Stream mapping|Press)/.test(line)) {
        errorLines.push(line.trim());
        if (errorLines.length > 20) errorLines.shift();
      }
    }
    wake?.();
  });
  child.stderr.on('end', () => {
    stderrDone = true;
    wake?.();
  });
  const exited = new Promise<number>((resolve) => child.on('close', (code) => resolve(code ?? 1)));
  const spawnFailed = new Promise<never>((_, reject) => child.on('error', reject));
  spawnFailed.catch(() => undefined);

  const infoFor = async (k: number): Promise<{ src: ShowInfo; out: ShowInfo } | null> => {
    while (!(before[k] && after[k]) && !stderrDone) {
      await new Promise<void>((resolve) => (wake = resolve));
      wake = null;
    }
    return before[k] && after[k] ? { src: before[k], out: after[k] } : null;
  };

  let k = 0;
  let buffered: Buffer[] = [];
  let bufferedBytes = 0;
  try {
    for await (const chunk of child.stdout as AsyncIterable<Buffer>) {
      buffered.push(chunk);
      bufferedBytes += chunk.length;
      while (bufferedBytes > 0) {
        const info = await infoFor(k);
        if (!info) throw new Error('ffmpeg sent frame data without frame information');
        const size = info.out.width * info.out.height * 3;
        if (bufferedBytes < size) break;
        const all = buffered.length === 1 ? buffered[0] : Buffer.concat(buffered, bufferedBytes);
        const rgb = new Uint8Array(all.buffer.slice(all.byteOffset, all.byteOffset + size));
        const remaining = all.subarray(size);
        buffered = remaining.length > 0 ? [remaining] : [];
        bufferedBytes = remaining.length;
        yield {
          index: start + k * every,
          timeMs: Number.isFinite(info.src.ptsTime) ? info.src.ptsTime * 1000 : NaN,
          rgb,
          width: info.out.width,
          height: info.out.height,
          sourceWidth: info.src.width,
          sourceHeight: info.src.height,
        };
        k++;
      }
    }
    const code = await Promise.race([exited, spawnFailed]);
    if (code !== 0) {
      throw new VideoDecodeError(errorLines.slice(-3).join(' / ') || `ffmpeg exited with code ${code}`, k);
    }
    if (bufferedBytes > 0 && k === 0) throw new VideoDecodeError('ffmpeg produced a partial frame', k);
  } finally {
    if (child.exitCode === null) child.kill('SIGKILL');
  }
}

export class VideoDecodeError extends Error {
  constructor(
    message: string,
    readonly framesDecoded: number,
  ) {
    super(message);
  }
}
