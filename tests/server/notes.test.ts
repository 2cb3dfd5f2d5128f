import { createRequire } from 'node:module';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { WebVTTParser, type VttNode } from 'webvtt-parser';
import type { NoteDto } from '@shared/schemas/note.schema';
import { escapeCueText, notesToWebVtt, vttTimestamp } from '@server/services/notes-vtt';
import { createTestServer, type TestServer } from '../helpers/server-harness';
import { removeRenderedVideos, renderVideo, settled, uploadClip } from './clip-fixtures';

// The parser decodes only a few entities unless given the full HTML table it ships.
const ENTITIES = createRequire(import.meta.url)('webvtt-parser/html-entities.json') as Record<string, string>;

let server: TestServer;
let clipId: string;

const DRAWING = {
  strokes: [
    {
      points: [
        [10, 20],
        [12, 24],
        [15, 30],
      ],
      color: '#ff6600',
    },
  ],
  arrows: [{ from: [40, 40], to: [60, 20], color: '#1e88e5' }],
  angles: [{ a: [100, 50], vertex: [100, 100], b: [150, 100], degrees: 90 }],
};

beforeAll(async () => {
  server = await createTestServer();
  const [sessionId] = await server.sessionIds();
  const video = await renderVideo('h264-mp4', { seconds: 6 });
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

async function create(role: 'head' | 'coach', body: object) {
  return server.http
    .post(`/api/clips/${clipId}/notes`)
    .set(await server.bearer(role))
    .send(body);
}

/** The text a player shows for a cue: its tree flattened, entities already decoded by the parser. */
function textOf(node: VttNode): string {
  if (node.type === 'text') return node.value ?? '';
  return (node.children ?? []).map(textOf).join('');
}

describe('notes', () => {
  let noteId: string;

  it('a coach pins a note with a drawing to a time and frame', async () => {
    const res = await create('coach', {
      timeMs: 1240,
      frameIndex: 31,
      text: 'Knees pinched at the apex',
      drawing: DRAWING,
    });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const note = res.body.note as NoteDto;
    noteId = note.id;
    expect(note).toMatchObject({
      clipId,
      timeMs: 1240,
      frameIndex: 31,
      text: 'Knees pinched at the apex',
      drawing: DRAWING,
      author: { name: 'Tomas Reinholt' },
    });
  });

  it('lists the clip’s notes in time order, for coaches and the analyst', async () => {
    await create('head', { timeMs: 300, frameIndex: 7, text: 'Good start' });
    for (const role of ['coach', 'head', 'analyst'] as const) {
      const res = await server.http.get(`/api/clips/${clipId}/notes`).set(await server.bearer(role));
      expect(res.status).toBe(200);
      expect((res.body.notes as NoteDto[]).map((n) => n.timeMs)).toEqual([300, 1240]);
    }
  });

  it('rejects empty text, bad colours and malformed drawings with the field named, storing nothing', async () => {
    const before = await server.count('note');
    const cases: [object, string][] = [
      [{ timeMs: 0, text: '   ' }, 'text'],
      [{ timeMs: -5, text: 'x' }, 'timeMs'],
      [
        {
          timeMs: 0,
          text: 'x',
          drawing: { strokes: [{ points: [[1, 2]], color: 'red; background:url(x)' }] },
        },
        'drawing.strokes.0.color',
      ],
      [
        { timeMs: 0, text: 'x', drawing: { arrows: [{ from: [1], to: [2, 3], color: '#fff' }] } },
        'drawing.arrows.0.from',
      ],
      [
        {
          timeMs: 0,
          text: 'x',
          drawing: { angles: [{ a: [0, 0], vertex: [1, 1], b: [2, 2], degrees: 400 }] },
        },
        'drawing.angles.0.degrees',
      ],
      [{ timeMs: 0, text: 'x'.repeat(4001) }, 'text'],
      // 6 s at 25 fps: frames 0–149.
      [{ timeMs: 0, frameIndex: 150, text: 'x' }, 'frameIndex'],
    ];
    for (const [body, path] of cases) {
      const res = await create('coach', body);
      expect(res.status, path).toBe(400);
      const paths = (res.body.error.details.issues as { path: (string | number)[] }[]).map((i) =>
        i.path.join('.'),
      );
      expect(paths).toContain(path);
    }
    expect(await server.count('note')).toBe(before);
  });

  it('the author edits the text and the drawing; another coach may not; the head coach may', async () => {
    const edited = await server.http
      .patch(`/api/notes/${noteId}`)
      .set(await server.bearer('coach'))
      .send({ text: 'Knees pinched at the apex: press them apart', drawing: null });
    expect(edited.status).toBe(200);
    expect(edited.body.note).toMatchObject({
      text: 'Knees pinched at the apex: press them apart',
      drawing: null,
    });
    expect(Date.parse(edited.body.note.updatedAt)).toBeGreaterThanOrEqual(
      Date.parse(edited.body.note.createdAt),
    );

    const headsNote = (await server.http.get(`/api/clips/${clipId}/notes`).set(await server.bearer('head')))
      .body.notes[0] as NoteDto;
    const byCoach = await server.http
      .patch(`/api/notes/${headsNote.id}`)
      .set(await server.bearer('coach'))
      .send({ text: 'changed' });
    expect(byCoach.status).toBe(403);
    const byHead = await server.http
      .patch(`/api/notes/${noteId}`)
      .set(await server.bearer('head'))
      .send({ timeMs: 1280 });
    expect(byHead.status).toBe(200);
    expect(byHead.body.note).toMatchObject({ timeMs: 1280, author: { name: 'Tomas Reinholt' } });
  });

  it('athletes and guardians cannot read notes before a review is published', async () => {
    for (const role of ['athlete', 'guardian'] as const) {
      const res = await server.http.get(`/api/clips/${clipId}/notes`).set(await server.bearer(role));
      expect(res.status).toBe(403);
    }
  });

  it('an unknown note is 404; a deleted note is gone', async () => {
    const missing = await server.http
      .delete('/api/notes/00000000-0000-4000-8000-000000000000')
      .set(await server.bearer('head'));
    expect(missing.status).toBe(404);
    const extra = await create('coach', { timeMs: 5000, text: 'Temporary' });
    const gone = await server.http
      .delete(`/api/notes/${extra.body.note.id}`)
      .set(await server.bearer('coach'));
    expect(gone.status).toBe(204);
    const again = await server.http
      .delete(`/api/notes/${extra.body.note.id}`)
      .set(await server.bearer('coach'));
    expect(again.status).toBe(404);
  });
});

describe('WebVTT export', () => {
  it('serves text/vtt as a download that a WebVTT parser reads without errors, one cue per note', async () => {
    await create('coach', {
      timeMs: 5500,
      frameIndex: 137,
      text: 'Hands <forward> & level\n\n--> then relax',
    });
    const res = await server.http.get(`/api/clips/${clipId}/notes.vtt`).set(await server.bearer('analyst'));
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('text/vtt; charset=utf-8');
    expect(res.headers['content-disposition']).toMatch(
      /^attachment; filename="?h264-mp4-6s[^"]*\.notes\.vtt"?$/,
    );
    const body = res.text;
    const parsed = new WebVTTParser(ENTITIES).parse(body);
    expect(parsed.errors).toEqual([]);
    expect(parsed.cues.map((c) => [c.startTime, c.endTime])).toEqual([
      [0.3, 4.3],
      [1.28, 5.28],
      // The clip is 6 s long: the last note's cue ends with the clip, not 4 s later.
      [5.5, 6],
    ]);
    // Markup-like text comes out as the coach typed it (escaped on the way, decoded by the player),
    // and the blank line inside the note did not end the cue early.
    expect(textOf(parsed.cues[2].tree)).toBe('Hands <forward> & level\n--> then relax');
    const voice = parsed.cues[2].tree.children?.[0];
    expect(voice).toMatchObject({ type: 'object', name: 'v', value: 'Tomas Reinholt' });
  });

  it('formats timestamps and escapes cue text as the WebVTT spec asks', () => {
    // 1 h 2 min 3.004 s = 3,723,004 ms.
    expect(vttTimestamp(3_723_004)).toBe('01:02:03.004');
    expect(vttTimestamp(0)).toBe('00:00:00.000');
    expect(escapeCueText('a < b && c > d')).toBe('a &lt; b &amp;&amp; c &gt; d');
    expect(escapeCueText('one\r\n\r\ntwo\n \nthree')).toBe('one\ntwo\nthree');
    expect(notesToWebVtt([], null)).toBe('WEBVTT\n');
  });
});
