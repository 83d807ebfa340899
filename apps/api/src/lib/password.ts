import { hash, verify } from '@node-rs/argon2';
import { commonPasswords } from './common-passwords';

// OWASP's argon2id parameters (m=19 MiB, t=2, p=1): about 60 ms here (platform-notes.md).
// `algorithm: 2` is Algorithm.Argon2id (a const enum, which isolatedModules cannot read).
const options = { algorithm: 2, memoryCost: 19_456, timeCost: 2, parallelism: 1 } as const;

/** Hashes a password with argon2id; returns a PHC string. */
export function hashPassword(password: string): Promise<string> {
  return hash(password, options);
}

let dummyHash: Promise<string> | undefined;

/** Computes the dummy hash used for unknown e-mail addresses (once per process). */
export function warmUpDummyHash(): Promise<string> {
  dummyHash ??= hashPassword('not-a-real-password-but-the-same-work');
  return dummyHash;
}

/**
 * Checks a password against a PHC string. With `null` (unknown e-mail) it verifies against a
 * dummy hash anyway, so an unknown address takes about as long as a wrong password.
 */
export async function verifyPassword(phc: string | null, password: string): Promise<boolean> {
  if (phc === null) {
    await verify(await warmUpDummyHash(), password).catch(() => false);
    return false;
  }
  try {
    return await verify(phc, password);
  } catch {
    return false; // a malformed stored hash is a failed check, never a crash
  }
}

/** A reason to refuse a chosen password (beyond the length rules of the contract), or null. */
export function passwordProblem(password: string): string | null {
  if (commonPasswords.has(password.toLowerCase())) {
    return 'This password is one of the most common ones. Choose a longer, less guessable one.';
  }
  if (new Set(password).size === 1) return 'Use more than one repeated character.';
  return null;
}
