import type { EntityManager } from 'typeorm';
import { IsNull, MoreThan } from 'typeorm';
import { InvitationEntity, type Invitation } from '../entities/invitation.entity';
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
