import { execFile } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import fs from 'node:fs/promises';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ClipDto } from '@shared/schemas/clip.schema';
import { createLogger } from '@server/logger';
import { ClipProcessingQueue } from '@server/media/processing-queue';
import { derivativeKeys } from '@server/media/clip-processor';
import { probeVideo } from '@server/media/probe';
import { keyframeInterval } from '@server/media/proxy';
import { thumbnailPlan } from '@server/media/thumbnails';
import { FFPROBE_PATH } from '@server/media/media-tools';
import { ClipRepository } from '@server/repositories/clip.repository';
import { createTestServer, type TestServer } from '../helpers/server-harness';
import {
  removeRenderedVideos,
  renderVideo,
  settled,
  uploadClip,
  writeScratch,
  type RenderedVideo,
} from './clip-fixtures';

const run = promisify(execFile);

let server: TestServer;
let sessionId: string;
let elsie: string;

beforeAll(async () => {
  server = await createTestServer();
  [sessionId] = await server.sessionIds();
  elsie = await server.athleteId('Elsie');
});
afterAll(async () => {
  await server.close();
  await removeRenderedVideos();
});

async function download(url: string): Promise<{ status: number; type: string; bytes: Buffer }> {
  const res = await server.http
    .get(url)
    .buffer(true)
    .parse((stream, done) => {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', () => done(null, Buffer.concat(chunks)));
    });
  return { status: res.status, type: String(res.headers['content-type']), bytes: res.body as Buffer };
}

async function saved(bytes: Buffer, name: string): Promise<string> {
  return writeScratch(`${randomUUID()}-${name}`, bytes);
}

/** Frame indices of the keyframes, from the packet flags ffprobe reports ("K" = keyframe). */
async function keyframes(file: string): Promise<number[]> {
  const { stdout } = await run(FFPROBE_PATH, [
    '-v',
    'error',
    '-select_streams',
    'v:0',
    '-show_entries',
    'packet=flags',
    '-of',
    'csv=p=0',
    file,
  ]);
  return stdout
    .trim()
    .split('\n')
    .map((flags, i) => (flags.includes('K') ? i : -1))
    .filter((i) => i >= 0);
}

async function uploadAndSettle(video: RenderedVideo | string, view: 'front' | 'side' = 'front') {
  const file = typeof video === 'string' ? video : video.path;
  const uploaded = await uploadClip(server, file, { sessionId, athleteIds: elsie, view });
  expect(uploaded.status).toBe('uploaded');
  return settled(server, uploaded.id);
}

/** The playable copy must be H.264 yuv420p in an MP4 with every source frame and quick seeking. */
async function expectProxy(clip: ClipDto, source: RenderedVideo, display: { width: number; height: number }) {
  const media = await download(clip.mediaUrl);
  expect(media.status).toBe(200);
  expect(media.type).toBe('video/mp4');
  const file = await saved(media.bytes, 'proxy.mp4');
  const probe = await probeVideo(file);
  expect(probe).toMatchObject({
    codec: 'h264',
    pixelFormat: 'yuv420p',
    rotation: 0,
    width: display.width,
    height: display.height,
    frameCount: source.frames,
  });
  // +faststart: the index (moov) comes before the media data (mdat), so playback starts at once.
  expect(media.bytes.indexOf('moov')).toBeLessThan(media.bytes.indexOf('mdat'));
  // A keyframe at least every half second: round(25 × 0.5) = 13 frames at 25 fps.
  const keys = await keyframes(file);
  expect(keyframeInterval(source.fps)).toBe(13);
  expect(keys[0]).toBe(0);
  for (let i = 1; i < keys.length; i++) expect(keys[i] - keys[i - 1]).toBeLessThanOrEqual(13);
  expect(source.frames - 1 - keys[keys.length - 1]).toBeLessThan(13);
  return media;
}

describe('media pipeline', () => {
  it('an H.264 MP4 plays as uploaded: no copy, but a poster and a thumbnail strip', async () => {
    const video = await renderVideo('h264-mp4', { seconds: 2 });
    const clip = await uploadAndSettle(video);
    expect(clip).toMatchObject({
      status: 'ready',
      failureReason: null,
      codec: 'h264',
      frameCount: 50,
      rotation: 0,
    });
    const media = await download(clip.mediaUrl);
    expect(Buffer.compare(media.bytes, await fs.readFile(video.path))).toBe(0);

    const poster = await download(clip.posterUrl!);
    expect(poster.type).toBe('image/jpeg');
    // Every JPEG starts with the SOI marker FF D8 (ITU T.81, B.1.1.3).
    expect([...poster.bytes.subarray(0, 2)]).toEqual([0xff, 0xd8]);

    // 2 s at 250 ms steps: tiles at 0, 250, … 1750 ms = 8 tiles in one row of 8.
    expect(thumbnailPlan(2000)).toEqual({ count: 8, intervalMs: 250 });
    expect(clip.thumbnails).toMatchObject({ count: 8, columns: 8, intervalMs: 250, tileWidth: 160 });
    // 160 × 120 scaled to 160 wide keeps its 4:3 height of 120.
    expect(clip.thumbnails!.tileHeight).toBe(120);
    const sprite = await download(clip.thumbnails!.url);
    expect(sprite.type).toBe('image/jpeg');
    const spriteFile = await saved(sprite.bytes, 'sprite.jpg');
    const { stdout } = await run(FFPROBE_PATH, [
      '-v',
      'error',
      '-show_entries',
      'stream=width,height',
      '-of',
      'csv=p=0',
      spriteFile,
    ]);
    expect(stdout.trim()).toBe(`${8 * 160},${120}`);
  });

  it('an AVI (MPEG-4 Part 2, Xvid) gets an H.264 copy with the same frame count; the original stays available', async () => {
    const video = await renderVideo('xvid-avi', { seconds: 2 });
    const clip = await uploadAndSettle(video);
    expect(clip).toMatchObject({ status: 'ready', codec: 'mpeg4', frameCount: 50, width: 160, height: 120 });
    await expectProxy(clip, video, { width: 160, height: 120 });
    const original = await download(clip.mediaUrl.replace('/media?', '/media?variant=original&'));
    expect(original.type).toBe('video/x-msvideo');
    expect(Buffer.compare(original.bytes, await fs.readFile(video.path))).toBe(0);
  });

  it('HEVC phone video gets an H.264 copy with the same frame count', async () => {
    const video = await renderVideo('hevc-mp4', { seconds: 2 });
    const clip = await uploadAndSettle(video);
    expect(clip).toMatchObject({ status: 'ready', codec: 'hevc', frameCount: 50 });
    await expectProxy(clip, video, { width: 160, height: 120 });
  });

  it('a rotated portrait clip gets an upright copy; sizes are the displayed ones', async () => {
    const video = await renderVideo('h264-mp4', { seconds: 2, rotate: 90 });
    const clip = await uploadAndSettle(video);
    expect(clip.rotation).not.toBe(0);
    expect(clip).toMatchObject({ status: 'ready', width: 120, height: 160 });
    await expectProxy(clip, video, { width: 120, height: 160 });
    expect(clip.thumbnails).toMatchObject({ tileWidth: 160 });
    // 120 × 160 scaled to 160 wide: 160 × 160 / 120 = 213.3, made even by the scale filter: 214 or 212.
    expect([212, 214]).toContain(clip.thumbnails!.tileHeight);
  });

  it('H.264 in Matroska gets an MP4 copy (browsers do not all play MKV)', async () => {
    const video = await renderVideo('h264-mkv', { seconds: 2 });
    const clip = await uploadAndSettle(video);
    expect(clip).toMatchObject({ status: 'ready', codec: 'h264', frameCount: 50 });
    await expectProxy(clip, video, { width: 160, height: 120 });
  });

  it('a damaged file (header intact, picture data zeroed) ends failed with a reason, and the original is kept', async () => {
    const video = await renderVideo('h264-mp4', { seconds: 2 });
    const bytes = Buffer.from(await fs.readFile(video.path));
    const mdat = bytes.indexOf('mdat');
    const moov = bytes.indexOf('moov');
    // ffmpeg writes the index (moov) after the picture data (mdat) unless asked for +faststart.
    expect(mdat).toBeLessThan(moov);
    bytes.fill(0, mdat + 4, moov - 4);
    const broken = await writeScratch('zeroed.mp4', bytes);
    const clip = await uploadAndSettle(broken);
    expect(clip.status).toBe('failed');
    expect(clip.failureReason).toMatch(/^The file could not be read as video: /);
    expect(clip.failureReason).not.toContain('/tmp');
    expect(clip.posterUrl).toBeNull();
    expect(clip.thumbnails).toBeNull();
    const original = await download(clip.mediaUrl);
    expect(Buffer.compare(original.bytes, bytes)).toBe(0);
    const poster = await server.http.get(`/api/clips/${clip.id}/poster`).set(await server.bearer('coach'));
    expect(poster.status).toBe(404);
    expect(poster.body.error.message).toContain('could not be processed');
  });

  it('a file ffprobe cannot read ends failed with the probe’s reason', async () => {
    // Stored as if uploaded, bypassing the upload checks: what the queue sees if a file rots in the store.
    const clubId = ((await server.runtime.dataSource.query('SELECT id FROM club')) as { id: string }[])[0].id;
    const id = randomUUID();
    const key = `clubs/${clubId}/clips/${id}/original.mp4`;
    const junk = await writeScratch('junk.mp4', 'not a video at all\n'.repeat(20));
    await server.runtime.storage.putFile(key, junk, 'video/mp4');
    const row = await new ClipRepository(server.runtime.dataSource.manager).findById(
      (
        await uploadClip(server, (await renderVideo('h264-mp4', { seconds: 1 })).path, {
          sessionId,
          athleteIds: elsie,
          view: 'side',
        })
      ).id,
    );
    await server.runtime.mediaQueue.idle();
    await new ClipRepository(server.runtime.dataSource.manager).insert(
      { ...row!, id, storageKey: key, status: 'uploaded', sha256: '0'.repeat(64), originalName: 'junk.mp4' },
      [elsie],
    );
    server.runtime.mediaQueue.enqueue(id);
    const clip = await settled(server, id);
    expect(clip.status).toBe('failed');
    expect(clip.failureReason).toMatch(/^The file could not be read as video: /);
    // ffmpeg's MP4 reader says why: the file has no index ("moov" atom), as text never has.
    expect(clip.failureReason).toContain('moov atom not found');
    expect(clip.failureReason).not.toContain(server.dataDir);
    expect(await server.runtime.storage.exists(key)).toBe(true);
  });

  it('processes several clips one after another while the API keeps answering', async () => {
    const video = await renderVideo('hevc-mp4', { seconds: 3, width: 320, height: 240 });
    const ids: string[] = [];
    for (let i = 0; i < 3; i++) {
      ids.push((await uploadClip(server, video.path, { sessionId, athleteIds: elsie, view: 'front' })).id);
    }
    const seen = new Set<string>();
    let answeredWhileBusy = false;
    while (server.runtime.mediaQueue.pending > 0) {
      const health = await server.http.get('/api/health');
      expect(health.status).toBe(200);
      const statuses = (await server.runtime.dataSource.query(
        `SELECT status FROM clip WHERE id IN (?, ?, ?)`,
        ids,
      )) as { status: string }[];
      // One at a time: never two clips processing at once.
      expect(statuses.filter((s) => s.status === 'processing').length).toBeLessThanOrEqual(1);
      for (const s of statuses) seen.add(s.status);
      answeredWhileBusy ||= statuses.some((s) => s.status !== 'ready');
      await new Promise((resolve) => setTimeout(resolve, 20));
    }
    expect(answeredWhileBusy).toBe(true);
    for (const id of ids) expect((await settled(server, id)).status).toBe('ready');
  });

  it('close() stops a running job without failing the clip; the next start resumes it', async () => {
    const video = await renderVideo('hevc-mp4', { seconds: 4, width: 640, height: 360 });
    const clubId = ((await server.runtime.dataSource.query('SELECT id FROM club')) as { id: string }[])[0].id;
    const template = await new ClipRepository(server.runtime.dataSource.manager).findById(
      (
        await uploadClip(server, (await renderVideo('h264-mp4', { seconds: 1 })).path, {
          sessionId,
          athleteIds: elsie,
          view: 'side',
        })
      ).id,
    );
    await server.runtime.mediaQueue.idle();
    const id = randomUUID();
    const key = `clubs/${clubId}/clips/${id}/original.mp4`;
    await server.runtime.storage.putFile(key, video.path, 'video/mp4');
    await new ClipRepository(server.runtime.dataSource.manager).insert(
      { ...template!, id, storageKey: key, status: 'uploaded', originalName: 'long.mp4' },
      [elsie],
    );
    const deps = {
      dataSource: server.runtime.dataSource,
      storage: server.runtime.storage,
      logger: createLogger('silent'),
      workDir: `${server.dataDir}/media-work-second`,
    };
    const first = new ClipProcessingQueue(deps);
    first.enqueue(id);
    const status = async () =>
      (
        (await server.runtime.dataSource.query('SELECT status FROM clip WHERE id = ?', [id])) as {
          status: string;
        }[]
      )[0].status;
    while ((await status()) !== 'processing') await new Promise((resolve) => setTimeout(resolve, 10));
    await first.close();
    expect(await status()).toBe('processing');
    const keys = derivativeKeys({ clubId, id });
    expect(await server.runtime.storage.exists(keys.proxy)).toBe(false);
    expect(await fs.readdir(deps.workDir)).toEqual([]);

    // A crash leaves a job's scratch folder behind; the next start clears it.
    await fs.mkdir(`${deps.workDir}/${id}-crashed`, { recursive: true });
    const second = new ClipProcessingQueue(deps);
    expect(await second.resume()).toBe(1);
    await expect(fs.stat(`${deps.workDir}/${id}-crashed`)).rejects.toThrow(/ENOENT/);
    await second.idle();
    await second.close();
    expect(await status()).toBe('ready');
    expect(await server.runtime.storage.exists(keys.proxy)).toBe(true);
  });
});
