import { randomBytes, randomUUID } from 'node:crypto';
import type { ShopRole } from '@tappet/contracts';
import type { Database } from '../../db/write-lock';
import type { Clock } from '../../lib/clock';
import { hashPassword } from '../../lib/password';
import { recordAudit } from '../audit/audit.service';
import { notFound } from '../../lib/http-error';
import { ShopEntity } from '../shops/shops.entity';
import { insertMembership, insertShop } from '../shops/shops.service';
import { UserEntity } from '../users/users.entity';

export interface CreatedUser {
  id: string;
  email: string;
  name: string;
  role: ShopRole | 'platform_admin';
}

export interface CreatedShop {
  shop: { id: string; name: string; slug: string };
  password: string;
  users: CreatedUser[];
}

/**
 * Creates a shop with a unique name and one user per requested role (plus a platform admin if
 * asked), all with the same fresh password. Tests use it so that each gets data of its own.
 */
export async function createShopWithUsers(
  db: Database,
  clock: Clock,
  options: {
    roles: ShopRole[];
    namePrefix?: string;
    platformAdmin?: boolean;
    spendingLimitMinor?: number | null;
    alsoMemberOf?: Array<{ shopId: string; role: ShopRole }>;
  },
): Promise<CreatedShop> {
  const unique = randomBytes(4).toString('hex');
  const name = `${options.namePrefix ?? 'Test Shop'} ${unique}`;
  const password = `pw-${randomBytes(12).toString('base64url')}`;
  const passwordHash = await hashPassword(password);
  const at = clock.now();
  const actor = { userId: null, ip: null };
  return db.write(async (manager) => {
    for (const extra of options.alsoMemberOf ?? []) {
      if (!(await manager.exists(ShopEntity, { where: { id: extra.shopId } }))) throw notFound('No such shop.');
    }
    const shop = await insertShop(manager, { name, at, actor });
    const users: CreatedUser[] = [];
    const addUser = async (role: CreatedUser['role'], index: number) => {
      const user = {
        id: randomUUID(),
        email: `${role.replace('_', '-')}${index > 0 ? `-${index + 1}` : ''}@${shop.slug}.test`,
        name: `${role === 'platform_admin' ? 'Platform admin' : role[0]!.toUpperCase() + role.slice(1)} ${unique}`,
        passwordHash,
        isPlatformAdmin: role === 'platform_admin',
        isActive: true,
        createdAt: at,
      };
      await manager.insert(UserEntity, user);
      await recordAudit(manager, { shopId: null, actor, action: 'user.created', entity: 'user', entityId: user.id, changes: { email: { before: null, after: user.email } }, at });
      if (role !== 'platform_admin') {
        await insertMembership(manager, { shopId: shop.id, userId: user.id, role, spendingLimitMinor: role === 'buyer' ? (options.spendingLimitMinor ?? 50_000) : null, at, actor });
        for (const extra of options.alsoMemberOf ?? []) {
          await insertMembership(manager, { shopId: extra.shopId, userId: user.id, role: extra.role, at, actor });
        }
      }
      users.push({ id: user.id, email: user.email, name: user.name, role });
    };
    const seen = new Map<string, number>();
    for (const role of options.roles) {
      const index = seen.get(role) ?? 0;
      seen.set(role, index + 1);
      await addUser(role, index);
    }
    if (options.platformAdmin) await addUser('platform_admin', 0);
    return { shop: { id: shop.id, name: shop.name, slug: shop.slug }, password, users };
  });
}
