import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditRepository } from '@server/repositories/audit.repository';
import { createTestServer, type TestServer } from '../helpers/server-harness';

let server: TestServer;

beforeAll(async () => {
  server = await createTestServer();
});
afterAll(async () => {
  await server.close();
});

async function lastMailTo(email: string) {
  const messages = await server.runtime.mailbox!.messages();
  const mine = messages.filter((m) => m.to.includes(email));
  if (mine.length === 0) throw new Error(`no mail to ${email}`);
  return mine[mine.length - 1];
}

function tokenFrom(text: string): string {
  const match = /http:\/\/stanceline\.test\/invite\/([A-Za-z0-9_-]+)/.exec(text);
  if (!match) throw new Error(`no invitation link in: ${text}`);
  return match[1];
}

describe('invitations', () => {
  it('head coach invites a coach: e-mail with PUBLIC_URL/invite/<token>, preview, accept, signed in', async () => {
    const u10 = await server.ageGroupId('U10');
    const created = await server.http
      .post('/api/invitations')
      .set(await server.bearer('head'))
      .send({ email: 'New.Coach@Larchwood.example', role: 'coach', ageGroupIds: [u10] });
    expect(created.status).toBe(201);
    expect(created.body.invitation).toMatchObject({ email: 'new.coach@larchwood.example', role: 'coach' });

    const mail = await lastMailTo('new.coach@larchwood.example');
    expect(mail.subject).toBe('Join Larchwood Valley Ski Club on Stanceline');
    expect(mail.text).toContain('Ingrid Falkner invited you');
    expect(mail.html).toContain('/invite/');
    const token = tokenFrom(mail.text);

    const preview = await server.http.get(`/api/invitations/${token}`);
    expect(preview.status).toBe(200);
    expect(preview.body.invitation).toMatchObject({
      email: 'new.coach@larchwood.example',
      role: 'coach',
      club: { name: 'Larchwood Valley Ski Club' },
    });

    const accepted = await server.http
      .post('/api/invitations/accept')
      .send({ token, name: 'Juno Hartley', password: 'a-long-enough-password' });
    expect(accepted.status).toBe(201);
    expect(accepted.body.user).toMatchObject({
      role: 'coach',
      name: 'Juno Hartley',
      coachedAgeGroupIds: [u10],
    });
    expect(String(accepted.headers['set-cookie'])).toContain('stanceline_refresh=');

    const login = await server.http
      .post('/api/auth/login')
      .send({ email: 'new.coach@larchwood.example', password: 'a-long-enough-password' });
    expect(login.status).toBe(200);

    const again = await server.http
      .post('/api/invitations/accept')
      .send({ token, name: 'Juno Hartley', password: 'a-long-enough-password' });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('invitation_used');

    const audit = await new AuditRepository(server.runtime.dataSource.manager).listByAction(
      'invitation.create',
    );
    expect(audit.map((e) => e.targetId)).toContain(created.body.invitation.id);
  });

  it('coach invites a guardian of an athlete in a coached group; the guardian then sees that child', async () => {
    const kit = await server.athleteId('Kit');
    const created = await server.http
      .post('/api/invitations')
      .set(await server.bearer('coach'))
      .send({ email: 'second.parent@larchwood.example', role: 'guardian', athleteId: kit });
    expect(created.status).toBe(201);
    const mail = await lastMailTo('second.parent@larchwood.example');
    expect(mail.text).toContain('as a guardian of Kit Gorrie');
    const accepted = await server.http
      .post('/api/invitations/accept')
      .send({ token: tokenFrom(mail.text), name: 'Pat Gorrie', password: 'another-long-password' });
    expect(accepted.status).toBe(201);
    expect(accepted.body.user.childAthleteIds).toEqual([kit]);
    const seen = await server.http
      .get('/api/athletes')
      .set('Authorization', `Bearer ${accepted.body.accessToken}`);
    expect(seen.body.athletes.map((a: { id: string }) => a.id)).toEqual([kit]);
  });

  it('an athlete invitation links the sign-in to the athlete record', async () => {
    const arlo = await server.athleteId('Arlo');
    await server.http
      .post('/api/invitations')
      .set(await server.bearer('head'))
      .send({ email: 'arlo@larchwood.example', role: 'athlete', athleteId: arlo })
      .expect(201);
    const accepted = await server.http.post('/api/invitations/accept').send({
      token: tokenFrom((await lastMailTo('arlo@larchwood.example')).text),
      name: 'Arlo Eskdale',
      password: 'skiing-is-fun-123',
    });
    expect(accepted.body.user).toMatchObject({ role: 'athlete', athleteId: arlo });
    const twice = await server.http
      .post('/api/invitations')
      .set(await server.bearer('head'))
      .send({ email: 'arlo2@larchwood.example', role: 'athlete', athleteId: arlo });
    expect(twice.status).toBe(409);
    expect(twice.body.error.code).toBe('athlete_has_account');
  });

  it('refuses members who already exist, missing athletes and unknown or expired tokens', async () => {
    const existing = await server.http
      .post('/api/invitations')
      .set(await server.bearer('head'))
      .send({ email: 'coach@larchwood.example', role: 'analyst' });
    expect(existing.status).toBe(409);
    expect(existing.body.error.code).toBe('already_member');

    const noAthlete = await server.http
      .post('/api/invitations')
      .set(await server.bearer('head'))
      .send({ email: 'someone@larchwood.example', role: 'guardian' });
    expect(noAthlete.status).toBe(400);
    expect(noAthlete.body.error.code).toBe('athlete_required');

    const unknown = await server.http.get('/api/invitations/this-token-was-never-issued');
    expect(unknown.status).toBe(404);

    await server.http
      .post('/api/invitations')
      .set(await server.bearer('head'))
      .send({ email: 'late@larchwood.example', role: 'analyst' })
      .expect(201);
    const token = tokenFrom((await lastMailTo('late@larchwood.example')).text);
    server.clock.offsetMs = 15 * 86_400_000; // past the 14-day default INVITATION_TTL
    const expired = await server.http
      .post('/api/invitations/accept')
      .send({ token, name: 'Late Comer', password: 'too-late-password' });
    server.clock.offsetMs = 0;
    expect(expired.status).toBe(410);
    expect(expired.body.error.code).toBe('invitation_expired');
  });

  it('validates the accept body: short passwords are refused with the field named', async () => {
    const res = await server.http
      .post('/api/invitations/accept')
      .send({ token: 'x'.repeat(20), name: 'A', password: 'short' });
    expect(res.status).toBe(400);
    expect(res.body.error.details.issues.map((i: { path: string[] }) => i.path[0])).toEqual(['password']);
  });
});

describe('club members', () => {
  it('lists sign-ins with their links and the open invitations for the head coach', async () => {
    await server.http
      .post('/api/invitations')
      .set(await server.bearer('head'))
      .send({ email: 'pending@larchwood.example', role: 'analyst' })
      .expect(201);
    const res = await server.http.get('/api/club/members').set(await server.bearer('head'));
    expect(res.status).toBe(200);
    const byEmail = new Map(res.body.members.map((m: { email: string }) => [m.email, m]));
    expect(byEmail.get('coach@larchwood.example')).toMatchObject({
      role: 'coach',
      ageGroups: ['U12', 'U14'],
    });
    expect(byEmail.get('guardian@larchwood.example')).toMatchObject({
      role: 'guardian',
      athletes: expect.arrayContaining([expect.objectContaining({ name: 'Elsie Marrow' })]),
    });
    expect(byEmail.get('athlete@larchwood.example')).toMatchObject({ athletes: [{ name: 'Elsie Marrow' }] });
    expect(res.body.invitations.map((i: { email: string }) => i.email)).toContain(
      'pending@larchwood.example',
    );
  });
});

describe('dev mailbox', () => {
  it('shows caught mail on /dev/mailbox to loopback callers', async () => {
    const page = await server.http.get('/dev/mailbox');
    expect(page.status).toBe(200);
    expect(page.text).toContain('Join Larchwood Valley Ski Club on Stanceline');
    const json = await server.http.get('/dev/mailbox.json');
    expect(json.body.messages.length).toBeGreaterThan(0);
  });
});
