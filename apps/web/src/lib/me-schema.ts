import type { MeWithActiveShop } from '@tappet/contracts';
import { shopRoles } from '@tappet/contracts';

// /api/me's answer, checked by hand rather than with the contract's zod schema: /api/me is the first
// request of every signed-in screen, and its check would otherwise make zod (27 KB gzipped, and its
// start-up work) a step every first screen waits for (docs/decisions/024-mobile-first-load.md).
// me-schema.test.ts holds it to the contract's meWithActiveShopSchema, case by case.

type Membership = MeWithActiveShop['memberships'][number];
type Checked<T> = { success: true; data: T } | { success: false };

// The pattern zod's z.uuid() uses (RFC 9562 versions 1–8, plus the nil and max ids).
const uuid = /^([0-9a-fA-F]{8}-[0-9a-fA-F]{4}-[1-8][0-9a-fA-F]{3}-[89abAB][0-9a-fA-F]{3}-[0-9a-fA-F]{12}|00000000-0000-0000-0000-000000000000|ffffffff-ffff-ffff-ffff-ffffffffffff)$/;
const roles: readonly string[] = shopRoles;

class Mismatch extends Error {}
function record(v: unknown): Record<string, unknown> {
  if (typeof v !== 'object' || v === null || Array.isArray(v)) throw new Mismatch();
  return v as Record<string, unknown>;
}
function text(v: unknown): string {
  if (typeof v !== 'string') throw new Mismatch();
  return v;
}
function id(v: unknown): string {
  if (!uuid.test(text(v))) throw new Mismatch();
  return v as string;
}
function flag(v: unknown): boolean {
  if (typeof v !== 'boolean') throw new Mismatch();
  return v;
}

function membership(v: unknown): Membership {
  const m = record(v);
  if (!roles.includes(text(m['role']))) throw new Mismatch();
  const limit = m['spendingLimitMinor'];
  if (limit !== null && !Number.isSafeInteger(limit)) throw new Mismatch();
  // Like zod's object(): only the known keys come through; the optional ones only when present.
  const out: Membership = { shopId: id(m['shopId']), shopName: text(m['shopName']), role: m['role'] as Membership['role'], spendingLimitMinor: limit as number | null };
  if ('readOnly' in m && m['readOnly'] !== undefined) out.readOnly = flag(m['readOnly']);
  if ('supportUntil' in m && m['supportUntil'] !== undefined) out.supportUntil = m['supportUntil'] === null ? null : text(m['supportUntil']);
  return out;
}

/** /api/me's answer, with the same `safeParse` the API client calls on a zod schema. */
export const meSchema = {
  safeParse(data: unknown): Checked<MeWithActiveShop> {
    try {
      const me = record(data);
      const user = record(me['user']);
      if (!Array.isArray(me['memberships'])) throw new Mismatch();
      const active = me['activeShopId'];
      return {
        success: true,
        data: {
          user: { id: id(user['id']), email: text(user['email']), name: text(user['name']), isPlatformAdmin: flag(user['isPlatformAdmin']) },
          memberships: me['memberships'].map(membership),
          activeShopId: active === null ? null : id(active),
        },
      };
    } catch (error) {
      if (error instanceof Mismatch) return { success: false };
      throw error;
    }
  },
};
