import { EntitySchema } from 'typeorm';
import type { ApiKeyRole } from '@tappet/contracts';

/** An API key of one shop. The secret is stored only as its SHA-256. */
export interface ApiKey {
  id: string;
  shopId: string;
  label: string;
  role: ApiKeyRole;
  secretHash: string;
  createdByUserId: string;
  /** The member the key acts for; null when it belongs to a named integration. */
  boundUserId: string | null;
  integrationName: string | null;
  createdAt: Date;
  lastUsedAt: Date | null;
  revokedAt: Date | null;
}

export const ApiKeyEntity = new EntitySchema<ApiKey>({
  name: 'ApiKey',
  tableName: 'api_keys',
  columns: {
    id: { type: 'varchar', length: 36, primary: true },
    shopId: { type: 'varchar', length: 36, name: 'shop_id' },
    label: { type: 'varchar', length: 100 },
    role: { type: 'varchar', length: 20 },
    secretHash: { type: 'varchar', length: 64, name: 'secret_hash', unique: true },
    createdByUserId: { type: 'varchar', length: 36, name: 'created_by_user_id' },
    boundUserId: { type: 'varchar', length: 36, name: 'bound_user_id', nullable: true },
    integrationName: { type: 'varchar', length: 100, name: 'integration_name', nullable: true },
    createdAt: { type: 'datetime', name: 'created_at' },
    lastUsedAt: { type: 'datetime', name: 'last_used_at', nullable: true },
    revokedAt: { type: 'datetime', name: 'revoked_at', nullable: true },
  },
});
