import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditRepository } from '@server/repositories/audit.repository';
import { DEMO_PASSWORD } from '@server/seed/demo-club';
import { createTestServer, DEMO_EMAILS, type TestServer } from '../helpers/server-harness';

let server: TestServer;

beforeAll(async () => {
  server = await createTestServer();
});
afterAll(async () => {
  await server.close();
});

function refreshCookieOf(res: { headers: Record<string, unknown> }): string {
  const cookies = ([] as string[]).concat((res.headers['set-cookie'] as string[] | undefined) ?? []);
  const cookie = cookies.find((c) => c.startsWith('stanceline_refresh='));
  if (!cookie) throw new Error('no refresh cookie set');
  return cookie;
}

describe('POST /api/auth/login', () => {
  it('signs in a demo member, returns the user and sets an httpOnly refresh cookie', async () => {
    const res = await server.http
      .post('/api/auth/login')
      .send({ email: 'Coach@Larchwood.example ', password: DEMO_PASSWORD });
    expect(res.status).toBe(200);
    expect(typeof res.body.accessToken).toBe('string');
    expect(res.body.user).toMatchObject({ email: DEMO_EMAILS.coach, role: 'coach', athleteId: null });
    expect(res.body.user.coachedAgeGroupIds).toHaveLength(2);
    const cookie = refreshCookieOf(res);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).toMatch(/Path=\/api\/auth/);
    // The refresh token never appears in the body.
    expect(JSON.stringify(res.body)).not.toContain(cookie.split(';')[0].split('=')[1]);
  });

  it('links the demo athlete and guardian to their records', async () => {
    const athlete = await server.login('athlete');
    const guardian = await server.login('guardian');
    const elsie = await server.athleteId('Elsie');
    const finn = await server.athleteId('Finn');
    expect(athlete.user.athleteId).toBe(elsie);
    expect(guardian.user.childAthleteIds.sort()).toEqual([elsie, finn].sort());
  });

  it('refuses a wrong password and an unknown e-mail with the same 401', async () => {
    const wrong = await server.http
      .post('/api/auth/login')
      .send({ email: DEMO_EMAILS.head, password: 'nope-nope' });
    const unknown = await server.http
      .post('/api/auth/login')
      .send({ email: 'nobody@larchwood.example', password: DEMO_PASSWORD });
    for (const res of [wrong, unknown]) {
      expect(res.status).toBe(401);
      expect(res.body.error.code).toBe('invalid_credentials');
      expect(res.headers['set-cookie']).toBeUndefined();
    }
    expect(wrong.body.error.message).toBe(unknown.body.error.message);
  });

  it('lists the zod issues of a malformed body', async () => {
    const res = await server.http.post('/api/auth/login').send({ email: 'not-an-email' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    const paths = (res.body.error.details.issues as { path: string[] }[]).map((i) => i.path.join('.'));
    expect(paths).toEqual(expect.arrayContaining(['email', 'password']));
  });

  it('answers broken JSON with a 400, not a 500', async () => {
    const res = await server.http
      .post('/api/auth/login')
      .set('Content-Type', 'application/json')
      .send('{"email":');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('malformed_body');
  });

  it('records sign-ins in the audit log', async () => {
    const before = (await new AuditRepository(server.runtime.dataSource.manager).listByAction('auth.sign_in'))
      .length;
    const { user } = await server.login('analyst');
    const events = await new AuditRepository(server.runtime.dataSource.manager).listByAction('auth.sign_in');
    expect(events).toHaveLength(before + 1);
    expect(events.at(-1)).toMatchObject({ actorUserId: user.id, targetId: user.id });
  });
});

describe('access token expiry and refresh', () => {
  it('rejects requests without a token, with a garbage token and with an expired token, each with its own code', async () => {
    const none = await server.http.get('/api/me');
    expect(none.status).toBe(401);
    expect(none.body.error.code).toBe('unauthenticated');

    const garbage = await server.http.get('/api/me').set('Authorization', 'Bearer not.a.jwt');
    expect(garbage.status).toBe(401);
    expect(garbage.body.error.code).toBe('invalid_token');

    // Issue the token an hour in the past: with the 15 min default TTL it expired 45 min ago.
    server.clock.offsetMs = -60 * 60_000;
    const old = await server.login('head');
    server.clock.offsetMs = 0;
    const expired = await server.http.get('/api/me').set('Authorization', `Bearer ${old.accessToken}`);
    expect(expired.status).toBe(401);
    expect(expired.body.error.code).toBe('token_expired');

    // The refresh cookie from that sign-in is still good (30 days): it yields a working token.
    const refreshed = await server.http.post('/api/auth/refresh').set('Cookie', old.cookie);
    expect(refreshed.status).toBe(200);
    expect(refreshed.body.user.email).toBe(DEMO_EMAILS.head);
    const me = await server.http.get('/api/me').set('Authorization', `Bearer ${refreshed.body.accessToken}`);
    expect(me.status).toBe(200);
    expect(me.body.club.name).toBe('Larchwood Valley Ski Club');
  });

  it('rotates the refresh token: the old cookie stops working once used', async () => {
    const session = await server.login('coach');
    const first = await server.http.post('/api/auth/refresh').set('Cookie', session.cookie);
    expect(first.status).toBe(200);
    const rotated = refreshCookieOf(first).split(';')[0];
    expect(rotated).not.toBe(session.cookie);

    const replay = await server.http.post('/api/auth/refresh').set('Cookie', session.cookie);
    expect(replay.status).toBe(401);
    expect(replay.body.error.code).toBe('invalid_refresh_token');

    const next = await server.http.post('/api/auth/refresh').set('Cookie', rotated);
    expect(next.status).toBe(200);
  });

  it('ends every session of a member when a rotated token is replayed later', async () => {
    const session = await server.login('guardian');
    const first = await server.http.post('/api/auth/refresh').set('Cookie', session.cookie);
    const current = refreshCookieOf(first).split(';')[0];
    // Past the grace window for simultaneous tabs (30 s), a replay counts as a leak.
    server.clock.offsetMs = 60_000;
    const replay = await server.http.post('/api/auth/refresh').set('Cookie', session.cookie);
    expect(replay.status).toBe(401);
    const afterLeak = await server.http.post('/api/auth/refresh').set('Cookie', current);
    server.clock.offsetMs = 0;
    expect(afterLeak.status).toBe(401);
  });

  it('refuses a refresh token past REFRESH_TTL', async () => {
    const session = await server.login('analyst');
    server.clock.offsetMs = 31 * 86_400_000;
    const res = await server.http.post('/api/auth/refresh').set('Cookie', session.cookie);
    server.clock.offsetMs = 0;
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('refresh_expired');
  });

  it('refuses a refresh without a cookie', async () => {
    const res = await server.http.post('/api/auth/refresh');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('no_refresh_token');
  });

  it('logout revokes the refresh token and clears the cookie', async () => {
    const session = await server.login('athlete');
    const out = await server.http.post('/api/auth/logout').set('Cookie', session.cookie);
    expect(out.status).toBe(204);
    expect(refreshCookieOf(out)).toMatch(/Expires=Thu, 01 Jan 1970/);
    const res = await server.http.post('/api/auth/refresh').set('Cookie', session.cookie);
    expect(res.status).toBe(401);
  });
});

describe('sign out everywhere', () => {
  it('voids every refresh token and every access token of the member at once', async () => {
    const laptop = await server.login('coach');
    const phone = await server.login('coach');
    const out = await server.http
      .post('/api/auth/logout')
      .set('Cookie', phone.cookie)
      .send({ everywhere: true });
    expect(out.status).toBe(204);
    const access = await server.http.get('/api/me').set('Authorization', `Bearer ${laptop.accessToken}`);
    expect(access.status).toBe(401);
    expect(access.body.error.code).toBe('invalid_token');
    const refresh = await server.http.post('/api/auth/refresh').set('Cookie', laptop.cookie);
    expect(refresh.status).toBe(401);
    // Signing in again works and yields a valid token under the new version.
    const again = await server.login('coach');
    const me = await server.http.get('/api/me').set('Authorization', `Bearer ${again.accessToken}`);
    expect(me.status).toBe(200);
  });

  it('keeps the rotated token when two tabs present the old one within the grace window', async () => {
    const session = await server.login('analyst');
    const first = await server.http.post('/api/auth/refresh').set('Cookie', session.cookie);
    const current = refreshCookieOf(first).split(';')[0];
    const lateTab = await server.http.post('/api/auth/refresh').set('Cookie', session.cookie);
    expect(lateTab.status).toBe(401);
    const stillGood = await server.http.post('/api/auth/refresh').set('Cookie', current);
    expect(stillGood.status).toBe(200);
  });
});

describe('login rate limit', () => {
  it('answers 429 after LOGIN_RATE_LIMIT attempts for one e-mail', async () => {
    const limited = await createTestServer({ LOGIN_RATE_LIMIT: '3' });
    try {
      const attempt = () =>
        limited.http.post('/api/auth/login').send({ email: DEMO_EMAILS.head, password: 'wrong-password' });
      const statuses = [];
      for (let i = 0; i < 4; i += 1) statuses.push((await attempt()).status);
      expect(statuses).toEqual([401, 401, 401, 429]);
      const other = await limited.http
        .post('/api/auth/login')
        .send({ email: DEMO_EMAILS.coach, password: DEMO_PASSWORD });
      expect(other.status).toBe(200);
    } finally {
      await limited.close();
    }
  });
});
