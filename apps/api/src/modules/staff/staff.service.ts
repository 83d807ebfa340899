import { randomUUID } from 'node:crypto';
import { In, IsNull, Not, type EntityManager } from 'typeorm';
import type { CreateInvitationRequest, InvitationSummary, PublicInvitation, ShopRole, StaffListResponse, StaffMember } from '@tappet/contracts';
import { roleLabels } from '@tappet/contracts';
import type { Env } from '../../config/env';
import { shopScoped } from '../../db/tenant-repository';
import type { Database } from '../../db/write-lock';
import type { Clock } from '../../lib/clock';
import { HttpError, forbidden, notFound } from '../../lib/http-error';
import type { Mailer } from '../../lib/mailer';
import { hashPassword, passwordProblem } from '../../lib/password';
import { RateLimiter, type RateLimitRule, type RateLimitStore } from '../../lib/rate-limiter';
import { databaseRateLimitStore } from '../../db/rate-limit-store';
import { rateLimitedError } from '../../middleware/rate-limits';
import { hashToken, newToken } from '../../lib/tokens';
import { recordAudit, type AuditActor } from '../audit/audit.service';
import { SessionEntity } from '../auth/auth.entity';
import { MembershipEntity, ShopEntity, type Membership, type Shop } from '../shops/shops.entity';
import { insertMembership } from '../shops/shops.service';
import { UserEntity, type User } from '../users/users.entity';
import { InvitationEntity, type Invitation } from './staff.entity';
import { assertSeatAvailable } from '../billing/plan-limits';

/** How long an invitation link works. */
export const invitationTtlMs = 7 * 24 * 60 * 60_000;

/** Invitation e-mails (new and resent) a shop may send per window. */
export const defaultInvitationSendLimit: RateLimitRule = { limit: 20, windowMs: 60 * 60_000 };

const conflict = (message: string) => new HttpError(409, 'conflict', message);
const lastOwnerMessage = 'A shop must keep at least one active owner. Make someone else an owner first.';
const invitationGone = () => notFound('This invitation link is invalid, used, withdrawn or expired. Ask the shop for a new one.');

export interface StaffServiceDeps {
  db: Database;
  env: Env;
  clock: Clock;
  mailer: Mailer;
  rateLimitStore?: RateLimitStore;
  invitationSendLimit?: RateLimitRule;
  onMailError?: (err: unknown) => void;
}

/** Outcome of accepting an invitation. */
export type AcceptOutcome = { kind: 'new-account'; email: string; password: string; shopId: string } | { kind: 'joined'; shopId: string };

/** Staff of a shop: members, invitations, roles, spending limits, deactivation. */
export function createStaffService(deps: StaffServiceDeps) {
  const { db, env, clock, mailer } = deps;
  const sendLimiter = new RateLimiter('invitation-send', deps.invitationSendLimit ?? defaultInvitationSendLimit, clock, deps.rateLimitStore ?? databaseRateLimitStore(db));

  /** Counts one invitation e-mail of the shop; 429 past the allowance. Call outside any write. */
  async function checkSendLimit(shopId: string): Promise<void> {
    const wait = await sendLimiter.take(shopId);
    if (wait > 0) throw rateLimitedError(wait, 'invitations sent from this shop');
  }

  function sendInvitationMail(shop: Shop, invitation: { email: string; role: ShopRole }, token: string, inviterName: string | null): void {
    const link = `${env.publicUrl}/accept-invitation?token=${encodeURIComponent(token)}`;
    // After the commit and not awaited: SMTP must never hold the write lock or the answer.
    mailer
      .send({
        to: invitation.email,
        subject: `You are invited to ${shop.name} on Tappet`,
        text: [
          'Hello,',
          '',
          `${inviterName ?? 'The owner'} invites you to join ${shop.name} on Tappet as ${roleLabels[invitation.role].toLowerCase()}.`,
          'Open this link within 7 days to accept. It works once.',
          '',
          link,
          '',
          'If you did not expect this, ignore this e-mail.',
        ].join('\n'),
      })
      .catch((err: unknown) => deps.onMailError?.(err));
  }

  /**
   * A new invitation inside the caller's write: the checks (already a member, an open invitation,
   * a free seat), the row and its audit event. The link's token is made here, so a retried write
   * (PostgreSQL) sends the token of the attempt that committed; send it after the commit.
   */
  async function createInvitation(manager: EntityManager, shop: Shop, input: CreateInvitationRequest, actor: AuditActor, now: Date): Promise<{ invitation: Invitation; token: string }> {
    const token = newToken();
    const invitation: Invitation = {
      id: randomUUID(),
      shopId: shop.id,
      email: input.email,
      role: input.role,
      spendingLimitMinor: input.role === 'buyer' ? (input.spendingLimitMinor ?? null) : null,
      tokenHash: hashToken(token),
      invitedByUserId: actor.userId,
      createdAt: now,
      sentAt: now,
      expiresAt: new Date(now.getTime() + invitationTtlMs),
      acceptedAt: null,
      acceptedUserId: null,
      withdrawnAt: null,
    };
    const existingUser = await manager.findOne(UserEntity, { where: { email: input.email } });
    if (existingUser) {
      const membership = await shopScoped(manager, MembershipEntity, shop.id).findOne({ userId: existingUser.id });
      if (membership?.isActive) throw conflict('This person is already a member of the shop.');
      if (membership) throw conflict('This person is a deactivated member of the shop: reactivate them instead.');
    }
    const open = await shopScoped(manager, InvitationEntity, shop.id).findOne({ email: input.email, acceptedAt: IsNull(), withdrawnAt: IsNull() });
    if (open) throw conflict('This address already has an open invitation: resend or withdraw it.');
    // The plan's seats count members and open invitations alike.
    await assertSeatAvailable(manager, shop.id, now);
    await manager.insert(InvitationEntity, invitation);
    await recordAudit(manager, {
      shopId: shop.id,
      actor,
      action: 'invitation.created',
      entity: 'invitation',
      entityId: invitation.id,
      changes: { email: { before: null, after: invitation.email }, role: { before: null, after: invitation.role }, spendingLimitMinor: { before: null, after: invitation.spendingLimitMinor } },
      at: now,
    });
    return { invitation, token };
  }

  /** Active owners of the shop other than `exceptUserId`. */
  async function otherActiveOwners(manager: EntityManager, shopId: string, exceptUserId: string): Promise<number> {
    return shopScoped(manager, MembershipEntity, shopId).count({ role: 'owner', isActive: true, userId: Not(exceptUserId) });
  }

  /** Ends the sessions a deactivated membership must not keep (see `deactivate`). */
  async function endSessionsFor(manager: EntityManager, shopId: string, userId: string): Promise<number> {
    const stillActiveElsewhere = await manager.count(MembershipEntity, { where: { userId, isActive: true, shopId: Not(shopId) } });
    const where = stillActiveElsewhere > 0 ? { userId, activeShopId: shopId } : { userId };
    const result = await manager.delete(SessionEntity, where);
    return result.affected ?? 0;
  }

  async function findPendingInvitation(manager: EntityManager, tokenHash: string): Promise<Invitation | null> {
    const invitation = await manager.findOne(InvitationEntity, { where: { tokenHash } });
    if (!invitation || invitation.acceptedAt || invitation.withdrawnAt) return null;
    if (invitation.expiresAt.getTime() <= clock.now().getTime()) return null;
    return invitation;
  }

  function toInvitationSummary(i: Invitation, inviterName: string | null): InvitationSummary {
    return {
      id: i.id,
      email: i.email,
      role: i.role,
      spendingLimitMinor: i.spendingLimitMinor,
      invitedByName: inviterName,
      createdAt: i.createdAt.toISOString(),
      expiresAt: i.expiresAt.toISOString(),
      expired: i.expiresAt.getTime() <= clock.now().getTime(),
    };
  }

  async function memberView(manager: EntityManager, membership: Membership): Promise<StaffMember> {
    const user = await manager.findOneOrFail(UserEntity, { where: { id: membership.userId } });
    return {
      membershipId: membership.id,
      userId: user.id,
      name: user.name,
      email: user.email,
      role: membership.role,
      spendingLimitMinor: membership.spendingLimitMinor,
      isActive: membership.isActive,
      joinedAt: membership.createdAt.toISOString(),
    };
  }

  /** Loads a membership of the shop under the write lock; a foreign or unknown id is a 404. */
  const memberOr404 = (manager: EntityManager, shopId: string, membershipId: string) => shopScoped(manager, MembershipEntity, shopId).findOneOr404({ id: membershipId }, 'No such member in this shop.');

  return {
    /** Members (active and deactivated) and open invitations. */
    async list(shopId: string): Promise<StaffListResponse> {
      const memberships = await shopScoped(db.reader, MembershipEntity, shopId).find({}, { createdAt: 'ASC' });
      const userIds = [...new Set(memberships.map((m) => m.userId))];
      const invitations = await shopScoped(db.reader, InvitationEntity, shopId).find({ acceptedAt: IsNull(), withdrawnAt: IsNull() }, { createdAt: 'ASC' });
      const inviterIds = invitations.map((i) => i.invitedByUserId).filter((id): id is string => id !== null);
      const users = await db.reader.find(UserEntity, { where: { id: In([...userIds, ...inviterIds]) } });
      const byId = new Map(users.map((u) => [u.id, u]));
      const members = memberships.flatMap((m): StaffMember[] => {
        const user = byId.get(m.userId);
        if (!user) return [];
        return [{ membershipId: m.id, userId: user.id, name: user.name, email: user.email, role: m.role, spendingLimitMinor: m.spendingLimitMinor, isActive: m.isActive, joinedAt: m.createdAt.toISOString() }];
      });
      members.sort((a, b) => Number(b.isActive) - Number(a.isActive) || a.name.localeCompare(b.name));
      return { members, invitations: invitations.map((i) => toInvitationSummary(i, (i.invitedByUserId && byId.get(i.invitedByUserId)?.name) || null)) };
    },

    /** Invites an address with a role and e-mails the link after the commit. */
    async invite(shop: Shop, input: CreateInvitationRequest, actor: AuditActor & { userId: string | null; name: string | null }): Promise<InvitationSummary> {
      await checkSendLimit(shop.id);
      const now = clock.now();
      const { invitation, token } = await db.write((manager) => createInvitation(manager, shop, input, actor, now));
      sendInvitationMail(shop, invitation, token, actor.name);
      return toInvitationSummary(invitation, actor.name);
    },

    /**
     * An invitation made inside the caller's own write (a shop onboarded with its owner's
     * invitation in one transaction). `send` mails the link: call it after the commit.
     */
    async inviteWithin(manager: EntityManager, shop: Shop, input: CreateInvitationRequest, actor: AuditActor & { userId: string | null; name: string | null }, now: Date) {
      const { invitation, token } = await createInvitation(manager, shop, input, actor, now);
      return { summary: toInvitationSummary(invitation, actor.name), send: () => sendInvitationMail(shop, invitation, token, actor.name) };
    },

    /** A new link for an open invitation; the old link stops working and the 7 days start again. */
    async resend(shop: Shop, invitationId: string, actor: AuditActor & { name: string | null }): Promise<InvitationSummary> {
      const token = newToken();
      const now = clock.now();
      const open = { id: invitationId, acceptedAt: IsNull(), withdrawnAt: IsNull() };
      const noSuchInvitation = 'No such open invitation in this shop.';
      // Looked up first so that a wrong id is not counted; the count is a write of its own.
      await shopScoped(db.reader, InvitationEntity, shop.id).findOneOr404(open, noSuchInvitation);
      await checkSendLimit(shop.id);
      const updated = await db.write(async (manager) => {
        const invitation = await shopScoped(manager, InvitationEntity, shop.id).findOneOr404(open, noSuchInvitation);
        const patch = { tokenHash: hashToken(token), sentAt: now, expiresAt: new Date(now.getTime() + invitationTtlMs) };
        await manager.update(InvitationEntity, { id: invitation.id }, patch);
        await recordAudit(manager, {
          shopId: shop.id,
          actor,
          action: 'invitation.resent',
          entity: 'invitation',
          entityId: invitation.id,
          changes: { expiresAt: { before: invitation.expiresAt.toISOString(), after: patch.expiresAt.toISOString() } },
          at: now,
        });
        return { ...invitation, ...patch };
      });
      sendInvitationMail(shop, updated, token, actor.name);
      return toInvitationSummary(updated, actor.name);
    },

    async withdraw(shopId: string, invitationId: string, actor: AuditActor): Promise<void> {
      const now = clock.now();
      await db.write(async (manager) => {
        const invitation = await shopScoped(manager, InvitationEntity, shopId).findOneOr404({ id: invitationId, acceptedAt: IsNull(), withdrawnAt: IsNull() }, 'No such open invitation in this shop.');
        await manager.update(InvitationEntity, { id: invitation.id }, { withdrawnAt: now });
        await recordAudit(manager, { shopId, actor, action: 'invitation.withdrawn', entity: 'invitation', entityId: invitation.id, changes: { withdrawnAt: { before: null, after: now.toISOString() } }, at: now });
      });
    },

    /** What the accept page shows; 404 for an unknown, used, withdrawn or expired token. */
    async describe(token: string): Promise<PublicInvitation> {
      const invitation = await findPendingInvitation(db.reader, hashToken(token));
      if (!invitation) throw invitationGone();
      const shop = await db.reader.findOneOrFail(ShopEntity, { where: { id: invitation.shopId } });
      const accountExists = await db.reader.exists(UserEntity, { where: { email: invitation.email } });
      return { shopName: shop.name, email: invitation.email, role: invitation.role, expiresAt: invitation.expiresAt.toISOString(), accountExists };
    },

    /**
     * Accepts an invitation. A new address gets an account with the name and password given; an
     * address that already has an account must be signed in as that account and just joins.
     */
    async accept(input: { token: string; name?: string; password?: string }, signedIn: User | null, ip: string | null): Promise<AcceptOutcome> {
      const tokenHash = hashToken(input.token);
      const first = await findPendingInvitation(db.reader, tokenHash);
      if (!first) throw invitationGone();
      const existing = await db.reader.findOne(UserEntity, { where: { email: first.email } });
      if (existing) {
        if (!signedIn || signedIn.id !== existing.id) throw forbidden(`This invitation is for ${first.email}, which already has an account. Sign in as that account, then accept it.`);
      } else {
        if (!input.name || !input.password) throw new HttpError(400, 'validation_failed', 'Enter your name and choose a password.', [...(input.name ? [] : [{ path: ['name'], message: 'Enter your name.' }]), ...(input.password ? [] : [{ path: ['password'], message: 'Choose a password.' }])]);
        const problem = passwordProblem(input.password);
        if (problem) throw new HttpError(400, 'validation_failed', problem, [{ path: ['password'], message: problem }]);
      }
      const passwordHash = existing ? null : await hashPassword(input.password ?? ''); // slow: outside the lock
      return db.write(async (manager): Promise<AcceptOutcome> => {
        const now = clock.now();
        // Checked again under the lock: the same link must not be accepted twice.
        const invitation = await findPendingInvitation(manager, tokenHash);
        if (!invitation) throw invitationGone();
        let userId: string;
        if (existing) {
          userId = existing.id;
        } else {
          if (await manager.exists(UserEntity, { where: { email: invitation.email } })) throw conflict('An account for this address was just created. Sign in and open the link again.');
          userId = randomUUID();
          await manager.insert(UserEntity, { id: userId, email: invitation.email, name: input.name ?? '', passwordHash: passwordHash ?? '', isPlatformAdmin: false, isActive: true, createdAt: now });
          await recordAudit(manager, { shopId: null, actor: { userId, ip }, action: 'user.created', entity: 'user', entityId: userId, changes: { email: { before: null, after: invitation.email } }, at: now });
        }
        const actor = { userId, ip };
        const membership = await shopScoped(manager, MembershipEntity, invitation.shopId).findOne({ userId });
        if (membership?.isActive) throw conflict('You are already a member of this shop.');
        if (membership) {
          // A former member invited back: the old membership (and its history) comes back to life.
          const patch = { isActive: true, role: invitation.role, spendingLimitMinor: invitation.spendingLimitMinor };
          await manager.update(MembershipEntity, { id: membership.id }, patch);
          await recordAudit(manager, { shopId: invitation.shopId, actor, action: 'membership.reactivated', entity: 'membership', entityId: membership.id, changes: { isActive: { before: false, after: true }, role: { before: membership.role, after: invitation.role } }, at: now });
        } else {
          await insertMembership(manager, { shopId: invitation.shopId, userId, role: invitation.role, spendingLimitMinor: invitation.spendingLimitMinor, at: now, actor });
        }
        await manager.update(InvitationEntity, { id: invitation.id }, { acceptedAt: now, acceptedUserId: userId });
        await recordAudit(manager, { shopId: invitation.shopId, actor, action: 'invitation.accepted', entity: 'invitation', entityId: invitation.id, changes: { acceptedAt: { before: null, after: now.toISOString() } }, at: now });
        return existing ? { kind: 'joined', shopId: invitation.shopId } : { kind: 'new-account', email: invitation.email, password: input.password ?? '', shopId: invitation.shopId };
      });
    },

    /** Changes a member's role; the last active owner cannot stop being one. */
    async changeRole(shopId: string, membershipId: string, role: ShopRole, actor: AuditActor): Promise<StaffMember> {
      return db.write(async (manager) => {
        const membership = await memberOr404(manager, shopId, membershipId);
        if (membership.role === role) return memberView(manager, membership);
        if (membership.role === 'owner' && membership.isActive && (await otherActiveOwners(manager, shopId, membership.userId)) === 0) throw conflict(lastOwnerMessage);
        // A spending limit only means something for a buyer.
        const patch = { role, spendingLimitMinor: role === 'buyer' ? membership.spendingLimitMinor : null };
        await manager.update(MembershipEntity, { id: membership.id }, patch);
        const changes: Record<string, { before: unknown; after: unknown }> = { role: { before: membership.role, after: role } };
        if (patch.spendingLimitMinor !== membership.spendingLimitMinor) changes['spendingLimitMinor'] = { before: membership.spendingLimitMinor, after: patch.spendingLimitMinor };
        await recordAudit(manager, { shopId, actor, action: 'membership.role_changed', entity: 'membership', entityId: membership.id, changes, at: clock.now() });
        return memberView(manager, { ...membership, ...patch });
      });
    },

    /** Sets a buyer's spending limit (minor units; null = none). */
    async setSpendingLimit(shopId: string, membershipId: string, spendingLimitMinor: number | null, actor: AuditActor): Promise<StaffMember> {
      return db.write(async (manager) => {
        const membership = await memberOr404(manager, shopId, membershipId);
        if (membership.role !== 'buyer') throw conflict('Only a parts buyer has a spending limit.');
        if (membership.spendingLimitMinor !== spendingLimitMinor) {
          await manager.update(MembershipEntity, { id: membership.id }, { spendingLimitMinor });
          await recordAudit(manager, { shopId, actor, action: 'membership.spending_limit_changed', entity: 'membership', entityId: membership.id, changes: { spendingLimitMinor: { before: membership.spendingLimitMinor, after: spendingLimitMinor } }, at: clock.now() });
        }
        return memberView(manager, { ...membership, spendingLimitMinor });
      });
    },

    /**
     * Deactivates a membership (never deletes it). Sessions working in this shop end at once; if
     * the person has no other active membership, all their sessions end.
     */
    async deactivate(shopId: string, membershipId: string, actor: AuditActor): Promise<StaffMember> {
      return db.write(async (manager) => {
        const membership = await memberOr404(manager, shopId, membershipId);
        if (!membership.isActive) return memberView(manager, membership);
        if (membership.role === 'owner' && (await otherActiveOwners(manager, shopId, membership.userId)) === 0) throw conflict(lastOwnerMessage);
        await manager.update(MembershipEntity, { id: membership.id }, { isActive: false });
        const ended = await endSessionsFor(manager, shopId, membership.userId);
        await recordAudit(manager, { shopId, actor, action: 'membership.deactivated', entity: 'membership', entityId: membership.id, changes: { isActive: { before: true, after: false }, sessionsEnded: { before: null, after: ended } }, at: clock.now() });
        return memberView(manager, { ...membership, isActive: false });
      });
    },

    async reactivate(shopId: string, membershipId: string, actor: AuditActor): Promise<StaffMember> {
      return db.write(async (manager) => {
        const membership = await memberOr404(manager, shopId, membershipId);
        if (membership.isActive) return memberView(manager, membership);
        await assertSeatAvailable(manager, shopId, clock.now());
        await manager.update(MembershipEntity, { id: membership.id }, { isActive: true });
        await recordAudit(manager, { shopId, actor, action: 'membership.reactivated', entity: 'membership', entityId: membership.id, changes: { isActive: { before: false, after: true } }, at: clock.now() });
        return memberView(manager, { ...membership, isActive: true });
      });
    },
  };
}

export type StaffService = ReturnType<typeof createStaffService>;
