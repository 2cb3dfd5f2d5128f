import { createHash, randomUUID } from 'node:crypto';
import { unzipSync, strFromU8 } from 'fflate';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ClipDto } from '@shared/schemas/clip.schema';
import { privacyOf } from '@server/app';
import { createTestServer, type DemoRole, type TestServer } from '../helpers/server-harness';
import { clip as syntheticClip } from '../shared/series/synthetic-clip';
import {
  removeRenderedVideos,
  renderVideo,
  rowsMentioning,
  shareWithAthlete,
  uploadClip,
} from './clip-fixtures';

// The consent life cycle (issue "Privacy of minors"): a withdrawal hides an athlete's clips and reviews
// at once from everyone but the head coach, the sweep erases them when the club's grace period ends
// (run with a clock the test moves), retention erases a past season's clips after a notice a week
// before, an adult athlete decides about their guardians, and the zip of an athlete's data round-trips
// against what is stored.

const DAY = 86_400_000;

let server: TestServer;
let videoPath: string;
let sessionId: string;

const sweep = () => privacyOf(server.app).sweep();

/**
 * A sweep at another time: the clock moves for the sweep only, so the requests around it keep valid
 * tokens.
 */
async function sweepAt(when: number | string) {
  server.clock.offsetMs = typeof when === 'number' ? when : Date.parse(`${when}T12:00:00Z`) - Date.now();
  try {
    return await sweep();
  } finally {
    server.clock.offsetMs = 0;
  }
}

/** Waits for the media pipeline, then reads the clip back as the head coach (any age group). */
async function ready(clipId: string): Promise<ClipDto> {
  await server.runtime.mediaQueue.idle();
  const res = await server.http.get(`/api/clips/${clipId}`).set(await as('head'));
  expect(res.status).toBe(200);
  return res.body.clip as ClipDto;
}
const as = (role: DemoRole) => server.bearer(role);

/** A ready clip of the athlete with stored frames, turns, flags and a note. */
async function clipOf(athleteId: string, note = 'Hands forward through the turn'): Promise<ClipDto> {
  const clip = await ready(
    (await uploadClip(server, videoPath, { sessionId, athleteIds: athleteId, view: 'front' }, 'head')).id,
  );
  const auth = await as('head');
  const frames = syntheticClip(clip.frameCount!, 25, (t) => ({
    inclinationDeg: 25 * Math.sin((2 * Math.PI * t) / 1600),
    legExtension: 0.85,
    shoulderTiltDeg: 12,
  }));
  const posted = await server.http
    .post(`/api/clips/${clip.id}/frames`)
    .set(auth)
    .send({ model: 'lightning', frames });
  expect(posted.status).toBe(200);
  await server.http.get(`/api/clips/${clip.id}/frames?model=lightning`).set(auth); // turns and flags settle
  const noted = await server.http
    .post(`/api/clips/${clip.id}/notes`)
    .set(auth)
    .send({ timeMs: 400, frameIndex: 10, text: note });
  expect(noted.status).toBe(201);
  return clip;
}

async function visibleTo(role: DemoRole, clipId: string): Promise<number> {
  return (await server.http.get(`/api/clips/${clipId}`).set(await as(role))).status;
}

async function exportedClipIds(role: DemoRole): Promise<Set<string>> {
  const res = await server.http.get('/api/exports/turns.csv').set(await as(role));
  expect(res.status).toBe(200);
  return new Set(
    res.text
      .split('\r\n')
      .slice(1)
      .filter(Boolean)
      .map((line) => line.split(',')[0]),
  );
}

async function consentOf(athleteId: string, role: DemoRole = 'head') {
  return (await server.http.get(`/api/athletes/${athleteId}`).set(await as(role))).body.athlete.consent as {
    status: string;
    withdrawnAt: string | null;
    erasureDueAt: string | null;
  };
}

async function objectsOf(clipId: string): Promise<string[]> {
  return (await server.runtime.storage.listKeys()).filter((k) => k.includes(clipId));
}

beforeAll(async () => {
  server = await createTestServer();
  [sessionId] = await server.sessionIds();
  videoPath = (await renderVideo('h264-mp4', { seconds: 2, fps: 25 })).path;
}, 180_000);
afterAll(async () => {
  await server.close();
  await removeRenderedVideos();
});

describe('withdrawing consent', () => {
  it('hides clips, reviews, flags and exports at once from all but the head coach; restoring brings them back', async () => {
    const elsie = await server.athleteId('Elsie');
    const clip = await clipOf(elsie);
    const reviewId = await shareWithAthlete(server, clip.id, elsie);
    for (const role of ['head', 'coach', 'analyst', 'athlete', 'guardian'] as const)
      expect(await visibleTo(role, clip.id), role).toBe(200);
    expect((await exportedClipIds('coach')).has(clip.id)).toBe(true);
    const mailsBefore = (await server.runtime.mailbox!.messages()).length;

    // The demo guardian withdraws in the app, for her daughter.
    const res = await server.http
      .post(`/api/athletes/${elsie}/consent/withdraw`)
      .set(await as('guardian'))
      .send({});
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const consent = res.body.athlete.consent;
    expect(consent.status).toBe('withdrawn');
    // The club's default grace period: 30 days from now.
    expect(Date.parse(consent.erasureDueAt) - Date.parse(consent.withdrawnAt)).toBe(30 * DAY);

    expect(await visibleTo('head', clip.id)).toBe(200);
    for (const role of ['coach', 'analyst', 'athlete', 'guardian'] as const)
      expect(await visibleTo(role, clip.id), role).toBe(404);
    for (const role of ['coach', 'analyst'] as const) {
      const list = await server.http.get(`/api/clips?athleteId=${elsie}`).set(await as(role));
      expect(
        list.body.clips.map((c: ClipDto) => c.id),
        role,
      ).not.toContain(clip.id);
      expect((await exportedClipIds(role)).has(clip.id), role).toBe(false);
      const flags = await server.http.get(`/api/flags?clipId=${clip.id}`).set(await as(role));
      expect(flags.body.total, role).toBe(0);
    }
    expect((await exportedClipIds('head')).has(clip.id)).toBe(true);
    for (const role of ['coach', 'athlete', 'guardian'] as const)
      expect((await server.http.get(`/api/reviews/${reviewId}`).set(await as(role))).status, role).toBe(404);
    const athleteReviews = await server.http.get('/api/reviews').set(await as('athlete'));
    expect(athleteReviews.body.reviews.map((r: { id: string }) => r.id)).not.toContain(reviewId);
    // No new clip of her can be stored, and her review cannot go out again.
    const upload = await server.http
      .post('/api/clips')
      .set(await as('head'))
      .field('sessionId', sessionId)
      .field('athleteIds', elsie)
      .field('view', 'front')
      .attach('file', videoPath);
    expect(upload.status).toBe(409);
    // The head coach is told, with the erasure date.
    const notice = (await server.runtime.mailbox!.messages())
      .slice(mailsBefore)
      .find((m) => m.to === 'head@larchwood.example');
    expect(notice?.subject).toBe('Consent withdrawn for Elsie Marrow');
    expect(notice?.text).toContain(consent.erasureDueAt.slice(0, 10));

    // Withdrawing twice is refused; restoring brings everything back.
    expect(
      (
        await server.http
          .post(`/api/athletes/${elsie}/consent/withdraw`)
          .set(await as('guardian'))
          .send({})
      ).status,
    ).toBe(409);
    const restored = await server.http
      .post(`/api/athletes/${elsie}/consent/restore`)
      .set(await as('guardian'))
      .send({});
    expect(restored.status).toBe(200);
    expect(restored.body.athlete.consent).toMatchObject({
      status: 'granted',
      withdrawnAt: null,
      erasureDueAt: null,
    });
    for (const role of ['head', 'coach', 'analyst', 'athlete', 'guardian'] as const)
      expect(await visibleTo(role, clip.id), role).toBe(200);

    // The consent record says who did what, when and for what.
    const record = await server.http.get(`/api/athletes/${elsie}/consent`).set(await as('guardian'));
    const actions = record.body.events.map((e: { action: string; decidedBy: string; method: string }) => [
      e.action,
      e.decidedBy,
      e.method,
    ]);
    expect(actions.slice(-2)).toEqual([
      ['withdrawn', 'Ruth Marrow', 'in_app'],
      ['restored', 'Ruth Marrow', 'in_app'],
    ]);
    expect(record.body.events[0]).toMatchObject({
      action: 'given',
      purposes: ['store_clips', 'share_by_email'],
    });
  });

  it('erases the clips when the grace period ends, not a day before, and only once (a clock the test moves)', async () => {
    const kit = await server.athleteId('Kit');
    const clip = await clipOf(kit);
    const withdrawn = await server.http
      .post(`/api/athletes/${kit}/consent/withdraw`)
      .set(await as('head'))
      .send({ decidedBy: 'Sami Gorrie', method: 'email' });
    expect(withdrawn.status).toBe(200);
    expect(withdrawn.body.athlete.consent.erasureDueAt).not.toBeNull();
    expect((await sweepAt(29 * DAY)).withdrawnClips).toBe(0);
    expect(await visibleTo('head', clip.id)).toBe(200);
    expect((await objectsOf(clip.id)).length).toBeGreaterThan(0);

    const report = await sweepAt(30 * DAY + 60_000);
    expect(report.withdrawnClips).toBeGreaterThanOrEqual(1);
    expect(report.athletes).toBeGreaterThanOrEqual(1);
    expect(await visibleTo('head', clip.id)).toBe(404);
    expect(await rowsMentioning(server, clip.id)).toEqual([]);
    expect(await objectsOf(clip.id)).toEqual([]);
    expect(await consentOf(kit)).toMatchObject({ status: 'withdrawn', erasureDueAt: null });
    const record = await server.http.get(`/api/athletes/${kit}/consent`).set(await as('head'));
    expect(record.body.events.at(-1)).toMatchObject({ action: 'erased', recordedByRole: 'system' });
    // The next sweep finds nothing more to do; the audit holds counts, no names.
    expect(await sweepAt(31 * DAY)).toMatchObject({ withdrawnClips: 0, athletes: 0 });
    const [entry] = (await server.runtime.dataSource.query(
      `SELECT * FROM audit_event WHERE action = 'athlete.withdrawn_clips_erase' ORDER BY createdAt DESC LIMIT 1`,
    )) as Record<string, unknown>[];
    expect(entry).toMatchObject({ actorUserId: null, targetId: null });
    expect(JSON.stringify(entry)).not.toMatch(/Kit|Gorrie/);
  });

  it('with a grace period of 0 days erases at once; a clip still being prepared waits for the next sweep', async () => {
    const maya = await server.athleteId('Maya');
    const ready = await clipOf(maya);
    const busy = await clipOf(maya);
    const settings = await server.http
      .put('/api/club/privacy')
      .set(await as('head'))
      .send({ consentGraceDays: 0, retentionDaysAfterSeason: 365 });
    expect(settings.status).toBe(200);
    // As if the server were still making its playable copy.
    await server.runtime.dataSource.query(`UPDATE clip SET status = 'processing' WHERE id = ?`, [busy.id]);
    try {
      const res = await server.http
        .post(`/api/athletes/${maya}/consent/withdraw`)
        .set(await as('head'))
        .send({ decidedBy: 'Cass Holt', method: 'in_person' });
      expect(res.status).toBe(200);
      await privacyOf(server.app).idle();
      expect(await rowsMentioning(server, ready.id)).toEqual([]);
      expect((await rowsMentioning(server, busy.id)).length).toBeGreaterThan(0);
      expect((await consentOf(maya)).erasureDueAt).not.toBeNull(); // not finished: the next sweep goes on
      await server.runtime.dataSource.query(`UPDATE clip SET status = 'ready' WHERE id = ?`, [busy.id]);
      expect((await sweep()).withdrawnClips).toBe(1);
      expect(await rowsMentioning(server, busy.id)).toEqual([]);
      expect(await objectsOf(busy.id)).toEqual([]);
      expect((await consentOf(maya)).erasureDueAt).toBeNull();
    } finally {
      await server.http
        .put('/api/club/privacy')
        .set(await as('head'))
        .send({ consentGraceDays: 30, retentionDaysAfterSeason: 365 });
    }
  });

  it('refuses what a role may not decide, and malformed requests, changing nothing', async () => {
    const elsie = await server.athleteId('Elsie');
    const signe = await server.athleteId('Signe');
    const before = await consentOf(elsie);
    const cases: [DemoRole, string, object, number][] = [
      ['coach', elsie, {}, 403],
      ['analyst', elsie, {}, 403],
      ['athlete', elsie, {}, 403], // a minor: her guardian decides
      ['guardian', signe, {}, 404], // not her child
      ['head', elsie, {}, 400], // whose request, and how?
      ['head', elsie, { decidedBy: 'Ruth Marrow', method: 'carrier pigeon' }, 400],
      ['head', elsie, { decidedBy: 'Ruth Marrow', method: 'email', extra: 1 }, 400],
      ['head', '00000000-0000-4000-8000-000000000000', { decidedBy: 'X', method: 'email' }, 404],
    ];
    for (const [role, id, body, status] of cases) {
      const res = await server.http
        .post(`/api/athletes/${id}/consent/withdraw`)
        .set(await as(role))
        .send(body);
      expect(res.status, `${role} ${JSON.stringify(body)}`).toBe(status);
      expect(typeof res.body.error.message).toBe('string');
    }
    expect(
      (
        await server.http
          .post('/api/athletes/nope/consent/withdraw')
          .set(await as('head'))
          .send({})
      ).status,
    ).toBe(400);
    const headNoName = await server.http
      .post(`/api/athletes/${elsie}/consent/withdraw`)
      .set(await as('head'))
      .send({});
    expect(headNoName.body.error.details.issues[0].path).toEqual(['decidedBy']);
    // Restoring what is not withdrawn; an athlete without consent has none to withdraw.
    expect(
      (
        await server.http
          .post(`/api/athletes/${elsie}/consent/restore`)
          .set(await as('guardian'))
          .send({})
      ).status,
    ).toBe(409);
    const noor = await server.athleteId('Noor');
    expect(
      (
        await server.http
          .post(`/api/athletes/${noor}/consent/withdraw`)
          .set(await as('head'))
          .send({ decidedBy: 'Hal Dunmore', method: 'email' })
      ).status,
    ).toBe(409);
    expect(await consentOf(elsie)).toEqual(before);
  });
});

describe('privacy settings and retention', () => {
  it('validates the settings and stores nothing that is refused', async () => {
    const head = await as('head');
    const before = (await server.http.get('/api/club/privacy').set(head)).body;
    for (const body of [
      { consentGraceDays: -1, retentionDaysAfterSeason: 365 },
      { consentGraceDays: 400, retentionDaysAfterSeason: 365 },
      { consentGraceDays: 1.5, retentionDaysAfterSeason: 365 },
      { consentGraceDays: '30', retentionDaysAfterSeason: 365 },
      { consentGraceDays: 30, retentionDaysAfterSeason: 3 },
      { consentGraceDays: 30 },
      { consentGraceDays: 30, retentionDaysAfterSeason: null, extra: true },
    ]) {
      const res = await server.http.put('/api/club/privacy').set(head).send(body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.details.issues.length).toBeGreaterThan(0);
    }
    expect((await server.http.get('/api/club/privacy').set(head)).body).toEqual(before);
    const keep = await server.http
      .put('/api/club/privacy')
      .set(head)
      .send({ consentGraceDays: 14, retentionDaysAfterSeason: null });
    expect(keep.body).toMatchObject({ consentGraceDays: 14, retentionDaysAfterSeason: null });
    await server.http
      .put('/api/club/privacy')
      .set(head)
      .send({ consentGraceDays: 30, retentionDaysAfterSeason: 365 });
  });

  it('tells the head coach a week before, once, then erases a past season’s clips on the day', async () => {
    const head = await as('head');
    const ruben = await server.athleteId('Ruben');
    // A past season holding a session of its own, with one clip.
    const created = await server.http
      .post('/api/sessions')
      .set(head)
      .send({ date: '2025-02-10', venue: 'Pinebrook Slope', discipline: 'slalom', snow: 'hard' });
    expect(created.status).toBe(201);
    const oldSession = created.body.session.id as string;
    const old = await ready(
      (
        await uploadClip(
          server,
          videoPath,
          { sessionId: oldSession, athleteIds: ruben, view: 'front' },
          'head',
        )
      ).id,
    );
    const season = await server.http
      .post('/api/seasons')
      .set(head)
      .send({ name: '2024-25', startsOn: '2024-11-01', endsOn: '2025-04-30' });
    expect(season.status).toBe(201);
    const current = await clipOf(ruben); // this season's clip stays
    await server.http
      .put('/api/club/privacy')
      .set(head)
      .send({ consentGraceDays: 30, retentionDaysAfterSeason: 30 });
    try {
      // Kept 30 days after 30 April 2025: erased on 31 May 2025, the notice from 24 May.
      const notices = async () =>
        (await server.runtime.mailbox!.messages()).filter((m) => m.subject.includes('season 2024-25'));
      expect((await sweepAt('2025-05-23')).notices).toBe(0);
      expect((await sweepAt('2025-05-24')).notices).toBe(1);
      const [notice] = await notices();
      expect(notice.to).toBe('head@larchwood.example');
      expect(notice.subject).toBe('Clips of season 2024-25 will be erased on 2025-05-31');
      expect(notice.text).toContain('1 clip of season 2024-25');
      expect(await sweepAt('2025-05-30')).toMatchObject({ notices: 0, retentionClips: 0 });
      expect(await notices()).toHaveLength(1);
      expect((await objectsOf(old.id)).length).toBeGreaterThan(0);
      expect((await sweepAt('2025-05-31')).retentionClips).toBe(1);
      expect(await rowsMentioning(server, old.id)).toEqual([]);
      expect(await objectsOf(old.id)).toEqual([]);
      expect(await visibleTo('head', current.id)).toBe(200);
      const settings = (await server.http.get('/api/club/privacy').set(head)).body;
      expect(settings.seasons.find((s: { name: string }) => s.name === '2024-25')).toMatchObject({
        erasesOn: '2025-05-31',
        clips: 0,
      });
      expect(settings.lastSweepAt).not.toBeNull();
    } finally {
      await server.http
        .put('/api/club/privacy')
        .set(head)
        .send({ consentGraceDays: 30, retentionDaysAfterSeason: 365 });
    }
  });
});

describe('adults decide for themselves', () => {
  it('ends a guardian’s access at 18 unless the athlete keeps it; the adult withdraws their own consent', async () => {
    const elsie = await server.athleteId('Elsie');
    const [{ birthYear }] = (await server.runtime.dataSource.query(
      'SELECT birthYear FROM athlete WHERE id = ?',
      [elsie],
    )) as { birthYear: number }[];
    const guardianId = (await server.http.get('/api/me').set(await as('guardian'))).body.user.id as string;
    // Nineteen by birth year: an adult under the rule that errs towards asking for consent.
    await server.runtime.dataSource.query('UPDATE athlete SET birthYear = ? WHERE id = ?', [
      new Date().getUTCFullYear() - 19,
      elsie,
    ]);
    try {
      // The guardian's next sign-in no longer reaches her (her brother stays).
      const guardian = (await server.login('guardian')).accessToken;
      const asGuardian = { Authorization: `Bearer ${guardian}` };
      expect((await server.http.get(`/api/athletes/${elsie}`).set(asGuardian)).status).toBe(404);
      expect(
        (await server.http.get(`/api/athletes/${await server.athleteId('Finn')}`).set(asGuardian)).status,
      ).toBe(200);
      expect(
        (await server.http.post(`/api/athletes/${elsie}/consent/withdraw`).set(asGuardian).send({})).status,
      ).toBe(404);

      const athlete = await as('athlete');
      const record = await server.http.get(`/api/athletes/${elsie}/consent`).set(athlete);
      expect(record.body.guardianAccess).toEqual([
        { guardianId, name: 'Ruth Marrow', hasAccess: false, keptByAthleteAt: null },
      ]);
      const kept = await server.http
        .put(`/api/athletes/${elsie}/guardians/${guardianId}/access`)
        .set(athlete)
        .send({ keep: true });
      expect(kept.status).toBe(200);
      expect(kept.body.guardianAccess[0].hasAccess).toBe(true);
      expect((await server.http.get(`/api/athletes/${elsie}`).set(asGuardian)).status).toBe(200);
      // Even kept, the guardian no longer decides about consent; the athlete does.
      expect(
        (await server.http.post(`/api/athletes/${elsie}/consent/withdraw`).set(asGuardian).send({})).status,
      ).toBe(403);
      const bad = await server.http
        .put(`/api/athletes/${elsie}/guardians/${randomUUID()}/access`)
        .set(athlete)
        .send({ keep: true });
      expect(bad.status).toBe(404);
      expect(
        (
          await server.http
            .put(`/api/athletes/${elsie}/guardians/${guardianId}/access`)
            .set(athlete)
            .send({ keep: 'yes' })
        ).status,
      ).toBe(400);
      const own = await server.http.post(`/api/athletes/${elsie}/consent/withdraw`).set(athlete).send({});
      expect(own.status).toBe(200);
      expect(own.body.athlete.consent).toMatchObject({ status: 'withdrawn', managedBy: 'athlete' });
      const back = await server.http.post(`/api/athletes/${elsie}/consent/restore`).set(athlete).send({});
      expect(back.status).toBe(200);
      const ended = await server.http
        .put(`/api/athletes/${elsie}/guardians/${guardianId}/access`)
        .set(athlete)
        .send({ keep: false });
      expect(ended.body.guardianAccess[0].hasAccess).toBe(false);
      const events = (await server.http.get(`/api/athletes/${elsie}/consent`).set(athlete)).body.events as {
        action: string;
      }[];
      expect(events.slice(-4).map((e) => e.action)).toEqual([
        'guardian_kept',
        'withdrawn',
        'restored',
        'guardian_ended',
      ]);
    } finally {
      await server.runtime.dataSource.query('UPDATE athlete SET birthYear = ? WHERE id = ?', [
        birthYear,
        elsie,
      ]);
    }
  });
});

describe('reviews by e-mail need consent for that purpose', () => {
  it('publishes without e-mail when consent covers only storing clips', async () => {
    const tilly = await server.athleteId('Tilly'); // demo: consent to store clips, not to e-mail reviews
    const clip = await clipOf(tilly);
    const auth = await as('head');
    const created = await server.http
      .post('/api/reviews')
      .set(auth)
      .send({ clipId: clip.id, athleteId: tilly });
    const id = created.body.review.id as string;
    await server.http.patch(`/api/reviews/${id}`).set(auth).send({ summary: 'Good stance.' });
    const before = (await server.runtime.mailbox!.messages()).length;
    const published = await server.http.post(`/api/reviews/${id}/publish`).set(auth);
    // Her guardian has no account yet, and no e-mail may go: nobody could be told.
    expect(published.status).toBe(409);
    expect(published.body.error.message).toMatch(/does not cover e-mail/);
    expect((await server.runtime.mailbox!.messages()).length).toBe(before);
    // With consent for e-mail recorded, it goes out.
    await server.http
      .post(`/api/athletes/${tilly}/consent`)
      .set(auth)
      .send({ guardianName: 'Leonie Ashby', method: 'email', shareByEmail: true });
    const again = await server.http.post(`/api/reviews/${id}/publish`).set(auth);
    expect(again.status).toBe(200);
    expect(again.body.recipients).toEqual([expect.objectContaining({ name: 'Leonie Ashby', emailed: true })]);
  });
});

describe('downloading all of an athlete’s data', () => {
  it('round-trips: records, CSVs, notes as WebVTT and media match what is stored', async () => {
    const finn = await server.athleteId('Finn');
    const clips = [
      await clipOf(finn, 'Shins on the boot tongues'),
      await clipOf(finn, 'Look two gates ahead'),
    ];
    const res = await server.http
      .get(`/api/athletes/${finn}/export.zip`)
      .set(await as('guardian'))
      .buffer(true)
      .parse((response, done) => {
        const chunks: Buffer[] = [];
        response.on('data', (c: Buffer) => chunks.push(c));
        response.on('end', () => done(null, Buffer.concat(chunks)));
      });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/zip');
    expect(res.headers['content-disposition']).toMatch(/stanceline-finn-marrow-\d{4}-\d{2}-\d{2}\.zip/);
    const files = unzipSync(new Uint8Array(res.body as Buffer));
    const json = JSON.parse(strFromU8(files['athlete.json'])) as {
      format: string;
      athlete: { id: string; firstName: string };
      consent: { record: { action: string }[] };
      clips: {
        id: string;
        files: Record<string, string>;
        notesFile: string;
        notes: { text: string }[];
        flags: unknown[];
        video: { sha256: string };
      }[];
    };
    expect(json.format).toBe('stanceline-athlete-export');
    expect(json.athlete).toMatchObject({ id: finn, firstName: 'Finn' });
    expect(json.consent.record[0].action).toBe('given');
    const stored = (await server.runtime.dataSource.query(
      'SELECT clipId FROM clip_athlete WHERE athleteId = ?',
      [finn],
    )) as { clipId: string }[];
    expect(json.clips.map((c) => c.id).sort()).toEqual(stored.map((r) => r.clipId).sort());

    for (const clip of clips) {
      const entry = json.clips.find((c) => c.id === clip.id)!;
      // Notes: the records and the WebVTT file hold the stored text.
      const notes = (await server.runtime.dataSource.query('SELECT body FROM note WHERE clipId = ?', [
        clip.id,
      ])) as {
        body: string;
      }[];
      expect(entry.notes.map((n) => n.text)).toEqual(notes.map((n) => n.body));
      const vtt = strFromU8(files[entry.notesFile]);
      expect(vtt.startsWith('WEBVTT')).toBe(true);
      for (const n of notes) expect(vtt).toContain(n.body);
      // Flags: as many as stored for the clip's model.
      const [{ n: flagCount }] = (await server.runtime.dataSource.query(
        `SELECT COUNT(*) AS n FROM flag f JOIN clip c ON c.id = f.clipId WHERE f.clipId = ? AND f.model = c.defaultModel`,
        [clip.id],
      )) as { n: number }[];
      expect(entry.flags).toHaveLength(flagCount);
      // Media: byte for byte what the store holds; the original matches the hash taken at upload.
      const [row] = (await server.runtime.dataSource.query(
        'SELECT storageKey, proxyKey, posterKey, sha256 FROM clip WHERE id = ?',
        [clip.id],
      )) as { storageKey: string; proxyKey: string; posterKey: string; sha256: string }[];
      const original = files[entry.files['original.mp4']];
      expect(createHash('sha256').update(original).digest('hex')).toBe(row.sha256);
      expect(entry.video.sha256).toBe(row.sha256);
      const stored = [
        [row.proxyKey, 'playable.mp4'],
        [row.posterKey, 'poster.jpg'],
      ].filter(([key]) => key !== null);
      expect(stored.map(([, name]) => name).every((name) => name in entry.files)).toBe(true);
      expect(Object.keys(entry.files)).toHaveLength(stored.length + 1);
      for (const [key, name] of stored) {
        const chunks: Buffer[] = [];
        for await (const c of await server.runtime.storage.getStream(key)) chunks.push(c as Buffer);
        expect(Buffer.compare(Buffer.from(files[entry.files[name]]), Buffer.concat(chunks)), name).toBe(0);
      }
    }
    // CSVs: one frames row per stored frame of the clips' default model.
    const csv = strFromU8(files['frames.csv']).replace(/^\uFEFF/, '');
    const rows = csv.split('\r\n').filter(Boolean);
    const [{ n: frameRows }] = (await server.runtime.dataSource.query(
      `SELECT COUNT(*) AS n FROM frame_result f JOIN clip c ON c.id = f.clipId
        JOIN clip_athlete ca ON ca.clipId = c.id WHERE ca.athleteId = ? AND f.model = c.defaultModel`,
      [finn],
    )) as { n: number }[];
    expect(rows.length - 1).toBe(frameRows);
    expect(rows[0].split(',').slice(0, 3)).toEqual(['clip_id', 'clip_name', 'athlete_id']);
    expect(Object.keys(files)).toEqual(expect.arrayContaining(['README.txt', 'turns.csv', 'keypoints.csv']));
  });

  it('gives a signed link for the browser, and refuses what the caller may not download', async () => {
    const finn = await server.athleteId('Finn');
    const link = await server.http.post(`/api/athletes/${finn}/export-link`).set(await as('guardian'));
    expect(link.status).toBe(200);
    expect(link.body.clips).toBeGreaterThanOrEqual(2);
    expect(link.body.approxBytes).toBeGreaterThan(0);
    const byLink = await server.http
      .get(link.body.url)
      .buffer(true)
      .parse((r, done) => {
        r.on('data', () => undefined);
        r.on('end', () => done(null, null));
      });
    expect(byLink.status).toBe(200);
    // The link is for this athlete only, and is no bearer token for anything else.
    const token = new URL(link.body.url, 'http://x').searchParams.get('token')!;
    const elsie = await server.athleteId('Elsie');
    expect(
      (await server.http.get(`/api/athletes/${elsie}/export.zip?token=${encodeURIComponent(token)}`)).status,
    ).toBe(401);
    expect((await server.http.get(`/api/athletes/${finn}`).query({ token })).status).toBe(401);
    expect((await server.http.get(`/api/athletes/${finn}/export.zip?token=garbage`)).status).toBe(401);
    // Staff other than the head coach, other families, malformed and unknown ids.
    expect((await server.http.post(`/api/athletes/${finn}/export-link`).set(await as('coach'))).status).toBe(
      403,
    );
    expect(
      (await server.http.post(`/api/athletes/${finn}/export-link`).set(await as('athlete'))).status,
    ).toBe(404);
    expect((await server.http.post('/api/athletes/nope/export-link').set(await as('head'))).status).toBe(400);
    expect(
      (await server.http.post(`/api/athletes/${randomUUID()}/export-link`).set(await as('head'))).status,
    ).toBe(404);
  });
});

describe('another club', () => {
  it('cannot see, withdraw, export or erase an athlete of another club: 404, nothing removed', async () => {
    const clubId = randomUUID();
    const groupId = randomUUID();
    const athleteId = randomUUID();
    const ds = server.runtime.dataSource;
    await ds.query(`INSERT INTO club (id, name, createdAt) VALUES (?, 'Other Ridge Club', datetime('now'))`, [
      clubId,
    ]);
    await ds.query(`INSERT INTO age_group (id, clubId, name, minAge, maxAge) VALUES (?, ?, 'U14', 12, 13)`, [
      groupId,
      clubId,
    ]);
    await ds.query(
      `INSERT INTO athlete (id, clubId, ageGroupId, firstName, lastName, birthYear, consentRecordedAt, createdAt)
       VALUES (?, ?, ?, 'Oda', 'Elsewhere', 2013, datetime('now'), datetime('now'))`,
      [athleteId, clubId, groupId],
    );
    const head = await as('head');
    expect((await server.http.delete(`/api/athletes/${athleteId}`).set(head)).status).toBe(404);
    expect(
      (
        await server.http
          .post(`/api/athletes/${athleteId}/consent/withdraw`)
          .set(head)
          .send({ decidedBy: 'X', method: 'email' })
      ).status,
    ).toBe(404);
    expect((await server.http.post(`/api/athletes/${athleteId}/export-link`).set(head)).status).toBe(404);
    expect((await server.http.get(`/api/athletes/${athleteId}/export.zip`).set(head)).status).toBe(404);
    expect((await server.http.get(`/api/athletes/${athleteId}/consent`).set(head)).status).toBe(404);
    expect(await ds.query('SELECT consentWithdrawnAt FROM athlete WHERE id = ?', [athleteId])).toEqual([
      { consentWithdrawnAt: null },
    ]);
  });
});
