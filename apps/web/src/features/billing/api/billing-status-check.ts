import { billingStates, type BillingStatus } from '@tappet/contracts';
import { flag, handChecked, integerOrNull, oneOf, record, textOrNull } from '../../../lib/hand-check';

// The billing notice's status answer, checked by hand rather than with billingStatusSchema: the
// notice is on every shop screen, and loading zod for it put another round of requests before the
// first screen's paint (docs/decisions/026-first-screen-requests.md). billing-status-check.test.ts
// holds it to the contract's schema, case by case.
export const billingStatusCheck = handChecked((data): BillingStatus => {
  const s = record(data);
  return {
    state: oneOf(billingStates, s['state']),
    readOnly: flag(s['readOnly']),
    readOnlyReason: textOrNull(s['readOnlyReason']),
    trialEndsAt: textOrNull(s['trialEndsAt']),
    trialDaysLeft: integerOrNull(s['trialDaysLeft']),
    pastDueSince: textOrNull(s['pastDueSince']),
    suspendsAt: textOrNull(s['suspendsAt']),
    canOpenPortal: flag(s['canOpenPortal']),
    suspendedByHand: flag(s['suspendedByHand']),
  };
});
