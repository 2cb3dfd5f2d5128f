import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ReviewDto, ReviewViewResponse } from '@shared/schemas/review.schema';
import type { LoginResponse } from '@shared/schemas/auth.schema';
import { createTestServer, type DemoRole, type TestServer } from '../helpers/server-harness';
import { removeRenderedVideos, renderVideo, settled, uploadClip } from './clip-fixtures';

// Reviews through the real API: drafts saved as they are written, publishing e-mailed through nodemailer
// to the embedded SMTP fake (read back here), withdrawal and republishing, read receipts, bad input.

let server: TestServer;
let elsie: string;
let kit: string;
let clipElsie: string;
let clipKit: string;
let noteIds: string[];
let focusPointId: string;

async function as(role: DemoRole) {
  return server.bearer(role);
}

async function mailTo(email: string) {
  return (await server.runtime.mailbox!.messages()).filter((m) => m.to.includes(email));
}

async function newReview(clipId: string, athleteId: string): Promise<ReviewDto> {
  const res = await server.http
    .post('/api/reviews')
    .set(await as('coach'))
    .send({ clipId, athleteId });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.review as ReviewDto;
}

async function patch(id: string, body: object, role: DemoRole = 'coach') {
  return server.http
    .patch(`/api/reviews/${id}`)
    .set(await as(role))
    .send(body);
}

beforeAll(async () => {
  server = await createTestServer();
  elsie = await server.athleteId('Elsie');
  kit = await server.athleteId('Kit');
  const [s1] = await server.sessionIds();
  const video = await renderVideo('h264-mp4', { seconds: 2, fps: 25 });
  clipElsie = (
    await settled(
      server,
      (await uploadClip(server, video.path, { sessionId: s1, athleteIds: elsie, view: 'front' })).id,
    )
  ).id;
  clipKit = (
    await settled(
      server,
      (await uploadClip(server, video.path, { sessionId: s1, athleteIds: kit, view: 'front' })).id,
    )
  ).id;
  noteIds = [];
  for (const [frameIndex, text] of [
    [10, 'Knees apart here'],
    [30, 'Inside hand up'],
  ] as const) {
    const res = await server.http
      .post(`/api/clips/${clipElsie}/notes`)
      .set(await as('coach'))
      .send({
        timeMs: frameIndex * 40,
        frameIndex,
        text,
        drawing: { strokes: [], arrows: [{ from: [1, 2], to: [30, 40], color: '#c47610' }], angles: [] },
      });
    noteIds.push(res.body.note.id);
  }
  const season = await server.http
    .post('/api/seasons')
    .set(await as('head'))
    .send({ name: '2026-27', startsOn: '2000-01-01', endsOn: '2099-12-31' });
  const point = await server.http
    .post(`/api/athletes/${elsie}/focus-points`)
    .set(await as('coach'))
    .send({
      seasonId: season.body.season.id,
      title: 'Knees apart at the apex',
      metric: 'kneeSeparationRatio',
      phase: 'apex',
      targetMin: 0.8,
      targetMax: 1.3,
    });
  focusPointId = point.body.focusPoint.id;
}, 180_000);
afterAll(async () => {
  await server.close();
  await removeRenderedVideos();
});

describe('a review from draft to the athlete’s phone', () => {
  let review: ReviewDto;

  it('starts as a draft with the tilt gauge on, saved field by field', async () => {
    review = await newReview(clipElsie, elsie);
    expect(review).toMatchObject({ status: 'draft', overlays: { tiltGauge: true, skeleton: false } });
    const saved = await patch(review.id, {
      summary: 'Knees stayed apart. Keep it up.',
      noteIds,
      focusPointIds: [focusPointId],
    });
    expect(saved.status, JSON.stringify(saved.body)).toBe(200);
    expect(saved.body.review).toMatchObject({ noteIds, focusPointIds: [focusPointId] });
    // A draft is the staff's: the athlete cannot open it yet, and nothing was e-mailed.
    expect((await server.http.get(`/api/reviews/${review.id}/view`).set(await as('athlete'))).status).toBe(
      404,
    );
    expect(await mailTo('athlete@larchwood.example')).toEqual([]);
  });

  it('the preview is exactly the athlete’s page, marked as a preview', async () => {
    const res = await server.http.get(`/api/reviews/${review.id}/view`).set(await as('coach'));
    const view = res.body as ReviewViewResponse;
    expect(view.preview).toBe(true);
    expect(view.notes.map((n) => n.text)).toEqual(['Knees apart here', 'Inside hand up']);
    expect(view.notes[0].drawing?.arrows).toHaveLength(1);
    expect(view.focusPoints[0].words).toMatch(/^Knee separation .*target 0\.80 to 1\.30$/);
  });

  it('publishing e-mails exactly the athlete and her guardian, text and HTML, with a link that opens it for them', async () => {
    const res = await server.http.post(`/api/reviews/${review.id}/publish`).set(await as('coach'));
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.recipients.map((r: { email: string }) => r.email).sort()).toEqual([
      'athlete@larchwood.example',
      'guardian@larchwood.example',
    ]);
    const messages = (await server.runtime.mailbox!.messages()).filter((m) => m.subject.includes('review'));
    expect(messages.map((m) => m.to).sort()).toEqual([
      'athlete@larchwood.example',
      'guardian@larchwood.example',
    ]);
    for (const m of messages) {
      expect(m.text).toContain('Knees stayed apart. Keep it up.');
      expect(m.html).toContain('Knees stayed apart. Keep it up.');
      expect(m.text).toContain(`http://stanceline.test/reviews/${review.id}`);
    }
    for (const role of ['athlete', 'guardian'] as const) {
      const view = await server.http.get(`/api/reviews/${review.id}/view`).set(await as(role));
      expect(view.status).toBe(200);
      expect(view.body.preview).toBe(false);
    }
    // The head coach reads it too (staff within reach); another family's guardian is checked below.
    const head = await server.http.get(`/api/reviews/${review.id}/view`).set(await as('head'));
    expect(head.status).toBe(200);
  });

  it('shows the coach who opened it, and the athlete’s list marks it read', async () => {
    const receipts = await server.http.get(`/api/reviews/${review.id}/receipts`).set(await as('coach'));
    expect(receipts.body.receipts.map((r: { name: string; role: string }) => r.role).sort()).toEqual([
      'athlete',
      'guardian',
    ]);
    const list = await server.http.get('/api/reviews').set(await as('athlete'));
    expect(list.body.reviews).toEqual([expect.objectContaining({ id: review.id, unread: false })]);
  });

  it('unpublishing withdraws it at once; a corrected review can be published again', async () => {
    expect(
      (await server.http.post(`/api/reviews/${review.id}/unpublish`).set(await as('coach'))).status,
    ).toBe(200);
    for (const role of ['athlete', 'guardian'] as const) {
      const res = await server.http.get(`/api/reviews/${review.id}/view`).set(await as(role));
      expect(res.status).toBe(410);
      expect(res.body.error.code).toBe('review_withdrawn');
    }
    expect((await server.http.get('/api/reviews').set(await as('athlete'))).body.reviews).toEqual([]);
    expect((await patch(review.id, { summary: 'Corrected: knees apart at the apex.' })).status).toBe(200);
    const again = await server.http.post(`/api/reviews/${review.id}/publish`).set(await as('coach'));
    expect(again.status).toBe(200);
    const view = await server.http.get(`/api/reviews/${review.id}/view`).set(await as('athlete'));
    expect(view.body.review.summary).toBe('Corrected: knees apart at the apex.');
    const corrected = (await mailTo('athlete@larchwood.example')).filter((m) =>
      m.subject.startsWith('Corrected review'),
    );
    expect(corrected).toHaveLength(1);
    // Published again, it is unread until she opens it.
  });

  it('a guardian without a password gets a link that sets one and then opens the review', async () => {
    const forKit = await newReview(clipKit, kit);
    await patch(forKit.id, { summary: 'Good first run, Kit.' });
    const res = await server.http.post(`/api/reviews/${forKit.id}/publish`).set(await as('coach'));
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const invited = res.body.recipients.find((r: { invited: boolean }) => r.invited);
    expect(invited).toBeDefined();
    const [mail] = await mailTo(invited.email);
    const match =
      /http:\/\/stanceline\.test\/reset-password\/([A-Za-z0-9_-]+)\?next=%2Freviews%2F([0-9a-f-]+)/.exec(
        mail.text,
      );
    expect(match?.[2]).toBe(forKit.id);
    const set = await server.http
      .post(`/api/auth/password-reset/${match![1]}`)
      .send({ password: 'larch valley spring powder' });
    expect(set.status, JSON.stringify(set.body)).toBe(200);
    const token = (set.body as LoginResponse).accessToken;
    const view = await server.http
      .get(`/api/reviews/${forKit.id}/view`)
      .set({ Authorization: `Bearer ${token}` });
    expect(view.status).toBe(200);
    // The same guardian cannot open Elsie's review: another family's child.
    const other = await server.http
      .get(`/api/reviews/${review.id}/view`)
      .set({ Authorization: `Bearer ${token}` });
    expect(other.status).toBe(404);
  });
});

describe('bad input gets a 4xx naming the field, and stores nothing', () => {
  it.each([
    ['a review of a clip the coach may not see', 'coach', 'create-signe', 404, null],
    ['an athlete not in the clip', 'coach', 'create-wrong-athlete', 400, 'athleteId'],
    ['notes from another clip', 'coach', 'notes-of-other-clip', 400, 'noteIds'],
    ['a focus point of another athlete', 'coach', 'foreign-point', 400, 'focusPointIds'],
    ['publishing with an empty summary', 'coach', 'publish-empty', 400, 'summary'],
    ['an unknown field', 'coach', 'unknown-field', 400, null],
    ['by an analyst', 'analyst', 'create', 403, null],
    ['by an athlete', 'athlete', 'create', 403, null],
  ] as const)('%s', async (_name, role, action, status, field) => {
    const before = await Promise.all(['review', 'review_item'].map((t) => server.count(t)));
    const draft =
      action === 'create' || action.startsWith('create-') ? null : await newReview(clipElsie, elsie);
    const counted = await Promise.all(['review', 'review_item'].map((t) => server.count(t)));
    let res;
    const auth = await as(role);
    if (action === 'create')
      res = await server.http.post('/api/reviews').set(auth).send({ clipId: clipElsie, athleteId: elsie });
    else if (action === 'create-signe') {
      const signe = await server.athleteId('Signe');
      const [s1] = await server.sessionIds();
      const video = await renderVideo('h264-mp4', { seconds: 1, fps: 25 });
      const clip = await uploadClip(
        server,
        video.path,
        { sessionId: s1, athleteIds: signe, view: 'front' },
        'head',
      );
      res = await server.http.post('/api/reviews').set(auth).send({ clipId: clip.id, athleteId: signe });
    } else if (action === 'create-wrong-athlete')
      res = await server.http.post('/api/reviews').set(auth).send({ clipId: clipElsie, athleteId: kit });
    else if (action === 'notes-of-other-clip') {
      const note = await server.http
        .post(`/api/clips/${clipKit}/notes`)
        .set(auth)
        .send({ timeMs: 80, frameIndex: 2, text: 'Kit only' });
      res = await patch(draft!.id, { noteIds: [note.body.note.id] }, role);
    } else if (action === 'foreign-point') {
      const season = (await server.http.get('/api/seasons').set(auth)).body.seasons[0].id;
      const point = await server.http
        .post(`/api/athletes/${kit}/focus-points`)
        .set(auth)
        .send({ seasonId: season, title: 'Kit’s point' });
      res = await patch(draft!.id, { focusPointIds: [point.body.focusPoint.id] }, role);
    } else if (action === 'publish-empty')
      res = await server.http.post(`/api/reviews/${draft!.id}/publish`).set(auth);
    else res = await patch(draft!.id, { colour: 'red' }, role);
    expect(res.status, JSON.stringify(res.body)).toBe(status);
    if (field)
      expect(res.body.error.details.issues.map((i: { path: string[] }) => i.path[0])).toContain(field);
    // Nothing stored by the refused call (the draft made for it aside).
    const after = await Promise.all(['review', 'review_item'].map((t) => server.count(t)));
    expect(after).toEqual(draft ? counted : before);
  });
});
