/* eslint-disable @nx/enforce-module-boundaries -- the seed writes through the API's own data layer
   (entities, migrations, write lock); see docs/decisions/002-module-boundaries.md. */
import { createHash, randomBytes, randomUUID } from 'node:crypto';
import path from 'node:path';
import type { DataSource } from 'typeorm';
import type { ShopRole } from '@tappet/contracts';
import { databaseFor, type Database } from '../apps/api/src/db/write-lock';
import { hashPassword } from '../apps/api/src/lib/password';
import { recordAudit } from '../apps/api/src/modules/audit/audit.service';
import { insertMembership, insertShop } from '../apps/api/src/modules/shops/shops.service';
import { UserEntity } from '../apps/api/src/modules/users/users.entity';
import { InvitationEntity } from '../apps/api/src/modules/staff/staff.entity';
import { invitationTtlMs } from '../apps/api/src/modules/staff/staff.service';
import { ApiKeyEntity } from '../apps/api/src/modules/api-keys/api-keys.entity';
import { seedCatalogueDemo } from './catalogue-demo';
import { seedBillingDemo } from './billing-demo';
import { seedStockDemo } from './stock-demo';
import { seedPurchasingDemo } from './purchasing-demo';
import { renderVehiclesDemoMedia, seedVehiclesDemo, storeVehiclesDemoFiles, type DemoStoredFile } from './vehicles-demo';
import { seedJobsDemo } from './jobs-demo';
import { seedCountsDemo } from './counts-demo';
import { seedSalesDemo } from './sales-demo';
import { seedEstimatesDemo } from './estimates-demo';

/** The demo password of every demo account. Public by design: never use it for real data. */
export const demoPassword = 'tappet-demo';

interface DemoPerson {
  email: string;
  name: string;
  platformAdmin?: boolean;
  memberships: Array<{ shop: 'harbour' | 'brackenfold'; role: ShopRole; spendingLimitMinor?: number }>;
}

// Invented people at invented shops; the .test domain is reserved for examples.
const people: DemoPerson[] = [
  { email: 'owner@harbour-works.test', name: 'Maren Tolliver', memberships: [{ shop: 'harbour', role: 'owner' }, { shop: 'brackenfold', role: 'viewer' }] },
  { email: 'mechanic@harbour-works.test', name: 'Oskar Brannagh', memberships: [{ shop: 'harbour', role: 'mechanic' }] },
  // 500.00 in minor units: orders up to that go out without the owner's approval.
  { email: 'buyer@harbour-works.test', name: 'Ines Quarrington', memberships: [{ shop: 'harbour', role: 'buyer', spendingLimitMinor: 50_000 }] },
  { email: 'viewer@harbour-works.test', name: 'Dilys Amberley', memberships: [{ shop: 'harbour', role: 'viewer' }] },
  { email: 'owner@brackenfold-garage.test', name: 'Callum Fenwright', memberships: [{ shop: 'brackenfold', role: 'owner' }] },
  { email: 'admin@tappet.test', name: 'Ottilie Marsh', platformAdmin: true, memberships: [] },
];

/** The demo sign-ins, for printing. */
export const demoSignIns = people.map((p) => ({ email: p.email, roles: p.platformAdmin ? ['platform admin'] : p.memberships.map((m) => `${m.role} (${m.shop === 'harbour' ? 'Harbour Works' : 'Brackenfold Garage'})`) }));

/**
 * Seeds the demo scenario: Harbour Works with an owner, mechanic, buyer and viewer; Brackenfold
 * Garage with its owner (and Harbour Works' owner as a viewer, so shop switching shows); a
 * platform admin. All sign in with {@link demoPassword}. Does nothing when any user exists.
 * Writes go through the data source's one write lock. Returns whether it seeded.
 */
export async function seedDemo(source: DataSource | Database, at: Date = new Date(), options: { uploadsDir?: string } = {}): Promise<boolean> {
  const db = 'write' in source ? source : databaseFor(source);
  if ((await db.reader.count(UserEntity)) > 0) return false;
  // Hashed before taking the lock (slow work); the seed is exempt from the common-password rule.
  const hashes = await Promise.all(people.map(() => hashPassword(demoPassword)));
  // Vehicle photos and documents are drawn before taking the lock (slow work); stored after commit.
  const vehicleMedia = await renderVehiclesDemoMedia();
  let vehicleFiles: DemoStoredFile[] = [];
  const actor = { userId: null, ip: null };
  await db.write(async (manager) => {
    const shops = {
      harbour: await insertShop(manager, { name: 'Harbour Works', slug: 'harbour-works', at, actor }),
      brackenfold: await insertShop(manager, { name: 'Brackenfold Garage', slug: 'brackenfold-garage', at, actor }),
    };
    const userIds = new Map<string, string>();
    for (const [i, person] of people.entries()) {
      const id = randomUUID();
      userIds.set(person.email, id);
      await manager.insert(UserEntity, { id, email: person.email, name: person.name, passwordHash: hashes[i]!, isPlatformAdmin: person.platformAdmin ?? false, isActive: true, createdAt: at });
      await recordAudit(manager, { shopId: null, actor, action: 'user.created', entity: 'user', entityId: id, changes: { email: { before: null, after: person.email } }, at });
      for (const m of person.memberships) {
        await insertMembership(manager, { shopId: shops[m.shop].id, userId: id, role: m.role, spendingLimitMinor: m.spendingLimitMinor ?? null, at, actor });
      }
    }
    await seedCatalogueDemo(manager, { harbour: shops.harbour.id, brackenfold: shops.brackenfold.id }, at);
    await seedBillingDemo(manager, { harbour: shops.harbour.id, brackenfold: shops.brackenfold.id }, at);
    await seedStockDemo(manager, { harbour: shops.harbour.id, brackenfold: shops.brackenfold.id }, at);
    await seedPurchasingDemo(manager, shops.harbour.id, { owner: userIds.get('owner@harbour-works.test')!, buyer: userIds.get('buyer@harbour-works.test')! }, at);
    vehicleFiles = await seedVehiclesDemo(manager, shops.harbour.id, { owner: userIds.get('owner@harbour-works.test')!, mechanic: userIds.get('mechanic@harbour-works.test')! }, at, vehicleMedia);
    await seedJobsDemo(manager, shops.harbour.id, { owner: userIds.get('owner@harbour-works.test')!, mechanic: userIds.get('mechanic@harbour-works.test')! }, at);
    await seedCountsDemo(manager, shops.harbour.id, { owner: userIds.get('owner@harbour-works.test')!, buyer: userIds.get('buyer@harbour-works.test')!, mechanic: userIds.get('mechanic@harbour-works.test')! }, at);
    await seedSalesDemo(manager, shops.harbour.id, { owner: userIds.get('owner@harbour-works.test')! }, at);
    await seedEstimatesDemo(manager, shops.harbour.id, { owner: userIds.get('owner@harbour-works.test')! }, at);

    // Shop administration: an invitation still open (the owner can resend it, and the new link
    // lands in the mail sink) and an API key for an invented integration. Neither token is known
    // to anyone: only their hashes are stored, as for real ones.
    const ownerId = userIds.get('owner@harbour-works.test')!;
    const ownerActor = { userId: ownerId, ip: null };
    const sha256 = (bytes: Buffer) => createHash('sha256').update(bytes.toString('base64url')).digest('hex');
    const invitation = {
      id: randomUUID(),
      shopId: shops.harbour.id,
      email: 'counter@harbour-works.test',
      role: 'viewer' as const,
      spendingLimitMinor: null,
      tokenHash: sha256(randomBytes(32)),
      invitedByUserId: ownerId,
      createdAt: at,
      sentAt: at,
      expiresAt: new Date(at.getTime() + invitationTtlMs),
      acceptedAt: null,
      acceptedUserId: null,
      withdrawnAt: null,
    };
    await manager.insert(InvitationEntity, invitation);
    await recordAudit(manager, { shopId: shops.harbour.id, actor: ownerActor, action: 'invitation.created', entity: 'invitation', entityId: invitation.id, changes: { email: { before: null, after: invitation.email }, role: { before: null, after: 'viewer' } }, at });
    const key = {
      id: randomUUID(),
      shopId: shops.harbour.id,
      label: 'Stock level feed',
      role: 'viewer' as const,
      secretHash: sha256(randomBytes(32)),
      createdByUserId: ownerId,
      boundUserId: null,
      integrationName: 'Counter display board',
      createdAt: at,
      lastUsedAt: null,
      revokedAt: null,
    };
    await manager.insert(ApiKeyEntity, key);
    await recordAudit(manager, { shopId: shops.harbour.id, actor: ownerActor, action: 'api_key.created', entity: 'api_key', entityId: key.id, changes: { label: { before: null, after: key.label }, role: { before: null, after: 'viewer' } }, at });
  });
  // The uploads folder sits beside the database file (env.ts: <data dir>/uploads), unless given.
  const database = String(db.dataSource.options.database ?? '');
  const uploadsDir = options.uploadsDir ?? (database && database !== ':memory:' ? path.join(path.dirname(database), 'uploads') : null);
  if (uploadsDir) await storeVehiclesDemoFiles(uploadsDir, vehicleFiles);
  return true;
}
