import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestServer, type TestServer } from '../helpers/server-harness';

let server: TestServer;

beforeAll(async () => {
  server = await createTestServer();
});
afterAll(async () => {
  await server.close();
});

describe('athletes', () => {
  it('reports consent per athlete: granted, missing for minors, not required for adults', async () => {
    const res = await server.http.get('/api/athletes').set(await server.bearer('head'));
    const byName = new Map(res.body.athletes.map((a: { firstName: string }) => [a.firstName, a]));
    expect(byName.get('Elsie')).toMatchObject({
      consent: { status: 'granted', guardianName: 'Ruth Marrow' },
    });
    expect(byName.get('Noor')).toMatchObject({
      consent: { status: 'missing', recordedAt: null, guardianName: null },
    });

    const year = new Date().getUTCFullYear();
    const u16 = await server.ageGroupId('U16');
    // Born 19 years ago: 18 or 19 today, an adult whatever the birthday.
    const adult = await server.http
      .post('/api/athletes')
      .set(await server.bearer('head'))
      .send({ firstName: 'Vera', lastName: 'Coachling', birthYear: year - 19, ageGroupId: u16 });
    expect(adult.status).toBe(201);
    expect(adult.body.athlete.consent.status).toBe('not_required');
    // Born 18 years ago: may still be 17 until the birthday, so consent is asked for.
    const borderline = await server.http
      .post('/api/athletes')
      .set(await server.bearer('head'))
      .send({ firstName: 'Ivo', lastName: 'Borderline', birthYear: year - 18, ageGroupId: u16 });
    expect(borderline.body.athlete.consent.status).toBe('missing');
  });

  it('creates an athlete as a coach of the group, with the form coercing the birth year', async () => {
    const u12 = await server.ageGroupId('U12');
    const res = await server.http
      .post('/api/athletes')
      .set(await server.bearer('coach'))
      .send({ firstName: '  Lumi ', lastName: 'Perrin', birthYear: '2015', ageGroupId: u12 });
    expect(res.status).toBe(201);
    expect(res.body.athlete).toMatchObject({
      firstName: 'Lumi',
      birthYear: 2015,
      ageGroup: { name: 'U12' },
      clipCount: 0,
      guardians: [],
    });
    const detail = await server.http
      .get(`/api/athletes/${res.body.athlete.id}`)
      .set(await server.bearer('coach'));
    expect(detail.status).toBe(200);
  });

  it('rejects a bad athlete body with the issues listed and stores nothing', async () => {
    const before = await server.count('athlete');
    const res = await server.http
      .post('/api/athletes')
      .set(await server.bearer('head'))
      .send({ firstName: '', birthYear: 1800, ageGroupId: 'nope' });
    expect(res.status).toBe(400);
    const fields = res.body.error.details.issues.map((i: { path: string[] }) => i.path[0]).sort();
    expect(fields).toEqual(['ageGroupId', 'birthYear', 'firstName', 'lastName']);
    expect(await server.count('athlete')).toBe(before);
  });

  it('searches by name and filters by age group', async () => {
    const auth = await server.bearer('head');
    const search = await server.http.get('/api/athletes?search=marrow').set(auth);
    expect(search.body.athletes.map((a: { firstName: string }) => a.firstName).sort()).toEqual([
      'Elsie',
      'Finn',
    ]);
    const u10 = await server.ageGroupId('U10');
    const group = await server.http.get(`/api/athletes?ageGroupId=${u10}`).set(auth);
    expect(new Set(group.body.athletes.map((a: { ageGroup: { name: string } }) => a.ageGroup.name))).toEqual(
      new Set(['U10']),
    );
    const wildcard = await server.http.get('/api/athletes?search=%25').set(auth);
    expect(wildcard.body.athletes).toEqual([]);
  });

  it('lists the age groups youngest first', async () => {
    const res = await server.http.get('/api/age-groups').set(await server.bearer('guardian'));
    expect(res.body.ageGroups.map((g: { name: string }) => g.name)).toEqual(['U10', 'U12', 'U14', 'U16']);
  });
});

describe('sessions', () => {
  it('creates a session and lists it newest first', async () => {
    const auth = await server.bearer('coach');
    const created = await server.http
      .post('/api/sessions')
      .set(auth)
      .send({ date: '2099-01-05', venue: 'Pinebrook Slope', discipline: 'slalom', snow: 'icy', notes: '' });
    expect(created.status).toBe(201);
    expect(created.body.session).toMatchObject({ date: '2099-01-05', notes: null, clipCount: 0 });
    const list = await server.http.get('/api/sessions').set(auth);
    expect(list.body.sessions[0].id).toBe(created.body.session.id);
  });

  it('refuses impossible dates and unknown disciplines', async () => {
    const res = await server.http
      .post('/api/sessions')
      .set(await server.bearer('head'))
      .send({ date: '2026-02-30', venue: 'Pinebrook Slope', discipline: 'downhill-ish', snow: 'packed' });
    expect(res.status).toBe(400);
    const fields = res.body.error.details.issues.map((i: { path: string[] }) => i.path[0]).sort();
    expect(fields).toEqual(['date', 'discipline']);
  });

  it('answers 404 for a session id that does not exist', async () => {
    const res = await server.http.get('/api/sessions/not-a-session').set(await server.bearer('head'));
    expect(res.status).toBe(404);
    expect(res.body.error).toEqual({ code: 'not_found', message: 'Session not found' });
  });
});
