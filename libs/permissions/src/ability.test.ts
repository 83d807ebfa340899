import { describe, expect, it } from 'vitest';
import { defineAbilityFor, subjectOf, type Actor, type ShopContext } from './ability';

const shopA = '11111111-1111-4111-8111-111111111111';
const shopB = '22222222-2222-4222-8222-222222222222';
const me: Actor = { userId: 'u-me', isPlatformAdmin: false };
const inShop = (role: ShopContext['role'], extra: Partial<ShopContext> = {}): ShopContext => ({
  shopId: shopA,
  role,
  spendingLimitMinor: null,
  ...extra,
});

describe('owner', () => {
  const ability = defineAbilityFor(me, inShop('owner'));
  it('manages staff, settings and billing in their own shop', () => {
    expect(ability.can('manage', subjectOf('Staff', { shopId: shopA }))).toBe(true);
    expect(ability.can('update', subjectOf('Settings', { shopId: shopA }))).toBe(true);
    expect(ability.can('manage', subjectOf('Billing', { shopId: shopA }))).toBe(true);
  });
  it('has no rights on another shop', () => {
    expect(ability.can('read', subjectOf('Part', { shopId: shopB }))).toBe(false);
    expect(ability.can('update', subjectOf('Staff', { shopId: shopB }))).toBe(false);
  });
  it('has no platform rights', () => {
    expect(ability.can('manage', 'Platform')).toBe(false);
  });
});

describe('mechanic', () => {
  const ability = defineAbilityFor(me, inShop('mechanic'));
  it('reads parts and stock, holds and issues stock', () => {
    expect(ability.can('read', subjectOf('Part', { shopId: shopA }))).toBe(true);
    expect(ability.can('hold', subjectOf('Stock', { shopId: shopA }))).toBe(true);
    expect(ability.can('issue', subjectOf('Stock', { shopId: shopA }))).toBe(true);
  });
  it('cannot receive or adjust stock, edit parts or manage staff', () => {
    expect(ability.can('receive', subjectOf('Stock', { shopId: shopA }))).toBe(false);
    expect(ability.can('adjust', subjectOf('Stock', { shopId: shopA }))).toBe(false);
    expect(ability.can('update', subjectOf('Part', { shopId: shopA }))).toBe(false);
    expect(ability.can('read', subjectOf('Staff', { shopId: shopA }))).toBe(false);
  });
  it('updates only jobs assigned to them', () => {
    expect(ability.can('update', subjectOf('Job', { shopId: shopA, assigneeIds: ['u-other', 'u-me'] }))).toBe(true);
    expect(ability.can('update', subjectOf('Job', { shopId: shopA, assigneeIds: ['u-other'] }))).toBe(false);
    expect(ability.can('update', subjectOf('Job', { shopId: shopA, assigneeIds: [] }))).toBe(false);
  });
  it('works on vehicles but cannot change their acquisition cost or asking price (field-level)', () => {
    const vehicle = subjectOf('Vehicle', { shopId: shopA });
    expect(ability.can('create', vehicle)).toBe(true);
    expect(ability.can('update', vehicle)).toBe(true);
    expect(ability.can('update', vehicle, 'model')).toBe(true);
    expect(ability.can('update', vehicle, 'acquisitionCostMinor')).toBe(false);
    expect(ability.can('update', vehicle, 'askingPriceMinor')).toBe(false);
    const owner = defineAbilityFor(me, inShop('owner'));
    expect(owner.can('update', vehicle, 'askingPriceMinor')).toBe(true);
    expect(owner.can('update', vehicle, 'acquisitionCostMinor')).toBe(true);
  });
  it('reads vehicles but not what one cost the shop or its margin (field-level, issue 10)', () => {
    const vehicle = subjectOf('Vehicle', { shopId: shopA });
    expect(ability.can('read', vehicle)).toBe(true);
    expect(ability.can('read', vehicle, 'model')).toBe(true);
    expect(ability.can('read', vehicle, 'margin')).toBe(false);
    expect(ability.can('read', vehicle, 'acquisitionCostMinor')).toBe(false);
    expect(defineAbilityFor(me, inShop('owner')).can('read', vehicle, 'margin')).toBe(true);
    expect(defineAbilityFor(me, inShop('viewer')).can('read', vehicle, 'margin')).toBe(true);
  });
});

describe('buyer', () => {
  it('sends purchase orders up to the spending limit only', () => {
    const ability = defineAbilityFor(me, inShop('buyer', { spendingLimitMinor: 50_000 }));
    expect(ability.can('send', subjectOf('PurchaseOrder', { shopId: shopA, totalMinor: 50_000 }))).toBe(true);
    expect(ability.can('send', subjectOf('PurchaseOrder', { shopId: shopA, totalMinor: 50_001 }))).toBe(false);
    expect(ability.can('create', subjectOf('PurchaseOrder', { shopId: shopA, totalMinor: 90_000 }))).toBe(true);
    expect(ability.can('approve', subjectOf('PurchaseOrder', { shopId: shopA, totalMinor: 10 }))).toBe(false);
  });
  it('without a limit set, sends nothing without approval', () => {
    const ability = defineAbilityFor(me, inShop('buyer'));
    expect(ability.can('send', subjectOf('PurchaseOrder', { shopId: shopA, totalMinor: 1 }))).toBe(false);
  });
  it('receives stock, keeps suppliers, but does not issue stock or manage staff', () => {
    const ability = defineAbilityFor(me, inShop('buyer'));
    expect(ability.can('receive', subjectOf('Stock', { shopId: shopA }))).toBe(true);
    expect(ability.can('create', subjectOf('Supplier', { shopId: shopA }))).toBe(true);
    expect(ability.can('issue', subjectOf('Stock', { shopId: shopA }))).toBe(false);
    expect(ability.can('manage', subjectOf('Staff', { shopId: shopA }))).toBe(false);
  });
});

describe('viewer', () => {
  const ability = defineAbilityFor(me, inShop('viewer'));
  it('reads the working data and the settings every screen needs (currency, units), but cannot change settings', () => {
    for (const s of ['Part', 'Stock', 'Vehicle', 'Job', 'PurchaseOrder', 'Settings'] as const) {
      expect(ability.can('read', subjectOf(s, { shopId: shopA }))).toBe(true);
    }
    expect(ability.can('update', subjectOf('Settings', { shopId: shopA }))).toBe(false);
  });
  it('changes nothing', () => {
    expect(ability.can('create', subjectOf('Part', { shopId: shopA }))).toBe(false);
    expect(ability.can('hold', subjectOf('Stock', { shopId: shopA }))).toBe(false);
    expect(ability.can('update', subjectOf('Job', { shopId: shopA, assigneeIds: ['u-me'] }))).toBe(false);
  });
});

describe('API keys', () => {
  it('never manage staff, keys, billing or settings even with a buyer role', () => {
    const ability = defineAbilityFor({ ...me, apiKeyId: 'k1' }, inShop('owner'));
    expect(ability.can('create', subjectOf('Staff', { shopId: shopA }))).toBe(false);
    expect(ability.can('create', subjectOf('ApiKey', { shopId: shopA }))).toBe(false);
    expect(ability.can('update', subjectOf('Settings', { shopId: shopA }))).toBe(false);
    expect(ability.can('read', subjectOf('Settings', { shopId: shopA }))).toBe(false);
    expect(ability.can('manage', subjectOf('Billing', { shopId: shopA }))).toBe(false);
  });
});

describe('read-only shop', () => {
  const ability = defineAbilityFor(me, inShop('owner', { writable: false }));
  it('refuses every write, with the reason', () => {
    expect(ability.can('create', subjectOf('Part', { shopId: shopA }))).toBe(false);
    expect(ability.can('update', subjectOf('Staff', { shopId: shopA }))).toBe(false);
    expect(ability.relevantRuleFor('create', subjectOf('Part', { shopId: shopA }))?.reason).toMatch(/read-only/);
  });
  it('still reads and exports', () => {
    expect(ability.can('read', subjectOf('Part', { shopId: shopA }))).toBe(true);
    expect(ability.can('export', subjectOf('ShopExport', { shopId: shopA }))).toBe(true);
  });
  it('lets the owner pay again and grant support access', () => {
    expect(ability.can('update', subjectOf('Billing', { shopId: shopA }))).toBe(true);
    expect(ability.can('create', subjectOf('SupportAccess', { shopId: shopA }))).toBe(true);
    const buyer = defineAbilityFor(me, inShop('buyer', { writable: false }));
    expect(buyer.can('update', subjectOf('Billing', { shopId: shopA }))).toBe(false);
  });
});

describe('platform admin', () => {
  it('manages the platform but sees no shop data without a membership or grant', () => {
    const ability = defineAbilityFor({ userId: 'admin', isPlatformAdmin: true }, null);
    expect(ability.can('manage', 'Platform')).toBe(true);
    expect(ability.can('read', subjectOf('Part', { shopId: shopA }))).toBe(false);
  });
  it('under a support grant reads shop data but never touches staff or billing', () => {
    const ability = defineAbilityFor({ userId: 'admin', isPlatformAdmin: true }, inShop('owner', { viaSupportGrant: true }));
    expect(ability.can('read', subjectOf('Part', { shopId: shopA }))).toBe(true);
    expect(ability.can('create', subjectOf('Staff', { shopId: shopA }))).toBe(false);
    expect(ability.can('manage', subjectOf('Billing', { shopId: shopA }))).toBe(false);
  });
});

describe('stock counts (issue 7)', () => {
  const can = (role: ShopContext['role'], action: 'read' | 'create' | 'count' | 'update' | 'approve', shopId = shopA) => defineAbilityFor(me, inShop(role)).can(action, subjectOf('StockCount', { shopId }));
  it('everyone reads counts; mechanics enter quantities but neither start, abandon nor post', () => {
    for (const role of ['owner', 'mechanic', 'buyer', 'viewer'] as const) expect(can(role, 'read')).toBe(true);
    expect(can('mechanic', 'count')).toBe(true);
    expect(can('mechanic', 'create')).toBe(false);
    expect(can('mechanic', 'update')).toBe(false);
    expect(can('mechanic', 'approve')).toBe(false);
  });
  it('buyers start, count and abandon; only the owner posts', () => {
    expect(can('buyer', 'create')).toBe(true);
    expect(can('buyer', 'count')).toBe(true);
    expect(can('buyer', 'update')).toBe(true);
    expect(can('buyer', 'approve')).toBe(false);
    expect(can('owner', 'approve')).toBe(true);
  });
  it('viewers change nothing, and nobody touches another shop’s count', () => {
    for (const action of ['create', 'count', 'update', 'approve'] as const) expect(can('viewer', action)).toBe(false);
    expect(can('owner', 'approve', shopB)).toBe(false);
    expect(can('owner', 'read', shopB)).toBe(false);
  });
  it('a read-only shop refuses counting and posting', () => {
    const ability = defineAbilityFor(me, inShop('owner', { writable: false }));
    expect(ability.can('count', subjectOf('StockCount', { shopId: shopA }))).toBe(false);
    expect(ability.can('approve', subjectOf('StockCount', { shopId: shopA }))).toBe(false);
    expect(ability.can('read', subjectOf('StockCount', { shopId: shopA }))).toBe(true);
  });
});

describe('sales (issue 12)', () => {
  const invoice = subjectOf('Invoice', { shopId: shopA });
  const payment = subjectOf('Payment', { shopId: shopA });
  it('lets only the owner issue invoices and record payments', () => {
    expect(defineAbilityFor(me, inShop('owner')).can('issue', invoice)).toBe(true);
    expect(defineAbilityFor(me, inShop('owner')).can('create', payment)).toBe(true);
    for (const role of ['buyer', 'viewer', 'mechanic'] as const) {
      const ability = defineAbilityFor(me, inShop(role));
      expect(ability.can('read', invoice)).toBe(true);
      expect(ability.can('issue', invoice)).toBe(false);
      expect(ability.can('create', invoice)).toBe(false);
      expect(ability.can('create', payment)).toBe(false);
    }
  });
  it('hides part costs and sales margins from a mechanic only', () => {
    const mechanic = defineAbilityFor(me, inShop('mechanic'));
    expect(mechanic.can('read', subjectOf('Part', { shopId: shopA }), 'unitCostMinor')).toBe(false);
    expect(mechanic.can('read', subjectOf('Invoice', { shopId: shopA }), 'margin')).toBe(false);
    expect(mechanic.can('read', subjectOf('Part', { shopId: shopA }))).toBe(true);
    for (const role of ['owner', 'buyer', 'viewer'] as const) {
      expect(defineAbilityFor(me, inShop(role)).can('read', subjectOf('Part', { shopId: shopA }), 'unitCostMinor')).toBe(true);
    }
  });
  it('refuses another shop’s invoices', () => {
    expect(defineAbilityFor(me, inShop('owner')).can('read', subjectOf('Invoice', { shopId: shopB }))).toBe(false);
  });
});

// Estimates, consignment and sales reports (issue 12).
describe('estimates, consignment and sales reports', () => {
  const est = (assigneeIds: string[]) => subjectOf('Estimate', { shopId: shopA, assigneeIds });
  it('lets a mechanic read only the estimates of their own jobs, and nothing of consignment or sales reports', () => {
    const ability = defineAbilityFor(me, inShop('mechanic'));
    expect(ability.can('read', est(['u-me']))).toBe(true);
    expect(ability.can('read', est(['u-other']))).toBe(false);
    expect(ability.can('send', est(['u-me']))).toBe(false);
    expect(ability.can('read', subjectOf('Consignment', { shopId: shopA }))).toBe(false);
    expect(ability.can('read', subjectOf('SalesReport', { shopId: shopA }))).toBe(false);
  });
  it('lets buyers and viewers read estimates, consignments and reports but not margins, and write none of them', () => {
    for (const role of ['buyer', 'viewer'] as const) {
      const ability = defineAbilityFor(me, inShop(role));
      expect(ability.can('read', est([]))).toBe(true);
      expect(ability.can('create', est([]))).toBe(false);
      expect(ability.can('read', subjectOf('Consignment', { shopId: shopA }))).toBe(true);
      expect(ability.can('update', subjectOf('Consignment', { shopId: shopA }))).toBe(false);
      expect(ability.can('read', subjectOf('SalesReport', { shopId: shopA }))).toBe(true);
      expect(ability.can('read', subjectOf('SalesReport', { shopId: shopA }), 'margin')).toBe(false);
    }
  });
  it('lets the owner do all of it, margins included, in their own shop only', () => {
    const ability = defineAbilityFor(me, inShop('owner'));
    expect(ability.can('send', est([]))).toBe(true);
    expect(ability.can('create', subjectOf('Consignment', { shopId: shopA }))).toBe(true);
    expect(ability.can('read', subjectOf('SalesReport', { shopId: shopA }), 'margin')).toBe(true);
    expect(ability.can('read', subjectOf('Estimate', { shopId: 'shop-b', assigneeIds: [] }))).toBe(false);
  });
});
