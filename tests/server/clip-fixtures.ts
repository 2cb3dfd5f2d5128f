// Videos rendered at test time with the npm ffmpeg, and a helper that uploads one and waits for
// the media pipeline. Not a test file: shared by the server tests of the clip workspace.
import { execFile } from 'node:child_process';
import fs from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import type { ClipDto } from '@shared/schemas/clip.schema';
import { FFMPEG_PATH } from '@server/media/media-tools';
import type { TestServer } from '../helpers/server-harness';

const run = promisify(execFile);

export interface RenderedVideo {
  path: string;
  width: number;
  height: number;
  fps: number;
  frames: number;
}

export type VideoKind = 'h264-mp4' | 'xvid-avi' | 'hevc-mp4' | 'h264-mkv';

const ENCODERS: Record<VideoKind, { ext: string; args: string[] }> = {
  'h264-mp4': { ext: 'mp4', args: ['-c:v', 'libx264', '-pix_fmt', 'yuv420p'] },
  // MPEG-4 Part 2 in AVI, as older cameras write it.
  'xvid-avi': { ext: 'avi', args: ['-c:v', 'libxvid', '-q:v', '5'] },
  // HEVC as phones record it (hvc1 tag, as Apple devices write it).
  'hevc-mp4': {
    ext: 'mp4',
    args: ['-c:v', 'libx265', '-preset', 'ultrafast', '-x265-params', 'log-level=error', '-tag:v', 'hvc1'],
  },
  'h264-mkv': { ext: 'mkv', args: ['-c:v', 'libx264', '-pix_fmt', 'yuv420p'] },
};

let scratch: string | null = null;

async function scratchDir(): Promise<string> {
  scratch ??= await fs.mkdtemp(path.join(os.tmpdir(), 'stanceline-clip-fixtures-'));
  return scratch;
}

export async function removeRenderedVideos(): Promise<void> {
  if (scratch) await fs.rm(scratch, { recursive: true, force: true });
  scratch = null;
}

/** ffmpeg's test pattern, `seconds` long at `fps`, so the frame count is seconds × fps by construction. */
export async function renderVideo(
  kind: VideoKind,
  opts: { seconds?: number; fps?: number; width?: number; height?: number; rotate?: number } = {},
): Promise<RenderedVideo> {
  const { seconds = 2, fps = 25, width = 160, height = 120 } = opts;
  const { ext, args } = ENCODERS[kind];
  const file = path.join(
    await scratchDir(),
    `${kind}-${seconds}s-${fps}fps-${width}x${height}-r${opts.rotate ?? 0}.${ext}`,
  );
  await run(FFMPEG_PATH, [
    '-hide_banner',
    '-loglevel',
    'error',
    '-f',
    'lavfi',
    '-i',
    `testsrc=size=${width}x${height}:rate=${fps}`,
    '-t',
    String(seconds),
    ...args,
    '-y',
    file,
  ]);
  if (opts.rotate) {
    // The display rotation is written on a stream copy, as phones store it beside unrotated frames.
    const rotated = file.replace(/(\.\w+)$/, '-rotated$1');
    await run(FFMPEG_PATH, [
      '-hide_banner',
      '-loglevel',
      'error',
      '-i',
      file,
      '-c',
      'copy',
      '-metadata:s:v:0',
      `rotate=${opts.rotate}`,
      '-y',
      rotated,
    ]);
    return { path: rotated, width, height, fps, frames: Math.round(seconds * fps) };
  }
  return { path: file, width, height, fps, frames: Math.round(seconds * fps) };
}

/** Bytes of a file written to the scratch folder, for hand-made broken inputs. */
export async function writeScratch(name: string, bytes: Buffer | string): Promise<string> {
  const file = path.join(await scratchDir(), name);
  await fs.writeFile(file, bytes);
  return file;
}

export async function uploadClip(
  server: TestServer,
  file: string,
  fields: { sessionId: string; athleteIds: string; view: 'front' | 'side'; facing?: 'toward' | 'away' },
  role: 'coach' | 'head' = 'coach',
): Promise<ClipDto> {
  const req = server.http.post('/api/clips').set(await server.bearer(role));
  for (const [k, v] of Object.entries(fields)) req.field(k, v);
  const res = await req.attach('file', file);
  if (res.status !== 201) throw new Error(`upload: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.clip as ClipDto;
}

/** Waits for the media pipeline to finish, then reads the clip back as the API shows it. */
export async function settled(server: TestServer, clipId: string): Promise<ClipDto> {
  await server.runtime.mediaQueue.idle();
  const res = await server.http.get(`/api/clips/${clipId}`).set(await server.bearer('coach'));
  if (res.status !== 200) throw new Error(`clip: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.clip as ClipDto;
}

/**
 * Publishes a review of a clip for its athlete: athletes and guardians open clips only through
 * published reviews, so a test that reads a clip as them shares it first, as a coach would.
 */
export async function shareWithAthlete(
  server: TestServer,
  clipId: string,
  athleteId: string,
): Promise<string> {
  const auth = await server.bearer('head');
  const created = await server.http.post('/api/reviews').set(auth).send({ clipId, athleteId });
  if (created.status !== 201) throw new Error(`review: ${created.status} ${JSON.stringify(created.body)}`);
  const id = created.body.review.id as string;
  await server.http.patch(`/api/reviews/${id}`).set(auth).send({ summary: 'Shared for the test.' });
  const published = await server.http.post(`/api/reviews/${id}/publish`).set(auth);
  if (published.status !== 200)
    throw new Error(`publish: ${published.status} ${JSON.stringify(published.body)}`);
  return id;
}

/** Every row of every table that mentions the text, as "table: row" (erasure leaves none). */
export async function rowsMentioning(server: TestServer, text: string): Promise<string[]> {
  const ds = server.runtime.dataSource;
  const tables = (await ds.query(
    "SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%'",
  )) as { name: string }[];
  const found: string[] = [];
  for (const { name } of tables) {
    for (const row of (await ds.query(`SELECT * FROM "${name}"`)) as Record<string, unknown>[]) {
      const json = JSON.stringify(row);
      if (json.includes(text)) found.push(`${name}: ${json.slice(0, 160)}`);
    }
  }
  return found;
}
