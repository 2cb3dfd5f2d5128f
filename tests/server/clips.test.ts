import fs from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import type { Test } from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditRepository } from '@server/repositories/audit.repository';
import { createTestServer, type TestServer } from '../helpers/server-harness';
import { shareWithAthlete } from './clip-fixtures';
import {
  rotatedVideoFixture,
  videoFixture,
  type VideoFixture,
  removeVideoFixtures,
} from '../helpers/video-fixture';

const LIMIT = 256 * 1024;
let server: TestServer;
let video: VideoFixture;
let scratch: string;
let sessionId: string;
let elsie: string;

beforeAll(async () => {
  [server, video] = await Promise.all([
    createTestServer({ MAX_UPLOAD_BYTES: String(LIMIT) }),
    videoFixture('mp4'),
  ]);
  scratch = await fs.mkdtemp(path.join(os.tmpdir(), 'stanceline-bad-uploads-'));
  [sessionId] = await server.sessionIds();
  elsie = await server.athleteId('Elsie');
});
afterAll(async () => {
  await server.close();
  await fs.rm(scratch, { recursive: true, force: true });
  await removeVideoFixtures();
});

async function upload(file: string, fields: Record<string, string>, role: 'head' | 'coach' = 'coach') {
  const req = server.http.post('/api/clips').set(await server.bearer(role));
  for (const [k, v] of Object.entries(fields)) req.field(k, v);
  return req.attach('file', file);
}

async function leftovers() {
  // Earlier uploads get their poster and thumbnails in the background; count once that has settled.
  await server.runtime.mediaQueue.idle();
  return {
    clips: await server.count('clip'),
    tags: await server.count('clip_athlete'),
    objects: (await server.runtime.storage.listKeys()).length,
    temp: (await server.tempFiles()).length,
  };
}

describe('upload round trip', () => {
  let clipId: string;
  let mediaUrl: string;

  it('stores the clip, probes it and answers with a ClipDto', async () => {
    expect(video.bytes.length).toBeLessThan(LIMIT);
    const res = await upload(video.path, { sessionId, athleteIds: elsie, view: 'side' });
    expect(res.status).toBe(201);
    const clip = res.body.clip;
    clipId = clip.id;
    mediaUrl = clip.mediaUrl;
    // Expected values are what the fixture was rendered with (testsrc 160x120, 25 fps, 1 s).
    expect(clip).toMatchObject({
      sessionId,
      view: 'side',
      status: 'uploaded',
      originalName: 'testsrc.mp4',
      sizeBytes: video.bytes.length,
      codec: 'h264',
      width: video.width,
      height: video.height,
      fps: video.fps,
      frameCount: video.frames,
      durationMs: 1000,
      athletes: [{ id: elsie, name: 'Elsie Marrow' }],
    });
    expect(clip.mediaUrl).toMatch(new RegExp(`^/api/clips/${clipId}/media\\?token=`));
    expect(await server.tempFiles()).toEqual([]);
    const audit = await new AuditRepository(server.runtime.dataSource.manager).listByAction('clip.upload');
    expect(audit.map((e) => e.targetId)).toContain(clipId);
  });

  it('serves the whole file with Accept-Ranges through the signed media URL (no bearer)', async () => {
    const res = await server.http.get(mediaUrl).buffer(true).parse(binaryParser);
    expect(res.status).toBe(200);
    expect(res.headers['accept-ranges']).toBe('bytes');
    expect(res.headers['content-type']).toBe('video/mp4');
    expect(Buffer.compare(res.body as Buffer, video.bytes)).toBe(0);
  });

  it('answers a Range request with 206 and exactly those bytes', async () => {
    const start = 100;
    const end = 1123;
    const res = await server.http
      .get(mediaUrl)
      .set('Range', `bytes=${start}-${end}`)
      .buffer(true)
      .parse(binaryParser);
    expect(res.status).toBe(206);
    expect(res.headers['content-range']).toBe(`bytes ${start}-${end}/${video.bytes.length}`);
    expect(res.headers['content-length']).toBe(String(end - start + 1));
    expect(Buffer.compare(res.body as Buffer, video.bytes.subarray(start, end + 1))).toBe(0);
  });

  it('serves open-ended and suffix ranges the way a <video> element asks for them', async () => {
    const size = video.bytes.length;
    const open = await server.http.get(mediaUrl).set('Range', 'bytes=0-').buffer(true).parse(binaryParser);
    expect(open.status).toBe(206);
    expect(open.headers['content-range']).toBe(`bytes 0-${size - 1}/${size}`);
    const tail = await server.http.get(mediaUrl).set('Range', 'bytes=-500').buffer(true).parse(binaryParser);
    expect(tail.status).toBe(206);
    expect(Buffer.compare(tail.body as Buffer, video.bytes.subarray(size - 500))).toBe(0);
  });

  it('answers HEAD with the headers of the full answer and no body', async () => {
    const res = await server.http.head(mediaUrl);
    expect(res.status).toBe(200);
    expect(res.headers['content-length']).toBe(String(video.bytes.length));
    expect(res.headers['accept-ranges']).toBe('bytes');
  });

  it('answers a range past the end with 416 and the size', async () => {
    const size = video.bytes.length;
    const res = await server.http.get(mediaUrl).set('Range', `bytes=${size + 10}-${size + 20}`);
    expect(res.status).toBe(416);
    expect(res.headers['content-range']).toBe(`bytes */${size}`);
    expect(res.body.error.code).toBe('range_not_satisfiable');
  });

  it('also accepts a bearer token, and refuses a media token made for another clip', async () => {
    // The athlete opens her clip once a review shares it; before that it is not hers to open.
    const before = await server.http.get(`/api/clips/${clipId}/media`).set(await server.bearer('athlete'));
    expect(before.status).toBe(404);
    await shareWithAthlete(server, clipId, elsie);
    const viaBearer = await server.http
      .get(`/api/clips/${clipId}/media`)
      .set(await server.bearer('athlete'))
      .set('Range', 'bytes=0-9');
    expect(viaBearer.status).toBe(206);
    const token = new URL(mediaUrl, 'http://x').searchParams.get('token')!;
    const other = await server.http.get(
      `/api/clips/00000000-0000-4000-8000-000000000000/media?token=${token}`,
    );
    expect(other.status).toBe(401);
    expect(other.body.error.code).toBe('invalid_media_token');
    const none = await server.http.get(`/api/clips/${clipId}/media`);
    expect(none.status).toBe(401);
  });

  it('lists the clip for its athlete, by athlete and by session', async () => {
    const byAthlete = await server.http
      .get(`/api/athletes/${elsie}/clips`)
      .set(await server.bearer('athlete'));
    expect(byAthlete.status).toBe(200);
    expect(byAthlete.body.clips.map((c: { id: string }) => c.id)).toContain(clipId);
    const byQuery = await server.http
      .get(`/api/clips?sessionId=${sessionId}`)
      .set(await server.bearer('head'));
    expect(byQuery.body.clips.map((c: { id: string }) => c.id)).toContain(clipId);
    const session = await server.http.get(`/api/sessions/${sessionId}`).set(await server.bearer('head'));
    expect(session.body.session.clipCount).toBeGreaterThanOrEqual(1);
  });

  it('reports portrait phone video as displayed (rotation applied to width and height)', async () => {
    const rotated = await rotatedVideoFixture();
    const res = await upload(rotated.path, { sessionId, athleteIds: elsie, view: 'front' });
    expect(res.status).toBe(201);
    expect(res.body.clip).toMatchObject({ width: 120, height: 160 });
  });

  it('accepts WebM as well, found by content', async () => {
    const webm = await videoFixture('webm');
    const res = await upload(webm.path, { sessionId, athleteIds: elsie, view: 'front' });
    expect(res.status).toBe(201);
    expect(res.body.clip).toMatchObject({ codec: 'vp9', width: 160, height: 120, frameCount: 25 });
    const media = await server.http.get(res.body.clip.mediaUrl).set('Range', 'bytes=0-3');
    expect(media.headers['content-type']).toBe('video/webm');
  });
});

describe('bad uploads get a 4xx with a clear message and leave nothing behind', () => {
  it('an empty file', async () => {
    const before = await leftovers();
    const empty = path.join(scratch, 'empty.mp4');
    await fs.writeFile(empty, '');
    const res = await upload(empty, { sessionId, athleteIds: elsie, view: 'side' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('empty_file');
    expect(res.body.error.message).toContain('empty');
    expect(await leftovers()).toEqual(before);
  });

  it('a text file named .mp4', async () => {
    const before = await leftovers();
    const fake = path.join(scratch, 'notes.mp4');
    await fs.writeFile(fake, 'Gate 12: late edge, hips back.\n'.repeat(50));
    const res = await upload(fake, { sessionId, athleteIds: elsie, view: 'side' });
    expect(res.status).toBe(415);
    expect(res.body.error.code).toBe('unsupported_type');
    expect(res.body.error.message).toContain('not a video');
    expect(await leftovers()).toEqual(before);
  });

  it('a PNG image named .mov', async () => {
    const before = await leftovers();
    const png = path.join(scratch, 'still.mov');
    // The 8-byte PNG signature (PNG spec, section 5.2) followed by an IHDR chunk header.
    await fs.writeFile(
      png,
      Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c489', 'hex'),
    );
    const res = await upload(png, { sessionId, athleteIds: elsie, view: 'side' });
    expect(res.status).toBe(415);
    expect(res.body.error.message).toContain('image/png');
    expect(await leftovers()).toEqual(before);
  });

  it('a truncated video (right magic bytes, no playable stream)', async () => {
    const before = await leftovers();
    const cut = path.join(scratch, 'cut.mp4');
    await fs.writeFile(cut, video.bytes.subarray(0, 64));
    const res = await upload(cut, { sessionId, athleteIds: elsie, view: 'side' });
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('unreadable_video');
    expect(await leftovers()).toEqual(before);
  });

  it('a file over MAX_UPLOAD_BYTES', async () => {
    const before = await leftovers();
    const big = path.join(scratch, 'big.mp4');
    await fs.writeFile(big, Buffer.concat([video.bytes, Buffer.alloc(LIMIT, 7)]));
    const res = await upload(big, { sessionId, athleteIds: elsie, view: 'side' });
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('file_too_large');
    expect(res.body.error.message).toBe('The file is larger than the 256 KiB limit');
    expect(await leftovers()).toEqual(before);
  });

  it('a request without a file', async () => {
    const before = await leftovers();
    const res = await server.http
      .post('/api/clips')
      .set(await server.bearer('coach'))
      .field('sessionId', sessionId)
      .field('athleteIds', elsie)
      .field('view', 'side');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('file_missing');
    expect(await leftovers()).toEqual(before);
  });

  it('fields that fail the schema, listed per field', async () => {
    const before = await leftovers();
    const res = await upload(video.path, { sessionId: 'x', athleteIds: '', view: 'top' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    const paths = (res.body.error.details.issues as { path: string[] }[]).map((i) => i.path[0]);
    expect(paths).toEqual(expect.arrayContaining(['sessionId', 'athleteIds', 'view']));
    expect(await leftovers()).toEqual(before);
  });

  it('fields sent after the file are checked too', async () => {
    const before = await leftovers();
    const res = await server.http
      .post('/api/clips')
      .set(await server.bearer('coach'))
      .attach('file', video.path)
      .field('sessionId', sessionId)
      .field('view', 'side');
    expect(res.status).toBe(400);
    expect(res.body.error.details.issues[0].path).toEqual(['athleteIds']);
    expect(await leftovers()).toEqual(before);
  });

  it('an athlete under 18 without recorded consent: 409 that says to record consent first', async () => {
    const before = await leftovers();
    const noor = await server.athleteId('Noor');
    const res = await upload(video.path, { sessionId, athleteIds: `${elsie},${noor}`, view: 'front' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('consent_required');
    expect(res.body.error.message).toMatch(/Record a guardian’s consent for Noor Dunmore first/);
    expect(res.body.error.details.athleteIds).toEqual([noor]);
    expect(await leftovers()).toEqual(before);

    // Once consent is recorded the same upload goes through.
    const consent = await server.http
      .post(`/api/athletes/${noor}/consent`)
      .set(await server.bearer('coach'))
      .send({ guardianName: 'Hal Dunmore', method: 'signed_form' });
    expect(consent.status).toBe(200);
    expect(consent.body.athlete.consent).toMatchObject({ status: 'granted', guardianName: 'Hal Dunmore' });
    const again = await upload(video.path, { sessionId, athleteIds: `${elsie},${noor}`, view: 'front' });
    expect(again.status).toBe(201);
    const audit = await new AuditRepository(server.runtime.dataSource.manager).listByAction(
      'athlete.consent',
    );
    expect(audit.map((e) => e.targetId)).toContain(noor);
  });

  it('a session of nobody’s club and an unknown athlete: 404', async () => {
    const before = await leftovers();
    const ghost = '00000000-0000-4000-8000-000000000000';
    const badSession = await upload(video.path, { sessionId: ghost, athleteIds: elsie, view: 'side' });
    expect(badSession.status).toBe(404);
    const badAthlete = await upload(video.path, { sessionId, athleteIds: ghost, view: 'side' });
    expect(badAthlete.status).toBe(404);
    expect(await leftovers()).toEqual(before);
  });
});

// superagent hands custom parsers the raw response stream; its typings say otherwise.
const binaryParser = ((res: NodeJS.ReadableStream, callback: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (chunk: Buffer) => chunks.push(chunk));
  res.on('end', () => callback(null, Buffer.concat(chunks)));
  res.on('error', (err: Error) => callback(err, Buffer.alloc(0)));
}) as unknown as Parameters<Test['parse']>[0];
