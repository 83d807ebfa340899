import { EntitySchema } from 'typeorm';

/** Field-level changes of one write: `{ field: { before, after } }`. */
export type AuditChanges = Record<string, { before: unknown; after: unknown }>;

/** One audited write. Append-only: the database refuses UPDATE and DELETE on this table. */
export interface AuditEvent {
  id: string;
  /** Null for platform-level events (sign-in, password reset). */
  shopId: string | null;
  actorUserId: string | null;
  actorApiKeyId: string | null;
  action: string;
  entity: string;
  entityId: string | null;
  changes: AuditChanges;
  ip: string | null;
  createdAt: Date;
}

export const AuditEventEntity = new EntitySchema<AuditEvent>({
  name: 'AuditEvent',
  tableName: 'audit_events',
  columns: {
    id: { type: 'varchar', length: 36, primary: true },
    shopId: { type: 'varchar', length: 36, name: 'shop_id', nullable: true },
    actorUserId: { type: 'varchar', length: 36, name: 'actor_user_id', nullable: true },
    actorApiKeyId: { type: 'varchar', length: 36, name: 'actor_api_key_id', nullable: true },
    action: { type: 'varchar', length: 100 },
    entity: { type: 'varchar', length: 100 },
    entityId: { type: 'varchar', length: 100, name: 'entity_id', nullable: true },
    changes: { type: 'simple-json' },
    ip: { type: 'varchar', length: 64, nullable: true },
    createdAt: { type: 'datetime', name: 'created_at' },
  },
});
