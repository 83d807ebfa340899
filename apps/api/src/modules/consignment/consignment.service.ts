import { randomUUID } from 'node:crypto';
import { In, type EntityManager } from 'typeorm';
import type { z } from 'zod';
import { consignmentSettlement, type ConsignmentCommission } from '@tappet/domain';
import { canMoveVehicle, vehicleStatusLabels, type ConsignmentListRow, type ConsignmentSettlement, type ConsignmentTerms, type ConsignmentVehicle, type ConsignmentWorkLine, type consignmentTermsInputSchema, type payoutInputSchema, type settlementInputSchema } from '@tappet/contracts';
import { shopScoped } from '../../db/tenant-repository';
import type { Database } from '../../db/write-lock';
import type { Clock } from '../../lib/clock';
import { badRequest, HttpError } from '../../lib/http-error';
import { recordAudit, type AuditActor } from '../audit/audit.service';
import { CustomerEntity } from '../customers/customers.entity';
import { EstimateEntity } from '../estimates/estimates.entity';
import { jobApprovalState, vehicleLabel } from '../estimates/estimates.service';
import { JobEntity } from '../jobs/jobs.entity';
import { shopBasics } from '../sales/sales.settings';
import { VehicleEntity, VehicleStatusChangeEntity, type VehicleRow } from '../vehicles/vehicles.entity';
import { moveVehicleStatus } from '../vehicles/vehicles.service';
import { ConsignmentSettlementEntity, ConsignmentTermsEntity, type ConsignmentSettlementRow, type ConsignmentTermsRow } from './consignment.entity';
import { renderSettlementPdf } from './settlement-pdf';

export type TermsInput = z.output<typeof consignmentTermsInputSchema>;
export type SettlementCreate = z.output<typeof settlementInputSchema>;
export type PayoutCreate = z.output<typeof payoutInputSchema>;

const conflict = (reason: string, message: string) => new HttpError(409, 'conflict', message, { reason });
const iso = (d: Date | string) => new Date(d).toISOString();
export const settlementReference = (n: number) => `CS-${String(n).padStart(6, '0')}`;

function termsView(row: ConsignmentTermsRow): ConsignmentTerms {
  return {
    commissionKind: row.commissionKind,
    commissionPercent: row.commissionMilliPercent === null ? null : row.commissionMilliPercent / 1000,
    commissionFixedMinor: row.commissionFixedMinor,
    agreedOn: row.agreedOn,
    note: row.note,
    updatedAt: iso(row.updatedAt),
  };
}

function settlementView(row: ConsignmentSettlementRow): ConsignmentSettlement {
  return {
    id: row.id,
    reference: settlementReference(row.number),
    soldOn: row.soldOn,
    salePriceMinor: row.salePriceMinor,
    commissionKind: row.commissionKind,
    commissionPercent: row.commissionMilliPercent === null ? null : row.commissionMilliPercent / 1000,
    commissionFixedMinor: row.commissionFixedMinor,
    commissionMinor: row.commissionMinor,
    work: row.work,
    workMinor: row.workMinor,
    payoutMinor: row.payoutMinor,
    consignorOwesMinor: row.payoutMinor < 0 ? -row.payoutMinor : 0,
    note: row.note,
    createdAt: iso(row.createdAt),
    payout: row.paidOn && row.payoutMethod && row.payoutReference ? { paidOn: row.paidOn, method: row.payoutMethod, reference: row.payoutReference, recordedAt: iso(row.payoutRecordedAt ?? row.createdAt) } : null,
  };
}

/**
 * The work the consignor approved on their vehicle: every job on it whose latest approved
 * estimate was made out to the consignor. Each is charged at the job's sell value now (parts
 * issued at sell prices, labour at its rate, tax included) but never more than the amount the
 * consignor approved: work beyond the approval was not agreed, so it is not deducted.
 */
export async function approvedWork(manager: EntityManager, shopId: string, vehicle: VehicleRow): Promise<ConsignmentWorkLine[]> {
  if (!vehicle.customerId) return [];
  const jobs = await manager.find(JobEntity, { where: { shopId, vehicleId: vehicle.id, status: In(['open', 'in_progress', 'waiting_parts', 'done']) }, order: { number: 'ASC' } });
  if (jobs.length === 0) return [];
  const approvedJobIds = new Set(
    (await manager.find(EstimateEntity, { where: { shopId, jobId: In(jobs.map((j) => j.id)), status: 'approved', customerId: vehicle.customerId } })).map((e) => e.jobId),
  );
  const out: ConsignmentWorkLine[] = [];
  for (const job of jobs.filter((j) => approvedJobIds.has(j.id))) {
    const state = await jobApprovalState(manager, shopId, job.id);
    if (!state.approved) continue;
    const approvedMinor = state.approved.amountMinor;
    out.push({ jobId: job.id, jobNumber: job.number, title: job.title, estimateReference: state.approved.reference, approvedMinor, actualGrossMinor: state.actualGrossMinor, chargedMinor: Math.min(approvedMinor, state.actualGrossMinor) });
  }
  return out;
}

const commissionOf = (t: Pick<ConsignmentTermsRow, 'commissionKind' | 'commissionMilliPercent' | 'commissionFixedMinor'>): ConsignmentCommission =>
  t.commissionKind === 'percent' ? { kind: 'percent', milliPercent: t.commissionMilliPercent ?? 0 } : { kind: 'fixed', amountMinor: t.commissionFixedMinor ?? 0 };

/**
 * Consignment: the terms agreed when a consigned vehicle comes in (commission as a percentage or
 * a fixed amount), the settlement after its sale (figures from libs/domain consignmentSettlement,
 * frozen when made), its PDF, and the payout to the consignor.
 */
export function createConsignmentService(deps: { db: Database; clock: Clock }) {
  const { db, clock } = deps;

  async function consignedVehicle(manager: EntityManager, shopId: string, vehicleId: string): Promise<VehicleRow> {
    const v = await shopScoped(manager, VehicleEntity, shopId).findOneOr404({ id: vehicleId }, 'No such vehicle in this shop.');
    if (v.kind !== 'consignment') throw conflict('not_consigned', 'This vehicle is not on consignment: only consigned vehicles have terms and settlements.');
    return v;
  }

  /**
   * A vehicle already recorded as sold (on its own page) is settled for that sale: the sale date
   * can be no later than the day it was recorded sold, nor before the move that preceded the sale.
   */
  async function saleDateAgreesWithSoldMove(manager: EntityManager, shopId: string, v: VehicleRow, soldOn: string): Promise<void> {
    const soldDay = iso(v.statusSince).slice(0, 10);
    if (soldOn > soldDay) throw badRequest(`This vehicle was recorded as sold on ${soldDay}: the sale date cannot be later than that.`);
    const [, before] = await shopScoped(manager, VehicleStatusChangeEntity, shopId).find({ vehicleId: v.id }, { changedAt: 'DESC' }, 2);
    if (before && soldOn < iso(before.changedAt).slice(0, 10)) {
      throw badRequest(`The sale date is before the vehicle became “${vehicleStatusLabels[before.toStatus]}” (${iso(before.changedAt).slice(0, 10)}). Enter the day it was sold.`);
    }
  }

  async function detail(manager: EntityManager, shopId: string, vehicleId: string): Promise<ConsignmentVehicle> {
    const v = await shopScoped(manager, VehicleEntity, shopId).findOneOr404({ id: vehicleId }, 'No such vehicle in this shop.');
    const terms = await shopScoped(manager, ConsignmentTermsEntity, shopId).findOne({ vehicleId });
    const settlement = await shopScoped(manager, ConsignmentSettlementEntity, shopId).findOne({ vehicleId });
    const consignor = v.customerId ? await shopScoped(manager, CustomerEntity, shopId).findOne({ id: v.customerId }) : null;
    const basics = await shopBasics(manager, shopId);
    return {
      vehicleId: v.id,
      vehicle: vehicleLabel(v),
      kind: v.kind,
      status: v.status,
      statusSince: iso(v.statusSince),
      askingPriceMinor: v.askingPriceMinor,
      currency: basics.currency,
      consignor: consignor ? { id: consignor.id, name: consignor.name, email: consignor.email } : null,
      terms: terms ? termsView(terms) : null,
      work: v.kind === 'consignment' && !settlement ? await approvedWork(manager, shopId, v) : [],
      settlement: settlement ? settlementView(settlement) : null,
    };
  }

  return {
    async list(shopId: string): Promise<ConsignmentListRow[]> {
      const reader = db.reader;
      const vehicles = await shopScoped(reader, VehicleEntity, shopId).find({ kind: 'consignment' }, { createdAt: 'DESC' });
      const terms = await shopScoped(reader, ConsignmentTermsEntity, shopId).find();
      const settlements = await shopScoped(reader, ConsignmentSettlementEntity, shopId).find();
      const customerIds = vehicles.map((v) => v.customerId).filter((c): c is string => c !== null);
      const customers = customerIds.length ? await reader.find(CustomerEntity, { where: { shopId, id: In(customerIds) } }) : [];
      return vehicles.map((v) => {
        const s = settlements.find((x) => x.vehicleId === v.id);
        return {
          vehicleId: v.id,
          vehicle: vehicleLabel(v),
          status: v.status,
          consignorName: customers.find((c) => c.id === v.customerId)?.name ?? null,
          hasTerms: terms.some((t) => t.vehicleId === v.id),
          settlementReference: s ? settlementReference(s.number) : null,
          payoutMinor: s ? s.payoutMinor : null,
          paid: Boolean(s?.paidOn),
        };
      });
    },

    get: (shopId: string, vehicleId: string) => detail(db.reader, shopId, vehicleId),

    /** Records (or changes, until settled) the commission agreed for a consigned vehicle. */
    async setTerms(shopId: string, vehicleId: string, input: TermsInput, actor: AuditActor): Promise<ConsignmentVehicle> {
      return db.write(async (manager) => {
        const v = await consignedVehicle(manager, shopId, vehicleId);
        if (await shopScoped(manager, ConsignmentSettlementEntity, shopId).findOne({ vehicleId })) throw conflict('settled', 'This vehicle is settled: its terms can no longer change.');
        const at = clock.now();
        const fields = {
          commissionKind: input.commissionKind,
          commissionMilliPercent: input.commissionKind === 'percent' ? Math.round((input.commissionPercent ?? 0) * 1000) : null,
          commissionFixedMinor: input.commissionKind === 'fixed' ? input.commissionFixedMinor : null,
          agreedOn: input.agreedOn,
          note: input.note,
        };
        const existing = await shopScoped(manager, ConsignmentTermsEntity, shopId).findOne({ vehicleId });
        if (existing) {
          await manager.update(ConsignmentTermsEntity, { shopId, id: existing.id }, { ...fields, updatedAt: at });
        } else {
          await manager.insert(ConsignmentTermsEntity, { id: randomUUID(), shopId, vehicleId: v.id, ...fields, createdByUserId: actor.userId, createdAt: at, updatedAt: at });
        }
        const before = existing ? { commissionKind: existing.commissionKind, commissionMilliPercent: existing.commissionMilliPercent, commissionFixedMinor: existing.commissionFixedMinor } : null;
        await recordAudit(manager, {
          shopId,
          actor,
          action: existing ? 'consignment.terms_updated' : 'consignment.terms_agreed',
          entity: 'vehicle',
          entityId: v.id,
          changes: { commissionKind: { before: before?.commissionKind ?? null, after: fields.commissionKind }, commissionMilliPercent: { before: before?.commissionMilliPercent ?? null, after: fields.commissionMilliPercent }, commissionFixedMinor: { before: before?.commissionFixedMinor ?? null, after: fields.commissionFixedMinor } },
          at,
        });
        return detail(manager, shopId, vehicleId);
      });
    },

    /** The settlement after the sale: figures computed now and frozen. One per vehicle. */
    async settle(shopId: string, vehicleId: string, input: SettlementCreate, actor: AuditActor): Promise<ConsignmentVehicle> {
      return db.write(async (manager) => {
        const v = await consignedVehicle(manager, shopId, vehicleId);
        const terms = await shopScoped(manager, ConsignmentTermsEntity, shopId).findOne({ vehicleId });
        if (!terms) throw conflict('no_terms', 'Record the commission agreed with the consignor first.');
        if (await shopScoped(manager, ConsignmentSettlementEntity, shopId).findOne({ vehicleId })) throw conflict('settled', 'This vehicle already has a settlement.');
        const at = clock.now();
        // Settling records the sale: the vehicle is marked sold on the sale date (the end of that
        // day, or now if that is still to come), through the vehicle's own status rules.
        if (v.status !== 'sold') {
          if (!canMoveVehicle(v.kind, v.status, 'sold')) throw conflict('not_ready_to_sell', `Settling records the sale, and a vehicle that is “${vehicleStatusLabels[v.status]}” cannot be sold: move it to “${vehicleStatusLabels.ready}” first.`);
          const soldAt = new Date(Math.min(at.getTime(), new Date(`${input.soldOn}T23:59:59.999Z`).getTime()));
          if (soldAt.getTime() < new Date(v.statusSince).getTime()) throw badRequest(`The sale date is before the vehicle became “${vehicleStatusLabels[v.status]}” (${iso(v.statusSince).slice(0, 10)}). Enter the day it was sold.`);
          await moveVehicleStatus(manager, shopId, vehicleId, { to: 'sold', at: soldAt, note: 'Sold on consignment; settled' }, actor, at);
        } else {
          await saleDateAgreesWithSoldMove(manager, shopId, v, input.soldOn);
        }
        const work = await approvedWork(manager, shopId, v);
        const figures = consignmentSettlement({ salePriceMinor: input.salePriceMinor, commission: commissionOf(terms), work: work.map((w) => ({ label: w.title, amountMinor: w.chargedMinor })) });
        const [first] = (await manager.query(`SELECT MAX(number) AS max FROM consignment_settlements WHERE shop_id = ?`, [shopId])) as Array<{ max: number | null }>;
        const row: ConsignmentSettlementRow = {
          id: randomUUID(),
          shopId,
          number: (first?.max ?? 0) + 1,
          vehicleId: v.id,
          consignorCustomerId: v.customerId,
          soldOn: input.soldOn,
          currency: (await shopBasics(manager, shopId)).currency,
          salePriceMinor: figures.salePriceMinor,
          commissionKind: terms.commissionKind,
          commissionMilliPercent: terms.commissionMilliPercent,
          commissionFixedMinor: terms.commissionFixedMinor,
          commissionMinor: figures.commissionMinor,
          work,
          workMinor: figures.workMinor,
          payoutMinor: figures.payoutMinor,
          note: input.note,
          createdByUserId: actor.userId,
          createdAt: at,
          paidOn: null,
          payoutMethod: null,
          payoutReference: null,
          payoutRecordedByUserId: null,
          payoutRecordedAt: null,
        };
        await manager.insert(ConsignmentSettlementEntity, row);
        await recordAudit(manager, {
          shopId,
          actor,
          action: 'consignment.settled',
          entity: 'consignment_settlement',
          entityId: row.id,
          changes: { vehicle: { before: null, after: v.id }, salePriceMinor: { before: null, after: row.salePriceMinor }, commissionMinor: { before: null, after: row.commissionMinor }, workMinor: { before: null, after: row.workMinor }, payoutMinor: { before: null, after: row.payoutMinor } },
          at,
        });
        return detail(manager, shopId, vehicleId);
      });
    },

    /** Records the payment to the consignor, once. */
    async recordPayout(shopId: string, vehicleId: string, input: PayoutCreate, actor: AuditActor): Promise<ConsignmentVehicle> {
      return db.write(async (manager) => {
        await consignedVehicle(manager, shopId, vehicleId);
        const s = await shopScoped(manager, ConsignmentSettlementEntity, shopId).findOne({ vehicleId });
        if (!s) throw conflict('not_settled', 'Make the settlement before recording the payout.');
        if (s.paidOn) throw conflict('already_paid', `The payout was already recorded on ${s.paidOn}.`);
        if (s.payoutMinor <= 0) throw conflict('nothing_to_pay', 'Nothing is due to the consignor on this settlement.');
        const at = clock.now();
        await manager.update(ConsignmentSettlementEntity, { shopId, id: s.id }, { paidOn: input.paidOn, payoutMethod: input.method, payoutReference: input.reference, payoutRecordedByUserId: actor.userId, payoutRecordedAt: at });
        await recordAudit(manager, { shopId, actor, action: 'consignment.paid_out', entity: 'consignment_settlement', entityId: s.id, changes: { paidOn: { before: null, after: input.paidOn }, method: { before: null, after: input.method }, reference: { before: null, after: input.reference }, amountMinor: { before: null, after: s.payoutMinor } }, at });
        return detail(manager, shopId, vehicleId);
      });
    },

    async pdf(shopId: string, vehicleId: string): Promise<{ filename: string; content: Buffer }> {
      const d = await detail(db.reader, shopId, vehicleId);
      if (!d.settlement) throw conflict('not_settled', 'This vehicle has no settlement yet.');
      const basics = await shopBasics(db.reader, shopId);
      const content = await renderSettlementPdf({ settlement: d.settlement, shopName: basics.shopName, shopAddress: basics.shopAddress, consignorName: d.consignor?.name ?? '', vehicle: d.vehicle, currency: d.currency });
      return { filename: `${d.settlement.reference}.pdf`, content };
    },
  };
}

export type ConsignmentService = ReturnType<typeof createConsignmentService>;

