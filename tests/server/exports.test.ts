import Papa from 'papaparse';
import { randomUUID } from 'node:crypto';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { ExportRepository } from '@server/repositories/export.repository';
import { confidenceColumn, exportColumns, metricColumn } from '@shared/exports/codebook';
import { METRIC_DEFINITIONS, METRIC_KEYS } from '@shared/metrics';
import type { ClipDto } from '@shared/schemas/clip.schema';
import type { CodebookResponse, ExportCountResponse } from '@shared/schemas/export.schema';
import type { ClipFramesResponse } from '@shared/schemas/frames.schema';
import { copyClip, copyRow } from '../helpers/copy-rows';
import { createTestServer, type DemoRole, type TestServer } from '../helpers/server-harness';
import { clip as syntheticClip } from '../shared/series/synthetic-clip';
import { removeRenderedVideos, renderVideo, settled, shareWithAthlete, uploadClip } from './clip-fixtures';

// CSV exports checked by parsing them back with papaparse (a general-purpose CSV parser) and comparing
// every value with what the API stores.

const SECONDS = 4;
const FPS = 25;

let server: TestServer;
let elsieClip: ClipDto;
let signeClip: ClipDto;
let elsie: string;
let signe: string;

const frames = syntheticClip(SECONDS * FPS, FPS, (t) => ({
  inclinationDeg: 25 * Math.sin((2 * Math.PI * t) / 1600),
  legExtension: 0.85 + 0.08 * Math.cos((2 * Math.PI * t) / 800),
  shoulderTiltDeg: 6,
}));

async function as(role: DemoRole) {
  return server.bearer(role);
}

/** Downloads an export and parses it: the header row, then one object per data row (all text). */
async function download(path: string, role: DemoRole = 'analyst') {
  const res = await server.http
    .get(path)
    .set(await as(role))
    .buffer(true)
    .parse((response, done) => {
      let text = '';
      response.setEncoding('utf8');
      response.on('data', (chunk: string) => (text += chunk));
      response.on('end', () => done(null, text));
    });
  expect(res.status, String(res.body).slice(0, 300)).toBe(200);
  const text = res.body as string;
  expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
  // UTF-8 with a byte-order mark (spreadsheets read the encoding from it), CRLF line ends (RFC 4180).
  expect(text.charCodeAt(0)).toBe(0xfeff);
  expect(text).toContain('\r\n');
  const parsed = Papa.parse<Record<string, string>>(text.slice(1), { header: true, skipEmptyLines: true });
  expect(parsed.errors).toEqual([]);
  return { header: parsed.meta.fields ?? [], rows: parsed.data };
}

/** Frames from here on are posted a second time, read carefully. */
const CAREFUL_FROM = 40;
const num = (text: string) => (text === '' ? null : Number(text));

beforeAll(async () => {
  server = await createTestServer();
  const [sessionId] = await server.sessionIds();
  elsie = await server.athleteId('Elsie');
  signe = await server.athleteId('Signe');
  const video = await renderVideo('h264-mp4', { seconds: SECONDS, fps: FPS });
  elsieClip = await settled(
    server,
    (await uploadClip(server, video.path, { sessionId, athleteIds: elsie, view: 'front' })).id,
  );
  const uploaded = await uploadClip(
    server,
    video.path,
    { sessionId, athleteIds: signe, view: 'front' },
    'head',
  );
  await server.runtime.mediaQueue.idle();
  // Signe (U16) is outside the coach's groups: read back as the head coach.
  signeClip = (await server.http.get(`/api/clips/${uploaded.id}`).set(await as('head'))).body.clip as ClipDto;
  for (const clip of [elsieClip, signeClip]) {
    const res = await server.http
      .post(`/api/clips/${clip.id}/frames`)
      .set(await as('head'))
      .send({ model: 'lightning', frames });
    expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(200);
  }
  // Elsie's last frames read again carefully.
  const again = await server.http
    .post(`/api/clips/${elsieClip.id}/frames`)
    .set(await as('head'))
    .send({ model: 'lightning', careful: true, frames: frames.slice(CAREFUL_FROM) });
  expect(again.status).toBe(200);
  // A coach corrected one frame by hand.
  const fix = await server.http
    .put(`/api/clips/${elsieClip.id}/frames/10`)
    .set(await as('coach'))
    .send({ model: 'lightning', keypoints: frames[10].keypoints.map((k) => ({ ...k, x: k.x + 1 })) });
  expect(fix.status).toBe(200);
}, 120_000);
afterAll(async () => {
  await server.close();
  await removeRenderedVideos();
});

async function stored(clipId: string): Promise<ClipFramesResponse> {
  return (await server.http.get(`/api/clips/${clipId}/frames?model=lightning`).set(await as('head'))).body;
}

describe('round trip through a CSV parser', () => {
  it('frames.csv: one row per stored frame, every metric and confidence as stored', async () => {
    const { header, rows } = await download(`/api/exports/frames.csv?clipId=${elsieClip.id}`);
    expect(header).toEqual(exportColumns('frames'));
    expect(header).toContain('kneeFlexionLeft_deg');
    expect(header).toContain('stanceWidthRatio_ratio');
    const want = await stored(elsieClip.id);
    expect(rows).toHaveLength(want.frames.length);
    for (const [i, frame] of want.frames.entries()) {
      const row = rows[i];
      expect(row).toMatchObject({
        clip_id: elsieClip.id,
        athlete_id: elsie,
        view: 'front',
        model: 'lightning',
        frame: String(frame.frameIndex),
        corrected: frame.corrected ? 'true' : 'false',
        careful: frame.careful ? 'true' : 'false',
      });
      expect(num(row.time_ms)).toBeCloseTo(frame.timeMs, 6);
      for (const key of METRIC_KEYS) {
        const value = frame.metrics[key];
        if (value === null) expect(row[metricColumn(key)], key).toBe('');
        else expect(Math.abs(num(row[metricColumn(key)])! - value), key).toBeLessThanOrEqual(5e-7);
        // The mean score of the points the metric reads, among those stored.
        const scores = METRIC_DEFINITIONS[key].keypoints.flatMap((name) =>
          frame.keypoints.filter((k) => k.name === name).map((k) => k.score),
        );
        const mean = scores.reduce((a, b) => a + b, 0) / scores.length;
        if (scores.length === 0) expect(row[confidenceColumn(key)], key).toBe('');
        else expect(Math.abs(num(row[confidenceColumn(key)])! - mean), key).toBeLessThanOrEqual(5e-7);
      }
    }
    expect(rows.filter((r) => r.corrected === 'true').map((r) => r.frame)).toEqual(['10']);
    expect(rows.filter((r) => r.careful === 'true').map((r) => Number(r.frame))).toEqual(
      frames.slice(CAREFUL_FROM).map((f) => f.frameIndex),
    );
  });

  it('keypoints.csv: long format, every stored point with the frame size', async () => {
    const { header, rows } = await download(`/api/exports/keypoints.csv?clipId=${elsieClip.id}`);
    expect(header).toEqual(exportColumns('keypoints'));
    const want = await stored(elsieClip.id);
    const expected = want.frames.flatMap((f) => f.keypoints.map((k) => ({ f, k })));
    expect(rows).toHaveLength(expected.length);
    for (const [i, { f, k }] of expected.entries()) {
      const row = rows[i];
      expect([row.frame, row.keypoint, row.corrected, row.careful]).toEqual([
        String(f.frameIndex),
        k.name,
        String(f.corrected),
        String(f.careful),
      ]);
      expect(Math.abs(num(row.x_px)! - k.x)).toBeLessThanOrEqual(5e-7);
      expect(Math.abs(num(row.y_px)! - k.y)).toBeLessThanOrEqual(5e-7);
      expect(num(row.score)).toBe(k.score);
      expect([num(row.frame_width_px), num(row.frame_height_px)]).toEqual([
        elsieClip.width,
        elsieClip.height,
      ]);
    }
  });

  it('turns.csv: one row per turn with apex values, transition rise and the habits flagged', async () => {
    const { header, rows } = await download(`/api/exports/turns.csv?clipId=${elsieClip.id}`);
    expect(header).toEqual(exportColumns('turns'));
    const want = await stored(elsieClip.id);
    const turns = want.series!.turns;
    expect(turns.length).toBeGreaterThan(3);
    expect(rows).toHaveLength(turns.length);
    for (const [i, turn] of turns.entries()) {
      const row = rows[i];
      expect([row.turn, row.direction, row.complete]).toEqual([
        String(turn.index),
        turn.direction,
        String(turn.complete),
      ]);
      expect(num(row.duration_ms)).toBeCloseTo(turn.durationMs, 6);
      expect(num(row.apex_inclination_deg)).toBeCloseTo(turn.apexValues.inclination!, 6);
      if (turn.transitionRise === null) expect(row.transition_rise_ratio).toBe('');
      else expect(num(row.transition_rise_ratio)).toBeCloseTo(turn.transitionRise, 6);
      const metrics = [
        ...new Set(want.flags.filter((f) => f.turnIndex === turn.index).map((f) => f.metric)),
      ].sort();
      expect(row.flag_metrics).toBe(metrics.join(';'));
      expect(num(row.flags)).toBe(metrics.length);
    }
  });

  it('values=smoothed gives the series values, one row per frame, and narrows to the metrics asked for', async () => {
    const raw = await download(
      `/api/exports/frames.csv?clipId=${elsieClip.id}&metrics=inclination,shoulderTilt`,
    );
    const smooth = await download(
      `/api/exports/frames.csv?clipId=${elsieClip.id}&metrics=shoulderTilt,inclination&values=smoothed`,
    );
    expect(smooth.header).toEqual([
      ...exportColumns('frames').slice(0, 10),
      'shoulderTilt_deg',
      'shoulderTilt_conf',
      'inclination_deg',
      'inclination_conf',
    ]);
    expect(raw.header).toEqual(smooth.header);
    expect(smooth.rows).toHaveLength(raw.rows.length);
    // Smoothing moves the values a little, never by much on this slow swing.
    const diffs = raw.rows.map((r, i) =>
      Math.abs(num(r.inclination_deg)! - num(smooth.rows[i].inclination_deg)!),
    );
    expect(Math.max(...diffs)).toBeGreaterThan(0);
    expect(Math.max(...diffs)).toBeLessThan(2);
  });

  it('counts the rows and estimates the size before a download', async () => {
    const count = (
      await server.http.get(`/api/exports/count?kind=frames&clipId=${elsieClip.id}`).set(await as('analyst'))
    ).body as ExportCountResponse;
    expect(count).toMatchObject({ kind: 'frames', clips: 1, rows: SECONDS * FPS });
    expect(count.approxBytes).toBeGreaterThan(SECONDS * FPS * 100);
    const points = (
      await server.http
        .get(`/api/exports/count?kind=keypoints&clipId=${elsieClip.id}`)
        .set(await as('analyst'))
    ).body as ExportCountResponse;
    expect(points.rows).toBe(frames.reduce((n, f) => n + f.keypoints.length, 0));
  });
});

describe('CSV injection (OWASP "CSV Injection": neutralise cells starting with = + - @ tab or carriage return)', () => {
  it.each([
    '=HYPERLINK("http://x.example","run")',
    '+SUM(A1:A2)',
    '-2+3',
    '@cmd',
    '\tleading tab',
    '\rreturn',
  ])('writes a clip named %j with a leading apostrophe', async (name) => {
    await server.runtime.dataSource.query('UPDATE clip SET originalName = ? WHERE id = ?', [
      name,
      signeClip.id,
    ]);
    const { rows } = await download(`/api/exports/turns.csv?clipId=${signeClip.id}`);
    expect(rows.length).toBeGreaterThan(0);
    for (const row of rows) expect(row.clip_name).toBe(`'${name}`);
  });

  it('leaves numbers, negative ones included, as numbers', async () => {
    const { rows } = await download(`/api/exports/frames.csv?clipId=${elsieClip.id}&metrics=inclination`);
    expect(rows.some((r) => r.inclination_deg.startsWith('-'))).toBe(true);
    expect(rows.every((r) => /^-?\d+(\.\d{1,6})?$/.test(r.inclination_deg))).toBe(true);
  });
});

describe('who exports what', () => {
  const clipIds = async (role: DemoRole) =>
    [
      ...new Set(
        (await download('/api/exports/frames.csv?metrics=shoulderTilt', role)).rows.map((r) => r.clip_id),
      ),
    ].sort();

  it('gives the analyst the club, a coach their groups, the athlete her own rows', async () => {
    expect(await clipIds('analyst')).toEqual([elsieClip.id, signeClip.id].sort());
    expect(await clipIds('head')).toEqual([elsieClip.id, signeClip.id].sort());
    expect(await clipIds('coach')).toEqual([elsieClip.id]);
    // Athletes and guardians export what a published review shared with them: nothing, then her clip.
    expect(await clipIds('athlete')).toEqual([]);
    await shareWithAthlete(server, elsieClip.id, elsie);
    expect(await clipIds('athlete')).toEqual([elsieClip.id]);
    expect(await clipIds('guardian')).toEqual([elsieClip.id]);
    const own = await download('/api/exports/frames.csv?metrics=shoulderTilt', 'athlete');
    expect(new Set(own.rows.map((r) => r.athlete_id))).toEqual(new Set([elsie]));
  });

  it('answers 404 for a clip of another club or outside the caller’s reach', async () => {
    // A second club with a copy of Elsie's clip, in the same database.
    const ds = server.runtime.dataSource;
    const otherClub = randomUUID();
    const otherSession = randomUUID();
    const otherClip = randomUUID();
    const [{ clubId }] = (await ds.query('SELECT "clubId" FROM clip WHERE id = ?', [elsieClip.id])) as {
      clubId: string;
    }[];
    await copyRow(ds, 'club', clubId, { id: otherClub, name: 'Another Valley Ski Club' });
    await copyRow(ds, 'training_session', elsieClip.sessionId, { id: otherSession, clubId: otherClub });
    await copyRow(ds, 'clip', elsieClip.id, { id: otherClip, clubId: otherClub, sessionId: otherSession });
    for (const role of ['analyst', 'head'] as const) {
      const other = await server.http.get(`/api/exports/frames.csv?clipId=${otherClip}`).set(await as(role));
      expect(other.status, role).toBe(404);
      expect(other.body.error.message).toBe('Clip not found');
    }
    const ours = await download('/api/exports/turns.csv', 'analyst');
    expect(ours.rows.some((r) => r.clip_id === otherClip)).toBe(false);
    const outside = await server.http
      .get(`/api/exports/frames.csv?clipId=${signeClip.id}`)
      .set(await as('coach'));
    expect(outside.status).toBe(404);
  });

  it('filters by age group, view and session dates', async () => {
    const u16 = await server.ageGroupId('U16');
    const byGroup = await download(`/api/exports/turns.csv?ageGroupId=${u16}`);
    expect(new Set(byGroup.rows.map((r) => r.clip_id))).toEqual(new Set([signeClip.id]));
    expect((await download('/api/exports/turns.csv?view=side')).rows).toEqual([]);
    expect((await download('/api/exports/turns.csv?from=2100-01-01')).rows).toEqual([]);
  });
});

describe('bad export requests', () => {
  it.each([
    ['colour=red', 'colour'],
    ['from=last-week', 'from'],
    ['from=2026-12-02&to=2026-11-01', 'to'],
    ['metrics=kneeAngle', 'kneeAngle'],
    ['values=filtered', 'values'],
    ['view=top', 'view'],
    ['clipId=first', 'clipId'],
  ])('refuses %s with a 400 naming the parameter', async (query, name) => {
    const res = await server.http.get(`/api/exports/frames.csv?${query}`).set(await as('analyst'));
    expect(res.status).toBe(400);
    expect(JSON.stringify(res.body.error)).toContain(name);
  });

  it('refuses a count without a kind', async () => {
    const res = await server.http.get('/api/exports/count').set(await as('analyst'));
    expect(res.status).toBe(400);
    expect(JSON.stringify(res.body.error)).toContain('kind');
  });
});

describe('streaming', () => {
  it('stops reading pages when the client goes away mid-download', async () => {
    // 400 copies of Elsie's clip (40,000 stored frames, about 12 MB of CSV): far more than the
    // loopback socket buffers hold, so the server has to wait for the client.
    const ds = server.runtime.dataSource;
    const copies: string[] = [];
    for (let i = 0; i < 400; i++) copies.push(await copyClip(ds, elsieClip.id, elsie, true));
    const pages = vi.spyOn(ExportRepository.prototype, 'framesPage');
    const http = server.app.listen(0, '127.0.0.1');
    try {
      await new Promise((r) => http.once('listening', r));
      const url = `http://127.0.0.1:${(http.address() as AddressInfo).port}/api/exports/frames.csv`;
      const abort = new AbortController();
      const res = await fetch(url, { headers: await as('analyst'), signal: abort.signal });
      await res.body!.getReader().read();
      abort.abort();
      await new Promise((r) => setTimeout(r, 500));
      const afterAbort = pages.mock.calls.length;
      await new Promise((r) => setTimeout(r, 500));
      // Nothing more is read once it noticed, far from all 402 clips.
      expect(pages.mock.calls.length).toBe(afterAbort);
      expect(afterAbort).toBeLessThan(200);
    } finally {
      pages.mockRestore();
      http.close();
      await ds.query(`DELETE FROM clip WHERE id IN (${copies.map(() => '?').join(', ')})`, copies);
    }
  });
});

describe('codebook', () => {
  it('lists every column of every export, from the metric definitions', async () => {
    const book = (await server.http.get('/api/exports/codebook').set(await as('athlete')))
      .body as CodebookResponse;
    for (const kind of ['frames', 'keypoints', 'turns'] as const) {
      const names = book.columns.filter((c) => c.export === kind).map((c) => c.name);
      expect(names).toEqual(exportColumns(kind));
    }
    const knee = book.columns.find((c) => c.name === 'kneeFlexionLeft_deg')!;
    expect(knee).toMatchObject({ unit: 'degrees', sign: '0 = straight leg, + = bent', view: 'side' });
    expect(knee.definition).toContain(METRIC_DEFINITIONS.kneeFlexionLeft.description);
    expect(book.smoothing).toContain('Butterworth');
  });
});
