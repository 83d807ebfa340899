import { Router } from 'express';
import {
  acceptInvitationRequestSchema,
  createInvitationRequestSchema,
  invitationParamsSchema,
  invitationTokenParamsSchema,
  membershipParamsSchema,
  shopIdParamsSchema,
  updateMemberRoleRequestSchema,
  updateSpendingLimitRequestSchema,
} from '@tappet/contracts';
import type { Env } from '../../config/env';
import { auditActorOf, authOf, readCookie, requestInfo, sessionCookie } from '../../middleware/authenticate';
import { authorize, shopOf } from '../../middleware/tenant-context';
import { bodyOf, validate } from '../../middleware/validate';
import type { AuthService } from '../auth/auth.service';
import type { StaffService } from './staff.service';

/** /api/shops/:shopId/staff (mounted behind the tenant context): owners manage the shop's people. */
export function staffRouter(deps: { staff: StaffService }): Router {
  const { staff } = deps;
  const router = Router({ mergeParams: true });

  router.get('/', validate({ params: shopIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Staff');
    res.json(await staff.list(shopOf(req).shop.id));
  });

  router.post('/invitations', validate({ params: shopIdParamsSchema, body: createInvitationRequestSchema }), async (req, res) => {
    authorize(req, 'create', 'Staff');
    res.status(201).json(await staff.invite(shopOf(req).shop, bodyOf(createInvitationRequestSchema, req), auditActorOf(req)));
  });

  router.post('/invitations/:invitationId/resend', validate({ params: invitationParamsSchema }), async (req, res) => {
    authorize(req, 'update', 'Staff');
    res.json(await staff.resend(shopOf(req).shop, String(req.params['invitationId']), auditActorOf(req)));
  });

  router.delete('/invitations/:invitationId', validate({ params: invitationParamsSchema }), async (req, res) => {
    authorize(req, 'delete', 'Staff');
    await staff.withdraw(shopOf(req).shop.id, String(req.params['invitationId']), auditActorOf(req));
    res.json({ ok: true });
  });

  router.patch('/:membershipId/role', validate({ params: membershipParamsSchema, body: updateMemberRoleRequestSchema }), async (req, res) => {
    authorize(req, 'update', 'Staff');
    res.json(await staff.changeRole(shopOf(req).shop.id, String(req.params['membershipId']), bodyOf(updateMemberRoleRequestSchema, req).role, auditActorOf(req)));
  });

  router.patch('/:membershipId/spending-limit', validate({ params: membershipParamsSchema, body: updateSpendingLimitRequestSchema }), async (req, res) => {
    authorize(req, 'update', 'Staff');
    res.json(await staff.setSpendingLimit(shopOf(req).shop.id, String(req.params['membershipId']), bodyOf(updateSpendingLimitRequestSchema, req).spendingLimitMinor, auditActorOf(req)));
  });

  router.post('/:membershipId/deactivate', validate({ params: membershipParamsSchema }), async (req, res) => {
    authorize(req, 'update', 'Staff');
    res.json(await staff.deactivate(shopOf(req).shop.id, String(req.params['membershipId']), auditActorOf(req)));
  });

  router.post('/:membershipId/reactivate', validate({ params: membershipParamsSchema }), async (req, res) => {
    authorize(req, 'update', 'Staff');
    res.json(await staff.reactivate(shopOf(req).shop.id, String(req.params['membershipId']), auditActorOf(req)));
  });

  return router;
}

/** /api/invitations: the public side of an invitation link. */
export function invitationsRouter(deps: { env: Env; staff: StaffService; auth: AuthService }): Router {
  const { env, staff, auth } = deps;
  const cookie = sessionCookie(env);
  const router = Router();

  router.get('/:token', validate({ params: invitationTokenParamsSchema }), async (req, res) => {
    res.json(await staff.describe(String(req.params['token'])));
  });

  router.post('/accept', validate({ body: acceptInvitationRequestSchema }), async (req, res) => {
    const body = bodyOf(acceptInvitationRequestSchema, req);
    const info = requestInfo(req);
    const outcome = await staff.accept(body, req.auth?.user ?? null, info.ip);
    if (outcome.kind === 'new-account') {
      // Signs the new person in exactly as the sign-in page would (new session token, audited).
      const { token, me } = await auth.signIn(outcome.email, outcome.password, info, readCookie(req, cookie.name));
      res.cookie(cookie.name, token, cookie.options);
      // A brand-new account has this one shop, so it is already the active one.
      res.json(me);
      return;
    }
    // An existing account (signed in as the invited address) joins and switches to the shop.
    res.json(await auth.setActiveShop(authOf(req), outcome.shopId, info));
  });

  return router;
}
