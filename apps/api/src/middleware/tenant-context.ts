import type { Request, RequestHandler } from 'express';
import { defineAbilityFor, subjectOf, type Action, type SubjectName, type SubjectRecord } from '@tappet/permissions';
import { idSchema } from '@tappet/contracts';
import { readJoinedRow } from '../db/raw-reads';
import type { Database } from '../db/write-lock';
import { HttpError, forbidden, notFound } from '../lib/http-error';
import { MembershipEntity, ShopEntity, readOnlyBillingStates } from '../modules/shops/shops.entity';
import { authOf } from './authenticate';
import { refuseWritesWhenReadOnly } from './read-only-shop';
import { supportGrantOf } from '../modules/platform/support-access.service';

const noSuchShop = () => notFound('No such shop.');

/**
 * For /api/shops/:shopId and everything below it: loads the caller's active membership of the
 * shop and builds `req.shop`, `req.membership` and `req.ability`. Anyone who is not a member gets
 * 404 (platform admins too: they see no shop data without a support grant).
 */
export function tenantContext(db: Database): RequestHandler {
  return async (req, _res, next) => {
    const parsed = idSchema.safeParse(req.params['shopId']);
    if (!parsed.success) throw noSuchShop();
    const shopId = parsed.data;
    if (req.apiKey) {
      // An API key acts in its own shop only, with its own role (at most buyer).
      const key = req.apiKey;
      const shop = key.shopId === shopId ? await db.reader.findOne(ShopEntity, { where: { id: shopId } }) : null;
      if (!shop) throw noSuchShop();
      req.shop = shop;
      req.membership = { id: key.id, shopId, userId: key.userId ?? '', role: key.role, spendingLimitMinor: null, isActive: true, createdAt: shop.createdAt };
      req.ability = defineAbilityFor(
        { userId: key.userId ?? `api-key:${key.id}`, isPlatformAdmin: false, apiKeyId: key.id },
        { shopId, role: key.role, spendingLimitMinor: null, writable: !readOnlyBillingStates.includes(shop.billingState) },
      );
      refuseWritesWhenReadOnly(req, shop);
      return next();
    }
    const auth = authOf(req);
    // Every request: the membership and its shop in one statement (inactive ones are no membership).
    const joined = await readJoinedRow(
      db.reader,
      'membership-with-shop',
      [[MembershipEntity, 'm'], [ShopEntity, 's']],
      'FROM "memberships" "m" JOIN "shops" "s" ON "s"."id" = "m"."shop_id" WHERE "m"."shop_id" = ? AND "m"."user_id" = ?',
      [shopId, auth.user.id],
    );
    const membership = joined?.[0].isActive ? joined[0] : null;
    if (!membership) {
      // A platform admin sees a shop only under its owner's support grant (noted and audited by
      // the support-access preflight); acting as owner, minus staff, keys, billing and grants.
      const grant = auth.user.isPlatformAdmin ? supportGrantOf(req) : null;
      const granted = grant && grant.shopId === shopId ? await db.reader.findOne(ShopEntity, { where: { id: shopId } }) : null;
      if (!grant || !granted) throw noSuchShop();
      req.shop = granted;
      req.membership = { id: `support:${grant.id}`, shopId, userId: auth.user.id, role: 'owner', spendingLimitMinor: null, isActive: true, createdAt: grant.createdAt };
      req.ability = defineAbilityFor(
        { userId: auth.user.id, isPlatformAdmin: true, apiKeyId: null },
        { shopId, role: 'owner', spendingLimitMinor: null, writable: !readOnlyBillingStates.includes(granted.billingState), viaSupportGrant: true },
      );
      refuseWritesWhenReadOnly(req, granted);
      return next();
    }
    const shop = joined![1];
    req.shop = shop;
    req.membership = membership;
    req.ability = defineAbilityFor(
      { userId: auth.user.id, isPlatformAdmin: auth.user.isPlatformAdmin, apiKeyId: null },
      { shopId, role: membership.role, spendingLimitMinor: membership.spendingLimitMinor, writable: !readOnlyBillingStates.includes(shop.billingState) },
    );
    refuseWritesWhenReadOnly(req, shop);
    next();
  };
}

/** The shop of a request that passed `tenantContext`. */
export function shopOf(req: Request) {
  if (!req.shop || !req.membership || !req.ability) throw new HttpError(500, 'internal', 'Tenant context missing.');
  return { shop: req.shop, membership: req.membership, ability: req.ability };
}

/**
 * Throws 403 `forbidden` unless the request's ability allows `action` on the record. The record is
 * tagged with its subject type and the current shop unless it says otherwise.
 */
export function authorize(req: Request, action: Action, type: SubjectName, record: SubjectRecord = {}): void {
  const { shop, ability } = shopOf(req);
  const subject = subjectOf(type, { shopId: shop.id, ...record });
  if (ability.can(action, subject)) return;
  const reason = ability.relevantRuleFor(action, subject)?.reason;
  throw forbidden(reason ?? `Your role in this shop does not allow you to ${action} ${describe(type)}.`);
}

function describe(type: SubjectName): string {
  const words = type.replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase();
  return type === 'Shop' ? 'this shop' : words;
}
