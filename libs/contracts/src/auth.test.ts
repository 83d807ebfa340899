import { describe, expect, it } from 'vitest';
import { passwordResetConfirmSchema, signInRequestSchema } from './auth';
import { errorBodySchema } from './common';

describe('sign-in request', () => {
  it('trims and lower-cases the e-mail address', () => {
    const parsed = signInRequestSchema.parse({ email: '  Owner@Harbour-Works.TEST ', password: 'x' });
    expect(parsed.email).toBe('owner@harbour-works.test');
  });
  it('refuses unknown fields (mass assignment, OWASP API3)', () => {
    const r = signInRequestSchema.safeParse({ email: 'a@b.test', password: 'x', isPlatformAdmin: true });
    expect(r.success).toBe(false);
  });
  it('names the field when the e-mail is not an address', () => {
    const r = signInRequestSchema.safeParse({ email: 'not-an-address', password: 'x' });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0]?.path).toEqual(['email']);
  });
});

describe('new password (OWASP ASVS 6.2.1 / 6.2.9)', () => {
  const token = 'a'.repeat(43);
  it('needs at least 8 characters', () => {
    expect(passwordResetConfirmSchema.safeParse({ token, password: 'short7!' }).success).toBe(false);
    expect(passwordResetConfirmSchema.safeParse({ token, password: 'eight888' }).success).toBe(true);
  });
  it('allows at least 64 characters', () => {
    expect(passwordResetConfirmSchema.safeParse({ token, password: 'p'.repeat(64) }).success).toBe(true);
  });
});

describe('error body', () => {
  it('has code and message, details optional', () => {
    expect(errorBodySchema.safeParse({ error: { code: 'not_found', message: 'No such shop.' } }).success).toBe(true);
    expect(errorBodySchema.safeParse({ error: { message: 'x' } }).success).toBe(false);
  });
});
