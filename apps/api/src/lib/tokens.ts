import { createHash, randomBytes } from 'node:crypto';

/** A new opaque token: 32 random bytes (256 bits), base64url. Only its hash is stored. */
export function newToken(): string {
  return randomBytes(32).toString('base64url');
}

/** SHA-256 (hex) of a token: the id under which the server stores it. */
export function hashToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}
