import type { EntityManager } from 'typeorm';
import { IsNull, MoreThan } from 'typeorm';
import { InvitationEntity, type Invitation } from '../entities/invitation.entity';
import { PasswordResetEntity, type PasswordReset } from '../entities/password-reset.entity';
import { RefreshTokenEntity, type RefreshToken } from '../entities/refresh-token.entity';

/** Refresh tokens and invitations: both are looked up by the hash of a secret the user holds. */
export class AuthRepository {
  constructor(private readonly manager: EntityManager) {}

  findRefreshToken(tokenHash: string): Promise<RefreshToken | null> {
    return this.manager.findOneBy(RefreshTokenEntity, { tokenHash });
  }

  async insertRefreshToken(token: RefreshToken): Promise<void> {
    await this.manager.insert(RefreshTokenEntity, token);
  }

  async revokeRefreshToken(id: string, at: Date): Promise<void> {
    await this.manager.update(RefreshTokenEntity, { id, revokedAt: IsNull() }, { revokedAt: at });
  }

  async revokeSession(sessionId: string, at: Date): Promise<void> {
    await this.manager.update(RefreshTokenEntity, { sessionId, revokedAt: IsNull() }, { revokedAt: at });
  }

  /** A session is live while one of its refresh tokens is neither revoked nor expired. */
  async isSessionLive(sessionId: string, userId: string, now: Date): Promise<boolean> {
    return this.manager.exists(RefreshTokenEntity, {
      where: { sessionId, userId, revokedAt: IsNull(), expiresAt: MoreThan(now) },
    });
  }

  async revokeAllRefreshTokens(userId: string, at: Date): Promise<void> {
    await this.manager.update(RefreshTokenEntity, { userId, revokedAt: IsNull() }, { revokedAt: at });
  }

  findPasswordReset(tokenHash: string): Promise<PasswordReset | null> {
    return this.manager.findOneBy(PasswordResetEntity, { tokenHash });
  }

  async insertPasswordReset(reset: PasswordReset): Promise<void> {
    await this.manager.insert(PasswordResetEntity, reset);
  }

  /** Marks the link used; false when it was used already (two tabs at once). */
  async usePasswordReset(id: string, at: Date): Promise<boolean> {
    const result = await this.manager.update(PasswordResetEntity, { id, usedAt: IsNull() }, { usedAt: at });
    return (result.affected ?? 0) > 0;
  }

  findInvitation(tokenHash: string): Promise<Invitation | null> {
    return this.manager.findOneBy(InvitationEntity, { tokenHash });
  }

  async insertInvitation(invitation: Invitation): Promise<void> {
    await this.manager.insert(InvitationEntity, invitation);
  }

  async deleteInvitation(id: string): Promise<void> {
    await this.manager.delete(InvitationEntity, { id });
  }

  async markInvitationAccepted(id: string, at: Date): Promise<void> {
    await this.manager.update(InvitationEntity, { id }, { acceptedAt: at });
  }
}
