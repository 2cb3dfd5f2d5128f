import { randomUUID } from 'node:crypto';
import type { DataSource } from 'typeorm';
import type { FocusPoint } from '../entities/focus-point.entity';
import { UnitOfWork } from '../repositories/unit-of-work';
import { systemClock, type Clock } from '../services/principal';

/** The season holding a date: July to June, named like 2026-27 (the demo club skis in the north). */
export function demoSeasonFor(date: Date): { name: string; startsOn: string; endsOn: string } {
  const year = date.getUTCMonth() >= 6 ? date.getUTCFullYear() : date.getUTCFullYear() - 1;
  return {
    name: `${year}-${String((year + 1) % 100).padStart(2, '0')}`,
    startsOn: `${year}-07-01`,
    endsOn: `${year + 1}-06-30`,
  };
}

/** Elsie's invented season plan: two measured focus points and one in words, in the coach's own cues. */
const DEMO_FOCUS_POINTS: Pick<
  FocusPoint,
  'title' | 'cue' | 'metric' | 'phase' | 'targetMin' | 'targetMax' | 'direction' | 'status'
>[] = [
  {
    title: 'Knees apart at the apex',
    cue: 'Two headlights on your knees, both lighting the snow in front of their own ski.',
    metric: 'kneeSeparationRatio',
    phase: 'apex',
    targetMin: 1,
    targetMax: 1.3,
    direction: null,
    status: 'working',
  },
  {
    title: 'Level shoulders through the turn',
    cue: 'Inside hand forward and up; carry a tray of drinks down the hill.',
    metric: 'insideShoulderDrop',
    phase: 'apex',
    targetMin: -5,
    targetMax: 5,
    direction: null,
    status: 'improving',
  },
  {
    title: 'Early pole plant',
    cue: 'Touch the snow as the skis go flat, not after.',
    metric: null,
    phase: null,
    targetMin: null,
    targetMax: null,
    direction: null,
    status: 'planned',
  },
];

/**
 * The demo club's season, and Elsie's plan in it: three focus points and her first front clip as the
 * baseline, so a first start shows progress charts and Compare with her later clip.
 */
export async function seedDemoSeasonPlan(dataSource: DataSource, clubId: string, clock: Clock = systemClock) {
  const uow = new UnitOfWork(dataSource);
  const now = clock.now();
  await uow.transaction(async (manager) => {
    const repos = uow.of(manager);
    const season = {
      id: randomUUID(),
      clubId,
      ...demoSeasonFor(now),
      retentionNoticeSentAt: null,
      createdAt: now,
    };
    await repos.plans.insertSeason(season);
    const coach = await repos.users.findByEmail('coach@larchwood.example');
    const [elsie] = (await manager.query(
      `SELECT a.id FROM athlete a WHERE a.clubId = ? AND a.firstName = 'Elsie'`,
      [clubId],
    )) as { id: string }[];
    if (!elsie) return;
    for (const [rank, point] of DEMO_FOCUS_POINTS.entries()) {
      await repos.plans.insertFocusPoint({
        id: randomUUID(),
        athleteId: elsie.id,
        seasonId: season.id,
        rank,
        ...point,
        createdById: coach?.id ?? null,
        createdAt: now,
        updatedAt: now,
      });
    }
    const [baseline] = (await manager.query(
      `SELECT c.id FROM clip c JOIN clip_athlete t ON t.clipId = c.id JOIN training_session s ON s.id = c.sessionId
        WHERE t.athleteId = ? AND c.view = 'front' ORDER BY s.date ASC, c.createdAt ASC LIMIT 1`,
      [elsie.id],
    )) as { id: string }[];
    if (baseline)
      await repos.plans.saveBaseline({
        id: randomUUID(),
        athleteId: elsie.id,
        seasonId: season.id,
        clipId: baseline.id,
        setById: coach?.id ?? null,
        setAt: now,
      });
  });
}
