import { createSecretKey, type KeyObject } from 'node:crypto';
import jwt from 'jsonwebtoken';
import type { ClipLinks } from '../mappers/clip.mapper';
import type { Clock, Principal } from './principal';

export const ACCESS_AUDIENCE = 'stanceline-api';
export const MEDIA_AUDIENCE = 'stanceline-media';
export const TOKEN_ISSUER = 'stanceline';

export interface AccessClaims {
  sub: string;
  /** The user's token version when issued; a bump (logout everywhere, a leaked refresh token) voids it. */
  ver: number;
  /** The sign-in session; the token stops working when that session ends (logout). */
  sid: string;
}

export interface MediaClaims {
  sub: string;
  ver: number;
  sid: string;
  clip: string;
}

/** What a signed download link of an athlete's data is bound to (a media token's scope). */
export function athleteExportScope(athleteId: string): string {
  return `athlete-export:${athleteId}`;
}

/** Signs access and media JWTs (HS256). Verification of access tokens is passport-jwt's job. */
export class TokenService {
  /**
   * The HMAC key as a KeyObject, made once: given a plain string, jsonwebtoken first tries to read it
   * as a public or private key on every call, which cost more than the signing itself.
   */
  readonly key: KeyObject;

  constructor(
    secret: string,
    private readonly accessTtlMs: number,
    private readonly mediaTtlMs: number,
    private readonly clock: Clock,
  ) {
    this.key = createSecretKey(Buffer.from(secret, 'utf8'));
  }

  private sign(payload: object, audience: string, ttlMs: number): string {
    const iat = Math.floor(this.clock.now().getTime() / 1000);
    return jwt.sign({ ...payload, iat, exp: iat + Math.max(1, Math.round(ttlMs / 1000)) }, this.key, {
      algorithm: 'HS256',
      audience,
      issuer: TOKEN_ISSUER,
    });
  }

  signAccess(claims: AccessClaims): string {
    return this.sign(claims, ACCESS_AUDIENCE, this.accessTtlMs);
  }

  signMedia(claims: MediaClaims): string {
    return this.sign(claims, MEDIA_AUDIENCE, this.mediaTtlMs);
  }

  /** Video, poster and thumbnail-strip addresses of a clip that an <img> or <video> can load as this caller. */
  clipLinks(principal: Principal, clipId: string): ClipLinks {
    const token = this.signMedia({
      sub: principal.user.id,
      ver: principal.user.tokenVersion,
      sid: principal.sessionId ?? '',
      clip: clipId,
    });
    const query = `?token=${encodeURIComponent(token)}`;
    return {
      media: `/api/clips/${clipId}/media${query}`,
      poster: `/api/clips/${clipId}/poster${query}`,
      thumbnails: `/api/clips/${clipId}/thumbnails${query}`,
    };
  }

  /** A download link of all of an athlete's data, as this caller, for the browser to fetch by address. */
  athleteExportLink(principal: Principal, athleteId: string): string {
    const token = this.signMedia({
      sub: principal.user.id,
      ver: principal.user.tokenVersion,
      sid: principal.sessionId ?? '',
      clip: athleteExportScope(athleteId),
    });
    return `/api/athletes/${athleteId}/export.zip?token=${encodeURIComponent(token)}`;
  }

  /** Returns the claims, or throws jsonwebtoken's TokenExpiredError / JsonWebTokenError. */
  verifyMedia(token: string): MediaClaims {
    const payload = jwt.verify(token, this.key, {
      algorithms: ['HS256'],
      audience: MEDIA_AUDIENCE,
      issuer: TOKEN_ISSUER,
    });
    if (
      typeof payload === 'string' ||
      typeof payload.sub !== 'string' ||
      typeof payload.clip !== 'string' ||
      typeof payload.sid !== 'string'
    ) {
      throw new jwt.JsonWebTokenError('malformed media token');
    }
    return { sub: payload.sub, ver: Number(payload.ver), sid: payload.sid, clip: payload.clip };
  }
}
