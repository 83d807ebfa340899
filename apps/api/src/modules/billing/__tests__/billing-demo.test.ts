// The demo's plans and the fake Stripe API's starting catalogue must agree, or the demo's billing
// portal would offer prices no plan knows.
/* eslint-disable @nx/enforce-module-boundaries -- checks the demo seed against the repo's fake Stripe catalogue. */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { catalogueSchema } from '../../../../../../tools/fake-stripe/server.ts';
import { demoPlans } from '../../../../../../seeds/billing-demo';

describe('demo billing catalogue', () => {
  it('has one monthly price per demo plan, same lookup key, currency and amount, in one plan family', () => {
    const catalogue = catalogueSchema.parse(JSON.parse(readFileSync(new URL('../../../../../../tools/fake-stripe/demo-catalogue.json', import.meta.url), 'utf8')));
    const prices = catalogue.flatMap((c) => c.prices.map((p) => ({ key: p.lookup_key, currency: p.currency, amount: p.unit_amount, interval: p.recurring?.interval, family: c.product.metadata?.['family'] })));
    expect(prices).toEqual(demoPlans.map((p) => ({ key: p.stripeLookupKey, currency: p.currency, amount: p.monthlyPriceMinor, interval: 'month', family: 'tappet-plans' })));
  });
});
