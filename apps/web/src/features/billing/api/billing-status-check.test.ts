import { billingStatusSchema } from '@tappet/contracts';
import { describe, expect, it } from 'vitest';
import { billingStatusCheck } from './billing-status-check';

const good = {
  state: 'past_due',
  readOnly: false,
  readOnlyReason: null,
  trialEndsAt: null,
  trialDaysLeft: null,
  pastDueSince: '2026-11-20T09:00:00.000Z',
  suspendsAt: '2026-12-04T09:00:00.000Z',
  canOpenPortal: true,
  suspendedByHand: false,
};

/** Each case: a change to a good answer; the hand check must agree with the contract's schema. */
const cases: Array<[string, (s: typeof good) => unknown]> = [
  ['the good answer', (s) => s],
  ['a trial with days left', (s) => ({ ...s, state: 'trial', trialEndsAt: '2026-12-10T00:00:00.000Z', trialDaysLeft: 8, pastDueSince: null, suspendsAt: null })],
  ['read-only with its reason', (s) => ({ ...s, state: 'suspended', readOnly: true, readOnlyReason: 'Payment is overdue.', suspendedByHand: true })],
  ['extra keys (dropped)', (s) => ({ ...s, extra: 1 })],
  ['not an object', () => 'active'],
  ['null', () => null],
  ['an array', () => [good]],
  ['unknown state', (s) => ({ ...s, state: 'paused' })],
  ['state missing', (s) => ({ ...s, state: undefined })],
  ['read-only a string', (s) => ({ ...s, readOnly: 'no' })],
  ['reason a number', (s) => ({ ...s, readOnlyReason: 3 })],
  ['reason missing', ({ readOnlyReason: _, ...s }) => s],
  ['days left fractional', (s) => ({ ...s, trialDaysLeft: 2.5 })],
  ['days left a string', (s) => ({ ...s, trialDaysLeft: '2' })],
  ['days left negative', (s) => ({ ...s, trialDaysLeft: -1 })],
  ['past due since a number', (s) => ({ ...s, pastDueSince: 0 })],
  ['suspends at missing', ({ suspendsAt: _, ...s }) => s],
  ['portal flag null', (s) => ({ ...s, canOpenPortal: null })],
  ['suspended by hand missing', ({ suspendedByHand: _, ...s }) => s],
];

describe('the hand-written billing status check', () => {
  it.each(cases)('agrees with the contract schema: %s', (_name, change) => {
    const data = change(structuredClone(good));
    const contract = billingStatusSchema.safeParse(data);
    const hand = billingStatusCheck.safeParse(data);
    expect(hand.success).toBe(contract.success);
    if (hand.success && contract.success) expect(hand.data).toEqual(contract.data);
  });
});
