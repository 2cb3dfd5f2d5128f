import { randomUUID } from 'node:crypto';
import bcrypt from 'bcryptjs';
import type { EntityManager } from 'typeorm';
import type { LoginInput, LoginResponse, MeResponse } from '@shared/schemas/auth.schema';
import type { User } from '../entities/user.entity';
import { HttpError, notFound, unauthorized } from '../errors';
import { toUserDto } from '../mappers/user.mapper';
import type { AuditService } from './audit.service';
import type { Clock, Principal } from './principal';
import { hashSecretToken, newSecretToken } from './secret-token';
import type { TokenService } from './token.service';
import type { Repositories, UnitOfWork } from '../repositories/unit-of-work';
import type { UserLinks } from '../repositories/user.repository';
import { guardianStillReaches } from './consent.rules';

const REUSE_GRACE_MS = 30_000;

export interface SignedIn extends LoginResponse {
  /** Goes into the httpOnly cookie, never into a response body. */
  refreshToken: string;
  refreshExpiresAt: Date;
}

export class AuthService {
  /** Compared against when the e-mail is unknown, so both failures take the same time. */
  private readonly dummyHash: string;

  constructor(
    private readonly uow: UnitOfWork,
    private readonly tokens: TokenService,
    private readonly audit: AuditService,
    private readonly clock: Clock,
    private readonly refreshTtlMs: number,
    private readonly bcryptRounds: number,
  ) {
    this.dummyHash = bcrypt.hashSync('not-a-real-password', bcryptRounds);
  }

  hashPassword(password: string): Promise<string> {
    return bcrypt.hash(password, this.bcryptRounds);
  }

  /**
   * The principal of a token, or null when the token no longer counts: its user is gone, its token
   * version was bumped (sign-out everywhere, a leaked refresh token), or its session has ended.
   */
  async loadPrincipal(userId: string, tokenVersion: number, sessionId: unknown): Promise<Principal | null> {
    const { users, auth } = this.uow.repos;
    const user = await users.findById(userId);
    if (!user) return null;
    if (tokenVersion !== user.tokenVersion) return null;
    if (typeof sessionId !== 'string' || !(await auth.isSessionLive(sessionId, userId, this.clock.now()))) {
      return null;
    }
    return {
      user,
      role: user.role,
      clubId: user.clubId,
      ...(await this.linksOf(this.uow.repos, user)),
      sessionId,
    };
  }

  async login(input: LoginInput): Promise<SignedIn> {
    const user = await this.uow.repos.users.findByEmail(input.email);
    const ok = await bcrypt.compare(input.password, user?.passwordHash ?? this.dummyHash);
    if (!user || !user.passwordHash || !ok) {
      if (user) {
        await this.audit.record(this.uow.repos.manager, {
          clubId: user.clubId,
          actorUserId: user.id,
          action: 'auth.sign_in_failed',
          targetType: 'user',
          targetId: user.id,
        });
      }
      throw unauthorized('invalid_credentials', 'Wrong e-mail address or password');
    }
    return this.uow.transaction(async (manager) => {
      await this.uow.of(manager).users.update(user.id, { lastSignInAt: this.clock.now() });
      await this.audit.record(manager, {
        clubId: user.clubId,
        actorUserId: user.id,
        action: 'auth.sign_in',
        targetType: 'user',
        targetId: user.id,
      });
      return this.issue(manager, user);
    });
  }

  /** New access token plus a new refresh row, inside the caller's transaction; a new session unless given. */
  async issue(manager: EntityManager, user: User, sessionId: string = randomUUID()): Promise<SignedIn> {
    const principal = await this.principalFor(manager, user, sessionId);
    const refreshToken = newSecretToken();
    const now = this.clock.now();
    const refreshExpiresAt = new Date(now.getTime() + this.refreshTtlMs);
    await this.uow.of(manager).auth.insertRefreshToken({
      id: randomUUID(),
      userId: user.id,
      sessionId,
      tokenHash: hashSecretToken(refreshToken),
      expiresAt: refreshExpiresAt,
      revokedAt: null,
      createdAt: now,
    });
    return {
      accessToken: this.tokens.signAccess({ sub: user.id, ver: user.tokenVersion, sid: sessionId }),
      user: toUserDto(principal),
      refreshToken,
      refreshExpiresAt,
    };
  }

  private async principalFor(manager: EntityManager, user: User, sessionId: string): Promise<Principal> {
    const links = await this.linksOf(this.uow.of(manager), user);
    return { user, role: user.role, clubId: user.clubId, ...links, sessionId };
  }

  /** A guardian reaches a child until the child turns 18, then only if the athlete keeps them. */
  private async linksOf(repos: Repositories, user: User): Promise<UserLinks> {
    const { guardianLinks, ...links } = await repos.users.links(user);
    const now = this.clock.now();
    const childAthleteIds = guardianLinks
      .filter((l) => guardianStillReaches(l.birthYear, l.keptByAthleteAt, now))
      .map((l) => l.athleteId);
    return { ...links, childAthleteIds };
  }

  /** Rotates the refresh token: the presented one is revoked, a new one is issued. */
  async refresh(refreshToken: string | undefined): Promise<SignedIn> {
    if (!refreshToken) throw unauthorized('no_refresh_token', 'Sign in again: no session cookie was sent');
    // Revocations must commit even when the answer is a refusal, so refusals are thrown after the transaction.
    const outcome = await this.uow.transaction(async (manager): Promise<SignedIn | HttpError> => {
      const repo = this.uow.of(manager).auth;
      const row = await repo.findRefreshToken(hashSecretToken(refreshToken));
      const now = this.clock.now();
      if (!row) return unauthorized('invalid_refresh_token', 'Sign in again: the session is not known');
      if (row.revokedAt) {
        // Two tabs refreshing at once present the same token within moments; that is not a replay.
        // Later reuse means the token leaked: end every session of the user, and with the token
        // version every access token and media link already issued.
        if (now.getTime() - row.revokedAt.getTime() > REUSE_GRACE_MS) {
          await repo.revokeAllRefreshTokens(row.userId, now);
          await this.uow.of(manager).users.bumpTokenVersion(row.userId);
        }
        return unauthorized('invalid_refresh_token', 'Sign in again: the session has ended');
      }
      if (row.expiresAt.getTime() <= now.getTime()) {
        await repo.revokeRefreshToken(row.id, now);
        return unauthorized('refresh_expired', 'Sign in again: the session expired');
      }
      const user = await this.uow.of(manager).users.findById(row.userId);
      if (!user) return unauthorized('invalid_refresh_token', 'Sign in again: the account no longer exists');
      await repo.revokeRefreshToken(row.id, now);
      return this.issue(manager, user, row.sessionId);
    });
    if (outcome instanceof HttpError) throw outcome;
    return outcome;
  }

  /** Revokes the presented refresh token; with `everywhere`, every session and access token of its user. */
  async logout(refreshToken: string | undefined, everywhere = false): Promise<void> {
    if (!refreshToken) return;
    await this.uow.transaction(async (manager) => {
      const repo = this.uow.of(manager).auth;
      const row = await repo.findRefreshToken(hashSecretToken(refreshToken));
      if (!row) return;
      const now = this.clock.now();
      // Ending the session ends its access tokens and media links too (they name the session).
      await repo.revokeSession(row.sessionId, now);
      if (!everywhere) return;
      await repo.revokeAllRefreshTokens(row.userId, now);
      // Access tokens carry the version they were issued under; bumping it voids them at once.
      await this.uow.of(manager).users.bumpTokenVersion(row.userId);
      const user = await this.uow.of(manager).users.findById(row.userId);
      await this.audit.record(manager, {
        clubId: user?.clubId ?? null,
        actorUserId: row.userId,
        action: 'auth.sign_out_everywhere',
        targetType: 'user',
        targetId: row.userId,
      });
    });
  }

  async me(principal: Principal): Promise<MeResponse> {
    const club = await this.uow.repos.club.findById(principal.clubId);
    if (!club) throw notFound('Club');
    return { user: toUserDto(principal), club: { id: club.id, name: club.name } };
  }
}
