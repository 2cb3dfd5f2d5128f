import fs from 'node:fs/promises';
import { pino } from 'pino';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { redactUrl } from '@server/middleware/request-logger.middleware';
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

describe('secrets in the request log', () => {
  it('redacts invitation tokens in paths and secrets in queries', () => {
    const secret = 'Zr4m7QpX0s9vT2yLk8wB1nC6dE3fG5hJ';
    const urls = [
      `/api/invitations/${secret}`,
      `/api/invitations/${secret}/accept`,
      `/invite/${secret}`,
      `/invite/${secret}?from=mail`,
      `/api/clips/abc/media?token=${secret}&variant=original`,
      `/api/auth/password-reset/${secret}`,
      `/reset-password/${secret}`,
      `/api/anything?code=${secret}`,
    ];
    for (const url of urls) {
      const logged = redactUrl(url);
      expect(logged).not.toContain(secret);
      expect(logged).toContain('[redacted]');
    }
    expect(redactUrl('/api/clips/abc/media?token=x&variant=original')).toBe(
      '/api/clips/abc/media?token=[redacted]&variant=original',
    );
  });

  it('keeps the token out of what the server actually logs for an invitation link', async () => {
    const lines: string[] = [];
    const logger = pino({ level: 'info' }, { write: (line: string) => lines.push(line) });
    const app = server.buildApp({ logger });
    const secret = 'Ab3dEf6hIj9kLm2nOp5qRs8tUv1wXy4z';
    await supertest(app).get(`/api/invitations/${secret}`);
    await supertest(app).get(`/invite/${secret}`);
    expect(lines.length).toBeGreaterThanOrEqual(2);
    expect(lines.join('\n')).not.toContain(secret);
  });
});

describe('development mailbox', () => {
  it('is not served to a request that came through a reverse proxy', async () => {
    expect((await server.http.get('/dev/mailbox.json')).status).toBe(200);
    for (const header of ['X-Forwarded-For', 'Forwarded', 'X-Real-IP']) {
      const res = await server.http.get('/dev/mailbox.json').set(header, 'for=203.0.113.9');
      expect(res.status).toBe(404);
    }
  });

  it('is not served unless the setting asks for it', async () => {
    const off = await createTestServer({ DEV_MAILBOX: 'off' });
    try {
      expect((await off.http.get('/dev/mailbox')).status).toBe(404);
    } finally {
      await off.close();
    }
  });
});

describe('security headers', () => {
  it('sends a content security policy without inline scripts, and refuses framing and sniffing', async () => {
    const res = await server.http.get('/api/health');
    const csp = String(res.headers['content-security-policy']);
    const scriptSrc = /script-src ([^;]+)/.exec(csp)?.[1] ?? '';
    expect(scriptSrc).toContain("'self'");
    expect(scriptSrc).not.toContain('unsafe-inline');
    expect(csp).toContain("frame-ancestors 'none'");
    expect(csp).toContain("object-src 'none'");
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['referrer-policy']).toBe('no-referrer');
    // Served over plain http here (PUBLIC_URL http://stanceline.test): no HSTS.
    expect(res.headers['strict-transport-security']).toBeUndefined();
  });

  it('asks browsers to keep to https when the app is served over https', async () => {
    const secure = await createTestServer({ PUBLIC_URL: 'https://stanceline.example' });
    try {
      const res = await secure.http.get('/api/health');
      expect(res.headers['strict-transport-security']).toMatch(/max-age=\d+/);
    } finally {
      await secure.close();
    }
  });
});

describe('malformed uploads', () => {
  it('answers 400 to a multipart body without its closing boundary, and to one without a boundary', async () => {
    const auth = await server.bearer('coach');
    const cut = await server.http
      .post('/api/clips')
      .set(auth)
      .set('Content-Type', 'multipart/form-data; boundary=XyZ')
      .send(
        '--XyZ\r\nContent-Disposition: form-data; name="view"\r\n\r\nfront\r\n--XyZ\r\nContent-Disposition: form-da',
      );
    expect(cut.status).toBe(400);
    expect(cut.body.error.code).toBe('malformed_upload');
    const noBoundary = await server.http
      .post('/api/clips')
      .set(auth)
      .set('Content-Type', 'multipart/form-data')
      .send('view=front');
    expect(noBoundary.status).toBe(400);
    expect(noBoundary.body.error.message).toMatch(/multipart/);
  });

  it('refuses an upload for an athlete the coach may not see before any of the file is written', async () => {
    // The scratch folder is made unusable: writing the file would fail with a server error, so a 404
    // shows the refusal came first, from the fields alone.
    const local = await createTestServer();
    try {
      await fs.rm(local.config.uploadTempDir, { recursive: true, force: true });
      await fs.writeFile(local.config.uploadTempDir, 'not a folder');
      const video = await renderVideo('h264-mp4', { seconds: 1 });
      const [sessionId] = await local.sessionIds();
      const res = await local.http
        .post('/api/clips')
        .set(await local.bearer('coach'))
        .field('sessionId', sessionId)
        // Signe is in U16, which the demo coach does not coach.
        .field('athleteIds', await local.athleteId('Signe'))
        .field('view', 'side')
        .attach('file', video.path);
      expect(res.status).toBe(404);
      expect(await local.count('clip')).toBe(0);
    } finally {
      await local.close();
    }
  });
});

describe('times bounded by the clip', () => {
  it('refuses a note or a frame whose time is past the clip’s end, naming the field', async () => {
    const auth = await server.bearer('coach');
    const huge = await server.http
      .post(`/api/clips/${clipId}/notes`)
      .set(auth)
      .send({ timeMs: 1e308, text: 'far away' });
    expect(huge.status).toBe(400);
    expect(JSON.stringify(huge.body)).toContain('timeMs');
    // One second past a one-second clip.
    const past = await server.http
      .post(`/api/clips/${clipId}/notes`)
      .set(auth)
      .send({ timeMs: 2000, text: 'late' });
    expect(past.status).toBe(400);
    expect(past.body.error.message).toMatch(/timeMs.*past the clip's end/);
    const frame = await server.http
      .post(`/api/clips/${clipId}/frames`)
      .set(auth)
      .send({
        model: 'lightning',
        frames: [{ frameIndex: 1, timeMs: 60_000, keypoints: [{ name: 'nose', x: 1, y: 1, score: 0.9 }] }],
      });
    expect(frame.status).toBe(400);
    expect(JSON.stringify(frame.body)).toContain('timeMs');
    const notes = await server.http.get(`/api/clips/${clipId}/notes`).set(auth);
    expect(notes.body.notes).toHaveLength(0);
    const vtt = await server.http.get(`/api/clips/${clipId}/notes.vtt`).set(auth);
    expect(vtt.status).toBe(200);
  });
});

describe('passwords', () => {
  const mailTo = async (to: string) =>
    (await server.runtime.mailbox!.messages()).filter((m) => m.to.includes(to));

  it('refuses an easy password when joining, naming the field and the reason', async () => {
    const invite = await server.http
      .post('/api/invitations')
      .set(await server.bearer('head'))
      .send({ email: 'weak.pass@larchwood.example', role: 'analyst' });
    expect(invite.status).toBe(201);
    const [mail] = await mailTo('weak.pass@larchwood.example');
    const token = /\/invite\/([A-Za-z0-9_-]+)/.exec(mail.text)![1];
    for (const password of ['aaaaaaaaaa', 'password123', '1234567890', 'qwertyuiop']) {
      const res = await server.http
        .post('/api/invitations/accept')
        .send({ token, name: 'Wren Lowe', password });
      expect(res.status).toBe(400);
      expect(res.body.error.details.issues[0].path).toEqual(['password']);
      expect(res.body.error.message).toMatch(/too easy to guess/);
    }
    // A pass phrase of plain words is fine.
    const ok = await server.http
      .post('/api/invitations/accept')
      .send({ token, name: 'Wren Lowe', password: 'lantern orchard gravel sunrise' });
    expect(ok.status).toBe(201);
  });

  it('changes a password: checks the current one, ends the other sessions, keeps this one', async () => {
    const here = await server.http
      .post('/api/auth/login')
      .send({ email: 'weak.pass@larchwood.example', password: 'lantern orchard gravel sunrise' });
    const elsewhere = await server.http
      .post('/api/auth/login')
      .send({ email: 'weak.pass@larchwood.example', password: 'lantern orchard gravel sunrise' });
    const auth = { Authorization: `Bearer ${here.body.accessToken as string}` };

    const wrong = await server.http
      .post('/api/auth/password')
      .set(auth)
      .send({ currentPassword: 'not it at all', newPassword: 'copper valley night train' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.details.issues[0].path).toEqual(['currentPassword']);
    const weak = await server.http
      .post('/api/auth/password')
      .set(auth)
      .send({ currentPassword: 'lantern orchard gravel sunrise', newPassword: 'aaaaaaaaaa' });
    expect(weak.status).toBe(400);
    expect(weak.body.error.details.issues[0].path).toEqual(['newPassword']);

    const changed = await server.http
      .post('/api/auth/password')
      .set(auth)
      .send({ currentPassword: 'lantern orchard gravel sunrise', newPassword: 'copper valley night train' });
    expect(changed.status).toBe(200);
    const fresh = { Authorization: `Bearer ${changed.body.accessToken as string}` };
    expect((await server.http.get('/api/me').set(fresh)).status).toBe(200);
    const other = { Authorization: `Bearer ${elsewhere.body.accessToken as string}` };
    expect((await server.http.get('/api/me').set(other)).status).toBe(401);
    const oldPassword = await server.http
      .post('/api/auth/login')
      .send({ email: 'weak.pass@larchwood.example', password: 'lantern orchard gravel sunrise' });
    expect(oldPassword.status).toBe(401);
  });

  it('resets a forgotten password by an e-mailed link that works once', async () => {
    const before = (await mailTo('weak.pass@larchwood.example')).length;
    const unknown = await server.http
      .post('/api/auth/password-reset')
      .send({ email: 'nobody@larchwood.example' });
    expect(unknown.status).toBe(202);
    expect(await mailTo('nobody@larchwood.example')).toHaveLength(0);

    const asked = await server.http
      .post('/api/auth/password-reset')
      .send({ email: ' Weak.Pass@larchwood.example' });
    expect(asked.status).toBe(202);
    expect(asked.body.message).toBe(unknown.body.message);
    const mails = await mailTo('weak.pass@larchwood.example');
    expect(mails).toHaveLength(before + 1);
    const link = mails.at(-1)!;
    expect(link.html).toContain('/reset-password/');
    const token = /\/reset-password\/([A-Za-z0-9_-]+)/.exec(link.text)![1];

    expect((await server.http.get(`/api/auth/password-reset/${token}`)).body).toEqual({
      email: 'weak.pass@larchwood.example',
    });
    expect((await server.http.get('/api/auth/password-reset/not-a-real-token-at-all')).status).toBe(404);
    const weak = await server.http
      .post(`/api/auth/password-reset/${token}`)
      .send({ password: 'password1234' });
    expect(weak.status).toBe(400);
    expect(weak.body.error.details.issues[0].path).toEqual(['password']);
    const short = await server.http.post(`/api/auth/password-reset/${token}`).send({ password: 'short' });
    expect(short.status).toBe(400);

    const done = await server.http
      .post(`/api/auth/password-reset/${token}`)
      .send({ password: 'harbor kite seven maples' });
    expect(done.status).toBe(200);
    expect(typeof done.body.accessToken).toBe('string');
    expect(
      (
        await server.http
          .post(`/api/auth/password-reset/${token}`)
          .send({ password: 'another fine phrase here' })
      ).status,
    ).toBe(410);
    const login = await server.http
      .post('/api/auth/login')
      .send({ email: 'weak.pass@larchwood.example', password: 'harbor kite seven maples' });
    expect(login.status).toBe(200);
  });
});
