import { And, In, LessThan, MoreThanOrEqual, type FindOptionsWhere } from 'typeorm';
import type { AuditEventListResponse, AuditEventQuery, AuditEventView } from '@tappet/contracts';
import type { Database } from '../../db/write-lock';
import { ApiKeyEntity } from '../api-keys/api-keys.entity';
import { UserEntity } from '../users/users.entity';
import { AuditEventEntity, type AuditEvent } from './audit.entity';
import { csvLine } from './csv';

export type AuditFilters = Omit<AuditEventQuery, 'page' | 'pageSize'>;

const dayMs = 24 * 60 * 60_000;

/** Start of the range: a date means its first instant (UTC). */
function lowerBound(value: string): Date {
  return new Date(value.length === 10 ? `${value}T00:00:00.000Z` : value);
}

/** End of the range, exclusive: a date includes that whole day; a date-time includes that instant. */
function upperBoundExclusive(value: string): Date {
  return value.length === 10 ? new Date(new Date(`${value}T00:00:00.000Z`).getTime() + dayMs) : new Date(new Date(value).getTime() + 1);
}

/** Where clauses (OR-ed) for one shop's audit events under the filters. */
function whereFor(shopId: string, filters: AuditFilters): Array<FindOptionsWhere<AuditEvent>> {
  const base: FindOptionsWhere<AuditEvent> = { shopId };
  if (filters.entity) base.entity = filters.entity;
  const from = filters.from ? MoreThanOrEqual(lowerBound(filters.from)) : undefined;
  const to = filters.to ? LessThan(upperBoundExclusive(filters.to)) : undefined;
  if (from && to) base.createdAt = And(from, to);
  else if (from ?? to) base.createdAt = from ?? to;
  if (!filters.actor) return [base];
  // The actor filter matches a person or an API key, whichever the id names.
  return [
    { ...base, actorUserId: filters.actor },
    { ...base, actorApiKeyId: filters.actor },
  ];
}

/** Reads of the audit log (writes go through `recordAudit`). */
export function createAuditQueries(deps: { db: Database }) {
  const { db } = deps;

  async function views(events: AuditEvent[]): Promise<AuditEventView[]> {
    const userIds = [...new Set(events.map((e) => e.actorUserId).filter((id): id is string => id !== null))];
    const keyIds = [...new Set(events.map((e) => e.actorApiKeyId).filter((id): id is string => id !== null))];
    const users = userIds.length ? await db.reader.find(UserEntity, { where: { id: In(userIds) }, select: { id: true, name: true } }) : [];
    const keys = keyIds.length ? await db.reader.find(ApiKeyEntity, { where: { id: In(keyIds) }, select: { id: true, label: true } }) : [];
    const userNames = new Map(users.map((u) => [u.id, u.name]));
    const keyLabels = new Map(keys.map((k) => [k.id, k.label]));
    return events.map((e) => ({
      id: e.id,
      action: e.action,
      entity: e.entity,
      entityId: e.entityId,
      actor: {
        userId: e.actorUserId,
        userName: (e.actorUserId && userNames.get(e.actorUserId)) ?? null,
        apiKeyId: e.actorApiKeyId,
        apiKeyLabel: (e.actorApiKeyId && keyLabels.get(e.actorApiKeyId)) ?? null,
      },
      changes: e.changes,
      ip: e.ip,
      createdAt: e.createdAt.toISOString(),
    }));
  }

  return {
    /** One page of events, newest first. */
    async list(shopId: string, query: AuditEventQuery): Promise<AuditEventListResponse> {
      const [events, total] = await db.reader.findAndCount(AuditEventEntity, {
        where: whereFor(shopId, query),
        order: { createdAt: 'DESC', id: 'DESC' },
        skip: (query.page - 1) * query.pageSize,
        take: query.pageSize,
      });
      return { events: await views(events), total, page: query.page, pageSize: query.pageSize };
    },

    /** CSV lines (header first), oldest first, read a page at a time so memory stays flat. */
    async *csv(shopId: string, filters: AuditFilters, pageSize = 500): AsyncGenerator<string> {
      yield csvLine(['created_at', 'action', 'entity', 'entity_id', 'actor_user_id', 'actor_name', 'actor_api_key_id', 'actor_api_key_label', 'ip', 'changes']);
      const where = whereFor(shopId, filters);
      for (let skip = 0; ; skip += pageSize) {
        const events = await db.reader.find(AuditEventEntity, { where, order: { createdAt: 'ASC', id: 'ASC' }, skip, take: pageSize });
        for (const v of await views(events)) {
          yield csvLine([v.createdAt, v.action, v.entity, v.entityId, v.actor.userId, v.actor.userName, v.actor.apiKeyId, v.actor.apiKeyLabel, v.ip, v.changes]);
        }
        if (events.length < pageSize) return;
      }
    },
  };
}

export type AuditQueries = ReturnType<typeof createAuditQueries>;
