import { createHash, randomBytes } from 'node:crypto';

/** A random secret for links and cookies; only its hash is ever stored. */
export function newSecretToken(): string {
  return randomBytes(32).toString('base64url');
}

export function hashSecretToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}
