import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '@server/seed/demo-club';
import { createTestServer, DEMO_EMAILS, type TestServer } from '../helpers/server-harness';
import { removeRenderedVideos, renderVideo, settled, uploadClip } from './clip-fixtures';

// Regression tests for the defects a probe of the running app found. Each one failed before its fix.

let server: TestServer;
let clipId: string;

beforeAll(async () => {
  server = await createTestServer();
  const video = await renderVideo('h264-mp4', { seconds: 1 });
  const [sessionId] = await server.sessionIds();
  const clip = await uploadClip(server, video.path, {
    sessionId,
    athleteIds: await server.athleteId('Elsie'),
    view: 'front',
  });
  clipId = (await settled(server, clip.id)).id;
});
afterAll(async () => {
  await server.close();
  await removeRenderedVideos();
});

function refreshCookieOf(res: { headers: Record<string, unknown> }): string {
  const cookies = ([] as string[]).concat((res.headers['set-cookie'] as string[] | undefined) ?? []);
  const cookie = cookies.find((c) => c.startsWith('stanceline_refresh='));
  if (!cookie) throw new Error('no refresh cookie set');
  return cookie.split(';')[0];
}

describe('login rate limit', () => {
  it('counts an e-mail spelled with spaces, tabs or capitals as the same account', async () => {
    const limited = await createTestServer({ LOGIN_RATE_LIMIT: '3' });
    try {
      const spellings = [
        DEMO_EMAILS.head,
        ` ${DEMO_EMAILS.head}`,
        `${DEMO_EMAILS.head}\t`,
        DEMO_EMAILS.head.toUpperCase(),
      ];
      const statuses = [];
      for (const email of spellings) {
        statuses.push(
          (await limited.http.post('/api/auth/login').send({ email, password: 'wrong-password' })).status,
        );
      }
      expect(statuses).toEqual([401, 401, 401, 429]);
    } finally {
      await limited.close();
    }
  });

  it('limits one address trying account after account', async () => {
    // Per account 2, per address 5 × 2 = 10: ten wrong tries spread over five accounts use up the address.
    const limited = await createTestServer({ LOGIN_RATE_LIMIT: '2' });
    try {
      const accounts = Object.values(DEMO_EMAILS);
      const statuses: number[] = [];
      for (let round = 0; round < 2; round++) {
        for (const email of accounts) {
          statuses.push(
            (await limited.http.post('/api/auth/login').send({ email, password: 'wrong' })).status,
          );
        }
      }
      expect(statuses.every((s) => s === 401)).toBe(true);
      const next = await limited.http
        .post('/api/auth/login')
        .send({ email: 'someone-else@larchwood.example', password: 'wrong' });
      expect(next.status).toBe(429);
    } finally {
      await limited.close();
    }
  });

  it('keeps the counts in the database, so another server process on it sees them', async () => {
    const limited = await createTestServer({ LOGIN_RATE_LIMIT: '2' });
    try {
      const wrong = { email: DEMO_EMAILS.coach, password: 'wrong-password' };
      expect((await limited.http.post('/api/auth/login').send(wrong)).status).toBe(401);
      expect((await limited.http.post('/api/auth/login').send(wrong)).status).toBe(401);
      // A second app on the same database (as a second process would be) refuses the third try.
      const second = (await import('supertest')).default(limited.buildApp({}));
      expect((await second.post('/api/auth/login').send(wrong)).status).toBe(429);
    } finally {
      await limited.close();
    }
  });
});

describe('sessions end with logout', () => {
  it('voids the access token and the media links of a session at logout, not only its cookie', async () => {
    const login = await server.http
      .post('/api/auth/login')
      .send({ email: DEMO_EMAILS.coach, password: DEMO_PASSWORD });
    const token = login.body.accessToken as string;
    const cookie = refreshCookieOf(login);
    const auth = { Authorization: `Bearer ${token}` };
    const { clip } = (await server.http.get(`/api/clips/${clipId}`).set(auth)).body as {
      clip: { mediaUrl: string };
    };
    const mediaUrl = clip.mediaUrl;
    expect((await server.http.get('/api/me').set(auth)).status).toBe(200);
    expect((await server.http.get(mediaUrl).set('Range', 'bytes=0-15')).status).toBe(206);

    // Another sign-in of the same member (another device) stays signed in.
    const other = await server.login('coach');

    expect((await server.http.post('/api/auth/logout').set('Cookie', cookie).send({})).status).toBe(204);
    expect((await server.http.get('/api/me').set(auth)).status).toBe(401);
    expect((await server.http.get(mediaUrl).set('Range', 'bytes=0-15')).status).toBe(401);
    expect(
      (await server.http.get('/api/me').set({ Authorization: `Bearer ${other.accessToken}` })).status,
    ).toBe(200);
  });

  it('voids every access token of the member when a used refresh token comes back later', async () => {
    const login = await server.http
      .post('/api/auth/login')
      .send({ email: DEMO_EMAILS.analyst, password: DEMO_PASSWORD });
    const stolen = refreshCookieOf(login);
    const rotated = await server.http.post('/api/auth/refresh').set('Cookie', stolen);
    expect(rotated.status).toBe(200);
    const current = { Authorization: `Bearer ${rotated.body.accessToken as string}` };
    expect((await server.http.get('/api/me').set(current)).status).toBe(200);
    // Well past the grace period for two tabs refreshing at once, the old cookie is replayed.
    server.clock.offsetMs += 5 * 60_000;
    try {
      expect((await server.http.post('/api/auth/refresh').set('Cookie', stolen)).status).toBe(401);
      expect((await server.http.get('/api/me').set(current)).status).toBe(401);
    } finally {
      server.clock.offsetMs -= 5 * 60_000;
    }
  });
});
