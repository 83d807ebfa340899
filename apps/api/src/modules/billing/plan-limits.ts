import { In, IsNull, MoreThan, Not, type EntityManager } from 'typeorm';
import { HttpError } from '../../lib/http-error';
import { PartEntity } from '../catalogue/catalogue.entity';
import { MembershipEntity } from '../shops/shops.entity';
import { InvitationEntity } from '../staff/staff.entity';
import { VehicleEntity } from '../vehicles/vehicles.entity';
import { PlanEntity, ShopBillingEntity } from './billing.entity';

/** What a shop's plan allows; each limit is null when the plan sets none. */
export interface PlanLimits {
  planName: string;
  seats: number | null;
  catalogue: number | null;
  vehicles: number | null;
}

export type LimitKind = 'seats' | 'catalogue' | 'vehicles';

/**
 * The limits of the shop's plan, or null when the shop has no plan yet (nothing is limited).
 * Pass the manager of the write that is about to add something, so the check and the insert see
 * the same rows.
 */
export async function planLimitsFor(manager: EntityManager, shopId: string): Promise<PlanLimits | null> {
  const billing = await manager.findOne(ShopBillingEntity, { where: { shopId } });
  if (!billing?.planId) return null;
  const plan = await manager.findOne(PlanEntity, { where: { id: billing.planId } });
  if (!plan) return null;
  return { planName: plan.name, seats: plan.seatLimit, catalogue: plan.catalogueLimit, vehicles: plan.vehicleLimit };
}

/** Seats in use: active members plus open, unexpired invitations (each will take a seat). */
export async function seatsUsed(manager: EntityManager, shopId: string, now: Date): Promise<number> {
  const members = await manager.count(MembershipEntity, { where: { shopId, isActive: true } });
  const invitations = await manager.count(InvitationEntity, { where: { shopId, acceptedAt: IsNull(), withdrawnAt: IsNull(), expiresAt: MoreThan(now) } });
  return members + invitations;
}

/** Parts in the shop's catalogue. */
export function catalogueSize(manager: EntityManager, shopId: string): Promise<number> {
  return manager.count(PartEntity, { where: { shopId } });
}

/** Vehicles in the shop now: those handed over or sold have left and take no place in the plan. */
export function vehicleCount(manager: EntityManager, shopId: string): Promise<number> {
  return manager.count(VehicleEntity, { where: { shopId, status: Not(In(['handed_over', 'sold'])) } });
}

const what: Record<LimitKind, { one: string; many: string; fix: string }> = {
  seats: { one: 'seat', many: 'seats', fix: 'Withdraw an open invitation, deactivate someone who has left, or choose a larger plan in Billing.' },
  catalogue: { one: 'part', many: 'parts', fix: 'Remove parts you no longer need, or choose a larger plan in Billing.' },
  vehicles: { one: 'vehicle', many: 'vehicles', fix: 'Vehicles that have left count no more once marked handed over or sold; or choose a larger plan in Billing.' },
};

/**
 * Throws 409 `conflict` (details `{ limit, allowed, used, adding, plan }`) when adding `adding`
 * more of `kind` to `used` would pass the shop's plan limit. Call it inside the write that adds.
 * The vehicles module calls it with its own count:
 * `await assertWithinPlanLimit(manager, shopId, 'vehicles', { used: await count, adding: 1 })`.
 */
export async function assertWithinPlanLimit(manager: EntityManager, shopId: string, kind: LimitKind, counts: { used: number; adding: number }): Promise<void> {
  const limits = await planLimitsFor(manager, shopId);
  const allowed = limits?.[kind] ?? null;
  if (limits === null || allowed === null || counts.used + counts.adding <= allowed) return;
  const w = what[kind];
  const noun = (n: number) => `${n} ${n === 1 ? w.one : w.many}`;
  const message =
    kind === 'seats'
      ? `Your plan (${limits.planName}) includes ${noun(allowed)}, and ${counts.used} ${counts.used === 1 ? 'is' : 'are'} taken by members and open invitations. ${w.fix}`
      : `Your plan (${limits.planName}) allows ${noun(allowed)}; the shop has ${counts.used} and this would add ${counts.adding}. ${w.fix}`;
  throw new HttpError(409, 'conflict', message, { limit: kind, allowed, used: counts.used, adding: counts.adding, plan: limits.planName });
}

/** Refuses one more seat past the plan (an invitation or a reactivation). */
export async function assertSeatAvailable(manager: EntityManager, shopId: string, now: Date): Promise<void> {
  await assertWithinPlanLimit(manager, shopId, 'seats', { used: await seatsUsed(manager, shopId, now), adding: 1 });
}

/** Refuses parts past the plan's catalogue size. */
export async function assertCatalogueRoom(manager: EntityManager, shopId: string, adding: number): Promise<void> {
  if (adding <= 0) return;
  await assertWithinPlanLimit(manager, shopId, 'catalogue', { used: await catalogueSize(manager, shopId), adding });
}

/**
 * Refuses a vehicle past the plan's vehicle limit. For the vehicles module: call it inside the
 * write that creates a vehicle, before the insert: `await assertVehicleRoom(manager, shopId, 1)`.
 */
export async function assertVehicleRoom(manager: EntityManager, shopId: string, adding = 1): Promise<void> {
  await assertWithinPlanLimit(manager, shopId, 'vehicles', { used: await vehicleCount(manager, shopId), adding });
}
