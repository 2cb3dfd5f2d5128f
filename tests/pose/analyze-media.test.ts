// Images and videos through server/pose/analyze-media (the CLI's media path), and the analyze CLI
// itself on phantom stills and clips, a corrupt video and a file that is no image at all.
import { execFile } from 'node:child_process';
import { copyFileSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { beforeAll, describe, expect, it } from 'vitest';
import { analyzeMediaFile, MediaInputError, type MediaFrame } from '@server/pose/analyze-media';
import { FFMPEG_PATH } from '@server/media/media-tools';
import { encodeClip, frontTurnsClip, type ClipSpec } from '../../fixtures/phantom/phantom-clip';
import { renderPhantom } from '../../fixtures/phantom/render-phantom';
import { PHANTOM_CASES } from './phantom-cases';
import { BODY_JOINTS, evaluateFrame } from './phantom-eval';
import { JOINT_TOLERANCE } from './tolerances';

const run = promisify(execFile);
const dir = join(process.cwd(), 'fixtures', 'generated', 'analyze-media');

/** A short clip: the first 0.8 s of the front turns (20 frames at 25 fps). */
function shortClip(width: number, height: number): ClipSpec {
  const clip = frontTurnsClip({ width, height });
  return { ...clip, frames: clip.frames.slice(0, 20) };
}

const small = shortClip(640, 360);
// Larger than the 1280 px the decoder keeps, so frames are downscaled and keypoints scaled back.
const large = shortClip(1920, 1080);

beforeAll(async () => {
  mkdirSync(dir, { recursive: true });
  const still = renderPhantom(PHANTOM_CASES[0].spec);
  writeFileSync(join(dir, 'still.png'), await still.png());
  await run(FFMPEG_PATH, [
    '-v',
    'error',
    '-y',
    '-i',
    join(dir, 'still.png'),
    '-q:v',
    '3',
    join(dir, 'still.jpg'),
  ]);
  await encodeClip(small, { mp4: join(dir, 'small.mp4'), webm: join(dir, 'small.webm') });
  await encodeClip(large, { mp4: join(dir, 'large.mp4') });
  // Corrupt: the first 2 kB of a real MP4 (header without the media), and random bytes named .mp4.
  writeFileSync(join(dir, 'truncated.mp4'), readFileSync(join(dir, 'small.mp4')).subarray(0, 2048));
  writeFileSync(
    join(dir, 'noise.mp4'),
    Buffer.from(Array.from({ length: 4096 }, (_, i) => (i * 7919) % 251)),
  );
  writeFileSync(join(dir, 'notes.txt'), 'stance notes, not an image\n');
  copyFileSync(join(dir, 'notes.txt'), join(dir, 'notes.png'));
  writeFileSync(join(dir, 'empty.jpg'), '');
}, 180_000);

async function collect(path: string, model: 'lightning' | 'thunder' | 'blazepose' = 'lightning', every = 1) {
  const frames: MediaFrame[] = [];
  for await (const f of analyzeMediaFile(path, { model, every })) frames.push(f);
  return frames;
}

describe('analyzeMediaFile', () => {
  it('reads a PNG and a JPEG as one frame each, keypoints in image pixels', async () => {
    const truth = renderPhantom(PHANTOM_CASES[0].spec).truth;
    for (const name of ['still.png', 'still.jpg']) {
      const frames = await collect(join(dir, name), 'thunder');
      expect(frames).toHaveLength(1);
      expect(frames[0]).toMatchObject({
        frame: null,
        timeMs: null,
        width: 640,
        height: 480,
        model: 'thunder',
      });
      const evaluation = evaluateFrame(frames[0].keypoints, truth);
      for (const joint of BODY_JOINTS)
        expect(evaluation.jointError[joint], joint).toBeLessThan(JOINT_TOLERANCE[joint]);
    }
  });

  it.each(['small.mp4', 'small.webm'])('reads every frame of %s with its index and time', async (name) => {
    const frames = await collect(join(dir, name));
    expect(frames.map((f) => f.frame)).toEqual(small.frames.map((_, i) => i));
    // 25 fps: frame n at n × 40 ms.
    frames.forEach((f, i) => expect(f.timeMs).toBeCloseTo(i * 40, 6));
    expect(frames.every((f) => f.keypoints.length === 17 && f.width === 640 && f.height === 360)).toBe(true);
  });

  it('keeps every Nth frame with --every', async () => {
    const frames = await collect(join(dir, 'small.mp4'), 'lightning', 3);
    expect(frames.map((f) => f.frame)).toEqual([0, 3, 6, 9, 12, 15, 18]);
    expect(frames[2].timeMs).toBeCloseTo(240, 6);
  });

  it('tracks the skier across a downscaled 1080p clip and reports keypoints in its own pixels', async () => {
    const frames = await collect(join(dir, 'large.mp4'), 'lightning');
    expect(frames).toHaveLength(20);
    for (const [i, f] of frames.entries()) {
      expect([f.width, f.height]).toEqual([1920, 1080]);
      const evaluation = evaluateFrame(f.keypoints, renderPhantom(large.frames[i]).truth);
      for (const joint of BODY_JOINTS) {
        expect(evaluation.jointError[joint], `frame ${i} ${joint}`).toBeLessThan(JOINT_TOLERANCE[joint]);
      }
    }
  });

  it.each([
    ['truncated.mp4', /cannot be read|cannot be decoded/],
    ['noise.mp4', /not an image or a video/],
    ['notes.txt', /not an image or a video/],
    ['notes.png', /not an image or a video/],
    ['empty.jpg', /empty/],
    ['missing.mp4', /not found/],
  ])('rejects %s with a clear error', async (name, message) => {
    await expect(collect(join(dir, name))).rejects.toThrow(MediaInputError);
    await expect(collect(join(dir, name))).rejects.toThrow(message);
  });
});

describe('npm run analyze on media', () => {
  const cli = (args: string[]) =>
    run('npx', ['tsx', 'server/cli/analyze.ts', ...args], { cwd: process.cwd(), timeout: 120_000 }).then(
      (r) => ({ code: 0, ...r }),
      (e: { code: number; stdout: string; stderr: string }) => ({
        code: e.code,
        stdout: e.stdout,
        stderr: e.stderr,
      }),
    );

  it('prints keypoints and metrics for a JPEG (--model thunder --json)', async () => {
    const { code, stdout } = await cli(['--model', 'thunder', '--json', join(dir, 'still.jpg')]);
    expect(code).toBe(0);
    const lines = stdout
      .trim()
      .split('\n')
      .map((l) => JSON.parse(l));
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatchObject({ frame: null, timeMs: null, width: 640, height: 480, model: 'thunder' });
    expect(lines[0].keypoints).toHaveLength(17);
    expect(lines[0].view).toBe('front');
    expect(typeof lines[0].metrics.shoulderTilt).toBe('number');
  });

  it('prints one line per frame of a clip, the frame count matching the clip', async () => {
    const { code, stdout } = await cli(['--json', '--view', 'front', join(dir, 'small.mp4')]);
    expect(code).toBe(0);
    const lines = stdout
      .trim()
      .split('\n')
      .map((l) => JSON.parse(l));
    expect(lines.map((l) => l.frame)).toEqual(small.frames.map((_, i) => i));
    expect(lines[19].timeMs).toBeCloseTo(760, 6);
  });

  it('fails with a message on a corrupt video and on a non-image, and goes on with the next file', async () => {
    const { code, stdout, stderr } = await cli([
      '--json',
      join(dir, 'truncated.mp4'),
      join(dir, 'notes.txt'),
      join(dir, 'still.png'),
    ]);
    expect(code).toBe(1);
    expect(stderr).toMatch(
      /truncated\.mp4: the video cannot be (read|decoded)|truncated\.mp4: not an image or a video/,
    );
    expect(stderr).toMatch(/notes\.txt: not an image or a video/);
    // The good file after the bad ones is still analysed.
    expect(stdout.trim().split('\n')).toHaveLength(1);
    expect(JSON.parse(stdout).file).toContain('still.png');
  });
});
