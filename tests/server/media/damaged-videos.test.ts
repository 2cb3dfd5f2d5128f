import { execFile } from 'node:child_process';
import fs from 'node:fs/promises';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { FFMPEG_PATH } from '@server/media/media-tools';
import { createTestServer, type TestServer } from '../../helpers/server-harness';
import { removeRenderedVideos, renderVideo, settled, uploadClip, writeScratch } from '../clip-fixtures';

// Videos that are damaged or beyond the product's limits get a reason a coach can act on, never a
// "ready" clip with half its frames or an internal error.
const run = promisify(execFile);
let server: TestServer;
let fields: { sessionId: string; athleteIds: string; view: 'front' };

beforeAll(async () => {
  server = await createTestServer();
  fields = {
    sessionId: (await server.sessionIds())[0],
    athleteIds: await server.athleteId('Elsie'),
    view: 'front',
  };
});
afterAll(async () => {
  await server.close();
  await removeRenderedVideos();
});

describe('damaged and extreme videos', () => {
  it('fails a copy cut short whose index says it is whole, naming both counts', async () => {
    const whole = await renderVideo('h264-mp4', { seconds: 4, fps: 25, width: 320, height: 240 });
    // The index (moov) first, as phones and most exports write it; then the file cut in half.
    const faststart = await writeScratch('faststart.mp4', '');
    await run(FFMPEG_PATH, [
      '-hide_banner',
      '-loglevel',
      'error',
      '-i',
      whole.path,
      '-c',
      'copy',
      '-movflags',
      '+faststart',
      '-y',
      faststart,
    ]);
    const bytes = await fs.readFile(faststart);
    const cut = await writeScratch('cut-short.mp4', bytes.subarray(0, Math.floor(bytes.length * 0.5)));

    const clip = await uploadClip(server, cut, fields);
    const done = await settled(server, clip.id);
    expect(done.status).toBe('failed');
    expect(done.failureReason).toMatch(/ends early: it lists 100 frames but holds only \d+/);
    expect(done.failureReason).toMatch(/Copy the clip from the phone again/);
  });

  it('refuses a clip larger than 4096 pixels on a side at upload, with the limit in the message', async () => {
    const huge = await renderVideo('h264-mp4', { seconds: 1, fps: 5, width: 8192, height: 64 });
    const res = await server.http
      .post('/api/clips')
      .set(await server.bearer('coach'))
      .field('sessionId', fields.sessionId)
      .field('athleteIds', fields.athleteIds)
      .field('view', 'front')
      .attach('file', huge.path);
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('video_too_large');
    expect(res.body.error.message).toMatch(/8192 × 64 pixels.*up to 4096 pixels/);
    expect(await server.count('clip')).toBe(1);
  });

  it('still takes a whole clip', async () => {
    const fine = await renderVideo('h264-mp4', { seconds: 2 });
    const done = await settled(server, (await uploadClip(server, fine.path, fields)).id);
    expect(done.status).toBe('ready');
  });
});
