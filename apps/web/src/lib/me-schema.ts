import type { MeWithActiveShop } from '@tappet/contracts';
import { shopRoles } from '@tappet/contracts';
import { flag, handChecked, id, idOrNull, integerOrNull, Mismatch, oneOf, record, text, textOrNull } from './hand-check';

// /api/me's answer, checked by hand rather than with the contract's zod schema: /api/me is the first
// request of every signed-in screen, and its check would otherwise make zod (27 KB gzipped, and its
// start-up work) a step every first screen waits for (docs/decisions/024-mobile-first-load.md).
// me-schema.test.ts holds it to the contract's meWithActiveShopSchema, case by case.

type Membership = MeWithActiveShop['memberships'][number];

function membership(v: unknown): Membership {
  const m = record(v);
  const role = oneOf(shopRoles, m['role']);
  // Like zod's object(): only the known keys come through; the optional ones only when present.
  const out: Membership = { shopId: id(m['shopId']), shopName: text(m['shopName']), role, spendingLimitMinor: integerOrNull(m['spendingLimitMinor']) };
  if ('readOnly' in m && m['readOnly'] !== undefined) out.readOnly = flag(m['readOnly']);
  if ('supportUntil' in m && m['supportUntil'] !== undefined) out.supportUntil = textOrNull(m['supportUntil']);
  return out;
}

/** /api/me's answer, with the same `safeParse` the API client calls on a zod schema. */
export const meSchema = handChecked((data): MeWithActiveShop => {
  const me = record(data);
  const user = record(me['user']);
  if (!Array.isArray(me['memberships'])) throw new Mismatch();
  const active = me['activeShopId'];
  return {
    user: { id: id(user['id']), email: text(user['email']), name: text(user['name']), isPlatformAdmin: flag(user['isPlatformAdmin']) },
    memberships: me['memberships'].map(membership),
    activeShopId: idOrNull(active),
  };
});
