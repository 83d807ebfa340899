import { EntitySchema } from 'typeorm';
import type { ShopRole } from '@tappet/contracts';

/** An e-mailed invitation to join a shop. Shop-owned. The token is stored only as its SHA-256. */
export interface Invitation {
  id: string;
  shopId: string;
  email: string;
  role: ShopRole;
  spendingLimitMinor: number | null;
  tokenHash: string;
  invitedByUserId: string | null;
  createdAt: Date;
  sentAt: Date;
  expiresAt: Date;
  acceptedAt: Date | null;
  acceptedUserId: string | null;
  withdrawnAt: Date | null;
}

export const InvitationEntity = new EntitySchema<Invitation>({
  name: 'Invitation',
  tableName: 'invitations',
  columns: {
    id: { type: 'varchar', length: 36, primary: true },
    shopId: { type: 'varchar', length: 36, name: 'shop_id' },
    email: { type: 'varchar', length: 254 },
    role: { type: 'varchar', length: 20 },
    spendingLimitMinor: { type: 'integer', name: 'spending_limit_minor', nullable: true },
    tokenHash: { type: 'varchar', length: 64, name: 'token_hash', unique: true },
    invitedByUserId: { type: 'varchar', length: 36, name: 'invited_by_user_id', nullable: true },
    createdAt: { type: 'datetime', name: 'created_at' },
    sentAt: { type: 'datetime', name: 'sent_at' },
    expiresAt: { type: 'datetime', name: 'expires_at' },
    acceptedAt: { type: 'datetime', name: 'accepted_at', nullable: true },
    acceptedUserId: { type: 'varchar', length: 36, name: 'accepted_user_id', nullable: true },
    withdrawnAt: { type: 'datetime', name: 'withdrawn_at', nullable: true },
  },
});
