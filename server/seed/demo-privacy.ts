import { randomUUID } from 'node:crypto';
import type { DataSource } from 'typeorm';
import { ConsentEventEntity } from '../entities/consent-event.entity';
import { UnitOfWork } from '../repositories/unit-of-work';
import { systemClock, type Clock } from '../services/principal';
import { demoSeasonFor } from './demo-plan';

const DAY = 86_400_000;

/**
 * The demo club's privacy on first start: last season (for the retention table), and Arlo's guardian
 * having asked by e-mail, three days ago, to withdraw consent (recorded by the head coach), so his clip is
 * hidden from all but the head coach and waits for erasure when the club's 30-day grace period ends.
 * All invented.
 */
export async function seedDemoPrivacy(dataSource: DataSource, clubId: string, clock: Clock = systemClock) {
  const uow = new UnitOfWork(dataSource);
  const now = clock.now();
  await uow.transaction(async (manager) => {
    const repos = uow.of(manager);
    const lastYear = demoSeasonFor(new Date(now.getTime() - 365 * DAY));
    const seasons = await repos.plans.listSeasons(clubId);
    if (!seasons.some((s) => s.name === lastYear.name))
      await repos.plans.insertSeason({
        id: randomUUID(),
        clubId,
        ...lastYear,
        retentionNoticeSentAt: null,
        createdAt: now,
      });

    const [arlo] = (await manager.query(
      `SELECT a.id, a.clubId FROM athlete a WHERE a.clubId = ? AND a.firstName = 'Arlo' AND a.lastName = 'Eskdale'`,
      [clubId],
    )) as { id: string }[];
    const guardian = await repos.users.findByEmail('j.eskdale@larchwood.example');
    const head = await repos.users.findByEmail('head@larchwood.example');
    const club = await repos.club.findById(clubId);
    if (!arlo || !guardian || !head || !club) return;
    const withdrawnAt = new Date(now.getTime() - 3 * DAY);
    // His consent was given at the start of the season, weeks before it was withdrawn.
    const givenAt = new Date(now.getTime() - 40 * DAY);
    await manager.update(ConsentEventEntity, { athleteId: arlo.id, action: 'given' }, { at: givenAt });
    await repos.athletes.update(arlo.id, { consentRecordedAt: givenAt });
    await repos.athletes.update(arlo.id, {
      consentWithdrawnAt: withdrawnAt,
      erasureDueAt: new Date(withdrawnAt.getTime() + club.consentGraceDays * DAY),
    });
    await repos.athletes.addConsentEvent({
      id: randomUUID(),
      athleteId: arlo.id,
      action: 'withdrawn',
      purposes: ['store_clips', 'share_by_email'],
      decidedBy: guardian.name,
      method: 'email',
      recordedById: head.id,
      recordedByRole: 'head_coach',
      at: withdrawnAt,
    });
  });
}
