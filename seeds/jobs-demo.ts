/* eslint-disable @nx/enforce-module-boundaries -- the seed writes through the API's own data layer
   (entities, stock functions, jobs rules); see docs/decisions/002-module-boundaries.md. */
import { randomUUID } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import type { JobStatus, TemplateItem } from '@tappet/contracts';
import { recordAudit } from '../apps/api/src/modules/audit/audit.service';
import { holdStock, issueStock } from '../apps/api/src/modules/stock/stock.service';
import { StockLineEntity } from '../apps/api/src/modules/stock/stock.entity';
import { VehicleEntity, type VehicleRow } from '../apps/api/src/modules/vehicles/vehicles.entity';
import { checkItemRecord, type RecordItem } from '../apps/api/src/modules/jobs/checklist-rules';
import { installBuiltInTemplates } from '../apps/api/src/modules/jobs/jobs.service';
import {
  ChecklistItemRecordEntity,
  ChecklistSignOffEntity,
  ChecklistTemplateEntity,
  JobAssigneeEntity,
  JobChecklistEntity,
  JobEntity,
  JobSpecialOrderEntity,
  LabourEntryEntity,
  type JobRow,
} from '../apps/api/src/modules/jobs/jobs.entity';

type Answer = Partial<RecordItem> & { result: RecordItem['result'] };
const answer = (a: Answer): RecordItem => ({ note: null, value: null, compression: null, tyres: null, photoFileId: null, ...a });

/**
 * Jobs at each stage on the demo vehicles of one shop (inside the caller's write, after the
 * vehicles and stock seeds): an open job, one in progress with parts held and issued, one waiting
 * for parts with a failed brake item and a special order, a done pre-sale inspection with a
 * completed checklist, and a cancelled one. Checklist readings go through the same rules as the
 * API (compression stored in kPa, tyre age from DOT codes).
 */
export async function seedJobsDemo(manager: EntityManager, shopId: string, people: { owner: string; mechanic: string }, at: Date): Promise<void> {
  const daysAgo = (n: number, hour = 10) => new Date(Date.UTC(at.getUTCFullYear(), at.getUTCMonth(), at.getUTCDate() - n, hour, 15));
  await installBuiltInTemplates(manager, shopId, daysAgo(60));
  const templates = await manager.find(ChecklistTemplateEntity, { where: { shopId } });
  const recommissioning = templates.find((t) => t.name.startsWith('Recommissioning'))!;
  const preSale = templates.find((t) => t.name.startsWith('Pre-sale'))!;
  const vehicles = await manager.find(VehicleEntity, { where: { shopId }, order: { createdAt: 'ASC' } });
  const pick = (statuses: string[], skip: VehicleRow[] = []) => vehicles.find((v) => statuses.includes(v.status) && !skip.includes(v)) ?? vehicles.find((v) => !skip.includes(v)) ?? vehicles[0];
  if (vehicles.length === 0) return;
  const lines = (await manager.find(StockLineEntity, { where: { shopId } })).filter((l) => l.onHand - l.held >= 3);
  let number = 0;

  async function job(vehicle: VehicleRow, p: { title: string; request: string; status: JobStatus; opened: number; assignees: string[]; notes?: string }): Promise<JobRow> {
    number += 1;
    const row: JobRow = {
      id: randomUUID(),
      shopId,
      number,
      vehicleId: vehicle.id,
      title: p.title,
      customerRequest: p.request,
      status: p.status,
      dueOn: daysAgo(-7).toISOString().slice(0, 10),
      notes: p.notes ?? null,
      createdByUserId: people.owner,
      createdAt: daysAgo(p.opened, 9),
      updatedAt: daysAgo(Math.max(0, p.opened - 2)),
      startedAt: p.status === 'open' ? null : daysAgo(p.opened - 1),
      completedAt: p.status === 'done' ? daysAgo(Math.max(0, p.opened - 3)) : null,
    };
    await manager.insert(JobEntity, row);
    for (const userId of p.assignees) await manager.insert(JobAssigneeEntity, { shopId, jobId: row.id, userId, assignedAt: row.createdAt });
    await recordAudit(manager, { shopId, actor: { userId: people.owner }, action: 'job.created', entity: 'job', entityId: row.id, changes: { number: { before: null, after: number }, title: { before: null, after: p.title } }, at: row.createdAt });
    return row;
  }

  async function checklist(j: JobRow, template: { id: string; name: string; items: TemplateItem[] }, answers: Record<string, Answer>, done: boolean): Promise<string> {
    const id = randomUUID();
    const when = daysAgo(1);
    await manager.insert(JobChecklistEntity, { id, shopId, jobId: j.id, templateId: template.id, name: template.name, items: template.items, completedAt: done ? when : null, completedByUserId: done ? people.mechanic : null, createdAt: j.createdAt });
    for (const item of template.items) {
      const a = answers[item.key];
      if (!a) continue;
      const checked = checkItemRecord(item, answer(a), at);
      await manager.insert(ChecklistItemRecordEntity, { id: randomUUID(), shopId, checklistId: id, itemKey: item.key, ...checked, photoFileId: null, recordedByUserId: people.mechanic, recordedAt: when });
    }
    await recordAudit(manager, { shopId, actor: { userId: people.mechanic }, action: 'job.checklist_started', entity: 'job', entityId: j.id, changes: { checklist: { before: null, after: template.name } }, at: j.createdAt });
    return id;
  }

  async function labour(j: JobRow, minutes: number, description: string, days: number) {
    await manager.insert(LabourEntryEntity, { id: randomUUID(), shopId, jobId: j.id, userId: people.mechanic, workedOn: daysAgo(days).toISOString().slice(0, 10), minutes, description, rateMinorPerHour: 6000, createdByUserId: people.mechanic, createdAt: daysAgo(days, 17) });
  }

  const ok: Answer = { result: 'ok' };
  const used: VehicleRow[] = [];
  const take = (statuses: string[]) => {
    const v = pick(statuses, used)!;
    used.push(v);
    return v;
  };

  // 1. Waiting for parts: brake hydraulics failed, aged tyres, a special order for the caliper seals.
  const waiting = await job(take(['in_work']), { title: 'Recommissioning after twelve years in a barn', request: 'Get it running and safe to ride again; it was laid up dry in 2013.', status: 'waiting_parts', opened: 12, assignees: [people.mechanic], notes: 'Front caliper pistons seized; seals ordered.' });
  await checklist(
    waiting,
    recommissioning,
    {
      'fuel-tank': { result: 'advise', note: 'Light surface rust inside; flushed. Suggest a tank liner at some point.' },
      'fuel-taps-lines': ok,
      carburettors: ok,
      hoses: { result: 'fail', note: 'Breather hose cracked through; replaced from stock.' },
      'manifold-rubbers': { result: 'advise', note: 'Hardening, no cracks yet.' },
      'brake-fluid': { result: 'fail', note: 'Fluid dark and thick; glycol type per the cap.' },
      'brake-hydraulics': { result: 'fail', note: 'Front caliper pistons seized. Waiting for the seal kit.' },
      'tyre-age': { result: 'fail', tyres: [{ position: 'Front', code: 'DOT 8K4P 3412' }, { position: 'Rear', code: 'DOT 8K4P 268' }], note: 'Both tyres well past ten years; rear predates 2000.' },
      compression: { result: 'ok', compression: { unit: 'psi', readings: [138, 131] } },
      ignition: ok,
    },
    false,
  );
  await labour(waiting, 150, 'Drained tank, stripped and cleaned carburettors', 10);
  await labour(waiting, 60, 'Brake strip-down and assessment', 8);
  const seal = lines[0];
  if (seal) {
    await manager.insert(JobSpecialOrderEntity, { id: randomUUID(), shopId, jobId: waiting.id, partId: seal.partId, quantity: 2, note: 'Caliper seal kit, front pair', status: 'open', createdByUserId: people.mechanic, createdAt: daysAgo(8), updatedAt: daysAgo(8) });
  }

  // 2. In progress, parts held and one issued.
  const inProgress = await job(take(['in_work', 'assessing']), { title: 'Recommissioning and service', request: 'Service after winter storage and check the brakes.', status: 'in_progress', opened: 5, assignees: [people.mechanic] });
  await checklist(inProgress, recommissioning, { 'fuel-tank': ok, 'fuel-taps-lines': ok, 'tyre-age': { result: 'ok', tyres: [{ position: 'Front', code: '1224' }, { position: 'Rear', code: '1124' }] }, compression: { result: 'ok', compression: { unit: 'psi', readings: [142, 140, 139, 141] } } }, false);
  await labour(inProgress, 90, 'Oil, filter and plugs', 3);
  const ctx = { actor: { userId: people.mechanic }, at: daysAgo(3) };
  const heldLine = lines[1] ?? lines[0];
  if (heldLine) {
    const hold = await holdStock(manager, shopId, { partId: heldLine.partId, binId: heldLine.binId, condition: heldLine.condition, quantity: 2, purpose: `Job ${inProgress.number}: ${inProgress.title}`, jobId: inProgress.id }, ctx);
    await issueStock(manager, shopId, { partId: heldLine.partId, binId: heldLine.binId, condition: heldLine.condition, quantity: 1, holdId: hold.id, jobId: inProgress.id, reference: `Job ${inProgress.number}` }, ctx);
  }

  // 3. Done: a pre-sale inspection, completed; one brake item was failed, then signed off by the owner.
  const done = await job(take(['ready', 'sold', 'handed_over']), { title: 'Pre-sale inspection', request: 'Inspect before listing for sale.', status: 'done', opened: 20, assignees: [people.mechanic] });
  const preSaleAnswers: Record<string, Answer> = Object.fromEntries(preSale.items.map((i) => [i.key, ok]));
  preSaleAnswers['tyre-age'] = { result: 'ok', tyres: [{ position: 'Front', code: '3123' }, { position: 'Rear', code: '3023' }] };
  preSaleAnswers['compression'] = { result: 'ok', compression: { unit: 'psi', readings: [128, 126] } };
  preSaleAnswers['cosmetics'] = { result: 'advise', note: 'Small chip on the tank; seat cover faded.' };
  preSaleAnswers['brakes'] = { result: 'fail', note: 'Rear drum linings thin; buyer to decide on relining.' };
  const preSaleId = await checklist(done, preSale, preSaleAnswers, true);
  await manager.insert(ChecklistSignOffEntity, { id: randomUUID(), shopId, jobId: done.id, checklistId: preSaleId, itemKey: 'brakes', reason: 'Sold as a project for trailer collection; relining quoted separately.', customerToldHow: 'Told the buyer in person and in writing on the sale note.', signedByUserId: people.owner, signedAt: daysAgo(17) });
  await labour(done, 120, 'Pre-sale inspection and road test', 18);

  // 4. Open, not started.
  await job(take(['arrived', 'assessing']), { title: 'Assess electrics', request: 'Lights flicker over bumps; horn dead.', status: 'open', opened: 1, assignees: [people.mechanic] });

  // 5. Cancelled.
  await job(take(['arrived', 'handed_over', 'in_work']), { title: 'Carburettor balance', request: 'Customer withdrew the request.', status: 'cancelled', opened: 30, assignees: [] });
}
