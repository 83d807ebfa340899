import { randomUUID } from 'node:crypto';
import type { Request, RequestHandler } from 'express';
import { In, IsNull, MoreThan, type EntityManager } from 'typeorm';
import type { GrantSupportAccessRequest, SupportAccessResponse, SupportGrantView } from '@tappet/contracts';
import { idSchema } from '@tappet/contracts';
import type { Database } from '../../db/write-lock';
import type { Clock } from '../../lib/clock';
import { notFound } from '../../lib/http-error';
import { AuditEventEntity } from '../audit/audit.entity';
import { recordAudit, type AuditActor } from '../audit/audit.service';
import { SupportGrantEntity, type SupportGrant } from '../billing/billing.entity';
import { MembershipEntity } from '../shops/shops.entity';
import { UserEntity } from '../users/users.entity';

const grantsByRequest = new WeakMap<Request, SupportGrant>();

/** The support grant a platform admin's request runs under (set by the preflight), or null. */
export function supportGrantOf(req: Request): SupportGrant | null {
  return grantsByRequest.get(req) ?? null;
}

/** Owners' time-boxed support-access grants, and the audit of what support did under them. */
export function createSupportAccessService(deps: { db: Database; clock: Clock }) {
  const { db, clock } = deps;

  async function activeGrant(manager: EntityManager, shopId: string): Promise<SupportGrant | null> {
    return manager.findOne(SupportGrantEntity, { where: { shopId, revokedAt: IsNull(), expiresAt: MoreThan(clock.now()) }, order: { expiresAt: 'DESC' } });
  }

  function view(g: SupportGrant, names: Map<string, string>): SupportGrantView {
    const now = clock.now().getTime();
    return {
      id: g.id,
      grantedByName: names.get(g.grantedByUserId) ?? null,
      note: g.note,
      createdAt: g.createdAt.toISOString(),
      expiresAt: g.expiresAt.toISOString(),
      revokedAt: g.revokedAt?.toISOString() ?? null,
      active: g.revokedAt === null && g.expiresAt.getTime() > now,
    };
  }

  const service = {
    activeGrant: (shopId: string) => activeGrant(db.reader, shopId),

    /** Grants support access for `hours`; an active grant is replaced by the new one. */
    async grant(shopId: string, input: GrantSupportAccessRequest, actor: AuditActor & { userId: string }): Promise<SupportGrantView> {
      const now = clock.now();
      const grant: SupportGrant = { id: randomUUID(), shopId, grantedByUserId: actor.userId, note: input.note || null, createdAt: now, expiresAt: new Date(now.getTime() + input.hours * 3600_000), revokedAt: null, revokedByUserId: null };
      await db.write(async (manager) => {
        const current = await activeGrant(manager, shopId);
        if (current) await manager.update(SupportGrantEntity, { id: current.id, shopId }, { revokedAt: now, revokedByUserId: actor.userId });
        await manager.insert(SupportGrantEntity, grant);
        await recordAudit(manager, {
          shopId,
          actor,
          action: 'support_access.granted',
          entity: 'support_access',
          entityId: grant.id,
          changes: { expiresAt: { before: current?.expiresAt.toISOString() ?? null, after: grant.expiresAt.toISOString() }, note: { before: null, after: grant.note } },
          at: now,
        });
      });
      const user = await db.reader.findOne(UserEntity, { where: { id: actor.userId } });
      return view(grant, new Map(user ? [[user.id, user.name]] : []));
    },

    /** Ends the active grant at once; 404 when there is none. */
    async revoke(shopId: string, actor: AuditActor & { userId: string }): Promise<void> {
      const now = clock.now();
      await db.write(async (manager) => {
        const current = await activeGrant(manager, shopId);
        if (!current) throw notFound('Support access is not granted at the moment.');
        await manager.update(SupportGrantEntity, { id: current.id, shopId }, { revokedAt: now, revokedByUserId: actor.userId });
        await recordAudit(manager, { shopId, actor, action: 'support_access.revoked', entity: 'support_access', entityId: current.id, changes: { revokedAt: { before: null, after: now.toISOString() } }, at: now });
      });
    },

    /** The current grant, past grants, and everything platform support did in the shop. */
    async overview(shopId: string): Promise<SupportAccessResponse> {
      const grants = await db.reader.find(SupportGrantEntity, { where: { shopId }, order: { createdAt: 'DESC' }, take: 20 });
      const admins = await db.reader.find(UserEntity, { where: { isPlatformAdmin: true } });
      const adminIds = admins.map((a) => a.id);
      const events = adminIds.length
        ? await db.reader.find(AuditEventEntity, { where: { shopId, actorUserId: In(adminIds) }, order: { createdAt: 'DESC' }, take: 200 })
        : [];
      const granterIds = [...new Set(grants.map((g) => g.grantedByUserId))];
      const granters = granterIds.length ? await db.reader.find(UserEntity, { where: { id: In(granterIds) } }) : [];
      const names = new Map([...admins, ...granters].map((u) => [u.id, u.name]));
      const views = grants.map((g) => view(g, names));
      return {
        current: views.find((g) => g.active) ?? null,
        grants: views,
        activity: events.map((e) => ({
          id: e.id,
          at: e.createdAt.toISOString(),
          actorName: (e.actorUserId && names.get(e.actorUserId)) || null,
          action: e.action,
          entity: e.entity,
          detail:
            e.action === 'support.viewed'
              ? String((e.changes['request'] as { after?: unknown } | undefined)?.after ?? '')
              : Object.keys(e.changes)
                  .filter((k) => k !== 'request')
                  .join(', '),
        })),
      };
    },

    /**
     * Mounted before every /api/shops/:shopId router: when a platform admin who is not a member
     * asks for a shop whose owner has granted support access, notes the grant for
     * `tenantContext` and audits the request (method and path), so the owner sees every look.
     */
    preflight(): RequestHandler {
      return async (req, _res, next) => {
        const user = req.auth?.user;
        const parsed = idSchema.safeParse(req.params['shopId']);
        if (!user?.isPlatformAdmin || !parsed.success || grantsByRequest.has(req)) return next();
        const shopId = parsed.data;
        if (await db.reader.exists(MembershipEntity, { where: { shopId, userId: user.id, isActive: true } })) return next();
        const grant = await activeGrant(db.reader, shopId);
        if (!grant) return next();
        grantsByRequest.set(req, grant);
        const path = req.originalUrl.split('?')[0] ?? '';
        await db.write((manager) =>
          recordAudit(manager, {
            shopId,
            actor: { userId: user.id, ip: req.ip ?? null },
            action: 'support.viewed',
            entity: 'support_access',
            entityId: grant.id,
            changes: { request: { before: null, after: `${req.method} ${path}` } },
            at: clock.now(),
          }),
        );
        next();
      };
    },
  };
  return service;
}

export type SupportAccessService = ReturnType<typeof createSupportAccessService>;
