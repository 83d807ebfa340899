import { createHash, randomBytes, randomUUID } from 'node:crypto';
import { In } from 'typeorm';
import { apiKeyPrefix, type ApiKeyRole, type ApiKeySummary, type CreateApiKeyRequest, type CreateApiKeyResponse } from '@tappet/contracts';
import { shopScoped } from '../../db/tenant-repository';
import type { Database } from '../../db/write-lock';
import type { Clock } from '../../lib/clock';
import { recordAudit, type AuditActor } from '../audit/audit.service';
import { MembershipEntity } from '../shops/shops.entity';
import { UserEntity } from '../users/users.entity';
import { ApiKeyEntity, type ApiKey } from './api-keys.entity';

/** last_used_at is written at most this often, so that busy integrations do not turn reads into writes. */
export const lastUsedIntervalMs = 60_000;

/** What `authenticate` attaches for a request carrying a valid key. */
export interface ApiKeyContext {
  id: string;
  shopId: string;
  role: ApiKeyRole;
  label: string;
  /** The member the key acts for, or null for an integration key. */
  userId: string | null;
}

/** SHA-256 (hex) of a key secret: the only form in which it is stored. */
export function hashApiKeySecret(secret: string): string {
  return createHash('sha256').update(secret, 'utf8').digest('hex');
}

/** A new secret: `tpk_` + 32 random bytes in base64url. */
export function newApiKeySecret(): string {
  return apiKeyPrefix + randomBytes(32).toString('base64url');
}

export function createApiKeysService(deps: { db: Database; clock: Clock }) {
  const { db, clock } = deps;

  async function summaries(keys: ApiKey[]): Promise<ApiKeySummary[]> {
    const users = keys.length ? await db.reader.find(UserEntity, { where: { id: In([...new Set(keys.map((k) => k.createdByUserId))]) } }) : [];
    const names = new Map(users.map((u) => [u.id, u.name]));
    return keys.map((k) => ({
      id: k.id,
      label: k.label,
      role: k.role,
      integrationName: k.integrationName,
      createdBy: names.has(k.createdByUserId) ? { id: k.createdByUserId, name: names.get(k.createdByUserId) ?? '' } : null,
      createdAt: k.createdAt.toISOString(),
      lastUsedAt: k.lastUsedAt?.toISOString() ?? null,
      revokedAt: k.revokedAt?.toISOString() ?? null,
    }));
  }

  return {
    async list(shopId: string): Promise<ApiKeySummary[]> {
      return summaries(await shopScoped(db.reader, ApiKeyEntity, shopId).find({}, { createdAt: 'DESC' }));
    },

    /** Creates a key for the owner who asks (or a named integration); the secret is returned once. */
    async create(shopId: string, input: CreateApiKeyRequest, actor: AuditActor & { userId: string }): Promise<CreateApiKeyResponse> {
      const secret = newApiKeySecret();
      const key: ApiKey = {
        id: randomUUID(),
        shopId,
        label: input.label,
        role: input.role,
        secretHash: hashApiKeySecret(secret),
        createdByUserId: actor.userId,
        boundUserId: input.integrationName ? null : actor.userId,
        integrationName: input.integrationName ?? null,
        createdAt: clock.now(),
        lastUsedAt: null,
        revokedAt: null,
      };
      await db.write(async (manager) => {
        await manager.insert(ApiKeyEntity, key);
        await recordAudit(manager, {
          shopId,
          actor,
          action: 'api_key.created',
          entity: 'api_key',
          entityId: key.id,
          changes: { label: { before: null, after: key.label }, role: { before: null, after: key.role }, integrationName: { before: null, after: key.integrationName } },
          at: key.createdAt,
        });
      });
      const [summary] = await summaries([key]);
      return { key: summary!, secret };
    },

    async revoke(shopId: string, apiKeyId: string, actor: AuditActor): Promise<ApiKeySummary> {
      const key = await db.write(async (manager) => {
        const found = await shopScoped(manager, ApiKeyEntity, shopId).findOneOr404({ id: apiKeyId }, 'No such API key in this shop.');
        if (found.revokedAt) return found;
        const revokedAt = clock.now();
        await manager.update(ApiKeyEntity, { id: found.id }, { revokedAt });
        await recordAudit(manager, { shopId, actor, action: 'api_key.revoked', entity: 'api_key', entityId: found.id, changes: { revokedAt: { before: null, after: revokedAt.toISOString() } }, at: revokedAt });
        return { ...found, revokedAt };
      });
      const [summary] = await summaries([key]);
      return summary!;
    },

    /**
     * The key behind a `tpk_…` secret, or null when it is unknown or revoked, or when the member it
     * acts for is no longer an active member of its shop. Records the use (throttled).
     */
    async resolve(secret: string): Promise<ApiKeyContext | null> {
      const key = await db.reader.findOne(ApiKeyEntity, { where: { secretHash: hashApiKeySecret(secret) } });
      if (!key || key.revokedAt) return null;
      if (key.boundUserId) {
        const membership = await shopScoped(db.reader, MembershipEntity, key.shopId).findOne({ userId: key.boundUserId, isActive: true });
        const user = membership ? await db.reader.findOne(UserEntity, { where: { id: key.boundUserId } }) : null;
        if (!user?.isActive) return null;
      }
      const now = clock.now();
      if (!key.lastUsedAt || now.getTime() - key.lastUsedAt.getTime() >= lastUsedIntervalMs) {
        await db.write((manager) => manager.update(ApiKeyEntity, { id: key.id }, { lastUsedAt: now }));
      }
      return { id: key.id, shopId: key.shopId, role: key.role, label: key.label, userId: key.boundUserId };
    },
  };
}

export type ApiKeysService = ReturnType<typeof createApiKeysService>;
