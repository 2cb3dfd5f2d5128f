import { randomUUID } from 'node:crypto';
import type { DataSource } from 'typeorm';
import { DEFAULT_REVIEW_OVERLAYS } from '@shared/schemas/review.schema';
import type { Note } from '../entities/note.entity';
import { UnitOfWork } from '../repositories/unit-of-work';
import { systemClock, type Clock } from '../services/principal';

const HOUR = 3_600_000;

/** Invented notes on Elsie's later clip: what a coach pins at the lodge (one with a drawing). */
const DEMO_NOTES = [
  {
    frameIndex: 35,
    text: 'Here, at the apex: knees a hand apart, both pointing down the hill. That is the shape to keep.',
    drawing: {
      strokes: [],
      arrows: [
        { from: [250, 215] as [number, number], to: [300, 250] as [number, number], color: '#c47610' },
      ],
      angles: [],
    },
  },
  {
    frameIndex: 63,
    text: 'Inside hand forward and up through this turn: your shoulders stay almost level.',
    drawing: null,
  },
] as const;

/**
 * One published review of Elsie's spring clip (two notes, one with a drawing, and her knee focus point,
 * beside her baseline) and one draft on her autumn clip, so both sides of a review show on first start.
 */
export async function seedDemoReviews(dataSource: DataSource, clubId: string, clock: Clock = systemClock) {
  const uow = new UnitOfWork(dataSource);
  const now = clock.now();
  const coach = await uow.repos.users.findByEmail('coach@larchwood.example');
  const rows = (await dataSource.query(
    `SELECT c.id, c.originalName, c.fps FROM clip c JOIN clip_athlete t ON t.clipId = c.id
       JOIN athlete a ON a.id = t.athleteId JOIN training_session s ON s.id = c.sessionId
      WHERE a.clubId = ? AND a.firstName = 'Elsie' AND c.view = 'front' ORDER BY s.date ASC`,
    [clubId],
  )) as { id: string; originalName: string; fps: number | null }[];
  const [elsie] = (await dataSource.query(`SELECT id FROM athlete WHERE clubId = ? AND firstName = 'Elsie'`, [
    clubId,
  ])) as { id: string }[];
  if (!coach || !elsie || rows.length < 2) return;
  const [autumn, spring] = rows;
  const points = (await dataSource.query(
    `SELECT id FROM focus_point WHERE athleteId = ? AND metric = 'kneeSeparationRatio' ORDER BY rank LIMIT 1`,
    [elsie.id],
  )) as { id: string }[];
  await uow.transaction(async (manager) => {
    const repos = uow.of(manager);
    const noteIds: string[] = [];
    for (const n of DEMO_NOTES) {
      const note: Note = {
        id: randomUUID(),
        clipId: spring.id,
        authorId: coach.id,
        timeMs: (n.frameIndex * 1000) / (spring.fps ?? 25),
        frameIndex: n.frameIndex,
        body: n.text,
        drawing: n.drawing ? { strokes: [], arrows: [...n.drawing.arrows], angles: [] } : null,
        createdAt: now,
        updatedAt: now,
      };
      await repos.notes.insert(note);
      noteIds.push(note.id);
    }
    const publishedAt = new Date(now.getTime() - 20 * HOUR);
    const published = {
      id: randomUUID(),
      clubId,
      clipId: spring.id,
      athleteId: elsie.id,
      createdById: coach.id,
      title: 'Free skiing on the lower pitch',
      summary:
        'Great session, Elsie. Your knees stayed apart through the apex much more than in November, and your shoulders are close to level. Watch the two moments below, then keep the headlights on for Saturday.',
      status: 'published' as const,
      overlays: { ...DEFAULT_REVIEW_OVERLAYS },
      compareClipId: autumn.id,
      showCurves: false,
      publishedAt,
      withdrawnAt: null,
      publishCount: 1,
      createdAt: publishedAt,
      updatedAt: publishedAt,
    };
    await repos.reviews.insert(published);
    await repos.reviews.setItems(published.id, 'note', noteIds, randomUUID);
    await repos.reviews.setItems(
      published.id,
      'focus_point',
      points.map((p) => p.id),
      randomUUID,
    );
    await repos.reviews.insert({
      ...published,
      id: randomUUID(),
      clipId: autumn.id,
      title: 'Baseline: open GS',
      summary: 'Where we start the season: ',
      status: 'draft',
      compareClipId: null,
      publishedAt: null,
      publishCount: 0,
      createdAt: now,
      updatedAt: now,
    });
  });
}
