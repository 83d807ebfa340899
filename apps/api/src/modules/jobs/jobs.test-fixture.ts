import sharp from 'sharp';
import type { Database } from '../../db/write-lock';
import { FakeClock } from '../../lib/clock';
import { localFileStore } from '../uploads/file-store';
import { prepareUpload } from '../uploads/upload-pipeline';
import { createJobsService } from './jobs.service';

/** Ids of jobs made for route tests; spares are handed out one per call so a write can repeat. */
export interface JobsFixture {
  /** A job assigned to nobody (so a mechanic is refused), with one recommissioning checklist. */
  jobId: string;
  checklistId: string;
  /** A small template of one item, which the owner may edit. */
  templateId: string;
  photoId: string;
  png: Buffer;
  /** An open job, for a status move. */
  nextOpenJobId(): string;
  /** A safety-critical item still unrecorded, for a sign-off. */
  nextSignOff(): { jobId: string; checklistId: string; itemKey: string };
  /** A checklist on `jobId` whose only item is recorded, for completing. */
  nextCompletableChecklistId(): string;
  /** An active hold for `jobId`. */
  nextHoldId(): string;
  /** A labour entry on `jobId`. */
  nextLabourId(): string;
}

/**
 * Writes jobs on `vehicleId` through the jobs service: a main job with checklists, holds,
 * issued stock (so returns can be sampled), labour and a photo. `partId`/`binId` must hold free
 * stock of condition `new` (the stock fixture's bin A does).
 */
export async function seedJobsFixture(db: Database, shopId: string, uploadsDir: string, refs: { vehicleId: string; partId: string; binId: string; userId: string }, spare = 14): Promise<JobsFixture> {
  const jobs = createJobsService({ db, clock: new FakeClock(), files: localFileStore(uploadsDir) });
  const actor = { userId: null };
  const { templates } = await jobs.listTemplates(shopId);
  const recommissioning = templates.find((t) => t.name.startsWith('Recommissioning'))!;
  const small = await jobs.createTemplate(shopId, { name: 'Fixture template', description: '', items: [{ key: 'look', section: 'All', label: 'Look it over', guidance: null, kind: 'check', safety: false, cautions: [], unit: null, min: null, max: null, outsideFails: false }] }, actor);
  const open = (title: string, templateIds: string[] = []) => jobs.create(shopId, { vehicleId: refs.vehicleId, title, customerRequest: 'Fixture', assigneeIds: [], dueOn: null, notes: null, templateIds }, actor);

  const main = await open('Fixture job', [recommissioning.id]);
  const checklistId = main.checklists[0]!.id;
  const openJobs: string[] = [];
  for (let i = 0; i < spare; i++) openJobs.push((await open(`Fixture open ${i}`)).id);
  const signOffs: Array<{ jobId: string; checklistId: string; itemKey: string }> = [];
  const safetyKeys = recommissioning.items.filter((i) => i.safety).map((i) => i.key);
  for (let i = 0; i < Math.ceil(spare / safetyKeys.length); i++) {
    const job = await open(`Fixture sign-off ${i}`, [recommissioning.id]);
    for (const itemKey of safetyKeys) signOffs.push({ jobId: job.id, checklistId: job.checklists[0]!.id, itemKey });
  }
  const completable: string[] = [];
  for (let i = 0; i < spare; i++) {
    const detail = await jobs.startChecklist(shopId, main.id, small.id, actor);
    const c = detail.checklists.find((x) => x.templateId === small.id && !completable.includes(x.id))!;
    await jobs.recordItem(shopId, main.id, c.id, 'look', { result: 'ok', note: null, value: null, compression: null, tyres: null, photoFileId: null }, actor);
    completable.push(c.id);
  }
  const holds: string[] = [];
  for (let i = 0; i < spare; i++) {
    const detail = await jobs.holdPart(shopId, main.id, { partId: refs.partId, binId: refs.binId, condition: 'new', quantity: 1 }, actor);
    holds.push(detail.holds.find((h) => h.status === 'active' && !holds.includes(h.id))!.id);
  }
  await jobs.issuePart(shopId, main.id, { partId: refs.partId, binId: refs.binId, condition: 'new', quantity: 50 }, actor);
  const labour: string[] = [];
  for (let i = 0; i < spare; i++) {
    const detail = await jobs.addLabour(shopId, main.id, { userId: refs.userId, workedOn: '2026-01-15', minutes: 30, description: `Fixture labour ${i}` }, actor);
    labour.push(detail.labour.find((l) => l.description === `Fixture labour ${i}`)!.id);
  }
  const png = await sharp({ create: { width: 40, height: 30, channels: 3, background: '#775533' } }).png().toBuffer();
  const [photo] = await jobs.addFiles(shopId, main.id, [await prepareUpload({ buffer: png, originalname: 'fixture.png' })], { caption: null }, actor);

  const take = <T>(list: T[], what: string) => () => {
    const next = list.shift();
    if (next === undefined) throw new Error(`The jobs fixture ran out of ${what}.`);
    return next;
  };
  return {
    jobId: main.id,
    checklistId,
    templateId: small.id,
    photoId: photo!.id,
    png,
    nextOpenJobId: take(openJobs, 'open jobs'),
    nextSignOff: take(signOffs, 'sign-off items'),
    nextCompletableChecklistId: take(completable, 'completable checklists'),
    nextHoldId: take(holds, 'holds'),
    nextLabourId: take(labour, 'labour entries'),
  };
}
