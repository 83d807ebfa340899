/* eslint-disable @nx/enforce-module-boundaries -- the seed writes through the API's own data layer
   (the estimates and consignment modules' in-transaction functions); see docs/decisions/002-module-boundaries.md. */
import { randomBytes, randomUUID } from 'node:crypto';
import { In, type EntityManager } from 'typeorm';
import { consignmentSettlement } from '@tappet/domain';
import { recordAudit } from '../apps/api/src/modules/audit/audit.service';
import { ConsignmentSettlementEntity, ConsignmentTermsEntity } from '../apps/api/src/modules/consignment/consignment.entity';
import { approvedWork } from '../apps/api/src/modules/consignment/consignment.service';
import { EstimateEntity, EstimateLinkEntity } from '../apps/api/src/modules/estimates/estimates.entity';
import { createEstimateInTx } from '../apps/api/src/modules/estimates/estimates.service';
import { JobEntity, LabourEntryEntity } from '../apps/api/src/modules/jobs/jobs.entity';
import { VehicleEntity } from '../apps/api/src/modules/vehicles/vehicles.entity';
import { hashToken } from '../apps/api/src/lib/tokens';

/**
 * Estimates and a consignment in one demo shop (inside the caller's write, after vehicles, jobs and
 * sales settings): an estimate waiting for the customer (its link's token is known to nobody; the
 * owner can send it again for a working link), an approved one, and the consigned vehicle with
 * agreed terms, an approved pre-sale job and a settlement whose payout is still to be recorded.
 */
export async function seedEstimatesDemo(manager: EntityManager, shopId: string, people: { owner: string }, at: Date): Promise<void> {
  const daysAgo = (n: number) => new Date(at.getTime() - n * 86_400_000);
  const actor = { userId: people.owner, ip: null };
  const vehicles = await manager.find(VehicleEntity, { where: { shopId } });
  const withCustomer = new Set(vehicles.filter((v) => v.customerId && v.kind === 'customer').map((v) => v.id));
  const consigned = vehicles.find((v) => v.kind === 'consignment' && v.customerId);
  const jobs = await manager.find(JobEntity, { where: { shopId, status: In(['open', 'in_progress', 'waiting_parts', 'done']) }, order: { number: 'ASC' } });
  const customerJobs = jobs.filter((j) => withCustomer.has(j.vehicleId));

  // Waiting for the customer: sent five days ago, the link valid for a fortnight.
  const waitingJob = customerJobs.find((j) => j.status === 'open') ?? customerJobs[0];
  if (waitingJob) {
    const e = await createEstimateInTx(
      manager,
      shopId,
      {
        jobId: waitingJob.id,
        note: 'Fault finding first; we will call before replacing anything not listed.',
        lines: [
          { kind: 'labour', partId: null, description: 'Trace the lighting and horn faults', quantity: '2', unitPriceMinor: undefined, taxRatePercent: undefined },
          { kind: 'other', partId: null, description: 'Connectors, heat-shrink and fuses', quantity: '1', unitPriceMinor: 1450, taxRatePercent: undefined },
        ],
      },
      actor,
      daysAgo(6),
    );
    const sentAt = daysAgo(5);
    await manager.update(EstimateEntity, { shopId, id: e.id }, { status: 'sent', sentAt, sentTo: 'customer@example.test', updatedAt: sentAt });
    await manager.insert(EstimateLinkEntity, { id: randomUUID(), shopId, estimateId: e.id, tokenHash: hashToken(randomBytes(32).toString('base64url')), expiresAt: new Date(sentAt.getTime() + 14 * 86_400_000), usedAt: null, revokedAt: null, createdAt: sentAt });
    await recordAudit(manager, { shopId, actor, action: 'estimate.sent', entity: 'estimate', entityId: e.id, changes: { status: { before: 'draft', after: 'sent' } }, at: sentAt });
  }

  // Approved: the customer accepted the amount through the link three days ago.
  const approvedJob = customerJobs.find((j) => j.id !== waitingJob?.id && (j.status === 'in_progress' || j.status === 'waiting_parts'));
  if (approvedJob) await approvedEstimate(approvedJob.id, 'Service after storage and brake overhaul', 'Halloway', 4);

  // The consigned vehicle: 10 % commission agreed at intake, a pre-sale job its owner approved,
  // then the sale settled; the payout is left for the owner to record.
  if (!consigned) return;
  let consignedJob = jobs.find((j) => j.vehicleId === consigned.id);
  if (!consignedJob) {
    const [row] = await manager.query<Array<{ max: number | null }>>(`SELECT MAX(number) AS max FROM jobs WHERE shop_id = ?`, [shopId]);
    // Still in progress when the buyer came: two hours booked so far, charged at that.
    const jobRow = { id: randomUUID(), shopId, number: Number(row?.max ?? 0) + 1, vehicleId: consigned.id, title: 'Pre-sale service', customerRequest: 'Service and safety check before sale.', status: 'in_progress' as const, dueOn: null, notes: null, createdByUserId: people.owner, createdAt: daysAgo(25), updatedAt: daysAgo(18), startedAt: daysAgo(24), completedAt: null };
    await manager.insert(JobEntity, jobRow);
    const [rate] = await manager.query<Array<{ rate: number | null }>>(`SELECT labour_rate_minor_per_hour AS rate FROM shop_settings WHERE shop_id = ?`, [shopId]);
    await manager.insert(LabourEntryEntity, { id: randomUUID(), shopId, jobId: jobRow.id, userId: people.owner, workedOn: daysAgo(20).toISOString().slice(0, 10), minutes: 120, description: 'Service, chain and brake adjustment', rateMinorPerHour: Number(rate?.rate ?? 6000), createdByUserId: people.owner, createdAt: daysAgo(20) });
    await recordAudit(manager, { shopId, actor, action: 'job.created', entity: 'job', entityId: jobRow.id, changes: { number: { before: null, after: jobRow.number } }, at: jobRow.createdAt });
    consignedJob = jobRow;
  }
  await approvedEstimate(consignedJob.id, 'Pre-sale service for the consignor', 'Dunmore', 24);
  const termsAt = daysAgo(60);
  const terms = { id: randomUUID(), shopId, vehicleId: consigned.id, commissionKind: 'percent' as const, commissionMilliPercent: 10_000, commissionFixedMinor: null, agreedOn: termsAt.toISOString().slice(0, 10), note: 'Twelve weeks; owner pays for agreed pre-sale work.', createdByUserId: people.owner, createdAt: termsAt, updatedAt: termsAt };
  await manager.insert(ConsignmentTermsEntity, terms);
  await recordAudit(manager, { shopId, actor, action: 'consignment.terms_agreed', entity: 'vehicle', entityId: consigned.id, changes: { commissionMilliPercent: { before: null, after: 10_000 } }, at: termsAt });
  const work = await approvedWork(manager, shopId, consigned);
  const salePriceMinor = 525_000;
  const figures = consignmentSettlement({ salePriceMinor, commission: { kind: 'percent', milliPercent: 10_000 }, work: work.map((w) => ({ label: w.title, amountMinor: w.chargedMinor })) });
  const settledAt = daysAgo(2);
  const [currency] = await manager.query<Array<{ currency: string | null }>>(`SELECT currency FROM shop_settings WHERE shop_id = ?`, [shopId]);
  const settlement = {
    id: randomUUID(),
    shopId,
    number: 1,
    vehicleId: consigned.id,
    consignorCustomerId: consigned.customerId,
    soldOn: settledAt.toISOString().slice(0, 10),
    currency: currency?.currency ?? 'GBP',
    salePriceMinor,
    commissionKind: 'percent' as const,
    commissionMilliPercent: 10_000,
    commissionFixedMinor: null,
    commissionMinor: figures.commissionMinor,
    work,
    workMinor: figures.workMinor,
    payoutMinor: figures.payoutMinor,
    note: 'Sold to a private buyer after a test ride.',
    createdByUserId: people.owner,
    createdAt: settledAt,
    paidOn: null,
    payoutMethod: null,
    payoutReference: null,
    payoutRecordedByUserId: null,
    payoutRecordedAt: null,
  };
  await manager.insert(ConsignmentSettlementEntity, settlement);
  await recordAudit(manager, { shopId, actor, action: 'consignment.settled', entity: 'consignment_settlement', entityId: settlement.id, changes: { payoutMinor: { before: null, after: figures.payoutMinor } }, at: settledAt });

  async function approvedEstimate(jobId: string, note: string, by: string, daysBack: number) {
    const e = await createEstimateInTx(
      manager,
      shopId,
      {
        jobId,
        note,
        lines: [
          { kind: 'labour', partId: null, description: 'Service and safety checks', quantity: '3.5', unitPriceMinor: undefined, taxRatePercent: undefined },
          { kind: 'other', partId: null, description: 'Oils, filters and brake fluid', quantity: '1', unitPriceMinor: 6800, taxRatePercent: undefined },
        ],
      },
      actor,
      daysAgo(daysBack + 1),
    );
    const decidedAt = daysAgo(daysBack);
    await manager.update(EstimateEntity, { shopId, id: e.id }, { status: 'approved', sentAt: daysAgo(daysBack + 1), sentTo: 'customer@example.test', decidedAt, decidedByName: by, approvedAmountMinor: e.grossMinor, updatedAt: decidedAt });
    await manager.insert(EstimateLinkEntity, { id: randomUUID(), shopId, estimateId: e.id, tokenHash: hashToken(randomBytes(32).toString('base64url')), expiresAt: new Date(decidedAt.getTime() + 13 * 86_400_000), usedAt: decidedAt, revokedAt: null, createdAt: daysAgo(daysBack + 1) });
    await recordAudit(manager, { shopId, actor: { userId: null, ip: null }, action: 'estimate.approved', entity: 'estimate', entityId: e.id, changes: { approvedAmountMinor: { before: null, after: e.grossMinor }, version: { before: null, after: 1 } }, at: decidedAt });
  }
}
