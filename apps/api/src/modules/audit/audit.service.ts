import { randomUUID } from 'node:crypto';
import type { AuditAction, AuditEntity } from '@tappet/contracts';
import type { EntityManager } from 'typeorm';
import type { QueryDeepPartialEntity } from 'typeorm/query-builder/QueryPartialEntity.js';
import { AuditEventEntity, type AuditChanges } from './audit.entity';

/** Who did something, as the audit log records it. */
export interface AuditActor {
  userId: string | null;
  apiKeyId?: string | null;
  ip?: string | null;
}

export interface AuditInput {
  shopId: string | null;
  actor: AuditActor;
  /** Dotted verb, e.g. `shop.updated`, `auth.signed_in`: one of the contracts' auditActionWords, so the audit screen has words for it. */
  action: AuditAction;
  entity: AuditEntity;
  entityId: string | null;
  changes?: AuditChanges;
  at: Date;
}

/**
 * Appends one audit event. Call it with the manager of the same db.write() as the change it
 * describes, so the change and its record commit or roll back together.
 */
export async function recordAudit(manager: EntityManager, input: AuditInput): Promise<void> {
  await manager.insert(AuditEventEntity, {
    id: randomUUID(),
    shopId: input.shopId,
    actorUserId: input.actor.userId,
    actorApiKeyId: input.actor.apiKeyId ?? null,
    action: input.action,
    entity: input.entity,
    entityId: input.entityId,
    changes: (input.changes ?? {}) as QueryDeepPartialEntity<AuditChanges>,
    ip: input.actor.ip ?? null,
    createdAt: input.at,
  });
}

/** The fields of `after` whose values differ from `before`, as audit changes. */
export function diffChanges<T extends object>(before: T, after: Partial<T>): AuditChanges {
  const changes: AuditChanges = {};
  for (const key of Object.keys(after) as Array<keyof T>) {
    if (after[key] !== undefined && after[key] !== before[key]) {
      changes[String(key)] = { before: before[key], after: after[key] };
    }
  }
  return changes;
}
