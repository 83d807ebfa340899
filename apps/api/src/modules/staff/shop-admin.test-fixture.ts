import { randomUUID } from 'node:crypto';
import type { Database } from '../../db/write-lock';
import { hashApiKeySecret } from '../api-keys/api-keys.service';
import { ApiKeyEntity } from '../api-keys/api-keys.entity';
import { MembershipEntity } from '../shops/shops.entity';
import { UserEntity } from '../users/users.entity';
import { InvitationEntity } from './staff.entity';

/**
 * Ids for route tests of staff and API keys. Each call takes a fresh record, so a route that
 * changes something (withdraw, deactivate, revoke, role change) changes something every time.
 */
export interface ShopAdminFixture {
  /** A buyer whose spending limit may be changed freely. */
  buyerMembershipId: string;
  /** A mechanic membership (fresh each call) to make a viewer. */
  nextRoleTargetId(): string;
  /** An active membership (fresh each call) to deactivate. */
  nextActiveMembershipId(): string;
  /** A deactivated membership (fresh each call) to reactivate. */
  nextInactiveMembershipId(): string;
  /** An open invitation (fresh each call) to resend or withdraw. */
  nextInvitationId(): string;
  /** A live API key (fresh each call) to revoke. */
  nextApiKeyId(): string;
}

/** Writes spare members, invitations and keys into a shop for tests that call every route as every role. */
export async function seedShopAdminFixture(db: Database, shopId: string, ownerUserId: string, spare = 12): Promise<ShopAdminFixture> {
  const at = new Date(Date.UTC(2026, 0, 15));
  const later = new Date(Date.UTC(2100, 0, 1));
  const pool = (n: number) => Array.from({ length: n }, () => randomUUID());
  const roleTargets = pool(spare);
  const active = pool(spare);
  const inactive = pool(spare);
  const invitations = pool(spare * 2);
  const keys = pool(spare);
  const buyerMembershipId = randomUUID();
  await db.write(async (manager) => {
    const addMember = async (membershipId: string, role: 'mechanic' | 'buyer' | 'viewer', isActive: boolean) => {
      const userId = randomUUID();
      // Never signs in: the hash is not a valid PHC string, so every password check fails.
      await manager.insert(UserEntity, { id: userId, email: `fixture-${userId}@fixture.test`, name: `Fixture ${role}`, passwordHash: '!', isPlatformAdmin: false, isActive: true, createdAt: at });
      await manager.insert(MembershipEntity, { id: membershipId, shopId, userId, role, spendingLimitMinor: role === 'buyer' ? 1000 : null, isActive, createdAt: at });
    };
    await addMember(buyerMembershipId, 'buyer', true);
    for (const id of roleTargets) await addMember(id, 'mechanic', true);
    for (const id of active) await addMember(id, 'viewer', true);
    for (const id of inactive) await addMember(id, 'viewer', false);
    await manager.insert(
      InvitationEntity,
      invitations.map((id) => ({ id, shopId, email: `invitee-${id}@fixture.test`, role: 'viewer' as const, spendingLimitMinor: null, tokenHash: hashApiKeySecret(id), invitedByUserId: ownerUserId, createdAt: at, sentAt: at, expiresAt: later, acceptedAt: null, acceptedUserId: null, withdrawnAt: null })),
    );
    await manager.insert(
      ApiKeyEntity,
      keys.map((id) => ({ id, shopId, label: 'Fixture key', role: 'viewer' as const, secretHash: hashApiKeySecret(`tpk_${id}`), createdByUserId: ownerUserId, boundUserId: null, integrationName: 'Fixture', createdAt: at, lastUsedAt: null, revokedAt: null })),
    );
  });
  const take = (ids: string[], what: string) => () => {
    const id = ids.shift();
    if (!id) throw new Error(`The shop administration fixture ran out of spare ${what}.`);
    return id;
  };
  return {
    buyerMembershipId,
    nextRoleTargetId: take(roleTargets, 'role targets'),
    nextActiveMembershipId: take(active, 'active members'),
    nextInactiveMembershipId: take(inactive, 'inactive members'),
    nextInvitationId: take(invitations, 'invitations'),
    nextApiKeyId: take(keys, 'API keys'),
  };
}
