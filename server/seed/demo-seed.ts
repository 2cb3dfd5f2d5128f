import { randomUUID } from 'node:crypto';
import bcrypt from 'bcryptjs';
import type { DataSource } from 'typeorm';
import type { AgeGroup } from '../entities/age-group.entity';
import type { User } from '../entities/user.entity';
import { systemClock, type Clock } from '../services/principal';
import { bandService } from '../services/tolerance-band.service';
import {
  DEMO_AGE_GROUPS,
  DEMO_ATHLETES,
  DEMO_CLUB_NAME,
  DEMO_GUARDIANS,
  DEMO_PASSWORD,
  DEMO_SESSIONS,
  DEMO_STAFF,
  DEMO_VENUE,
} from './demo-club';
import { repositoriesFor, UnitOfWork } from '../repositories/unit-of-work';

export { DEMO_PASSWORD, DEMO_SIGN_INS } from './demo-club';

function isoDate(date: Date): string {
  return date.toISOString().slice(0, 10);
}

/** Seeds the invented demo club in one transaction when the database has no club yet. */
export async function seedDemoClub(
  dataSource: DataSource,
  opts: { bcryptRounds: number; clock?: Clock },
): Promise<{ clubId: string; clubName: string } | null> {
  if ((await repositoriesFor(dataSource.manager).club.count()) > 0) return null;
  const now = (opts.clock ?? systemClock).now();
  const year = now.getUTCFullYear();
  const passwordHash = await bcrypt.hash(DEMO_PASSWORD, opts.bcryptRounds);

  return dataSource.transaction(async (manager) => {
    const clubs = repositoriesFor(manager).club;
    const users = repositoriesFor(manager).users;
    const athletes = repositoriesFor(manager).athletes;
    const sessions = repositoriesFor(manager).sessions;

    const clubId = randomUUID();
    await clubs.insert({
      id: clubId,
      name: DEMO_CLUB_NAME,
      consentGraceDays: 30,
      retentionDaysAfterSeason: 365,
      createdAt: now,
    });

    const groups = new Map<string, AgeGroup>();
    for (const g of DEMO_AGE_GROUPS) {
      const group: AgeGroup = { id: randomUUID(), clubId, name: g.name, minAge: g.minAge, maxAge: g.maxAge };
      await clubs.insertAgeGroup(group);
      groups.set(g.name, group);
    }

    const user = (email: string, name: string, role: User['role'], withPassword: boolean): User => ({
      id: randomUUID(),
      clubId,
      email,
      name,
      role,
      passwordHash: withPassword ? passwordHash : null,
      tokenVersion: 0,
      lastSignInAt: null,
      createdAt: now,
    });

    const staffIds = new Map<string, string>();
    for (const s of DEMO_STAFF) {
      const u = user(s.email, s.name, s.role, true);
      await users.insert(u);
      staffIds.set(s.key, u.id);
      for (const groupName of s.groups)
        await users.addCoachAssignment(randomUUID(), u.id, groups.get(groupName)!.id);
    }

    const guardianIds = new Map<string, string>();
    for (const g of DEMO_GUARDIANS) {
      const u = user(g.email, g.name, 'guardian', g.password);
      await users.insert(u);
      guardianIds.set(g.key, u.id);
    }

    const headId = staffIds.get('head')!;
    for (const a of DEMO_ATHLETES) {
      let userId: string | null = null;
      if (a.email) {
        const u = user(a.email, `${a.firstName} ${a.lastName}`, 'athlete', true);
        await users.insert(u);
        userId = u.id;
      }
      const guardian = DEMO_GUARDIANS.find((g) => g.key === a.guardian)!;
      const athleteId = randomUUID();
      await athletes.insert({
        id: athleteId,
        clubId,
        ageGroupId: groups.get(a.group)!.id,
        userId,
        firstName: a.firstName,
        lastName: a.lastName,
        birthYear: year - a.age,
        consentRecordedAt: a.consent ? now : null,
        consentGuardianName: a.consent ? guardian.name : null,
        consentMethod: a.consent ? 'signed_form' : null,
        consentRecordedById: a.consent ? headId : null,
        consentShareByEmail: a.consent && a.shareByEmail !== false,
        consentWithdrawnAt: null,
        erasureDueAt: null,
        createdAt: now,
      });
      if (a.consent) {
        await athletes.addConsentEvent({
          id: randomUUID(),
          athleteId,
          action: 'given',
          purposes: a.shareByEmail === false ? ['store_clips'] : ['store_clips', 'share_by_email'],
          decidedBy: guardian.name,
          method: 'signed_form',
          recordedById: headId,
          recordedByRole: 'head_coach',
          at: now,
        });
      }
      await users.addGuardianLink(randomUUID(), guardianIds.get(a.guardian)!, athleteId, now);
    }

    for (const s of DEMO_SESSIONS) {
      await sessions.insert({
        id: randomUUID(),
        clubId,
        date: isoDate(new Date(now.getTime() - s.daysAgo * 86_400_000)),
        venue: DEMO_VENUE,
        discipline: s.discipline,
        snow: s.snow,
        notes: s.notes,
        createdById: staffIds.get('coach')!,
        createdAt: now,
      });
    }
    await bandService(new UnitOfWork(dataSource), opts.clock ?? systemClock).ensureDefaults(manager, clubId);
    return { clubId, clubName: DEMO_CLUB_NAME };
  });
}
