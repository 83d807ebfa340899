import { randomUUID } from 'node:crypto';
import { In, type EntityManager } from 'typeorm';
import type { z } from 'zod';
import { builtInTemplates, handOverBlockers, type PressureUnit } from '@tappet/domain';
import {
  defaultShopSettings,
  jobStatusMoves,
  type Checklist,
  type ChecklistTemplate,
  type JobBlocker,
  type JobDetail,
  type JobFile,
  type JobPartLine,
  type JobPartMovement,
  type JobStatus,
  type JobSummary,
  type LabourEntry,
  type SignOff,
  type SpecialOrder,
  type VehicleCosts,
  type jobHoldInputSchema,
  type jobInputSchema,
  type jobIssueInputSchema,
  jobListLimit,
  type jobListQuerySchema,
  type jobReturnInputSchema,
  type jobStatusMoveSchema,
  type jobUpdateSchema,
  type labourInputSchema,
  type signOffInputSchema,
  type specialOrderInputSchema,
  type templateInputSchema,
  type templateUpdateSchema,
} from '@tappet/contracts';
import { shopScoped } from '../../db/tenant-repository';
import type { Database } from '../../db/write-lock';
import type { Clock } from '../../lib/clock';
import { HttpError, notFound } from '../../lib/http-error';
import { diffChanges, recordAudit, type AuditActor } from '../audit/audit.service';
import { PartEntity } from '../catalogue/catalogue.entity';
import { ShopSettingsEntity } from '../settings/settings.entity';
import { MembershipEntity, ShopEntity } from '../shops/shops.entity';
import { HoldEntity, MovementEntity } from '../stock/stock.entity';
import { listHolds } from '../stock/stock.queries';
import { holdStock, issueStock, releaseHold, returnStock, type StockWriteContext } from '../stock/stock.service';
import type { FileStore } from '../uploads/file-store';
import type { PreparedUpload } from '../uploads/upload-pipeline';
import { UserEntity } from '../users/users.entity';
import { VehicleEntity } from '../vehicles/vehicles.entity';
import { checkItemRecord, spreadOf, type RecordItem } from './checklist-rules';
import { renderJobSheetPdf } from './job-sheet-pdf';
import {
  ChecklistItemRecordEntity,
  ChecklistSignOffEntity,
  ChecklistTemplateEntity,
  JobAssigneeEntity,
  JobChecklistEntity,
  JobEntity,
  JobFileEntity,
  JobSpecialOrderEntity,
  LabourEntryEntity,
  type ChecklistItemRecordRow,
  type ChecklistSignOffRow,
  type ChecklistTemplateRow,
  type JobChecklistRow,
  type JobFileRow,
  type JobRow,
} from './jobs.entity';

export type JobCreate = z.output<typeof jobInputSchema>;
export type JobPatch = z.output<typeof jobUpdateSchema>;
export type JobListFilters = z.output<typeof jobListQuerySchema>;
export type JobStatusMoveInput = z.output<typeof jobStatusMoveSchema>;
export type TemplateCreate = z.output<typeof templateInputSchema>;
export type TemplatePatch = z.output<typeof templateUpdateSchema>;
export type SignOffCreate = z.output<typeof signOffInputSchema>;
export type JobHold = z.output<typeof jobHoldInputSchema>;
export type JobIssue = z.output<typeof jobIssueInputSchema>;
export type JobReturn = z.output<typeof jobReturnInputSchema>;
export type SpecialOrderCreate = z.output<typeof specialOrderInputSchema>;
export type LabourCreate = z.output<typeof labourInputSchema>;

type Person = { id: string; name: string };

const noSuchJob = () => notFound('No such job in this shop.');
const noSuchChecklist = () => notFound('No such checklist on this job.');
const conflict = (reason: string, message: string, details: Record<string, unknown> = {}) => new HttpError(409, 'conflict', message, { reason, ...details });
const iso = (d: Date | string) => new Date(d).toISOString();
const closedStatuses: JobStatus[] = ['done', 'cancelled'];

async function jobRow(manager: EntityManager, shopId: string, jobId: string): Promise<JobRow> {
  const row = await shopScoped(manager, JobEntity, shopId).findOne({ id: jobId });
  if (!row) throw noSuchJob();
  return row;
}

/** Refuses anyone who is not an active member of the shop (404: the id means nothing here). */
async function assertMembers(manager: EntityManager, shopId: string, userIds: string[]): Promise<void> {
  if (userIds.length === 0) return;
  const found = await manager.find(MembershipEntity, { where: { shopId, userId: In(userIds), isActive: true } });
  if (found.length !== new Set(userIds).size) throw notFound('No such person in this shop.');
}

/** The ids of the people assigned to a job (what the CASL condition `assigneeIds` looks at). */
export async function assigneeIdsOf(reader: EntityManager, shopId: string, jobId: string): Promise<string[]> {
  const rows = await reader.find(JobAssigneeEntity, { where: { shopId, jobId } });
  return rows.map((r) => r.userId);
}

/** Blockers of the given checklists: safety items failed or unrecorded and not signed off. */
function blockersOf(checklists: JobChecklistRow[], records: ChecklistItemRecordRow[], signOffs: ChecklistSignOffRow[]): JobBlocker[] {
  const out: JobBlocker[] = [];
  for (const c of checklists) {
    const byKey = new Map(records.filter((r) => r.checklistId === c.id).map((r) => [r.itemKey, r]));
    const signed = new Set(signOffs.filter((s) => s.checklistId === c.id).map((s) => s.itemKey));
    const blockers = handOverBlockers(c.items.map((i) => ({ key: i.key, label: i.label, safety: i.safety, result: byKey.get(i.key)?.result ?? null, signedOff: signed.has(i.key) })));
    for (const b of blockers) out.push({ checklistId: c.id, checklistName: c.name, ...b });
  }
  return out;
}

async function checklistState(reader: EntityManager, shopId: string, jobIds: string[]) {
  if (jobIds.length === 0) return { checklists: [], records: [], signOffs: [] };
  const checklists = await reader.find(JobChecklistEntity, { where: { shopId, jobId: In(jobIds) }, order: { createdAt: 'ASC', id: 'ASC' } });
  const ids = checklists.map((c) => c.id);
  const records = ids.length ? await reader.find(ChecklistItemRecordEntity, { where: { shopId, checklistId: In(ids) } }) : [];
  const signOffs = await reader.find(ChecklistSignOffEntity, { where: { shopId, jobId: In(jobIds) } });
  return { checklists, records, signOffs };
}

/**
 * What stops a vehicle being marked ready or handed over: the safety-critical checklist items,
 * on every job of the vehicle that is not cancelled, that are failed or unrecorded and not signed
 * off by the owner. For the vehicles module to call (inside its own db.write, with its manager)
 * before a move to `ready` or `handed_over`; an empty list means nothing blocks.
 */
export async function vehicleHandOverBlockers(manager: EntityManager, shopId: string, vehicleId: string): Promise<Array<JobBlocker & { jobId: string; jobNumber: number }>> {
  const jobs = await manager.find(JobEntity, { where: { shopId, vehicleId } });
  const live = jobs.filter((j) => j.status !== 'cancelled');
  const state = await checklistState(manager, shopId, live.map((j) => j.id));
  const out: Array<JobBlocker & { jobId: string; jobNumber: number }> = [];
  for (const job of live) {
    const checklists = state.checklists.filter((c) => c.jobId === job.id);
    for (const b of blockersOf(checklists, state.records, state.signOffs.filter((s) => s.jobId === job.id))) out.push({ ...b, jobId: job.id, jobNumber: job.number });
  }
  return out;
}

/** A vehicle timeline entry for a job, in the shape of the vehicles module's timeline. */
export interface JobTimelineEntry {
  kind: 'job';
  at: string;
  title: string;
  detail: string | null;
  by: Person | null;
  refId: string;
}

/**
 * The jobs of a vehicle as timeline entries (opened, and done when done), for the vehicles
 * module's timeline. Newest first.
 */
export async function jobTimelineEntries(reader: EntityManager, shopId: string, vehicleId: string): Promise<JobTimelineEntry[]> {
  const jobs = await reader.find(JobEntity, { where: { shopId, vehicleId } });
  const who = await peopleOf(reader, jobs.map((j) => j.createdByUserId));
  const entries: JobTimelineEntry[] = [];
  for (const j of jobs) {
    entries.push({ kind: 'job', at: iso(j.createdAt), title: `Job ${j.number} opened: ${j.title}`, detail: j.customerRequest || null, by: j.createdByUserId ? (who.get(j.createdByUserId) ?? null) : null, refId: j.id });
    if (j.completedAt && j.status === 'done') entries.push({ kind: 'job', at: iso(j.completedAt), title: `Job ${j.number} done: ${j.title}`, detail: null, by: null, refId: j.id });
  }
  return entries.sort((a, b) => b.at.localeCompare(a.at));
}

async function peopleOf(reader: EntityManager, ids: Array<string | null | undefined>): Promise<Map<string, Person>> {
  const wanted = [...new Set(ids.filter((x): x is string => typeof x === 'string'))];
  if (wanted.length === 0) return new Map();
  const rows = await reader.find(UserEntity, { where: { id: In(wanted) }, select: { id: true, name: true } });
  return new Map(rows.map((u) => [u.id, { id: u.id, name: u.name }]));
}

/**
 * Installs Tappet's two shipped templates in a shop that has never had a template. Runs inside
 * the caller's db.write; audited as the system (no actor).
 */
export async function installBuiltInTemplates(manager: EntityManager, shopId: string, at: Date): Promise<boolean> {
  if ((await shopScoped(manager, ChecklistTemplateEntity, shopId).count()) > 0) return false;
  for (const t of builtInTemplates) {
    const id = randomUUID();
    await manager.insert(ChecklistTemplateEntity, { id, shopId, name: t.name, description: t.description, items: t.items, archived: false, createdAt: at, updatedAt: at });
    await recordAudit(manager, { shopId, actor: { userId: null }, action: 'checklist_template.installed', entity: 'checklist_template', entityId: id, changes: { name: { before: null, after: t.name } }, at });
  }
  return true;
}

const toTemplate = (t: ChecklistTemplateRow): ChecklistTemplate => ({ id: t.id, name: t.name, description: t.description, items: t.items, archived: t.archived, updatedAt: iso(t.updatedAt) });

/**
 * Jobs on vehicles, their checklists, parts, labour and photos. Every write goes through the write
 * lock with its audit event; every id (in the URL or the body) is looked up within the shop.
 * Parts move through the stock module's functions inside the same transaction.
 */
export function createJobsService(deps: { db: Database; clock: Clock; files: FileStore }) {
  const { db, clock, files } = deps;
  const stockCtx = (actor: AuditActor): StockWriteContext => ({ actor, at: clock.now() });

  async function openJob(manager: EntityManager, shopId: string, jobId: string): Promise<JobRow> {
    const job = await jobRow(manager, shopId, jobId);
    if (closedStatuses.includes(job.status)) throw conflict('job_closed', `Job ${job.number} is ${job.status === 'done' ? 'done' : 'cancelled'}: reopen it first.`);
    return job;
  }

  async function summaries(shopId: string, rows: JobRow[]): Promise<JobSummary[]> {
    const reader = db.reader;
    const jobIds = rows.map((r) => r.id);
    const vehicleIds = [...new Set(rows.map((r) => r.vehicleId))];
    const vehicles = vehicleIds.length ? await reader.find(VehicleEntity, { where: { shopId, id: In(vehicleIds) } }) : [];
    const vehicleById = new Map(vehicles.map((v) => [v.id, v]));
    const assignees = jobIds.length ? await reader.find(JobAssigneeEntity, { where: { shopId, jobId: In(jobIds) }, order: { assignedAt: 'ASC' } }) : [];
    const who = await peopleOf(reader, assignees.map((a) => a.userId));
    const state = await checklistState(reader, shopId, jobIds);
    return rows.map((r) => {
      const v = vehicleById.get(r.vehicleId);
      const checklists = state.checklists.filter((c) => c.jobId === r.id);
      const records = state.records.filter((x) => checklists.some((c) => c.id === x.checklistId));
      const total = checklists.reduce((n, c) => n + c.items.length, 0);
      return {
        id: r.id,
        number: r.number,
        title: r.title,
        customerRequest: r.customerRequest,
        status: r.status,
        dueOn: r.dueOn,
        vehicle: { id: r.vehicleId, marque: v?.marque ?? '', model: v?.model ?? '', year: v?.year ?? null, frameNumber: v?.frameNumber ?? null },
        assignees: assignees.filter((a) => a.jobId === r.id).map((a) => who.get(a.userId) ?? { id: a.userId, name: '' }),
        progress: { recorded: records.length, total },
        blockerCount: blockersOf(checklists, records, state.signOffs.filter((s) => s.jobId === r.id)).length,
        createdAt: iso(r.createdAt),
        updatedAt: iso(r.updatedAt),
        startedAt: r.startedAt ? iso(r.startedAt) : null,
        completedAt: r.completedAt ? iso(r.completedAt) : null,
      };
    });
  }

  async function detail(shopId: string, jobId: string): Promise<JobDetail> {
    const reader = db.reader;
    const row = await jobRow(reader, shopId, jobId);
    const [summary] = await summaries(shopId, [row]);
    const state = await checklistState(reader, shopId, [jobId]);
    const labourRows = await reader.find(LabourEntryEntity, { where: { shopId, jobId }, order: { workedOn: 'ASC', createdAt: 'ASC' } });
    const orderRows = await reader.find(JobSpecialOrderEntity, { where: { shopId, jobId }, order: { createdAt: 'ASC' } });
    const fileRows = await reader.find(JobFileEntity, { where: { shopId, jobId }, order: { createdAt: 'ASC' } });
    const movementRows = await reader.find(MovementEntity, { where: { shopId, jobId }, order: { seq: 'ASC' } });
    const holdIds = (await reader.find(HoldEntity, { where: { shopId, jobId }, select: { id: true } })).map((h) => h.id);
    const holds = holdIds.length ? await listHolds(reader, shopId, { ids: holdIds }) : [];
    const partIds = [...new Set([...movementRows.map((m) => m.partId), ...orderRows.map((o) => o.partId)])];
    const parts = partIds.length ? await reader.find(PartEntity, { where: { shopId, id: In(partIds) } }) : [];
    const partById = new Map(parts.map((p) => [p.id, p]));
    const who = await peopleOf(reader, [
      row.createdByUserId,
      ...state.records.map((r) => r.recordedByUserId),
      ...state.checklists.map((c) => c.completedByUserId),
      ...state.signOffs.map((s) => s.signedByUserId),
      ...labourRows.map((l) => l.userId),
      ...orderRows.map((o) => o.createdByUserId),
      ...fileRows.map((f) => f.byUserId),
      ...movementRows.map((m) => m.userId),
    ]);
    const person = (id: string | null) => (id ? (who.get(id) ?? null) : null);
    const settings = await reader.findOne(ShopSettingsEntity, { where: { shopId } });

    const checklists: Checklist[] = state.checklists.map((c) => ({
      id: c.id,
      templateId: c.templateId,
      name: c.name,
      items: c.items,
      records: Object.fromEntries(
        state.records
          .filter((r) => r.checklistId === c.id)
          .map((r) => [
            r.itemKey,
            {
              result: r.result,
              note: r.note,
              value: r.value,
              compressionKPa: r.compressionKPa,
              compressionSpreadPercent: spreadOf(r.compressionKPa),
              tyres: r.tyres,
              suggested: r.suggested,
              photoFileId: r.photoFileId,
              recordedBy: person(r.recordedByUserId),
              recordedAt: iso(r.recordedAt),
            },
          ]),
      ),
      completedAt: c.completedAt ? iso(c.completedAt) : null,
      completedBy: person(c.completedByUserId),
      createdAt: iso(c.createdAt),
    }));
    const signOffs: SignOff[] = state.signOffs.map((s) => ({ id: s.id, checklistId: s.checklistId, itemKey: s.itemKey, reason: s.reason, customerToldHow: s.customerToldHow, signedBy: person(s.signedByUserId), signedAt: iso(s.signedAt) }));
    const movements: JobPartMovement[] = movementRows
      .filter((m) => m.kind === 'issued' || m.kind === 'returned')
      .map((m) => ({
        id: m.id,
        kind: m.kind as 'issued' | 'returned',
        partId: m.partId,
        partNumber: partById.get(m.partId)?.number ?? '',
        partDescription: partById.get(m.partId)?.description ?? '',
        binId: m.binId,
        condition: m.condition,
        quantity: -m.quantityDelta,
        costMinor: -m.valueChangeMinor,
        at: iso(m.occurredAt),
        byName: person(m.userId)?.name ?? null,
      }));
    const lines = new Map<string, JobPartLine>();
    for (const m of movements) {
      const line = lines.get(m.partId) ?? { partId: m.partId, partNumber: m.partNumber, partDescription: m.partDescription, quantity: 0, costMinor: 0 };
      line.quantity += m.quantity;
      line.costMinor += m.costMinor;
      lines.set(m.partId, line);
    }
    const partLines = [...lines.values()].filter((l) => l.quantity !== 0 || l.costMinor !== 0);
    const labour: LabourEntry[] = labourRows.map((l) => ({
      id: l.id,
      user: person(l.userId) ?? { id: l.userId, name: '' },
      workedOn: l.workedOn,
      minutes: l.minutes,
      description: l.description,
      rateMinorPerHour: l.rateMinorPerHour,
      costMinor: Math.round((l.minutes * l.rateMinorPerHour) / 60),
      createdAt: iso(l.createdAt),
    }));
    const specialOrders: SpecialOrder[] = orderRows.map((o) => ({
      id: o.id,
      jobId: o.jobId,
      partId: o.partId,
      partNumber: partById.get(o.partId)?.number ?? '',
      partDescription: partById.get(o.partId)?.description ?? '',
      quantity: o.quantity,
      note: o.note,
      status: o.status,
      createdAt: iso(o.createdAt),
      createdBy: person(o.createdByUserId),
    }));
    const filesOut: JobFile[] = fileRows.map((f) => toFile(f, person));
    const partsMinor = partLines.reduce((n, l) => n + l.costMinor, 0);
    const labourMinor = labour.reduce((n, l) => n + l.costMinor, 0);
    return {
      ...summary!,
      notes: row.notes,
      createdBy: person(row.createdByUserId),
      checklists,
      signOffs,
      blockers: blockersOf(state.checklists, state.records, state.signOffs),
      holds,
      movements,
      partLines,
      specialOrders,
      labour,
      files: filesOut,
      cost: { currency: settings?.currency ?? defaultShopSettings.currency, partsMinor, labourMinor, totalMinor: partsMinor + labourMinor, labourMinutes: labour.reduce((n, l) => n + l.minutes, 0) },
      moves: [...jobStatusMoves[row.status]],
    };
  }

  const toFile = (f: JobFileRow, person: (id: string | null) => Person | null): JobFile => ({
    id: f.id,
    originalName: f.originalName,
    mediaType: f.mediaType,
    byteSize: f.byteSize,
    checklistId: f.checklistId,
    itemKey: f.itemKey,
    caption: f.caption,
    uploadedBy: person(f.byUserId),
    createdAt: iso(f.createdAt),
  });

  async function checklistOf(manager: EntityManager, shopId: string, jobId: string, checklistId: string): Promise<JobChecklistRow> {
    const row = await shopScoped(manager, JobChecklistEntity, shopId).findOne({ id: checklistId, jobId });
    if (!row) throw noSuchChecklist();
    return row;
  }

  async function startChecklistIn(manager: EntityManager, shopId: string, job: JobRow, templateId: string, actor: AuditActor, at: Date): Promise<string> {
    const template = await shopScoped(manager, ChecklistTemplateEntity, shopId).findOne({ id: templateId });
    if (!template) throw notFound('No such checklist template in this shop.');
    if (template.archived) throw conflict('template_archived', `The template “${template.name}” is archived.`);
    const id = randomUUID();
    await manager.insert(JobChecklistEntity, { id, shopId, jobId: job.id, templateId: template.id, name: template.name, items: template.items, completedAt: null, completedByUserId: null, createdAt: at });
    await recordAudit(manager, { shopId, actor, action: 'job.checklist_started', entity: 'job', entityId: job.id, changes: { checklist: { before: null, after: { id, name: template.name } } }, at });
    return id;
  }

  return {
    /** The people assigned to a job, for the CASL condition; 404 for a job not in the shop. */
    async assigneeIds(shopId: string, jobId: string): Promise<string[]> {
      await jobRow(db.reader, shopId, jobId);
      return assigneeIdsOf(db.reader, shopId, jobId);
    },

    /** Jobs, newest first: the board (all) or one person's (assignee). Done and cancelled only on request. */
    async list(shopId: string, filters: JobListFilters, callerId: string | null): Promise<{ jobs: JobSummary[]; truncated: boolean }> {
      const qb = db.reader.createQueryBuilder(JobEntity, 'j').where('j.shopId = :shopId', { shopId });
      if (filters.status) qb.andWhere('j.status = :status', { status: filters.status });
      else if (!filters.closed) qb.andWhere('j.status NOT IN (:...closed)', { closed: closedStatuses });
      if (filters.vehicleId) qb.andWhere('j.vehicleId = :vehicleId', { vehicleId: filters.vehicleId });
      const assignee = filters.assignee === 'me' ? callerId : filters.assignee;
      if (filters.assignee) {
        qb.andWhere('EXISTS (SELECT 1 FROM job_assignees a WHERE a.shop_id = j.shop_id AND a.job_id = j.id AND a.user_id = :assignee)', { assignee: assignee ?? '' });
      }
      // One more than the limit, to say whether the list was cut short.
      const rows = await qb.orderBy('j.number', 'DESC').limit(jobListLimit + 1).getMany();
      return { jobs: await summaries(shopId, rows.slice(0, jobListLimit)), truncated: rows.length > jobListLimit };
    },

    detail,

    /** The printable job sheet (PDF), compression in the shop's pressure unit. */
    async sheet(shopId: string, jobId: string): Promise<{ fileName: string; content: Buffer }> {
      const job = await detail(shopId, jobId);
      const shop = await db.reader.findOne(ShopEntity, { where: { id: shopId } });
      const settings = await db.reader.findOne(ShopSettingsEntity, { where: { shopId } });
      const pressureUnit = (settings?.pressureUnit ?? defaultShopSettings.pressureUnit) as PressureUnit;
      const content = await renderJobSheetPdf({ job, shopName: shop?.name ?? '', pressureUnit, printedAt: clock.now() });
      return { fileName: `job-${job.number}.pdf`, content };
    },

    async create(shopId: string, input: JobCreate, actor: AuditActor): Promise<JobDetail> {
      const id = randomUUID();
      await db.write(async (manager) => {
        const vehicle = await shopScoped(manager, VehicleEntity, shopId).findOne({ id: input.vehicleId });
        if (!vehicle) throw notFound('No such vehicle in this shop.');
        await assertMembers(manager, shopId, input.assigneeIds);
        const at = clock.now();
        const [max] = await manager.query<Array<{ n: number | null }>>(`SELECT MAX(number) AS n FROM jobs WHERE shop_id = ?`, [shopId]);
        const number = Number(max?.n ?? 0) + 1;
        const row: JobRow = { id, shopId, number, vehicleId: vehicle.id, title: input.title, customerRequest: input.customerRequest, status: 'open', dueOn: input.dueOn, notes: input.notes, createdByUserId: actor.userId, createdAt: at, updatedAt: at, startedAt: null, completedAt: null };
        await manager.insert(JobEntity, row);
        if (input.assigneeIds.length) await manager.insert(JobAssigneeEntity, input.assigneeIds.map((userId) => ({ shopId, jobId: id, userId, assignedAt: at })));
        await recordAudit(manager, { shopId, actor, action: 'job.created', entity: 'job', entityId: id, changes: { number: { before: null, after: number }, vehicle: { before: null, after: vehicle.id }, title: { before: null, after: input.title }, assignees: { before: null, after: input.assigneeIds } }, at });
        if (input.templateIds.length) await installBuiltInTemplates(manager, shopId, at);
        for (const templateId of input.templateIds) await startChecklistIn(manager, shopId, row, templateId, actor, at);
      });
      return detail(shopId, id);
    },

    async update(shopId: string, jobId: string, patch: JobPatch, actor: AuditActor): Promise<JobDetail> {
      await db.write(async (manager) => {
        const before = await jobRow(manager, shopId, jobId);
        const at = clock.now();
        const { assigneeIds, ...fields } = patch;
        const changes = diffChanges(before, fields);
        if (Object.keys(changes).length) await manager.update(JobEntity, { shopId, id: jobId }, { ...fields, updatedAt: at });
        if (assigneeIds) {
          await assertMembers(manager, shopId, assigneeIds);
          const current = await assigneeIdsOf(manager, shopId, jobId);
          const same = current.length === assigneeIds.length && current.every((u) => assigneeIds.includes(u));
          if (!same) {
            await manager.delete(JobAssigneeEntity, { shopId, jobId });
            if (assigneeIds.length) await manager.insert(JobAssigneeEntity, assigneeIds.map((userId) => ({ shopId, jobId, userId, assignedAt: at })));
            changes['assignees'] = { before: current, after: assigneeIds };
            await manager.update(JobEntity, { shopId, id: jobId }, { updatedAt: at });
          }
        }
        if (Object.keys(changes).length) await recordAudit(manager, { shopId, actor, action: 'job.updated', entity: 'job', entityId: jobId, changes, at });
      });
      return detail(shopId, jobId);
    },

    /**
     * Moves a job to another status. `done` is refused (409, details.blockers) while a
     * safety-critical item is failed or unrecorded and not signed off by the owner.
     */
    async moveStatus(shopId: string, jobId: string, input: JobStatusMoveInput, actor: AuditActor): Promise<JobDetail> {
      await db.write(async (manager) => {
        const job = await jobRow(manager, shopId, jobId);
        if (!jobStatusMoves[job.status].includes(input.to)) throw conflict('status_move', `A job that is ${job.status.replace('_', ' ')} cannot move to ${input.to.replace('_', ' ')}.`, { from: job.status, to: input.to });
        if (input.to === 'done') {
          const state = await checklistState(manager, shopId, [jobId]);
          const blockers = blockersOf(state.checklists, state.records, state.signOffs);
          if (blockers.length) {
            throw conflict('safety_blockers', `${blockers.length} safety-critical item${blockers.length === 1 ? ' is' : 's are'} failed or not recorded. Fix and record ${blockers.length === 1 ? 'it' : 'them'}, or the owner signs off with a reason and a record that the customer was told.`, { blockers });
          }
        }
        const at = clock.now();
        const patch: Partial<JobRow> = { status: input.to, updatedAt: at };
        if (input.to === 'in_progress' && !job.startedAt) patch.startedAt = at;
        if (input.to === 'done') patch.completedAt = at;
        if (job.status === 'done') patch.completedAt = null;
        await manager.update(JobEntity, { shopId, id: jobId }, patch);
        await recordAudit(manager, { shopId, actor, action: 'job.status_changed', entity: 'job', entityId: jobId, changes: { status: { before: job.status, after: input.to }, ...(input.note ? { note: { before: null, after: input.note } } : {}) }, at });
      });
      return detail(shopId, jobId);
    },

    async startChecklist(shopId: string, jobId: string, templateId: string, actor: AuditActor): Promise<JobDetail> {
      await db.write(async (manager) => {
        const job = await openJob(manager, shopId, jobId);
        await startChecklistIn(manager, shopId, job, templateId, actor, clock.now());
      });
      return detail(shopId, jobId);
    },

    /** Records (or re-records) one checklist item; the rules of its kind are checked first. */
    async recordItem(shopId: string, jobId: string, checklistId: string, itemKey: string, input: RecordItem, actor: AuditActor): Promise<JobDetail> {
      await db.write(async (manager) => {
        await openJob(manager, shopId, jobId);
        const checklist = await checklistOf(manager, shopId, jobId, checklistId);
        if (checklist.completedAt) throw conflict('checklist_completed', `“${checklist.name}” was completed: it is kept as it was.`);
        const item = checklist.items.find((i) => i.key === itemKey);
        if (!item) throw notFound('No such item on this checklist.');
        if (input.photoFileId) {
          const photo = await shopScoped(manager, JobFileEntity, shopId).findOne({ id: input.photoFileId, jobId });
          if (!photo) throw notFound('No such photo on this job.');
        }
        const at = clock.now();
        const checked = checkItemRecord(item, input, at);
        const repo = shopScoped(manager, ChecklistItemRecordEntity, shopId);
        const before = await repo.findOne({ checklistId, itemKey });
        const row = { ...checked, photoFileId: input.photoFileId, recordedByUserId: actor.userId, recordedAt: at };
        if (before) await manager.update(ChecklistItemRecordEntity, { shopId, id: before.id }, row);
        else await repo.insert({ id: randomUUID(), checklistId, itemKey, ...row });
        await manager.update(JobEntity, { shopId, id: jobId }, { updatedAt: at });
        await recordAudit(manager, {
          shopId,
          actor,
          action: 'job.checklist_item_recorded',
          entity: 'job',
          entityId: jobId,
          changes: { item: { before: null, after: `${checklist.name}: ${item.label}` }, result: { before: before?.result ?? null, after: checked.result }, ...(checked.suggested ? { suggested: { before: null, after: checked.suggested } } : {}) },
          at,
        });
      });
      return detail(shopId, jobId);
    },

    /** Completes a checklist once every item is recorded: who and when are kept, and it is locked. */
    async completeChecklist(shopId: string, jobId: string, checklistId: string, actor: AuditActor): Promise<JobDetail> {
      await db.write(async (manager) => {
        await openJob(manager, shopId, jobId);
        const checklist = await checklistOf(manager, shopId, jobId, checklistId);
        if (checklist.completedAt) throw conflict('checklist_completed', `“${checklist.name}” is already complete.`);
        const recorded = new Set((await shopScoped(manager, ChecklistItemRecordEntity, shopId).find({ checklistId })).map((r) => r.itemKey));
        const missing = checklist.items.filter((i) => !recorded.has(i.key));
        if (missing.length) throw conflict('items_unrecorded', `${missing.length} item${missing.length === 1 ? ' is' : 's are'} not recorded yet: ${missing.map((i) => i.label).slice(0, 3).join('; ')}${missing.length > 3 ? '…' : ''}.`, { keys: missing.map((i) => i.key) });
        const at = clock.now();
        await manager.update(JobChecklistEntity, { shopId, id: checklistId }, { completedAt: at, completedByUserId: actor.userId });
        await recordAudit(manager, { shopId, actor, action: 'job.checklist_completed', entity: 'job', entityId: jobId, changes: { checklist: { before: null, after: checklist.name } }, at });
      });
      return detail(shopId, jobId);
    },

    /**
     * The owner's sign-off of a safety-critical item that is failed or unrecorded: the reason and
     * how the customer was told are kept, and the item stays shown as unresolved.
     */
    async signOff(shopId: string, jobId: string, input: SignOffCreate, actor: AuditActor): Promise<JobDetail> {
      await db.write(async (manager) => {
        await jobRow(manager, shopId, jobId);
        const checklist = await checklistOf(manager, shopId, jobId, input.checklistId);
        const item = checklist.items.find((i) => i.key === input.itemKey);
        if (!item) throw notFound('No such item on this checklist.');
        if (!item.safety) throw conflict('not_safety_item', 'Only safety-critical items need a sign-off.');
        const record = await shopScoped(manager, ChecklistItemRecordEntity, shopId).findOne({ checklistId: checklist.id, itemKey: item.key });
        if (record && record.result !== 'fail') throw conflict('nothing_to_sign_off', 'This item is recorded and not failed: nothing blocks hand-over.');
        if (await shopScoped(manager, ChecklistSignOffEntity, shopId).findOne({ checklistId: checklist.id, itemKey: item.key })) throw conflict('already_signed_off', 'This item is already signed off.');
        const at = clock.now();
        const id = randomUUID();
        await manager.insert(ChecklistSignOffEntity, { id, shopId, jobId, checklistId: checklist.id, itemKey: item.key, reason: input.reason, customerToldHow: input.customerToldHow, signedByUserId: actor.userId, signedAt: at });
        await recordAudit(manager, { shopId, actor, action: 'job.safety_item_signed_off', entity: 'job', entityId: jobId, changes: { item: { before: null, after: item.label }, state: { before: null, after: record ? 'failed' : 'unrecorded' }, reason: { before: null, after: input.reason }, customerTold: { before: null, after: input.customerToldHow } }, at });
      });
      return detail(shopId, jobId);
    },

    /** Holds free stock for the job (a stock hold carrying the job's id). */
    async holdPart(shopId: string, jobId: string, input: JobHold, actor: AuditActor): Promise<JobDetail> {
      await db.write(async (manager) => {
        const job = await openJob(manager, shopId, jobId);
        await holdStock(manager, shopId, { ...input, purpose: `Job ${job.number}: ${job.title}`.slice(0, 200), jobId: job.id }, stockCtx(actor));
      });
      return detail(shopId, jobId);
    },

    /** Issues stock to the job: from one of the job's holds, or free stock. */
    async issuePart(shopId: string, jobId: string, input: JobIssue, actor: AuditActor): Promise<JobDetail> {
      await db.write(async (manager) => {
        const job = await openJob(manager, shopId, jobId);
        if ('holdId' in input) {
          const hold = await shopScoped(manager, HoldEntity, shopId).findOne({ id: input.holdId, jobId: job.id });
          if (!hold) throw notFound('No such hold for this job.');
          await issueStock(manager, shopId, { partId: hold.partId, binId: hold.binId, condition: hold.condition, quantity: input.quantity, holdId: hold.id, jobId: job.id, reference: `Job ${job.number}` }, stockCtx(actor));
        } else {
          await issueStock(manager, shopId, { ...input, jobId: job.id, reference: `Job ${job.number}` }, stockCtx(actor));
        }
      });
      return detail(shopId, jobId);
    },

    /** Returns parts from the job to a bin; never more than the job has of that part and condition. */
    async returnPart(shopId: string, jobId: string, input: JobReturn, actor: AuditActor): Promise<JobDetail> {
      await db.write(async (manager) => {
        const job = await openJob(manager, shopId, jobId);
        const moved = await manager.find(MovementEntity, { where: { shopId, jobId: job.id, partId: input.partId, condition: input.condition } });
        const onJob = moved.filter((m) => m.kind === 'issued' || m.kind === 'returned').reduce((n, m) => n - m.quantityDelta, 0);
        if (input.quantity > onJob) throw conflict('more_than_issued', onJob === 0 ? 'None of this part in that condition was issued to this job.' : `Only ${onJob} of this part in that condition are on this job.`, { onJob });
        const issues = moved.filter((m) => m.kind === 'issued');
        const issuedQty = issues.reduce((n, m) => n - m.quantityDelta, 0);
        // Back at the average cost it left at, so the job's cost falls by what it was charged.
        const unitCostMinor = issuedQty > 0 ? Math.round(issues.reduce((n, m) => n - m.valueChangeMinor, 0) / issuedQty) : undefined;
        await returnStock(manager, shopId, { ...input, jobId: job.id, reference: `Job ${job.number}`, ...(unitCostMinor === undefined ? {} : { unitCostMinor }) }, stockCtx(actor));
      });
      return detail(shopId, jobId);
    },

    /** Releases one of the job's holds: the stock is free again. */
    async releasePartHold(shopId: string, jobId: string, holdId: string, actor: AuditActor): Promise<JobDetail> {
      await db.write(async (manager) => {
        const job = await jobRow(manager, shopId, jobId);
        const hold = await shopScoped(manager, HoldEntity, shopId).findOne({ id: holdId, jobId: job.id });
        if (!hold) throw notFound('No such hold for this job.');
        await releaseHold(manager, shopId, hold.id, stockCtx(actor));
      });
      return detail(shopId, jobId);
    },

    /**
     * Records a part the job needs that is not in stock. Purchasing reads the open ones
     * (`openSpecialOrders`) onto its reorder list, marked for the job.
     */
    async addSpecialOrder(shopId: string, jobId: string, input: SpecialOrderCreate, actor: AuditActor): Promise<JobDetail> {
      await db.write(async (manager) => {
        const job = await openJob(manager, shopId, jobId);
        const part = await shopScoped(manager, PartEntity, shopId).findOne({ id: input.partId });
        if (!part) throw notFound('No such part in this shop.');
        const at = clock.now();
        const id = randomUUID();
        await manager.insert(JobSpecialOrderEntity, { id, shopId, jobId: job.id, partId: part.id, quantity: input.quantity, note: input.note, status: 'open', createdByUserId: actor.userId, createdAt: at, updatedAt: at });
        await recordAudit(manager, { shopId, actor, action: 'job.special_order_added', entity: 'job', entityId: job.id, changes: { part: { before: null, after: part.number }, quantity: { before: null, after: input.quantity } }, at });
      });
      return detail(shopId, jobId);
    },

    /** Records time on the job at the shop's current labour rate. */
    async addLabour(shopId: string, jobId: string, input: LabourCreate, actor: AuditActor): Promise<JobDetail> {
      await db.write(async (manager) => {
        const job = await openJob(manager, shopId, jobId);
        await assertMembers(manager, shopId, [input.userId]);
        const settings = await manager.findOne(ShopSettingsEntity, { where: { shopId } });
        const at = clock.now();
        const id = randomUUID();
        const rate = settings?.labourRateMinorPerHour ?? defaultShopSettings.labourRateMinorPerHour;
        await manager.insert(LabourEntryEntity, { id, shopId, jobId: job.id, userId: input.userId, workedOn: input.workedOn, minutes: input.minutes, description: input.description, rateMinorPerHour: rate, createdByUserId: actor.userId, createdAt: at });
        await recordAudit(manager, { shopId, actor, action: 'job.labour_added', entity: 'job', entityId: job.id, changes: { labour: { before: null, after: { id, user: input.userId, workedOn: input.workedOn, minutes: input.minutes, rateMinorPerHour: rate } } }, at });
      });
      return detail(shopId, jobId);
    },

    /** The person a labour entry is for (404 when it is not on this job). */
    async labourUserOf(shopId: string, jobId: string, entryId: string): Promise<string> {
      const row = await shopScoped(db.reader, LabourEntryEntity, shopId).findOne({ id: entryId, jobId });
      if (!row) throw notFound('No such labour entry on this job.');
      return row.userId;
    },

    async removeLabour(shopId: string, jobId: string, entryId: string, actor: AuditActor): Promise<JobDetail> {
      await db.write(async (manager) => {
        await openJob(manager, shopId, jobId);
        const row = await shopScoped(manager, LabourEntryEntity, shopId).findOne({ id: entryId, jobId });
        if (!row) throw notFound('No such labour entry on this job.');
        await manager.delete(LabourEntryEntity, { shopId, id: entryId });
        await recordAudit(manager, { shopId, actor, action: 'job.labour_removed', entity: 'job', entityId: jobId, changes: { labour: { before: { id: row.id, user: row.userId, workedOn: row.workedOn, minutes: row.minutes }, after: null } }, at: clock.now() });
      });
      return detail(shopId, jobId);
    },

    async assertJob(shopId: string, jobId: string): Promise<void> {
      await jobRow(db.reader, shopId, jobId);
    },

    /** Stores photos of a job (through the shared upload pipeline and file store), optionally of one checklist item. */
    async addFiles(shopId: string, jobId: string, uploads: PreparedUpload[], fields: { checklistId?: string | undefined; itemKey?: string | undefined; caption: string | null }, actor: AuditActor): Promise<JobFile[]> {
      const job = await jobRow(db.reader, shopId, jobId);
      if (fields.checklistId) {
        const checklist = await checklistOf(db.reader, shopId, jobId, fields.checklistId);
        if (fields.itemKey && !checklist.items.some((i) => i.key === fields.itemKey)) throw notFound('No such item on this checklist.');
      } else if (fields.itemKey) {
        throw new HttpError(400, 'validation_failed', 'Give the checklist of the item too.', [{ path: ['checklistId'], message: 'Give the checklist of the item too.' }]);
      }
      const at = clock.now();
      const rows: JobFileRow[] = uploads.map((u) => {
        const id = randomUUID();
        const base = `${shopId}/jobs/${job.id}/${id}`;
        return {
          id,
          shopId,
          jobId: job.id,
          checklistId: fields.checklistId ?? null,
          itemKey: fields.itemKey ?? null,
          originalName: u.originalName,
          mediaType: u.mediaType,
          byteSize: u.data.length,
          storageKey: `${base}.${u.extension}`,
          thumbnailKey: u.thumbnail ? `${base}.thumb.jpg` : null,
          caption: fields.caption,
          byUserId: actor.userId,
          createdAt: at,
        };
      });
      const written: string[] = [];
      try {
        for (const [i, u] of uploads.entries()) {
          const row = rows[i]!;
          await files.put(row.storageKey, u.data);
          written.push(row.storageKey);
          if (row.thumbnailKey && u.thumbnail) {
            await files.put(row.thumbnailKey, u.thumbnail);
            written.push(row.thumbnailKey);
          }
        }
        await db.write(async (manager) => {
          await jobRow(manager, shopId, jobId);
          await manager.insert(JobFileEntity, rows);
          for (const row of rows) await recordAudit(manager, { shopId, actor, action: 'job.file_added', entity: 'job', entityId: jobId, changes: { file: { before: null, after: { id: row.id, name: row.originalName, item: row.itemKey } } }, at });
        });
      } catch (err) {
        // Bytes without a row are removed, so a failed upload leaves nothing behind.
        for (const key of written) await files.remove(key).catch(() => undefined);
        throw err;
      }
      const who = await peopleOf(db.reader, [actor.userId]);
      return rows.map((r) => toFile(r, (id) => (id ? (who.get(id) ?? null) : null)));
    },

    async readFile(shopId: string, jobId: string, fileId: string, variant: 'original' | 'thumbnail'): Promise<{ row: JobFileRow; data: Buffer }> {
      const row = await shopScoped(db.reader, JobFileEntity, shopId).findOne({ id: fileId, jobId });
      if (!row) throw notFound('No such file on this job.');
      const key = variant === 'thumbnail' ? row.thumbnailKey : row.storageKey;
      if (!key) throw notFound('This file has no thumbnail.');
      try {
        return { row, data: await files.read(key) };
      } catch {
        throw notFound('The stored file is missing. Upload it again.');
      }
    },

    // ── Templates ──

    /** The shop's templates; a shop that never had one gets Tappet's two first. */
    async listTemplates(shopId: string): Promise<{ templates: ChecklistTemplate[] }> {
      if ((await shopScoped(db.reader, ChecklistTemplateEntity, shopId).count()) === 0) {
        await db.write((manager) => installBuiltInTemplates(manager, shopId, clock.now()));
      }
      const rows = await shopScoped(db.reader, ChecklistTemplateEntity, shopId).find({}, { archived: 'ASC', name: 'ASC' });
      return { templates: rows.map(toTemplate) };
    },

    async createTemplate(shopId: string, input: TemplateCreate, actor: AuditActor): Promise<ChecklistTemplate> {
      const id = randomUUID();
      const at = clock.now();
      await db.write(async (manager) => {
        await installBuiltInTemplates(manager, shopId, at);
        await manager.insert(ChecklistTemplateEntity, { id, shopId, name: input.name, description: input.description, items: input.items, archived: false, createdAt: at, updatedAt: at });
        await recordAudit(manager, { shopId, actor, action: 'checklist_template.created', entity: 'checklist_template', entityId: id, changes: { name: { before: null, after: input.name }, items: { before: null, after: input.items.length } }, at });
      });
      const row = await shopScoped(db.reader, ChecklistTemplateEntity, shopId).findOneOr404({ id });
      return toTemplate(row);
    },

    /** Changes a template. Checklists already started keep the items they were started with. */
    async updateTemplate(shopId: string, templateId: string, patch: TemplatePatch, actor: AuditActor): Promise<ChecklistTemplate> {
      await db.write(async (manager) => {
        const before = await shopScoped(manager, ChecklistTemplateEntity, shopId).findOneOr404({ id: templateId }, 'No such checklist template in this shop.');
        const at = clock.now();
        const changes = diffChanges({ name: before.name, description: before.description, archived: before.archived }, { name: patch.name, description: patch.description, archived: patch.archived });
        if (patch.items) changes['items'] = { before: before.items.length, after: patch.items.length };
        await manager.update(ChecklistTemplateEntity, { shopId, id: templateId }, { ...patch, updatedAt: at } as never);
        await recordAudit(manager, { shopId, actor, action: 'checklist_template.updated', entity: 'checklist_template', entityId: templateId, changes, at });
      });
      return toTemplate(await shopScoped(db.reader, ChecklistTemplateEntity, shopId).findOneOr404({ id: templateId }));
    },
  };
}

/**
 * What a vehicle has cost the shop: the cost of every job on it (parts at the cost they left stock
 * at, net of returns; labour at the rate each entry was booked at, rounded per entry as on the
 * job) plus, for shop stock, the acquisition cost; and the margin against the asking price. The
 * caller has looked the vehicle up within the shop.
 */
export async function vehicleCosts(reader: EntityManager, shopId: string, vehicle: { id: string; kind: string; acquisitionCostMinor: number | null; askingPriceMinor: number | null }): Promise<VehicleCosts> {
  const jobs = await reader.find(JobEntity, { where: { shopId, vehicleId: vehicle.id }, order: { number: 'ASC' } });
  const jobIds = jobs.map((j) => j.id);
  const parts = new Map<string, number>();
  const labour = new Map<string, number>();
  if (jobIds.length) {
    const moved = await reader.find(MovementEntity, { where: { shopId, jobId: In(jobIds), kind: In(['issued', 'returned']) }, select: { jobId: true, valueChangeMinor: true } });
    for (const m of moved) if (m.jobId) parts.set(m.jobId, (parts.get(m.jobId) ?? 0) - m.valueChangeMinor);
    const entries = await reader.find(LabourEntryEntity, { where: { shopId, jobId: In(jobIds) }, select: { jobId: true, minutes: true, rateMinorPerHour: true } });
    for (const l of entries) labour.set(l.jobId, (labour.get(l.jobId) ?? 0) + Math.round((l.minutes * l.rateMinorPerHour) / 60));
  }
  const perJob = jobs.map((j) => {
    const partsMinor = parts.get(j.id) ?? 0;
    const labourMinor = labour.get(j.id) ?? 0;
    return { jobId: j.id, number: j.number, title: j.title, status: j.status, partsMinor, labourMinor, totalMinor: partsMinor + labourMinor };
  });
  const settings = await reader.findOne(ShopSettingsEntity, { where: { shopId } });
  const jobsMinor = perJob.reduce((n, j) => n + j.totalMinor, 0);
  const acquisition = vehicle.kind === 'shop_stock' ? vehicle.acquisitionCostMinor : null;
  const totalCostMinor = (acquisition ?? 0) + jobsMinor;
  const asking = vehicle.askingPriceMinor;
  const marginMinor = asking !== null && acquisition !== null ? asking - totalCostMinor : null;
  return {
    vehicleId: vehicle.id,
    kind: vehicle.kind,
    currency: settings?.currency ?? defaultShopSettings.currency,
    acquisitionCostMinor: acquisition,
    askingPriceMinor: asking,
    jobs: perJob,
    jobsMinor,
    totalCostMinor,
    marginMinor,
    marginPercent: marginMinor !== null && asking ? Math.round((marginMinor / asking) * 1000) / 10 : null,
  };
}

/**
 * Open special orders of a shop (parts jobs need that are not in stock), oldest first: the hook
 * for purchasing's reorder list. Each names its job so the order can be marked for it.
 */
export async function openSpecialOrders(reader: EntityManager, shopId: string): Promise<Array<{ id: string; jobId: string; jobNumber: number; partId: string; quantity: number; createdAt: Date }>> {
  const rows = await reader.query<Array<{ id: string; jobId: string; jobNumber: number; partId: string; quantity: number; createdAt: string }>>(
    `SELECT o.id, o.job_id AS jobId, j.number AS jobNumber, o.part_id AS partId, o.quantity, o.created_at AS createdAt
       FROM job_special_orders o JOIN jobs j ON j.shop_id = o.shop_id AND j.id = o.job_id
      WHERE o.shop_id = ? AND o.status = 'open' ORDER BY o.created_at, o.id`,
    [shopId],
  );
  return rows.map((r) => ({ ...r, createdAt: new Date(r.createdAt) }));
}

/**
 * Moves a special order on (ordered, received, cancelled) inside the caller's db.write: for
 * purchasing to call when it orders or receives the part. 404 for an order not in the shop.
 */
export async function setSpecialOrderStatus(manager: EntityManager, shopId: string, orderId: string, status: 'open' | 'ordered' | 'received' | 'cancelled', actor: AuditActor, at: Date): Promise<void> {
  const row = await shopScoped(manager, JobSpecialOrderEntity, shopId).findOne({ id: orderId });
  if (!row) throw notFound('No such special order in this shop.');
  await manager.update(JobSpecialOrderEntity, { shopId, id: orderId }, { status, updatedAt: at });
  await recordAudit(manager, { shopId, actor, action: 'job.special_order_status', entity: 'job', entityId: row.jobId, changes: { status: { before: row.status, after: status } }, at });
}

export type JobsService = ReturnType<typeof createJobsService>;
