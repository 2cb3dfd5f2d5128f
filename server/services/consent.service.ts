import { randomUUID } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import type { AthleteResponse, RecordConsentInput } from '@shared/schemas/athlete.schema';
import type {
  ConsentDecisionInput,
  ConsentEventDto,
  ConsentPurpose,
  ConsentRecordResponse,
} from '@shared/schemas/consent.schema';
import type { Athlete } from '../entities/athlete.entity';
import type { ConsentEvent } from '../entities/consent-event.entity';
import { conflict, fieldError, forbidden, notFound } from '../errors';
import type { UnitOfWork } from '../repositories/unit-of-work';
import type { AccessService } from './access.service';
import type { AthleteService } from './athlete.service';
import type { AuditService } from './audit.service';
import { consentManagedBy, consentStatus, guardianStillReaches, isMinor } from './consent.rules';
import type { Clock, Principal } from './principal';
import type { PrivacyService } from './privacy.service';
import type { Logger } from 'pino';

const DAY_MS = 86_400_000;

interface Deps {
  uow: UnitOfWork;
  access: AccessService;
  athletes: AthleteService;
  audit: AuditService;
  clock: Clock;
  /** Tells the head coach of a withdrawal made in the app, and sweeps at once when no grace period is set. */
  privacy: Pick<PrivacyService, 'noticeWithdrawal' | 'sweep'>;
  logger: Logger;
}

/**
 * The consent life cycle of an athlete: given (recorded by a coach), withdrawn (by a guardian, by an
 * adult athlete, or by the head coach recording someone's request), restored before or after the
 * erasure of clips, and who an adult athlete lets keep a guardian's access. Every step goes on the
 * athlete's consent record; the audit trail keeps who acted, without names.
 */
export class ConsentService {
  constructor(private readonly deps: Deps) {}

  /** A coach records a guardian's consent (or consent given again after a withdrawal). */
  async give(principal: Principal, athleteId: string, input: RecordConsentInput): Promise<AthleteResponse> {
    const { uow, access, clock } = this.deps;
    const athlete = await this.deps.athletes.findVisible(principal, athleteId);
    if (!access.canManageAthlete(principal, athlete)) {
      throw forbidden('Only the head coach or a coach of this athlete’s age group can record consent');
    }
    const now = clock.now();
    const restoring = athlete.consentWithdrawnAt !== null;
    const patch: Partial<Athlete> = {
      consentRecordedAt: now,
      consentGuardianName: input.guardianName,
      consentMethod: input.method,
      consentRecordedById: principal.user.id,
      consentShareByEmail: input.shareByEmail,
      consentWithdrawnAt: null,
      erasureDueAt: null,
    };
    await uow.transaction(async (manager) => {
      const repos = uow.of(manager);
      await repos.athletes.update(athlete.id, patch);
      await this.recordStep(manager, principal, athlete, now, {
        action: restoring ? 'restored' : 'given',
        purposes: input.shareByEmail ? ['store_clips', 'share_by_email'] : ['store_clips'],
        decidedBy: input.guardianName,
        method: input.method,
        audit: restoring ? 'athlete.consent_restore' : 'athlete.consent',
        details: { method: input.method, shareByEmail: input.shareByEmail },
      });
    });
    return this.deps.athletes.get(principal, athlete.id);
  }

  /**
   * Withdraws consent: the athlete's clips and reviews leave everyone's sight but the head coach's at
   * once, and are erased when the club's grace period ends (0 days: at the next sweep, started now).
   */
  async withdraw(
    principal: Principal,
    athleteId: string,
    input: ConsentDecisionInput,
  ): Promise<AthleteResponse> {
    const { uow, clock } = this.deps;
    const athlete = await this.deps.athletes.findVisible(principal, athleteId);
    const now = clock.now();
    const decision = this.decider(principal, athlete, input, now);
    const status = consentStatus(athlete, now);
    if (status === 'withdrawn') throw conflict('consent_withdrawn', 'Consent is withdrawn already');
    if (status === 'missing')
      throw conflict(
        'no_consent',
        `No consent for ${athlete.firstName} is on record, so none can be withdrawn`,
      );
    const club = await uow.repos.club.findById(athlete.clubId);
    const graceDays = club?.consentGraceDays ?? 30;
    const patch: Partial<Athlete> = {
      consentWithdrawnAt: now,
      erasureDueAt: new Date(now.getTime() + graceDays * DAY_MS),
    };
    await uow.transaction(async (manager) => {
      const repos = uow.of(manager);
      await repos.athletes.update(athlete.id, patch);
      await this.recordStep(manager, principal, athlete, now, {
        action: 'withdrawn',
        purposes: ['store_clips', 'share_by_email'],
        ...decision,
        audit: 'athlete.consent_withdraw',
        details: { graceDays },
      });
    });
    const afterwards = async () => {
      if (principal.role !== 'head_coach')
        await this.deps.privacy.noticeWithdrawal(
          athlete.clubId,
          athlete.id,
          `${athlete.firstName} ${athlete.lastName}`,
          decision.decidedBy,
          patch.erasureDueAt!,
        );
      if (graceDays === 0) await this.deps.privacy.sweep();
    };
    // The withdrawal stands once stored: a failed notice is logged, a failed erasure is redone by the next sweep.
    await afterwards().catch((error: unknown) =>
      this.deps.logger.warn({ err: error }, 'after a withdrawal of consent'),
    );
    return this.deps.athletes.get(principal, athlete.id);
  }

  /** Takes a withdrawal back: the clips not yet erased come back into sight; nothing erased returns. */
  async restore(
    principal: Principal,
    athleteId: string,
    input: ConsentDecisionInput,
  ): Promise<AthleteResponse> {
    const { uow, clock } = this.deps;
    const athlete = await this.deps.athletes.findVisible(principal, athleteId);
    const now = clock.now();
    const decision = this.decider(principal, athlete, input, now);
    if (!athlete.consentWithdrawnAt) throw conflict('consent_not_withdrawn', 'Consent is not withdrawn');
    const patch: Partial<Athlete> = { consentWithdrawnAt: null, erasureDueAt: null };
    // A minor's consent is on record again; an adult needs none recorded.
    if (isMinor(athlete.birthYear, now)) {
      patch.consentRecordedAt = now;
      patch.consentGuardianName = decision.decidedBy;
      patch.consentRecordedById = principal.user.id;
    }
    await uow.transaction(async (manager) => {
      const repos = uow.of(manager);
      await repos.athletes.update(athlete.id, patch);
      await this.recordStep(manager, principal, athlete, now, {
        action: 'restored',
        purposes: athlete.consentShareByEmail ? ['store_clips', 'share_by_email'] : ['store_clips'],
        ...decision,
        audit: 'athlete.consent_restore',
      });
    });
    return this.deps.athletes.get(principal, athlete.id);
  }

  /** The consent record and, for an adult athlete, which guardians still have access. */
  async record(principal: Principal, athleteId: string): Promise<ConsentRecordResponse> {
    const { uow, clock } = this.deps;
    const athlete = await this.deps.athletes.findVisible(principal, athleteId);
    const events = await uow.repos.athletes.consentEvents(athlete.id);
    const names = await uow.repos.users.namesByIds(
      events.map((e) => e.recordedById).filter((id): id is string => id !== null),
    );
    const now = clock.now();
    const adult = !isMinor(athlete.birthYear, now);
    const links = adult ? await uow.repos.athletes.guardianLinks(athlete.id) : [];
    const guardianNames = await uow.repos.users.namesByIds(links.map((l) => l.guardianUserId));
    return {
      events: events.map((e) => toConsentEventDto(e, names)),
      guardianAccess: links.map((l) => ({
        guardianId: l.guardianUserId,
        name: guardianNames.get(l.guardianUserId) ?? 'A guardian',
        hasAccess: guardianStillReaches(athlete.birthYear, l.keptByAthleteAt, now),
        keptByAthleteAt: l.keptByAthleteAt ? l.keptByAthleteAt.toISOString() : null,
      })),
    };
  }

  /** An adult athlete keeps a guardian's access, or ends it (the guardian's next request no longer reaches). */
  async setGuardianAccess(
    principal: Principal,
    athleteId: string,
    guardianId: string,
    keep: boolean,
  ): Promise<ConsentRecordResponse> {
    const { uow, clock } = this.deps;
    const athlete = await this.deps.athletes.findVisible(principal, athleteId);
    if (principal.role !== 'athlete' || principal.athleteId !== athlete.id)
      throw forbidden('Only the athlete decides who keeps access once they are 18');
    const now = clock.now();
    if (isMinor(athlete.birthYear, now))
      throw forbidden('Until you are 18 your guardians keep access; this choice is yours from then on');
    await uow.transaction(async (manager) => {
      const repos = uow.of(manager);
      const changed = await repos.athletes.setGuardianKept(athlete.id, guardianId, keep ? now : null);
      if (changed === 0) throw notFound('Guardian');
      await this.recordStep(manager, principal, athlete, now, {
        action: keep ? 'guardian_kept' : 'guardian_ended',
        purposes: [],
        decidedBy: principal.user.name,
        method: 'in_app',
        audit: keep ? 'athlete.guardian_keep' : 'athlete.guardian_end',
      });
    });
    return this.record(principal, athlete.id);
  }

  /**
   * Whose decision a withdrawal or restoration is. A guardian decides for a minor, an adult athlete for
   * themself, in the app; the head coach records either's request, naming them and how it came.
   */
  private decider(
    principal: Principal,
    athlete: Athlete,
    input: ConsentDecisionInput,
    now: Date,
  ): Pick<ConsentEvent, 'decidedBy' | 'method'> {
    const managedBy = consentManagedBy(athlete, now);
    switch (principal.role) {
      case 'head_coach':
        if (!input.decidedBy) throw fieldError('decidedBy', 'Enter who asked, as they gave their name');
        if (!input.method) throw fieldError('method', 'Say how the request came');
        return { decidedBy: input.decidedBy, method: input.method };
      case 'guardian':
        if (managedBy === 'athlete')
          throw forbidden(`${athlete.firstName} is 18 or older and decides about consent themself`);
        return { decidedBy: principal.user.name, method: 'in_app' };
      case 'athlete':
        if (managedBy === 'guardian')
          throw forbidden('Until you are 18 a guardian decides about consent; ask them or your head coach');
        return { decidedBy: principal.user.name, method: 'in_app' };
      default:
        throw forbidden(
          'Only a guardian, an adult athlete, or the head coach recording their request can change consent',
        );
    }
  }

  /**
   * One step of the consent life cycle in the caller's transaction: its entry in the athlete's
   * consent record, and the audit entry of who acted (no names).
   */
  private async recordStep(
    manager: EntityManager,
    principal: Principal,
    athlete: Athlete,
    at: Date,
    step: {
      action: ConsentEvent['action'];
      purposes: ConsentPurpose[];
      decidedBy: string;
      method: ConsentEvent['method'];
      audit: string;
      details?: Record<string, unknown>;
    },
  ): Promise<void> {
    const { audit, details, ...entry } = step;
    await this.deps.uow.of(manager).athletes.addConsentEvent({
      id: randomUUID(),
      athleteId: athlete.id,
      ...entry,
      recordedById: principal.user.id,
      recordedByRole: principal.role,
      at,
    });
    await this.deps.audit.record(manager, {
      clubId: athlete.clubId,
      actorUserId: principal.user.id,
      action: audit,
      targetType: 'athlete',
      targetId: athlete.id,
      details,
    });
  }
}

export function toConsentEventDto(event: ConsentEvent, names: Map<string, string>): ConsentEventDto {
  return {
    id: event.id,
    action: event.action,
    purposes: event.purposes,
    decidedBy: event.decidedBy,
    method: event.method,
    recordedBy: event.recordedById ? (names.get(event.recordedById) ?? null) : null,
    recordedByRole: event.recordedByRole,
    at: event.at.toISOString(),
  };
}
