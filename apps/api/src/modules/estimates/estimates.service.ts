import { randomUUID } from 'node:crypto';
import { In, IsNull, type EntityManager } from 'typeorm';
import type { z } from 'zod';
import { documentTotals, type DocumentTotals, type TaxRounding } from '@tappet/domain';
import type {
  approveEstimateSchema,
  createEstimateSchema,
  declineEstimateSchema,
  Estimate,
  EstimateLine,
  EstimateStatus,
  estimateLineInputSchema,
  JobApprovalState,
  PublicEstimate,
  PublicEstimateDecision,
  sendEstimateSchema,
  updateEstimateSchema,
} from '@tappet/contracts';
import { shopScoped } from '../../db/tenant-repository';
import type { Database } from '../../db/write-lock';
import type { Clock } from '../../lib/clock';
import { HttpError, badRequest, notFound } from '../../lib/http-error';
import type { Mailer } from '../../lib/mailer';
import { hashToken, newToken } from '../../lib/tokens';
import { recordAudit, type AuditActor } from '../audit/audit.service';
import { PartEntity } from '../catalogue/catalogue.entity';
import { CustomerEntity } from '../customers/customers.entity';
import { JobAssigneeEntity, JobEntity, type JobRow } from '../jobs/jobs.entity';
import { sellPricesFor } from '../sales/pricing.service';
import { shopBasics, taxRoundingFor } from '../sales/sales.settings';
import { VehicleEntity, type VehicleRow } from '../vehicles/vehicles.entity';
import { EstimateEntity, EstimateLineEntity, EstimateLinkEntity, type EstimateLineRow, type EstimateRow } from './estimates.entity';
import { renderEstimatePdf } from './estimate-pdf';
import { jobValue } from './job-value';

export type EstimateCreate = z.output<typeof createEstimateSchema>;
export type EstimatePatch = z.output<typeof updateEstimateSchema>;
export type EstimateLineIn = z.output<typeof estimateLineInputSchema>;
export type EstimateSend = z.output<typeof sendEstimateSchema>;
export type EstimateApprove = z.output<typeof approveEstimateSchema>;
export type EstimateDecline = z.output<typeof declineEstimateSchema>;

const noSuchEstimate = () => notFound('No such estimate in this shop.');
const iso = (d: Date | string) => new Date(d).toISOString();
const conflict = (reason: string, message: string) => new HttpError(409, 'conflict', message, { reason });
/** A link that exists but can no longer be used: 410 with the reason, nothing changed. */
const gone = (reason: 'link_expired' | 'link_used' | 'link_replaced', message: string) => new HttpError(410, 'conflict', message, { reason });

/** "EST-000012", and "EST-000012-v2" for a revision. */
export const estimateReference = (number: number, version: number) => `EST-${String(number).padStart(6, '0')}${version > 1 ? `-v${version}` : ''}`;
export const vehicleLabel = (v: Pick<VehicleRow, 'year' | 'marque' | 'model'>) => [v.year, v.marque, v.model].filter(Boolean).join(' ');

/** Estimates whose lines may still change. */
const editable: EstimateStatus[] = ['draft'];

async function jobOf(manager: EntityManager, shopId: string, jobId: string): Promise<JobRow> {
  return shopScoped(manager, JobEntity, shopId).findOneOr404({ id: jobId }, 'No such job in this shop.');
}

/** Ids of the people assigned to a job (for the mechanic's read rule). */
export async function jobAssigneeIds(manager: EntityManager, shopId: string, jobId: string): Promise<string[]> {
  return (await manager.find(JobAssigneeEntity, { where: { shopId, jobId } })).map((a) => a.userId);
}

/**
 * The approval state of a job: the latest approved estimate's amount against the newest estimate
 * and the job's actual value at sell prices now (parts issued, labour recorded, tax included).
 * Work beyond the approved amount needs a new approval: `overApproved` says when.
 */
export async function jobApprovalState(manager: EntityManager, shopId: string, jobId: string): Promise<JobApprovalState> {
  await jobOf(manager, shopId, jobId);
  const rows = await manager.find(EstimateEntity, { where: { shopId, jobId }, order: { number: 'DESC', version: 'DESC' } });
  const approvedRow = rows.filter((r) => r.status === 'approved').sort((a, b) => +new Date(b.decidedAt ?? 0) - +new Date(a.decidedAt ?? 0))[0] ?? null;
  const latestRow = rows.find((r) => r.status !== 'superseded') ?? null;
  const value = await jobValue(manager, shopId, jobId);
  const approved = approvedRow
    ? { estimateId: approvedRow.id, reference: estimateReference(approvedRow.number, approvedRow.version), version: approvedRow.version, amountMinor: approvedRow.approvedAmountMinor ?? approvedRow.grossMinor, at: iso(approvedRow.decidedAt ?? approvedRow.updatedAt) }
    : null;
  const latest = latestRow ? { estimateId: latestRow.id, reference: estimateReference(latestRow.number, latestRow.version), version: latestRow.version, status: latestRow.status, grossMinor: latestRow.grossMinor } : null;
  const actualGrossMinor = value.totals.grossMinor;
  const overApproved = approved !== null && (actualGrossMinor > approved.amountMinor || (latest !== null && latest.estimateId !== approved.estimateId && latest.grossMinor > approved.amountMinor));
  return { jobId, currency: value.currency, approved, latest, actualGrossMinor, overApproved };
}

type PricedLine = Omit<EstimateLineRow, 'id' | 'shopId' | 'estimateId'>;

/**
 * Prices the lines of an estimate: a part without a typed price takes its sell price from the
 * shop's pricing rules (sellPricesFor), labour the shop's rate per hour, and every line the
 * standard tax rate unless given; totals through documentTotals under the shop's tax rounding.
 */
async function priceLines(manager: EntityManager, shopId: string, input: readonly EstimateLineIn[]): Promise<{ lines: PricedLine[]; totals: DocumentTotals; rounding: TaxRounding; currency: string }> {
  const basics = await shopBasics(manager, shopId);
  const rounding = await taxRoundingFor(manager, shopId);
  const partIds = [...new Set(input.filter((l) => l.partId).map((l) => l.partId!))];
  const parts = partIds.length ? await manager.find(PartEntity, { where: { shopId, id: In(partIds) } }) : [];
  if (parts.length !== partIds.length) throw notFound('No such part in this shop.');
  const prices = partIds.length ? await sellPricesFor(manager, shopId, partIds) : new Map();
  const drafts = input.map((l, i) => {
    let unitPriceMinor = l.unitPriceMinor;
    let priceBasis = 'typed';
    if (unitPriceMinor === undefined) {
      if (l.kind === 'part') {
        const price = l.partId ? prices.get(l.partId) : undefined;
        if (!price || price.unitMinor === null) throw new HttpError(400, 'validation_failed', 'This part has no sell price yet: type a unit price.', [{ path: ['lines', i, 'unitPriceMinor'], message: 'No list price or cost to price it from: type a unit price.' }]);
        unitPriceMinor = price.unitMinor;
        priceBasis = price.basis;
      } else if (l.kind === 'labour') {
        unitPriceMinor = basics.labourRateMinorPerHour;
        priceBasis = 'labour-rate';
      } else {
        throw new HttpError(400, 'validation_failed', 'Give a unit price.', [{ path: ['lines', i, 'unitPriceMinor'], message: 'Give a unit price.' }]);
      }
    }
    return { kind: l.kind, partId: l.kind === 'part' ? l.partId : null, description: l.description, quantity: l.quantity, unitPriceMinor: unitPriceMinor as number, priceBasis, taxRatePercent: l.taxRatePercent ?? basics.standardTaxRatePercent };
  });
  const totals = documentTotals(drafts, rounding);
  const lines = drafts.map((d, i) => ({ ...d, position: i + 1, ...totals.lines[i]! }));
  return { lines, totals, rounding, currency: basics.currency };
}

/** Replaces the lines of an estimate. */
async function writeLines(manager: EntityManager, shopId: string, estimateId: string, lines: PricedLine[]) {
  await manager.delete(EstimateLineEntity, { shopId, estimateId });
  if (lines.length) await manager.insert(EstimateLineEntity, lines.map((l) => ({ ...l, id: randomUUID(), shopId, estimateId })));
}

/**
 * Drafts an estimate for a job inside the caller's write (the service and the demo seed): lines
 * priced by priceLines, the next number of the shop, the vehicle's customer as the customer.
 */
export async function createEstimateInTx(manager: EntityManager, shopId: string, input: EstimateCreate, actor: AuditActor, at: Date): Promise<EstimateRow> {
  const job = await jobOf(manager, shopId, input.jobId);
  const open = await manager.findOne(EstimateEntity, { where: { shopId, jobId: job.id, status: In(['draft', 'sent']) } });
  if (open) throw conflict('open_estimate', `This job already has estimate ${estimateReference(open.number, open.version)} in progress: change or revise that one.`);
  const vehicle = await shopScoped(manager, VehicleEntity, shopId).findOneOr404({ id: job.vehicleId });
  const priced = await priceLines(manager, shopId, input.lines);
  const [first] = (await manager.query(`SELECT MAX(number) AS max FROM estimates WHERE shop_id = ?`, [shopId])) as Array<{ max: number | null }>;
  const row: EstimateRow = {
    id: randomUUID(),
    shopId,
    number: (first?.max ?? 0) + 1,
    version: 1,
    jobId: job.id,
    customerId: vehicle.customerId,
    status: 'draft',
    currency: priced.currency,
    taxRounding: priced.rounding,
    note: input.note,
    netMinor: priced.totals.netMinor,
    taxMinor: priced.totals.taxMinor,
    grossMinor: priced.totals.grossMinor,
    taxByRate: JSON.stringify(priced.totals.taxByRate),
    sentAt: null,
    sentTo: null,
    decidedAt: null,
    decidedByName: null,
    approvedAmountMinor: null,
    declineReason: null,
    createdByUserId: actor.userId,
    createdAt: at,
    updatedAt: at,
  };
  await manager.insert(EstimateEntity, row);
  await writeLines(manager, shopId, row.id, priced.lines);
  await recordAudit(manager, { shopId, actor, action: 'estimate.created', entity: 'estimate', entityId: row.id, changes: { job: { before: null, after: job.id }, gross: { before: null, after: row.grossMinor } }, at });
  return row;
}

export function createEstimatesService(deps: { db: Database; clock: Clock; mailer: Mailer; publicUrl: string; onMailError?: (err: unknown) => void }) {
  const { db, clock, mailer } = deps;

  async function estimateRow(manager: EntityManager, shopId: string, estimateId: string): Promise<EstimateRow> {
    const row = await shopScoped(manager, EstimateEntity, shopId).findOne({ id: estimateId });
    if (!row) throw noSuchEstimate();
    return row;
  }

  async function view(manager: EntityManager, shopId: string, row: EstimateRow): Promise<Estimate> {
    // One after another: inside a write on PostgreSQL they share one client, which must not run
    // two queries at once (pg warns now and will refuse in its next major version).
    const job = await jobOf(manager, shopId, row.jobId);
    const lines = await manager.find(EstimateLineEntity, { where: { shopId, estimateId: row.id }, order: { position: 'ASC' } });
    const link = await manager.findOne(EstimateLinkEntity, { where: { shopId, estimateId: row.id }, order: { createdAt: 'DESC' } });
    const vehicle = await shopScoped(manager, VehicleEntity, shopId).findOne({ id: job.vehicleId });
    const customer = row.customerId ? await shopScoped(manager, CustomerEntity, shopId).findOne({ id: row.customerId }) : null;
    const partIds = lines.filter((l) => l.partId).map((l) => l.partId!);
    const parts = partIds.length ? await manager.find(PartEntity, { where: { shopId, id: In(partIds) } }) : [];
    const numberOf = new Map(parts.map((p) => [p.id, p.number]));
    return {
      id: row.id,
      number: row.number,
      version: row.version,
      reference: estimateReference(row.number, row.version),
      jobId: job.id,
      jobNumber: job.number,
      jobTitle: job.title,
      vehicle: vehicle ? vehicleLabel(vehicle) : '',
      customerId: row.customerId,
      customerName: customer?.name ?? null,
      customerEmail: customer?.email ?? null,
      status: row.status,
      currency: row.currency,
      taxRounding: row.taxRounding,
      note: row.note,
      lines: lines.map(
        (l): EstimateLine => ({
          id: l.id,
          kind: l.kind,
          partId: l.partId,
          partNumber: l.partId ? (numberOf.get(l.partId) ?? null) : null,
          description: l.description,
          quantity: l.quantity,
          unitPriceMinor: l.unitPriceMinor,
          priceBasis: l.priceBasis,
          taxRatePercent: Number(l.taxRatePercent),
          netMinor: l.netMinor,
          taxMinor: l.taxMinor,
          grossMinor: l.grossMinor,
        }),
      ),
      netMinor: row.netMinor,
      taxMinor: row.taxMinor,
      grossMinor: row.grossMinor,
      taxByRate: JSON.parse(row.taxByRate) as Estimate['taxByRate'],
      sentAt: row.sentAt ? iso(row.sentAt) : null,
      sentTo: row.sentTo,
      linkExpiresAt: link && !link.revokedAt ? iso(link.expiresAt) : null,
      decidedAt: row.decidedAt ? iso(row.decidedAt) : null,
      decidedByName: row.decidedByName,
      approvedAmountMinor: row.approvedAmountMinor,
      declineReason: row.declineReason,
      createdAt: iso(row.createdAt),
      updatedAt: iso(row.updatedAt),
    };
  }

  /** Finds the link of a token (by its hash) and refuses one that cannot be used. Changes nothing. */
  async function usableLink(manager: EntityManager, token: string) {
    const link = await manager.findOne(EstimateLinkEntity, { where: { tokenHash: hashToken(token) } });
    if (!link) throw notFound('This link is not valid. Ask the shop to send the estimate again.');
    if (link.usedAt) throw gone('link_used', 'This link has already been used. Ask the shop if you need to change your answer.');
    if (link.revokedAt) throw gone('link_replaced', 'This estimate has been replaced by a newer one: use the link in the latest e-mail.');
    if (new Date(link.expiresAt).getTime() <= clock.now().getTime()) throw gone('link_expired', 'This link has expired. Ask the shop to send the estimate again.');
    const estimate = await manager.findOne(EstimateEntity, { where: { shopId: link.shopId, id: link.estimateId } });
    if (!estimate || estimate.status !== 'sent') throw gone('link_replaced', 'This estimate is no longer waiting for an answer.');
    return { link, estimate };
  }

  return {
    /** The assignees of a job of the shop (404 for any other job), for the read rule. */
    async jobAssigneeIds(shopId: string, jobId: string): Promise<string[]> {
      await jobOf(db.reader, shopId, jobId);
      return jobAssigneeIds(db.reader, shopId, jobId);
    },
    approvalState: (shopId: string, jobId: string) => jobApprovalState(db.reader, shopId, jobId),

    /** Estimates of the shop, or of one job (404 for a job not in the shop), newest first. */
    async list(shopId: string, filter: { jobId?: string }): Promise<Estimate[]> {
      const reader = db.reader;
      if (filter.jobId) await jobOf(reader, shopId, filter.jobId);
      const jobIds = filter.jobId ? [filter.jobId] : undefined;
      const rows = await reader.find(EstimateEntity, { where: { shopId, ...(jobIds ? { jobId: In(jobIds) } : {}) }, order: { number: 'DESC', version: 'DESC' } });
      return Promise.all(rows.map((r) => view(reader, shopId, r)));
    },

    async get(shopId: string, estimateId: string): Promise<{ estimate: Estimate; assigneeIds: string[] }> {
      const row = await estimateRow(db.reader, shopId, estimateId);
      return { estimate: await view(db.reader, shopId, row), assigneeIds: await jobAssigneeIds(db.reader, shopId, row.jobId) };
    },

    async create(shopId: string, input: EstimateCreate, actor: AuditActor): Promise<Estimate> {
      return db.write(async (manager) => view(manager, shopId, await createEstimateInTx(manager, shopId, input, actor, clock.now())));
    },

    async update(shopId: string, estimateId: string, patch: EstimatePatch, actor: AuditActor): Promise<Estimate> {
      return db.write(async (manager) => {
        const row = await estimateRow(manager, shopId, estimateId);
        if (!editable.includes(row.status)) throw conflict('not_draft', 'Only a draft estimate can be changed: revise it to make a new version.');
        const at = clock.now();
        const changes: Partial<EstimateRow> = { updatedAt: at };
        if (patch.note !== undefined) changes.note = patch.note;
        if (patch.lines !== undefined) {
          const priced = await priceLines(manager, shopId, patch.lines);
          await writeLines(manager, shopId, row.id, priced.lines);
          Object.assign(changes, { netMinor: priced.totals.netMinor, taxMinor: priced.totals.taxMinor, grossMinor: priced.totals.grossMinor, taxByRate: JSON.stringify(priced.totals.taxByRate), taxRounding: priced.rounding });
        }
        await manager.update(EstimateEntity, { shopId, id: row.id }, changes);
        await recordAudit(manager, { shopId, actor, action: 'estimate.updated', entity: 'estimate', entityId: row.id, changes: { gross: { before: row.grossMinor, after: changes.grossMinor ?? row.grossMinor }, ...(patch.lines ? { lines: { before: null, after: patch.lines.length } } : {}) }, at });
        return view(manager, shopId, { ...row, ...changes });
      });
    },

    /**
     * Sends (or sends again) an estimate: a new single-use link valid for `linkValidDays` (older
     * links of the estimate stop working), then the PDF by e-mail after the commit.
     */
    async send(shopId: string, estimateId: string, input: EstimateSend, actor: AuditActor): Promise<{ estimate: Estimate; emailed: boolean }> {
      const token = newToken();
      const { estimate, to, expiresAt } = await db.write(async (manager) => {
        const row = await estimateRow(manager, shopId, estimateId);
        if (row.status !== 'draft' && row.status !== 'sent') throw conflict('not_sendable', `This estimate is ${row.status}: revise it to send a new version.`);
        const lineCount = await manager.count(EstimateLineEntity, { where: { shopId, estimateId: row.id } });
        if (lineCount === 0) throw conflict('no_lines', 'Add at least one line before sending the estimate.');
        const customer = row.customerId ? await shopScoped(manager, CustomerEntity, shopId).findOne({ id: row.customerId }) : null;
        const to = input.email ?? customer?.email ?? null;
        if (!to) throw badRequest('The customer has no e-mail address on record: give one to send the estimate to.', [{ path: ['email'], message: 'Give an e-mail address.' }]);
        const at = clock.now();
        const expiresAt = new Date(at.getTime() + input.linkValidDays * 86_400_000);
        await manager.update(EstimateLinkEntity, { shopId, estimateId: row.id, revokedAt: IsNull(), usedAt: IsNull() }, { revokedAt: at });
        await manager.insert(EstimateLinkEntity, { id: randomUUID(), shopId, estimateId: row.id, tokenHash: hashToken(token), expiresAt, usedAt: null, revokedAt: null, createdAt: at });
        await manager.update(EstimateEntity, { shopId, id: row.id }, { status: 'sent', sentAt: at, sentTo: to, updatedAt: at });
        await recordAudit(manager, { shopId, actor, action: 'estimate.sent', entity: 'estimate', entityId: row.id, changes: { status: { before: row.status, after: 'sent' }, sentTo: { before: row.sentTo, after: to }, linkExpiresAt: { before: null, after: expiresAt.toISOString() } }, at });
        return { estimate: await view(manager, shopId, { ...row, status: 'sent', sentAt: at, sentTo: to, updatedAt: at }), to, expiresAt };
      });
      const url = `${deps.publicUrl}/estimate-approval#${token}`;
      let emailed = false;
      try {
        const basics = await shopBasics(db.reader, shopId);
        const pdf = await renderEstimatePdf({ ...estimate, shopName: basics.shopName, shopAddress: basics.shopAddress, date: clock.now(), approvalUrl: url, linkExpiresAt: expiresAt });
        const money = new Intl.NumberFormat('en-GB', { style: 'currency', currency: estimate.currency });
        await mailer.send({
          to,
          subject: `Estimate ${estimate.reference} from ${basics.shopName}`,
          text: [
            `Hello${estimate.customerName ? ` ${estimate.customerName}` : ''},`,
            '',
            `Please find estimate ${estimate.reference} for "${estimate.jobTitle}" on your ${estimate.vehicle} attached: ${money.format(estimate.grossMinor / 100)} including tax.`,
            '',
            'To approve or decline it, open this link (it works once, until ' + expiresAt.toISOString().slice(0, 10) + '):',
            url,
            '',
            basics.shopName,
          ].join('\n'),
          attachments: [{ filename: `${estimate.reference}.pdf`, content: pdf, contentType: 'application/pdf' }],
        });
        emailed = true;
      } catch (err) {
        deps.onMailError?.(err);
      }
      return { estimate, emailed };
    },

    /**
     * A new version of an estimate, as a draft with the same lines re-priced at today's prices
     * where they were not typed. A draft or sent estimate is superseded (its link stops working);
     * an approved one stays the job's approval until the new version is approved.
     */
    async revise(shopId: string, estimateId: string, actor: AuditActor): Promise<Estimate> {
      return db.write(async (manager) => {
        const row = await estimateRow(manager, shopId, estimateId);
        const newest = await manager.findOne(EstimateEntity, { where: { shopId, number: row.number }, order: { version: 'DESC' } });
        if (newest && newest.id !== row.id) throw conflict('not_latest', `Revise the newest version, ${estimateReference(newest.number, newest.version)}.`);
        const open = await manager.findOne(EstimateEntity, { where: { shopId, jobId: row.jobId, status: In(['draft', 'sent']) } });
        if (open && open.id !== row.id) throw conflict('open_estimate', `This job already has estimate ${estimateReference(open.number, open.version)} in progress.`);
        const old = await manager.find(EstimateLineEntity, { where: { shopId, estimateId: row.id }, order: { position: 'ASC' } });
        const priced = await priceLines(
          manager,
          shopId,
          old.map((l) => ({ kind: l.kind, partId: l.partId, description: l.description, quantity: l.quantity, unitPriceMinor: l.priceBasis === 'typed' ? l.unitPriceMinor : undefined, taxRatePercent: Number(l.taxRatePercent) })),
        );
        const at = clock.now();
        if (row.status === 'draft' || row.status === 'sent') {
          await manager.update(EstimateEntity, { shopId, id: row.id }, { status: 'superseded', updatedAt: at });
          await manager.update(EstimateLinkEntity, { shopId, estimateId: row.id, revokedAt: IsNull(), usedAt: IsNull() }, { revokedAt: at });
        }
        const next: EstimateRow = {
          ...row,
          id: randomUUID(),
          version: row.version + 1,
          status: 'draft',
          currency: priced.currency,
          taxRounding: priced.rounding,
          netMinor: priced.totals.netMinor,
          taxMinor: priced.totals.taxMinor,
          grossMinor: priced.totals.grossMinor,
          taxByRate: JSON.stringify(priced.totals.taxByRate),
          sentAt: null,
          sentTo: null,
          decidedAt: null,
          decidedByName: null,
          approvedAmountMinor: null,
          declineReason: null,
          createdByUserId: actor.userId,
          createdAt: at,
          updatedAt: at,
        };
        await manager.insert(EstimateEntity, next);
        await writeLines(manager, shopId, next.id, priced.lines);
        await recordAudit(manager, { shopId, actor, action: 'estimate.revised', entity: 'estimate', entityId: next.id, changes: { revises: { before: null, after: row.id }, version: { before: row.version, after: next.version } }, at });
        return view(manager, shopId, next);
      });
    },

    async pdf(shopId: string, estimateId: string): Promise<{ filename: string; content: Buffer; assigneeIds: string[] }> {
      const row = await estimateRow(db.reader, shopId, estimateId);
      const estimate = await view(db.reader, shopId, row);
      const basics = await shopBasics(db.reader, shopId);
      const content = await renderEstimatePdf({ ...estimate, shopName: basics.shopName, shopAddress: basics.shopAddress, date: new Date(row.updatedAt), approvalUrl: null, linkExpiresAt: null });
      return { filename: `${estimate.reference}.pdf`, content, assigneeIds: await jobAssigneeIds(db.reader, shopId, row.jobId) };
    },

    /** What the customer's link shows. Refuses unknown, used, replaced or expired links. */
    async publicView(token: string): Promise<PublicEstimate> {
      const { link, estimate: row } = await usableLink(db.reader, token);
      const estimate = await view(db.reader, row.shopId, row);
      const basics = await shopBasics(db.reader, row.shopId);
      return {
        shopName: basics.shopName,
        reference: estimate.reference,
        version: estimate.version,
        jobTitle: estimate.jobTitle,
        vehicle: estimate.vehicle,
        customerName: estimate.customerName,
        currency: estimate.currency,
        note: estimate.note,
        lines: estimate.lines.map(({ kind, description, quantity, unitPriceMinor, taxRatePercent, netMinor, taxMinor, grossMinor }) => ({ kind, description, quantity, unitPriceMinor, taxRatePercent, netMinor, taxMinor, grossMinor })),
        netMinor: estimate.netMinor,
        taxMinor: estimate.taxMinor,
        grossMinor: estimate.grossMinor,
        taxByRate: estimate.taxByRate,
        expiresAt: iso(link.expiresAt),
      };
    },

    /**
     * The customer approves through the link: the version and total they saw must match the
     * estimate, and the link is used up. Records the time, the approved amount and the version.
     */
    async approve(input: EstimateApprove, ip: string | null): Promise<PublicEstimateDecision> {
      return db.write(async (manager) => {
        const { link, estimate } = await usableLink(manager, input.token);
        if (input.version !== estimate.version || input.grossMinor !== estimate.grossMinor) throw conflict('estimate_changed', 'The estimate has changed since you opened it: reload the page to see the current one.');
        const at = clock.now();
        await manager.update(EstimateLinkEntity, { id: link.id }, { usedAt: at });
        await manager.update(EstimateEntity, { shopId: estimate.shopId, id: estimate.id }, { status: 'approved', decidedAt: at, decidedByName: input.name, approvedAmountMinor: estimate.grossMinor, updatedAt: at });
        await recordAudit(manager, {
          shopId: estimate.shopId,
          actor: { userId: null, ip },
          action: 'estimate.approved',
          entity: 'estimate',
          entityId: estimate.id,
          changes: { status: { before: 'sent', after: 'approved' }, approvedAmountMinor: { before: null, after: estimate.grossMinor }, version: { before: null, after: estimate.version }, approvedBy: { before: null, after: input.name } },
          at,
        });
        return { status: 'approved', reference: estimateReference(estimate.number, estimate.version), version: estimate.version, decidedAt: at.toISOString(), approvedAmountMinor: estimate.grossMinor };
      });
    },

    async decline(input: EstimateDecline, ip: string | null): Promise<PublicEstimateDecision> {
      return db.write(async (manager) => {
        const { link, estimate } = await usableLink(manager, input.token);
        const at = clock.now();
        await manager.update(EstimateLinkEntity, { id: link.id }, { usedAt: at });
        await manager.update(EstimateEntity, { shopId: estimate.shopId, id: estimate.id }, { status: 'declined', decidedAt: at, declineReason: input.reason, updatedAt: at });
        await recordAudit(manager, { shopId: estimate.shopId, actor: { userId: null, ip }, action: 'estimate.declined', entity: 'estimate', entityId: estimate.id, changes: { status: { before: 'sent', after: 'declined' }, reason: { before: null, after: input.reason } }, at });
        return { status: 'declined', reference: estimateReference(estimate.number, estimate.version), version: estimate.version, decidedAt: at.toISOString(), approvedAmountMinor: null };
      });
    },
  };
}

export type EstimatesService = ReturnType<typeof createEstimatesService>;
