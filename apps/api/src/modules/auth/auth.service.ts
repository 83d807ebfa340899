import { IsNull, LessThan, MoreThan, type EntityManager } from 'typeorm';
import type { MeWithActiveShop } from '@tappet/contracts';
import type { Env } from '../../config/env';
import { readJoinedRow } from '../../db/raw-reads';
import { shopScoped } from '../../db/tenant-repository';
import type { Database } from '../../db/write-lock';
import type { Clock } from '../../lib/clock';
import { HttpError, badRequest, forbidden } from '../../lib/http-error';
import type { Mailer } from '../../lib/mailer';
import { hashPassword, passwordProblem, verifyPassword, warmUpDummyHash } from '../../lib/password';
import { RateLimiter, type RateLimitRule, type RateLimitStore } from '../../lib/rate-limiter';
import { databaseRateLimitStore } from '../../db/rate-limit-store';
import { rateLimitedError } from '../../middleware/rate-limits';
import { hashToken, newToken } from '../../lib/tokens';
import { recordAudit, type AuditActor } from '../audit/audit.service';
import { MembershipEntity, ShopEntity, readOnlyBillingStates, type BillingState } from '../shops/shops.entity';
import { SupportGrantEntity } from '../billing/billing.entity';
import { UserEntity, type User } from '../users/users.entity';
import { PasswordResetTokenEntity, SessionEntity, type Session } from './auth.entity';

/** Rate limits of the sign-in and password-reset endpoints. */
export interface AuthLimits {
  signInFailuresPerAccount: RateLimitRule;
  signInFailuresPerIp: RateLimitRule;
  resetRequestsPerAccount: RateLimitRule;
  resetRequestsPerIp: RateLimitRule;
}

const fifteenMinutes = 15 * 60_000;
export const defaultAuthLimits: AuthLimits = {
  signInFailuresPerAccount: { limit: 10, windowMs: fifteenMinutes },
  // Higher than per account: a whole workshop may sit behind one address.
  signInFailuresPerIp: { limit: 50, windowMs: fifteenMinutes },
  resetRequestsPerAccount: { limit: 5, windowMs: fifteenMinutes },
  resetRequestsPerIp: { limit: 20, windowMs: fifteenMinutes },
};

/** How long a password reset link works. */
export const resetTokenTtlMs = 60 * 60_000;
/** last_seen_at is written at most this often, to keep reads from turning into writes. */
const touchIntervalMs = 60_000;

export interface RequestInfo {
  ip: string | null;
  userAgent: string | null;
}

/** A valid session and its user, as `authenticate` attaches it to the request. */
export interface AuthContext {
  session: Session;
  user: User;
}

export interface AuthServiceDeps {
  db: Database;
  env: Env;
  clock: Clock;
  mailer: Mailer;
  limits?: Partial<AuthLimits>;
  rateLimitStore?: RateLimitStore;
  /** Where failed background e-mails are reported. */
  onMailError?: (err: unknown) => void;
}

const signInFailedMessage = 'The e-mail address or password is not right.';

/** Deletes every session of a user (password change or reset, deactivation). */
export async function endAllSessions(manager: EntityManager, userId: string): Promise<number> {
  const result = await manager.delete(SessionEntity, { userId });
  return result.affected ?? 0;
}

/** Sign-in, sessions, the me payload and password reset. */
export function createAuthService(deps: AuthServiceDeps) {
  const { db, env, clock, mailer } = deps;
  // Ready before the first unknown address arrives, so that one is not slower than the rest.
  void warmUpDummyHash();
  const limits = { ...defaultAuthLimits, ...deps.limits };
  const store = deps.rateLimitStore ?? databaseRateLimitStore(db);
  const limiter = {
    signInAccount: new RateLimiter('sign-in-account', limits.signInFailuresPerAccount, clock, store),
    signInIp: new RateLimiter('sign-in-ip', limits.signInFailuresPerIp, clock, store),
    resetAccount: new RateLimiter('reset-account', limits.resetRequestsPerAccount, clock, store),
    resetIp: new RateLimiter('reset-ip', limits.resetRequestsPerIp, clock, store),
  };

  async function buildMe(user: User, activeShopId: string | null): Promise<MeWithActiveShop> {
    const rows = await db.reader
      .createQueryBuilder()
      .select(['m.shop_id AS shopId', 's.name AS shopName', 'm.role AS role', 'm.spending_limit_minor AS spendingLimitMinor', 's.billing_state AS billingState'])
      .from(MembershipEntity, 'm')
      .innerJoin(ShopEntity.options.name, 's', 's.id = m.shop_id')
      .where('m.user_id = :userId AND m.is_active = 1', { userId: user.id })
      .orderBy('s.name', 'ASC')
      .getRawMany<MeWithActiveShop['memberships'][number] & { billingState: BillingState }>();
    const memberships: MeWithActiveShop['memberships'] = rows.map((r) => ({
      shopId: r.shopId,
      shopName: r.shopName,
      role: r.role,
      spendingLimitMinor: r.spendingLimitMinor === null ? null : Number(r.spendingLimitMinor),
      readOnly: readOnlyBillingStates.includes(r.billingState),
    }));
    if (user.isPlatformAdmin) {
      // Shops whose owners granted support access now: listed so the console can open them.
      const grants = await db.reader.find(SupportGrantEntity, { where: { revokedAt: IsNull(), expiresAt: MoreThan(clock.now()) }, order: { expiresAt: 'DESC' } });
      for (const grant of grants) {
        if (memberships.some((m) => m.shopId === grant.shopId)) continue;
        const shop = await db.reader.findOne(ShopEntity, { where: { id: grant.shopId } });
        if (!shop) continue;
        memberships.push({
          shopId: shop.id,
          shopName: shop.name,
          role: 'owner',
          spendingLimitMinor: null,
          readOnly: readOnlyBillingStates.includes(shop.billingState),
          supportUntil: grant.expiresAt.toISOString(),
        });
      }
    }
    return {
      user: { id: user.id, email: user.email, name: user.name, isPlatformAdmin: user.isPlatformAdmin },
      memberships,
      // Only a shop the person is still an active member of counts as active.
      activeShopId: memberships.some((m) => m.shopId === activeShopId) ? activeShopId : null,
    };
  }

  return {
    limits,
    buildMe,

    /**
     * Checks the credentials and opens a new session (a new token every time; the session the
     * browser came with, if any, is ended). Returns the cookie token and the me payload.
     */
    async signIn(email: string, password: string, info: RequestInfo, previousToken: string | null) {
      const ipKey = info.ip ?? 'unknown';
      const accountKey = email;
      const wait = Math.max(await limiter.signInIp.retryAfterSeconds(ipKey), await limiter.signInAccount.retryAfterSeconds(accountKey));
      if (wait > 0) throw rateLimitedError(wait, 'failed sign-in attempts');

      const user = await db.reader.findOne(UserEntity, { where: { email } });
      const ok = await verifyPassword(user?.passwordHash ?? null, password);
      if (!user || !ok) {
        await limiter.signInIp.record(ipKey);
        await limiter.signInAccount.record(accountKey);
        throw new HttpError(401, 'unauthenticated', signInFailedMessage);
      }
      // Only said after the right password, so it reveals nothing to a guesser.
      if (!user.isActive) throw forbidden('This account has been deactivated. Ask the owner of your shop.');
      await limiter.signInAccount.reset(accountKey);

      const token = newToken();
      const now = clock.now();
      // Start in the shop where the person carries the most responsibility (then the oldest).
      const rank: Record<string, number> = { owner: 0, buyer: 1, mechanic: 2, viewer: 3 };
      const [firstMembership] = (await db.reader.find(MembershipEntity, { where: { userId: user.id, isActive: true }, order: { createdAt: 'ASC' } })).sort(
        (a, b) => (rank[a.role] ?? 9) - (rank[b.role] ?? 9),
      );
      await db.write(async (manager) => {
        if (previousToken) await manager.delete(SessionEntity, { id: hashToken(previousToken) });
        // Housekeeping: sessions (anyone's) past their absolute or idle end. Both columns are indexed.
        await manager.delete(SessionEntity, { expiresAt: LessThan(now) });
        await manager.delete(SessionEntity, { lastSeenAt: LessThan(new Date(now.getTime() - env.session.idleTimeoutMs)) });
        await manager.insert(SessionEntity, {
          id: hashToken(token),
          userId: user.id,
          activeShopId: firstMembership?.shopId ?? null,
          createdAt: now,
          lastSeenAt: now,
          expiresAt: new Date(now.getTime() + env.session.absoluteTimeoutMs),
          ip: info.ip,
          userAgent: info.userAgent?.slice(0, 512) ?? null,
        });
        await recordAudit(manager, { shopId: null, actor: { userId: user.id, ip: info.ip }, action: 'auth.signed_in', entity: 'user', entityId: user.id, at: now });
      });
      return { token, me: await buildMe(user, firstMembership?.shopId ?? null) };
    },

    /** The session behind a cookie token, or null when it is unknown, expired or its user inactive. */
    async resolveSession(token: string): Promise<AuthContext | null> {
      const id = hashToken(token);
      // Every request: the session and its person in one statement.
      const found = await readJoinedRow(db.reader, 'session-with-user', [[SessionEntity, 's'], [UserEntity, 'u']], 'FROM "sessions" "s" JOIN "users" "u" ON "u"."id" = "s"."user_id" WHERE "s"."id" = ?', [id]);
      if (!found) return null;
      const [session, person] = found;
      const now = clock.now().getTime();
      const idleExpired = now - session.lastSeenAt.getTime() > env.session.idleTimeoutMs;
      const absoluteExpired = now >= session.expiresAt.getTime();
      const user = idleExpired || absoluteExpired ? null : person;
      if (!user || !user.isActive) {
        await db.write((manager) => manager.delete(SessionEntity, { id }));
        return null;
      }
      if (now - session.lastSeenAt.getTime() > touchIntervalMs) {
        session.lastSeenAt = new Date(now);
        await db.write((manager) => manager.update(SessionEntity, { id }, { lastSeenAt: session.lastSeenAt }));
      }
      return { session, user };
    },

    async signOut(auth: AuthContext, info: RequestInfo): Promise<void> {
      await db.write(async (manager) => {
        await manager.delete(SessionEntity, { id: auth.session.id });
        await recordAudit(manager, { shopId: null, actor: { userId: auth.user.id, ip: info.ip }, action: 'auth.signed_out', entity: 'user', entityId: auth.user.id, at: clock.now() });
      });
    },

    /** Makes `shopId` the session's active shop; a shop the person is not in is a 404. */
    async setActiveShop(auth: AuthContext, shopId: string, info: RequestInfo) {
      // The id from the body is looked up within that shop and this person: anything else is a 404.
      await shopScoped(db.reader, MembershipEntity, shopId).findOneOr404({ userId: auth.user.id, isActive: true }, 'No such shop.');
      await db.write(async (manager) => {
        await manager.update(SessionEntity, { id: auth.session.id }, { activeShopId: shopId });
        await recordAudit(manager, {
          shopId,
          actor: { userId: auth.user.id, ip: info.ip },
          action: 'session.active_shop_changed',
          entity: 'session',
          entityId: null,
          changes: { activeShopId: { before: auth.session.activeShopId, after: shopId } },
          at: clock.now(),
        });
      });
      return buildMe(auth.user, shopId);
    },

    /**
     * Starts a password reset. Answers the same whether or not the address exists; when it does,
     * e-mails a single-use link built from PUBLIC_URL (never from the request's Host header).
     */
    async requestPasswordReset(email: string, info: RequestInfo): Promise<void> {
      const ipKey = info.ip ?? 'unknown';
      const accountKey = email;
      const wait = Math.max(await limiter.resetIp.retryAfterSeconds(ipKey), await limiter.resetAccount.retryAfterSeconds(accountKey));
      if (wait > 0) throw rateLimitedError(wait, 'password reset requests');
      // Counted whether or not the address exists, so the limit reveals nothing either.
      await limiter.resetIp.record(ipKey);
      await limiter.resetAccount.record(accountKey);

      const user = await db.reader.findOne(UserEntity, { where: { email } });
      if (!user || !user.isActive) return;
      const token = newToken();
      const now = clock.now();
      await db.write(async (manager) => {
        await manager.insert(PasswordResetTokenEntity, { id: hashToken(token), userId: user.id, createdAt: now, expiresAt: new Date(now.getTime() + resetTokenTtlMs), usedAt: null });
        await recordAudit(manager, { shopId: null, actor: { userId: null, ip: info.ip }, action: 'auth.password_reset_requested', entity: 'user', entityId: user.id, at: now });
      });
      const link = `${env.publicUrl}/reset-password?token=${encodeURIComponent(token)}`;
      // Sent after the commit and not awaited: the answer must not wait for (or reveal) SMTP.
      mailer
        .send({
          to: user.email,
          subject: 'Reset your Tappet password',
          text: [
            `Hello ${user.name},`,
            '',
            'Someone (we hope you) asked to reset the password of your Tappet account.',
            'Open this link within 60 minutes to choose a new password. It works once.',
            '',
            link,
            '',
            'If you did not ask for this, ignore this e-mail: your password stays as it is.',
          ].join('\n'),
        })
        .catch((err: unknown) => deps.onMailError?.(err));
    },

    /** Sets a new password with a reset token, uses the token up and ends every session of the user. */
    async confirmPasswordReset(token: string, password: string, info: RequestInfo): Promise<void> {
      const problem = passwordProblem(password);
      if (problem) throw new HttpError(400, 'validation_failed', problem, [{ path: ['password'], message: problem }]);
      const invalid = () => badRequest('This reset link is invalid, used or expired. Ask for a new one.');
      const id = hashToken(token);
      const found = await db.reader.findOne(PasswordResetTokenEntity, { where: { id } });
      if (!found || found.usedAt || found.expiresAt.getTime() <= clock.now().getTime()) throw invalid();
      const passwordHash = await hashPassword(password); // slow: outside the write lock
      await db.write(async (manager) => {
        const now = clock.now();
        // Checked again under the lock: two concurrent confirmations must not both succeed.
        const fresh = await manager.findOne(PasswordResetTokenEntity, { where: { id } });
        if (!fresh || fresh.usedAt || fresh.expiresAt.getTime() <= now.getTime()) throw invalid();
        const user = await manager.findOne(UserEntity, { where: { id: fresh.userId } });
        if (!user || !user.isActive) throw invalid();
        // This token and any other outstanding one of the same user stop working.
        await manager.update(PasswordResetTokenEntity, { userId: user.id, usedAt: IsNull() }, { usedAt: now });
        await manager.update(UserEntity, { id: user.id }, { passwordHash });
        await endAllSessions(manager, user.id);
        await recordAudit(manager, {
          shopId: null,
          actor: { userId: user.id, ip: info.ip },
          action: 'user.password_reset',
          entity: 'user',
          entityId: user.id,
          changes: { password: { before: '[hidden]', after: '[changed]' } },
          at: now,
        });
      });
    },

    /** Deactivates a user and ends all their sessions (staff management will call this). */
    async deactivateUser(userId: string, actor: AuditActor, shopId: string | null): Promise<void> {
      await db.write(async (manager) => {
        await manager.update(UserEntity, { id: userId }, { isActive: false });
        await endAllSessions(manager, userId);
        await recordAudit(manager, { shopId, actor, action: 'user.deactivated', entity: 'user', entityId: userId, changes: { isActive: { before: true, after: false } }, at: clock.now() });
      });
    },
  };
}

export type AuthService = ReturnType<typeof createAuthService>;
