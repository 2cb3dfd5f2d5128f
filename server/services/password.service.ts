import { randomUUID } from 'node:crypto';
import bcrypt from 'bcryptjs';
import type {
  ChangePasswordInput,
  PasswordResetCompleteInput,
  PasswordResetInfo,
} from '@shared/schemas/auth.schema';
import type { EntityManager } from 'typeorm';
import type { User } from '../entities/user.entity';
import { badRequest, HttpError, notFound } from '../errors';
import type { Mailer } from '../mail/mailer';
import { passwordResetMail } from '../mail/templates';
import type { UnitOfWork } from '../repositories/unit-of-work';
import type { AuditService } from './audit.service';
import type { AuthService, SignedIn } from './auth.service';
import { checkNewPassword } from './password-policy';
import type { Clock, Principal } from './principal';
import { hashSecretToken, newSecretToken } from './secret-token';

const RESET_TTL_MS = 60 * 60_000;
/** A first password chosen from a shared review's e-mail: a week, as invitations. */
const SETUP_TTL_MS = 7 * 24 * 60 * 60_000;

/**
 * Changing a password, and resetting a forgotten one by an e-mailed link. Either way every other
 * session of the member ends (a password change is often the answer to a lost phone), and the
 * member is signed in afresh.
 */
export class PasswordService {
  constructor(
    private readonly uow: UnitOfWork,
    private readonly auth: AuthService,
    private readonly audit: AuditService,
    private readonly mailer: Mailer,
    private readonly clock: Clock,
    private readonly publicUrl: () => string,
  ) {}

  async change(principal: Principal, input: ChangePasswordInput): Promise<SignedIn> {
    const user = principal.user;
    if (!user.passwordHash || !(await bcrypt.compare(input.currentPassword, user.passwordHash))) {
      throw badRequest('validation_failed', 'currentPassword: that is not your current password', {
        issues: [
          { path: ['currentPassword'], code: 'wrong_password', message: 'That is not your current password' },
        ],
      });
    }
    checkNewPassword(input.newPassword, 'newPassword', [user.email, user.name]);
    const passwordHash = await this.auth.hashPassword(input.newPassword);
    return this.uow.transaction(async (manager) => {
      const signedIn = await this.replacePassword(
        manager,
        user,
        passwordHash,
        principal.sessionId ?? undefined,
      );
      await this.audit.record(manager, {
        clubId: user.clubId,
        actorUserId: user.id,
        action: 'auth.password_changed',
        targetType: 'user',
        targetId: user.id,
      });
      return signedIn;
    });
  }

  /** Sends a reset link when the address belongs to a member; says nothing either way (no enumeration). */
  async requestReset(email: string): Promise<void> {
    const user = await this.uow.repos.users.findByEmail(email);
    if (!user || !user.passwordHash) return;
    const token = newSecretToken();
    const now = this.clock.now();
    await this.uow.repos.auth.insertPasswordReset({
      id: randomUUID(),
      userId: user.id,
      tokenHash: hashSecretToken(token),
      expiresAt: new Date(now.getTime() + RESET_TTL_MS),
      usedAt: null,
      createdAt: now,
    });
    await this.mailer.send(
      passwordResetMail({
        to: user.email,
        link: `${this.publicUrl()}/reset-password/${token}`,
        expiresInMinutes: RESET_TTL_MS / 60_000,
      }),
    );
  }

  /**
   * A link for a member who has no password yet (a guardian added by a coach): choosing one signs them
   * in and opens `next`. Valid for a week, once.
   */
  async setupLink(userId: string, next: string): Promise<string> {
    const token = newSecretToken();
    const now = this.clock.now();
    await this.uow.repos.auth.insertPasswordReset({
      id: randomUUID(),
      userId,
      tokenHash: hashSecretToken(token),
      expiresAt: new Date(now.getTime() + SETUP_TTL_MS),
      usedAt: null,
      createdAt: now,
    });
    return `${this.publicUrl()}/reset-password/${token}?next=${encodeURIComponent(next)}`;
  }

  async inspectReset(token: string): Promise<PasswordResetInfo> {
    const { user } = await this.openReset(token);
    return { email: user.email };
  }

  async completeReset(token: string, input: PasswordResetCompleteInput): Promise<SignedIn> {
    const { reset, user } = await this.openReset(token);
    checkNewPassword(input.password, 'password', [user.email, user.name]);
    const passwordHash = await this.auth.hashPassword(input.password);
    const outcome = await this.uow.transaction(async (manager): Promise<SignedIn | HttpError> => {
      if (!(await this.uow.of(manager).auth.usePasswordReset(reset.id, this.clock.now()))) {
        return new HttpError(410, 'reset_used', 'This reset link was used already; ask for a new one');
      }
      const signedIn = await this.replacePassword(manager, user, passwordHash);
      await this.audit.record(manager, {
        clubId: user.clubId,
        actorUserId: user.id,
        action: 'auth.password_reset',
        targetType: 'user',
        targetId: user.id,
      });
      return signedIn;
    });
    if (outcome instanceof HttpError) throw outcome;
    return outcome;
  }

  private async openReset(token: string) {
    const reset = await this.uow.repos.auth.findPasswordReset(hashSecretToken(token));
    if (!reset) throw notFound('Reset link');
    if (reset.usedAt)
      throw new HttpError(410, 'reset_used', 'This reset link was used already; ask for a new one');
    if (reset.expiresAt.getTime() <= this.clock.now().getTime()) {
      throw new HttpError(410, 'reset_expired', 'This reset link has expired; ask for a new one');
    }
    const user = await this.uow.repos.users.findById(reset.userId);
    if (!user) throw notFound('Reset link');
    return { reset, user };
  }

  /** New hash; every session and token of the member ends; a fresh session (or the current one) starts. */
  private async replacePassword(
    manager: EntityManager,
    user: User,
    passwordHash: string,
    keepSession?: string,
  ): Promise<SignedIn> {
    const repos = this.uow.of(manager);
    await repos.users.update(user.id, { passwordHash });
    await repos.auth.revokeAllRefreshTokens(user.id, this.clock.now());
    await repos.users.bumpTokenVersion(user.id);
    const fresh = await repos.users.findById(user.id);
    return this.auth.issue(manager, fresh ?? user, keepSession);
  }
}
