import { randomUUID } from 'node:crypto';
import type { DataSource } from 'typeorm';
import { UnitOfWork } from '../repositories/unit-of-work';
import { systemClock, type Clock } from '../services/principal';

const DAY = 86_400_000;

/** Invented changes of the demo club's bands: a first start shows edited bands and their history. */
const DEMO_BAND_CHANGES = [
  {
    by: 'head@larchwood.example',
    group: 'U14',
    metric: 'kneeSeparationRatio',
    after: { min: 0.85, max: 1.3, target: 1 },
    daysAgo: 12,
  },
  {
    by: 'coach@larchwood.example',
    group: 'U12',
    metric: 'shoulderTilt',
    after: { min: -6, max: 6, target: 0 },
    daysAgo: 5,
  },
] as const;

/** Invented reviews of the first flags of Elsie's baseline front clip, one kept and one dismissed. */
const DEMO_REVIEWS = [
  {
    by: 'coach@larchwood.example',
    status: 'reviewed',
    comment: 'Talked it through at the lift: knees over the feet through the fall line. Drill on Saturday.',
  },
  {
    by: 'head@larchwood.example',
    status: 'dismissed',
    comment: 'A gate panel hides the far knee here; not a habit.',
  },
] as const;

/** The demo club's own bands, each change on record, before its clips are measured against them. */
export async function seedDemoBandChanges(dataSource: DataSource, clock: Clock = systemClock): Promise<void> {
  const uow = new UnitOfWork(dataSource);
  const now = clock.now();
  await uow.transaction(async (manager) => {
    const repos = uow.of(manager);
    for (const change of DEMO_BAND_CHANGES) {
      const user = await repos.users.findByEmail(change.by);
      if (!user) continue;
      const group = (await repos.club.listAgeGroups(user.clubId)).find((g) => g.name === change.group);
      const band = group ? await repos.toleranceBands.findOne(group.id, change.metric) : null;
      if (!band) continue;
      const at = new Date(now.getTime() - change.daysAgo * DAY);
      const before = { min: band.min, max: band.max, target: band.target, source: band.source };
      const after = { ...change.after, source: 'club' as const };
      await repos.toleranceBands.save({
        ...band,
        ...after,
        version: band.version + 1,
        updatedById: user.id,
        updatedAt: at,
      });
      await repos.toleranceBands.addChange({
        id: randomUUID(),
        clubId: band.clubId,
        ageGroupId: band.ageGroupId,
        metric: band.metric,
        version: band.version + 1,
        action: 'edit',
        before,
        after,
        changedById: user.id,
        changedAt: at,
      });
    }
  });
}

/** Reviews of the demo flags, so the inbox shows reviewed and dismissed items beside the open ones. */
export async function seedDemoFlagReviews(
  dataSource: DataSource,
  clock: Clock = systemClock,
): Promise<number> {
  const uow = new UnitOfWork(dataSource);
  const rows = (await dataSource.query(
    `SELECT f.id FROM flag f JOIN clip c ON c.id = f.clipId JOIN athlete a ON a.id = f.athleteId
       JOIN training_session s ON s.id = c.sessionId
      WHERE a.firstName = 'Elsie' AND c.view = 'front' AND f.model = c.defaultModel
      ORDER BY s.date ASC, f.firstFrame ASC, f.metric ASC LIMIT ?`,
    [DEMO_REVIEWS.length],
  )) as { id: string }[];
  for (const [i, row] of rows.entries()) {
    const review = DEMO_REVIEWS[i];
    const user = await uow.repos.users.findByEmail(review.by);
    if (!user) continue;
    await uow.repos.flags.setStatus(row.id, {
      status: review.status,
      statusComment: review.comment,
      statusById: user.id,
      statusAt: clock.now(),
    });
  }
  return rows.length;
}
