import { meWithActiveShopSchema } from '@tappet/contracts';
import { describe, expect, it } from 'vitest';
import { meSchema } from './me-schema';

const shopId = '3f2b8c1e-5d4a-4c6b-9e7f-1a2b3c4d5e6f';
const good = {
  user: { id: '9a8b7c6d-5e4f-4a3b-8c2d-1e0f9a8b7c6d', email: 'fitter@example.test', name: 'Ida Fenwright', isPlatformAdmin: false },
  memberships: [
    { shopId, shopName: 'Quillon Motor Works', role: 'mechanic', spendingLimitMinor: null },
    { shopId: 'ffffffff-ffff-ffff-ffff-ffffffffffff', shopName: 'Other', role: 'owner', spendingLimitMinor: 25000, readOnly: true, supportUntil: '2026-01-01T00:00:00.000Z' },
    { shopId: '00000000-0000-0000-0000-000000000000', shopName: 'Support', role: 'owner', spendingLimitMinor: 0, supportUntil: null },
  ],
  activeShopId: shopId,
};

/** Each case: a change to a good answer; the hand check must agree with the contract's schema. */
const cases: Array<[string, (me: typeof good) => unknown]> = [
  ['the good answer', (me) => me],
  ['no active shop', (me) => ({ ...me, activeShopId: null })],
  ['extra keys (dropped)', (me) => ({ ...me, extra: 1, user: { ...me.user, extra: 2 }, memberships: [{ ...me.memberships[0], extra: 3 }] })],
  ['no memberships', (me) => ({ ...me, memberships: [] })],
  ['not an object', () => 'me'],
  ['null', () => null],
  ['an array', () => [good]],
  ['user missing', (me) => ({ ...me, user: undefined })],
  ['user id not a uuid', (me) => ({ ...me, user: { ...me.user, id: 'u-1' } })],
  ['user id of version 9', (me) => ({ ...me, user: { ...me.user, id: '9a8b7c6d-5e4f-9a3b-8c2d-1e0f9a8b7c6d' } })],
  ['name a number', (me) => ({ ...me, user: { ...me.user, name: 7 } })],
  ['admin flag a string', (me) => ({ ...me, user: { ...me.user, isPlatformAdmin: 'no' } })],
  ['memberships an object', (me) => ({ ...me, memberships: {} })],
  ['unknown role', (me) => ({ ...me, memberships: [{ ...me.memberships[0], role: 'boss' }] })],
  ['fractional limit', (me) => ({ ...me, memberships: [{ ...me.memberships[0], spendingLimitMinor: 1.5 }] })],
  ['limit missing', (me) => ({ ...me, memberships: [{ shopId, shopName: 'x', role: 'viewer' }] })],
  ['read-only a string', (me) => ({ ...me, memberships: [{ ...me.memberships[0], readOnly: 'yes' }] })],
  ['support end a number', (me) => ({ ...me, memberships: [{ ...me.memberships[0], supportUntil: 5 }] })],
  ['active shop missing', (me) => ({ user: me.user, memberships: me.memberships })],
  ['active shop not a uuid', (me) => ({ ...me, activeShopId: 'shop' })],
];

describe('the hand-written /api/me check', () => {
  it.each(cases)('agrees with the contract schema: %s', (_name, change) => {
    const data = change(structuredClone(good));
    const contract = meWithActiveShopSchema.safeParse(data);
    const hand = meSchema.safeParse(data);
    expect(hand.success).toBe(contract.success);
    if (hand.success && contract.success) expect(hand.data).toEqual(contract.data);
  });
});
