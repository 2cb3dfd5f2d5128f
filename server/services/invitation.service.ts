import { randomUUID } from 'node:crypto';
import type {
  AcceptInvitationInput,
  CreateInvitationInput,
  InvitationPreviewResponse,
  InvitationResponse,
} from '@shared/schemas/auth.schema';
import type { Invitation } from '../entities/invitation.entity';
import type { User } from '../entities/user.entity';
import { HttpError, badRequest, conflict, forbidden, notFound } from '../errors';
import type { Mailer } from '../mail/mailer';
import { checkNewPassword } from './password-policy';
import { invitationMail } from '../mail/templates';
import type { AccessService } from './access.service';
import type { AuditService } from './audit.service';
import type { AuthService, SignedIn } from './auth.service';
import type { Clock, Principal } from './principal';
import { hashSecretToken, newSecretToken } from './secret-token';
import type { UnitOfWork } from '../repositories/unit-of-work';

export class InvitationService {
  constructor(
    private readonly uow: UnitOfWork,
    private readonly access: AccessService,
    private readonly auth: AuthService,
    private readonly audit: AuditService,
    private readonly mailer: Mailer,
    private readonly clock: Clock,
    private readonly publicUrl: () => string,
    private readonly ttlMs: number,
  ) {}

  /**
   * Head coach: anyone. Coach: athletes of their groups and those athletes' guardians.
   * Athlete and guardian invitations name the athlete record they attach to.
   */
  async create(principal: Principal, input: CreateInvitationInput): Promise<InvitationResponse> {
    const manager = this.uow.repos.manager;
    if (principal.role !== 'head_coach' && input.role !== 'athlete' && input.role !== 'guardian') {
      throw forbidden('Coaches can invite athletes and guardians; ask the head coach to invite staff');
    }
    let athleteName: string | null = null;
    if (input.role === 'athlete' || input.role === 'guardian') {
      if (!input.athleteId) {
        throw badRequest('athlete_required', `Choose the athlete this ${input.role} invitation is for`);
      }
      const athlete = await this.uow.of(manager).athletes.findById(input.athleteId);
      if (!athlete || !this.access.canSeeAthlete(principal, athlete)) throw notFound('Athlete');
      if (!this.access.canManageAthlete(principal, athlete)) {
        throw forbidden('You can only invite athletes and guardians of the age groups you coach');
      }
      if (input.role === 'athlete' && athlete.userId) {
        throw conflict(
          'athlete_has_account',
          `${athlete.firstName} ${athlete.lastName} already has a sign-in`,
        );
      }
      athleteName = `${athlete.firstName} ${athlete.lastName}`;
    }
    const ageGroupIds = input.role === 'coach' ? [...new Set(input.ageGroupIds ?? [])] : [];
    if (ageGroupIds.length > 0) {
      const groups = await this.uow.of(manager).club.listAgeGroups(principal.clubId);
      const known = new Set(groups.map((g) => g.id));
      if (!ageGroupIds.every((id) => known.has(id))) {
        throw badRequest('unknown_age_group', 'Choose age groups of this club');
      }
    }
    if (await this.uow.of(manager).users.findByEmail(input.email)) {
      throw conflict('already_member', `${input.email} already has a Stanceline sign-in`);
    }

    const token = newSecretToken();
    const now = this.clock.now();
    const invitation: Invitation = {
      id: randomUUID(),
      clubId: principal.clubId,
      email: input.email,
      role: input.role,
      athleteId: input.role === 'athlete' || input.role === 'guardian' ? input.athleteId! : null,
      ageGroupIds,
      tokenHash: hashSecretToken(token),
      invitedById: principal.user.id,
      expiresAt: new Date(now.getTime() + this.ttlMs),
      acceptedAt: null,
      createdAt: now,
    };
    const club = await this.uow.of(manager).club.findById(principal.clubId);
    const authRepo = this.uow.of(manager).auth;
    await authRepo.insertInvitation(invitation);
    try {
      await this.mailer.send(
        invitationMail({
          to: input.email,
          link: `${this.publicUrl()}/invite/${token}`,
          clubName: club?.name ?? 'your club',
          inviterName: principal.user.name,
          role: input.role,
          athleteName,
          expiresAt: invitation.expiresAt,
        }),
      );
    } catch (error) {
      // No mail, no invitation: a link nobody received must not stay valid.
      await authRepo.deleteInvitation(invitation.id);
      throw new HttpError(
        502,
        'mail_failed',
        'The invitation e-mail could not be sent; try again later',
        undefined,
        { cause: error },
      );
    }
    await this.audit.record(manager, {
      clubId: principal.clubId,
      actorUserId: principal.user.id,
      action: 'invitation.create',
      targetType: 'invitation',
      targetId: invitation.id,
      details: { email: input.email, role: input.role, athleteId: invitation.athleteId },
    });
    return {
      invitation: {
        id: invitation.id,
        email: invitation.email,
        role: invitation.role,
        athleteId: invitation.athleteId,
        ageGroupIds: invitation.ageGroupIds,
        expiresAt: invitation.expiresAt.toISOString(),
        createdAt: invitation.createdAt.toISOString(),
      },
    };
  }

  private async findOpen(token: string): Promise<Invitation> {
    const invitation = await this.uow.repos.auth.findInvitation(hashSecretToken(token));
    if (!invitation) throw notFound('Invitation');
    if (invitation.acceptedAt)
      throw conflict('invitation_used', 'This invitation was already used; sign in instead');
    if (invitation.expiresAt.getTime() <= this.clock.now().getTime()) {
      throw new HttpError(
        410,
        'invitation_expired',
        'This invitation has expired; ask your coach for a new one',
      );
    }
    return invitation;
  }

  async preview(token: string): Promise<InvitationPreviewResponse> {
    const invitation = await this.findOpen(token);
    const manager = this.uow.repos.manager;
    const club = await this.uow.of(manager).club.findById(invitation.clubId);
    const athlete = invitation.athleteId
      ? await this.uow.of(manager).athletes.findById(invitation.athleteId)
      : null;
    return {
      invitation: {
        email: invitation.email,
        role: invitation.role,
        club: { id: invitation.clubId, name: club?.name ?? '' },
        athleteName: athlete ? `${athlete.firstName} ${athlete.lastName}` : null,
        expiresAt: invitation.expiresAt.toISOString(),
      },
    };
  }

  /** Creates the member with their links (athlete record, child, coached groups) and signs them in. */
  async accept(input: AcceptInvitationInput): Promise<SignedIn> {
    const invitation = await this.findOpen(input.token);
    checkNewPassword(input.password, 'password', [invitation.email, input.name]);
    const passwordHash = await this.auth.hashPassword(input.password);
    return this.uow.transaction(async (manager) => {
      const users = this.uow.of(manager).users;
      if (await users.findByEmail(invitation.email)) {
        throw conflict('already_member', `${invitation.email} already has a Stanceline sign-in`);
      }
      const now = this.clock.now();
      const user: User = {
        id: randomUUID(),
        clubId: invitation.clubId,
        email: invitation.email,
        name: input.name,
        role: invitation.role,
        passwordHash,
        tokenVersion: 0,
        lastSignInAt: now,
        createdAt: now,
      };
      await users.insert(user);
      if (invitation.role === 'athlete' && invitation.athleteId) {
        const athletes = this.uow.of(manager).athletes;
        const athlete = await athletes.findById(invitation.athleteId);
        if (!athlete) throw notFound('Athlete');
        if (athlete.userId) throw conflict('athlete_has_account', 'This athlete already has a sign-in');
        await athletes.update(athlete.id, { userId: user.id });
      }
      if (invitation.role === 'guardian' && invitation.athleteId) {
        await users.addGuardianLink(randomUUID(), user.id, invitation.athleteId, now);
      }
      for (const ageGroupId of invitation.ageGroupIds) {
        await users.addCoachAssignment(randomUUID(), user.id, ageGroupId);
      }
      await this.uow.of(manager).auth.markInvitationAccepted(invitation.id, now);
      await this.audit.record(manager, {
        clubId: invitation.clubId,
        actorUserId: user.id,
        action: 'invitation.accept',
        targetType: 'invitation',
        targetId: invitation.id,
      });
      return this.auth.issue(manager, user);
    });
  }
}
