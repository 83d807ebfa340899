import { describe, expect, it } from 'vitest';
import { createApiKeyRequestSchema } from './api-keys';
import { auditEventQuerySchema } from './audit';
import { defaultShopSettings, shopSettingsSchema, updateShopSettingsRequestSchema } from './settings';
import { acceptInvitationRequestSchema, createInvitationRequestSchema } from './staff';

describe('settings contract', () => {
  it('accepts the defaults with a name', () => {
    expect(shopSettingsSchema.parse({ name: 'Harbour Works', ...defaultShopSettings })).toEqual({ name: 'Harbour Works', ...defaultShopSettings });
  });
  it('upper-cases a known currency and refuses an unknown one', () => {
    expect(updateShopSettingsRequestSchema.parse({ currency: 'sek' })).toEqual({ currency: 'SEK' });
    expect(updateShopSettingsRequestSchema.safeParse({ currency: 'ZZZ' }).success).toBe(false);
  });
  it('allows up to 3 decimals of tax and service level, not more', () => {
    expect(updateShopSettingsRequestSchema.safeParse({ taxRatePercent: 8.875, serviceLevel: 0.999 }).success).toBe(true);
    expect(updateShopSettingsRequestSchema.safeParse({ taxRatePercent: 8.8751 }).success).toBe(false);
    expect(updateShopSettingsRequestSchema.safeParse({ serviceLevel: 0.9995 }).success).toBe(false);
    expect(updateShopSettingsRequestSchema.safeParse({ taxRatePercent: 1e-7 }).success).toBe(false);
  });
  it('refuses an empty change and unknown fields', () => {
    expect(updateShopSettingsRequestSchema.safeParse({}).success).toBe(false);
    expect(updateShopSettingsRequestSchema.safeParse({ shopId: 'x' }).success).toBe(false);
  });
});

describe('staff and key contracts', () => {
  it('lower-cases invitation addresses and refuses a platform role', () => {
    expect(createInvitationRequestSchema.parse({ email: ' Kit@Harbour-Works.TEST', role: 'buyer' }).email).toBe('kit@harbour-works.test');
    expect(createInvitationRequestSchema.safeParse({ email: 'kit@harbour-works.test', role: 'platform_admin' }).success).toBe(false);
  });
  it('refuses a malformed invitation token', () => {
    expect(acceptInvitationRequestSchema.safeParse({ token: 'short' }).success).toBe(false);
    expect(acceptInvitationRequestSchema.safeParse({ token: `${'a'.repeat(42)}/` }).success).toBe(false);
  });
  it('gives keys at most the buyer role', () => {
    expect(createApiKeyRequestSchema.safeParse({ label: 'Feed', role: 'buyer' }).success).toBe(true);
    expect(createApiKeyRequestSchema.safeParse({ label: 'Feed', role: 'owner' }).success).toBe(false);
  });
  it('caps audit pages at 100 and coerces query strings', () => {
    expect(auditEventQuerySchema.parse({ page: '2', pageSize: '100' })).toMatchObject({ page: 2, pageSize: 100 });
    expect(auditEventQuerySchema.safeParse({ pageSize: '101' }).success).toBe(false);
  });
});
