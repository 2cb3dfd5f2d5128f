import { execFile } from 'node:child_process';
import fs from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import ffmpeg from '@ffmpeg-installer/ffmpeg';

const run = promisify(execFile);

export interface VideoFixture {
  path: string;
  bytes: Buffer;
  /** What the clip was rendered with, for asserting the probe. */
  width: number;
  height: number;
  fps: number;
  frames: number;
}

const cache = new Map<string, Promise<VideoFixture>>();
const dirs = new Set<string>();

/** Deletes the rendered fixtures; call from afterAll (test files get their own module state). */
export async function removeVideoFixtures(): Promise<void> {
  await Promise.all([...dirs].map((dir) => fs.rm(dir, { recursive: true, force: true })));
  dirs.clear();
  cache.clear();
}

/**
 * Renders ffmpeg's test pattern to a tiny clip in a temp folder (once per worker and format).
 * 1 s at 25 fps, 160x120: 25 frames.
 */
export function videoFixture(format: 'mp4' | 'webm' = 'mp4'): Promise<VideoFixture> {
  let pending = cache.get(format);
  if (!pending) {
    pending = (async () => {
      const dir = await fs.mkdtemp(path.join(os.tmpdir(), 'stanceline-fixture-'));
      dirs.add(dir);
      const file = path.join(dir, `testsrc.${format}`);
      const codec =
        format === 'mp4'
          ? ['-c:v', 'libx264', '-pix_fmt', 'yuv420p']
          : ['-c:v', 'libvpx-vp9', '-b:v', '200k'];
      await run(ffmpeg.path, [
        '-hide_banner',
        '-loglevel',
        'error',
        '-f',
        'lavfi',
        '-i',
        'testsrc=size=160x120:rate=25',
        '-t',
        '1',
        ...codec,
        '-y',
        file,
      ]);
      return { path: file, bytes: await fs.readFile(file), width: 160, height: 120, fps: 25, frames: 25 };
    })();
    cache.set(format, pending);
  }
  return pending;
}

/** The mp4 fixture remuxed with a 90° display rotation, as phones store portrait video. */
export async function rotatedVideoFixture(): Promise<VideoFixture> {
  const source = await videoFixture('mp4');
  const file = path.join(path.dirname(source.path), 'testsrc-rotated.mp4');
  await run(ffmpeg.path, [
    '-hide_banner',
    '-loglevel',
    'error',
    '-i',
    source.path,
    '-c',
    'copy',
    '-metadata:s:v:0',
    'rotate=90',
    '-y',
    file,
  ]);
  return {
    ...source,
    path: file,
    bytes: await fs.readFile(file),
    width: source.height,
    height: source.width,
  };
}
