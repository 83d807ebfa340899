import { randomUUID } from 'node:crypto';
import type { Database } from '../../db/write-lock';
import { FakeClock } from '../../lib/clock';
import { VehicleEntity, type VehicleRow } from '../vehicles/vehicles.entity';
import { createConsignmentService } from './consignment.service';

/** Consigned vehicles made for route tests; spares are handed out one per call. */
export interface ConsignmentFixture {
  /** A consigned vehicle with terms, never settled (terms may be changed again and again). */
  vehicleId: string;
  /** A settled vehicle, for reading the settlement and its PDF. */
  settledVehicleId: string;
  /** A consigned vehicle with terms, not settled. */
  nextSettleableId(): string;
  /** A settled vehicle whose payout is not recorded. */
  nextUnpaidId(): string;
}

/** Consigned vehicles of `customerId` (the consignor), with terms of 10 %, some settled. */
export async function seedConsignmentFixture(db: Database, shopId: string, customerId: string, spare = 12): Promise<ConsignmentFixture> {
  const at = new Date(Date.UTC(2026, 0, 15));
  const consignment = createConsignmentService({ db, clock: new FakeClock() });
  const actor = { userId: null };
  const vehicle = async (): Promise<string> => {
    const row: VehicleRow = {
      id: randomUUID(),
      shopId,
      kind: 'consignment',
      marque: 'Fixture',
      model: 'Consigned',
      year: 1965,
      colour: null,
      frameNumber: null,
      engineNumber: null,
      vin: null,
      vinCheckAcknowledgedByUserId: null,
      vinCheckAcknowledgedAt: null,
      condition: 'sorted_rider',
      notes: null,
      customerId,
      acquisitionCostMinor: null,
      askingPriceMinor: 500_000,
      status: 'ready',
      statusSince: at,
      numbersMatching: null,
      numbersCheckedByUserId: null,
      numbersCheckedAt: null,
      numbersNote: null,
      createdAt: at,
      updatedAt: at,
    };
    await db.write((m) => m.insert(VehicleEntity, row));
    await consignment.setTerms(shopId, row.id, { commissionKind: 'percent', commissionPercent: 10, commissionFixedMinor: null, agreedOn: '2026-01-15', note: null }, actor);
    return row.id;
  };
  const settled = async () => {
    const id = await vehicle();
    await consignment.settle(shopId, id, { salePriceMinor: 450_000, soldOn: '2026-01-20', note: null }, actor);
    return id;
  };
  const vehicleId = await vehicle();
  const settledVehicleId = await settled();
  const settleable: string[] = [];
  const unpaid: string[] = [];
  for (let i = 0; i < spare; i++) {
    settleable.push(await vehicle());
    unpaid.push(await settled());
  }
  const take = (list: string[], what: string) => () => {
    const next = list.shift();
    if (next === undefined) throw new Error(`The consignment fixture ran out of ${what}.`);
    return next;
  };
  return { vehicleId, settledVehicleId, nextSettleableId: take(settleable, 'settleable vehicles'), nextUnpaidId: take(unpaid, 'unpaid settlements') };
}
