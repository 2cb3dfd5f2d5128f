import net from 'node:net';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Mailer } from '@server/mail/mailer';
import { ObjectStorage } from '@server/storage/object-storage';
import { createTestServer, type TestServer } from '../helpers/server-harness';
import { removeVideoFixtures, videoFixture, type VideoFixture } from '../helpers/video-fixture';

// When a backing service fails, the caller gets a clear 5xx and nothing half-done is kept.

let server: TestServer;
let video: VideoFixture;
let deadEndpoint: string;

beforeAll(async () => {
  [server, video] = await Promise.all([createTestServer(), videoFixture('mp4')]);
  // A port that was just free: nothing listens there, so connections are refused at once.
  const probe = net.createServer();
  await new Promise<void>((resolve) => probe.listen(0, '127.0.0.1', resolve));
  const { port } = probe.address() as net.AddressInfo;
  await new Promise<void>((resolve) => probe.close(() => resolve()));
  deadEndpoint = `http://127.0.0.1:${port}`;
});
afterAll(async () => {
  await server.close();
  await removeVideoFixtures();
});

describe('clip storage unreachable', () => {
  it('refuses the upload with 503 and keeps no row and no temp file; health says degraded', async () => {
    const storage = new ObjectStorage({ ...server.config.s3, endpoint: deadEndpoint });
    const http = supertest(server.buildApp({ storage }));
    const [sessionId] = await server.sessionIds();
    const before = await server.count('clip');
    const res = await http
      .post('/api/clips')
      .set(await server.bearer('coach'))
      .field('sessionId', sessionId)
      .field('athleteIds', await server.athleteId('Elsie'))
      .field('view', 'side')
      .attach('file', video.path);
    expect(res.status).toBe(503);
    expect(res.body.error).toEqual({
      code: 'storage_unavailable',
      message: 'Clip storage cannot be reached; the upload was not kept. Try again.',
    });
    expect(await server.count('clip')).toBe(before);
    expect(await server.tempFiles()).toEqual([]);

    const health = await http.get('/api/health');
    expect(health.status).toBe(503);
    expect(health.body).toEqual({ status: 'degraded', checks: { database: true, storage: false } });
    storage.close();
  });
});

describe('mail relay failing', () => {
  it('answers 502 and keeps no invitation that nobody received', async () => {
    const mailer: Mailer = {
      send: () => Promise.reject(new Error('relay said 421 try later')),
      close: () => undefined,
    };
    const http = supertest(server.buildApp({ mailer }));
    const before = await server.count('invitation');
    const res = await http
      .post('/api/invitations')
      .set(await server.bearer('head'))
      .send({ email: 'unlucky@larchwood.example', role: 'analyst' });
    expect(res.status).toBe(502);
    expect(res.body.error.code).toBe('mail_failed');
    expect(JSON.stringify(res.body)).not.toContain('421');
    expect(await server.count('invitation')).toBe(before);
  });
});
