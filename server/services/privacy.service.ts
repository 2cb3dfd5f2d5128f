import { randomUUID } from 'node:crypto';
import type { Logger } from 'pino';
import type {
  PrivacySettingsDto,
  PrivacySettingsInput,
  SeasonRetentionDto,
} from '@shared/schemas/consent.schema';
import type { Club } from '../entities/club.entity';
import type { Season } from '../entities/season.entity';
import { notFound } from '../errors';
import { consentWithdrawnMail, retentionNoticeMail } from '../mail/templates';
import type { Mailer } from '../mail/mailer';
import type { UnitOfWork } from '../repositories/unit-of-work';
import type { AuditService } from './audit.service';
import type { ErasureService } from './erasure.service';
import type { Clock, Principal } from './principal';

/** How long before a season's clips are erased the head coach is told. */
export const RETENTION_NOTICE_DAYS = 7;
const DAY_MS = 86_400_000;
const SWEEP_ACTION = 'privacy.sweep';

/** A calendar date plus whole days, as YYYY-MM-DD (UTC, like every date of the app). */
export function addDays(isoDate: string, days: number): string {
  return new Date(Date.parse(`${isoDate}T00:00:00Z`) + days * DAY_MS).toISOString().slice(0, 10);
}

/** What one sweep did. */
export interface SweepReport {
  /** Clips erased because their athlete's consent was withdrawn and the grace period ended. */
  withdrawnClips: number;
  /** Athletes whose erasure after a withdrawal is complete. */
  athletes: number;
  /** Clips erased past the club's retention after their season. */
  retentionClips: number;
  /** Notices sent to head coaches a week before a season's clips go. */
  notices: number;
}

interface Deps {
  uow: UnitOfWork;
  erasure: ErasureService;
  mailer: Mailer;
  audit: AuditService;
  clock: Clock;
  logger: Logger;
  publicUrl: () => string;
}

/**
 * The club's privacy settings (grace period after a withdrawal, retention after a season) and the
 * daily sweep that carries them out. The sweep holds no state of its own: what is due is read from the
 * database each time (erasure dates, season ends), so a sweep killed half-way is finished by the next
 * one and nothing is erased twice.
 */
export class PrivacyService {
  private running: Promise<SweepReport> | null = null;

  constructor(private readonly deps: Deps) {}

  async settings(principal: Principal): Promise<PrivacySettingsDto> {
    const { uow } = this.deps;
    const club = await this.club(principal.clubId);
    const seasons = await uow.repos.plans.listSeasons(club.id);
    const pending = await uow.repos.athletes.pendingErasures(club.id);
    const clipCounts = await uow.repos.athletes.clipCounts(pending.map((a) => a.id));
    const last = await uow.repos.audit.latest(SWEEP_ACTION);
    const retention: SeasonRetentionDto[] = [];
    for (const season of seasons) {
      retention.push({
        seasonId: season.id,
        name: season.name,
        endsOn: season.endsOn,
        erasesOn: erasesOn(club, season),
        clips: (await uow.repos.clips.idsWithSessionBetween(club.id, season.startsOn, season.endsOn)).length,
        noticeSentAt: season.retentionNoticeSentAt ? season.retentionNoticeSentAt.toISOString() : null,
      });
    }
    return {
      consentGraceDays: club.consentGraceDays,
      retentionDaysAfterSeason: club.retentionDaysAfterSeason,
      seasons: retention.sort((a, b) => (a.endsOn < b.endsOn ? 1 : -1)),
      pendingErasures: pending.map((a) => ({
        athleteId: a.id,
        name: `${a.firstName} ${a.lastName}`,
        erasureDueAt: a.erasureDueAt!.toISOString(),
        clips: clipCounts.get(a.id) ?? 0,
      })),
      lastSweepAt: last ? last.createdAt.toISOString() : null,
    };
  }

  async updateSettings(principal: Principal, input: PrivacySettingsInput): Promise<PrivacySettingsDto> {
    const { uow } = this.deps;
    const club = await this.club(principal.clubId);
    await uow.transaction(async (manager) => {
      const repos = uow.of(manager);
      await repos.club.update(club.id, input);
      // A new retention means new dates: every season's notice is owed again.
      if (input.retentionDaysAfterSeason !== club.retentionDaysAfterSeason)
        await manager.query(`UPDATE season SET retentionNoticeSentAt = NULL WHERE clubId = ?`, [club.id]);
      await this.deps.audit.record(manager, {
        clubId: club.id,
        actorUserId: principal.user.id,
        action: 'club.privacy_settings',
        targetType: 'club',
        targetId: club.id,
        details: { before: pick(club), after: input },
      });
    });
    return this.settings(principal);
  }

  /** Tells the club's head coaches that consent was withdrawn in the app (a coach's record needs no notice). */
  async noticeWithdrawal(
    clubId: string,
    athleteId: string,
    athleteName: string,
    decidedBy: string,
    due: Date,
  ) {
    const { uow, mailer, publicUrl } = this.deps;
    for (const head of await uow.repos.users.headCoachesOf(clubId)) {
      await mailer.send(
        consentWithdrawnMail({
          to: head.email,
          recipientName: head.name,
          athleteName,
          decidedBy,
          erasesOn: due.toISOString().slice(0, 10),
          link: `${publicUrl()}/athletes/${athleteId}`,
        }),
      );
    }
  }

  /** One sweep; a call while one runs waits for it instead of starting a second. */
  sweep(): Promise<SweepReport> {
    this.running ??= this.sweepOnce().finally(() => {
      this.running = null;
    });
    return this.running;
  }

  /** Resolves once no sweep is running (closing the server waits for one half done). */
  async idle(): Promise<void> {
    await this.running?.catch(() => undefined);
  }

  private async sweepOnce(): Promise<SweepReport> {
    const { uow, clock, logger } = this.deps;
    const now = clock.now();
    const report: SweepReport = { withdrawnClips: 0, athletes: 0, retentionClips: 0, notices: 0 };

    for (const athlete of await uow.repos.athletes.dueForErasure(now)) {
      const clipIds = await uow.repos.athletes.clipIdsOf(athlete.id);
      const erased = await this.deps.erasure.eraseClipsBySweep(
        athlete.clubId,
        clipIds,
        'athlete.withdrawn_clips_erase',
      );
      report.withdrawnClips += erased.length;
      if (erased.length < clipIds.length) continue; // a clip still being prepared: the next sweep
      await uow.transaction(async (manager) => {
        const repos = uow.of(manager);
        // Reviews of the athlete on clips they are not tagged in, if any, go too.
        await manager.query(`DELETE FROM review WHERE athleteId = ?`, [athlete.id]);
        await repos.athletes.update(athlete.id, { erasureDueAt: null });
        await repos.athletes.addConsentEvent({
          id: randomUUID(),
          athleteId: athlete.id,
          action: 'erased',
          purposes: ['store_clips'],
          decidedBy: 'The grace period after the withdrawal ended',
          method: null,
          recordedById: null,
          recordedByRole: 'system',
          at: now,
        });
      });
      report.athletes += 1;
    }

    const today = now.toISOString().slice(0, 10);
    for (const club of await uow.repos.club.withRetention()) {
      for (const season of await uow.repos.plans.listSeasons(club.id)) {
        const due = erasesOn(club, season)!;
        const clipIds = await uow.repos.clips.idsWithSessionBetween(club.id, season.startsOn, season.endsOn);
        if (clipIds.length === 0) continue;
        if (today >= due) {
          const erased = await this.deps.erasure.eraseClipsBySweep(club.id, clipIds, 'clip.retention_erase');
          report.retentionClips += erased.length;
        } else if (today >= addDays(due, -RETENTION_NOTICE_DAYS) && !season.retentionNoticeSentAt) {
          await this.sendRetentionNotice(club, season, due, clipIds.length, now);
          report.notices += 1;
        }
      }
    }

    await uow.transaction((manager) =>
      this.deps.audit.record(manager, {
        clubId: null,
        actorUserId: null,
        action: SWEEP_ACTION,
        details: { ...report },
      }),
    );
    if (report.withdrawnClips + report.retentionClips + report.notices > 0)
      logger.info({ report }, 'privacy sweep');
    return report;
  }

  private async sendRetentionNotice(club: Club, season: Season, due: string, clips: number, now: Date) {
    const { uow, mailer, publicUrl } = this.deps;
    // Marked first: a notice missed by a crash is better than one sent every day.
    await uow.repos.plans.updateSeason(season.id, { retentionNoticeSentAt: now });
    for (const head of await uow.repos.users.headCoachesOf(club.id)) {
      await mailer.send(
        retentionNoticeMail({
          to: head.email,
          recipientName: head.name,
          clubName: club.name,
          seasonName: season.name,
          erasesOn: due,
          clips,
          link: `${publicUrl()}/club#privacy`,
        }),
      );
    }
  }

  private async club(id: string): Promise<Club> {
    const club = await this.deps.uow.repos.club.findById(id);
    if (!club) throw notFound('Club');
    return club;
  }
}

/** The day a season's clips are erased under the club's retention, or null when the club keeps them. */
export function erasesOn(club: Club, season: Season): string | null {
  if (club.retentionDaysAfterSeason === null) return null;
  return addDays(season.endsOn, club.retentionDaysAfterSeason + 1);
}

function pick(club: Club): PrivacySettingsInput {
  return { consentGraceDays: club.consentGraceDays, retentionDaysAfterSeason: club.retentionDaysAfterSeason };
}
