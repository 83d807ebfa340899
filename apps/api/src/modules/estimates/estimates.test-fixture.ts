import type { Database } from '../../db/write-lock';
import { FakeClock } from '../../lib/clock';
import { createMemoryMailer } from '../../lib/mailer';
import { createJobsService } from '../jobs/jobs.service';
import { localFileStore } from '../uploads/file-store';
import { createEstimatesService } from './estimates.service';

/** Estimates made for route tests; spares are handed out one per call so a write can repeat. */
export interface EstimatesFixture {
  /** A draft on a job assigned to nobody: read, printed, edited, never sent. */
  draftId: string;
  /** The job of `draftId`, for the approval state. */
  jobId: string;
  /** A draft with a line, sent (again) by each call. */
  sendableId: string;
  /** A job with no estimate yet. */
  nextJobId(): string;
  /** An estimate that may be revised (the newest version, alone on its job). */
  nextRevisableId(): string;
}

/**
 * Writes jobs on `vehicleId` (whose customer has an e-mail address) and estimates on them through
 * the services, each with one typed line.
 */
export async function seedEstimatesFixture(db: Database, shopId: string, uploadsDir: string, vehicleId: string, spare = 12): Promise<EstimatesFixture> {
  const clock = new FakeClock();
  const jobs = createJobsService({ db, clock, files: localFileStore(uploadsDir) });
  const estimates = createEstimatesService({ db, clock, mailer: createMemoryMailer(), publicUrl: 'http://tappet.test' });
  const actor = { userId: null };
  const job = async (title: string) => (await jobs.create(shopId, { vehicleId, title, customerRequest: 'Estimate fixture', assigneeIds: [], dueOn: null, notes: null, templateIds: [] }, actor)).id;
  const line = { kind: 'other' as const, partId: null, description: 'Fixture work', quantity: '1', unitPriceMinor: 10_000 };
  const estimate = async (jobId: string) => (await estimates.create(shopId, { jobId, note: null, lines: [line] }, actor)).id;
  const jobId = await job('Estimate fixture draft');
  const draftId = await estimate(jobId);
  const sendableId = await estimate(await job('Estimate fixture to send'));
  const freeJobs: string[] = [];
  const revisable: string[] = [];
  for (let i = 0; i < spare; i++) {
    freeJobs.push(await job(`Estimate fixture free ${i}`));
    revisable.push(await estimate(await job(`Estimate fixture revisable ${i}`)));
  }
  const take = (list: string[], what: string) => () => {
    const next = list.shift();
    if (next === undefined) throw new Error(`The estimates fixture ran out of ${what}.`);
    return next;
  };
  return { draftId, jobId, sendableId, nextJobId: take(freeJobs, 'free jobs'), nextRevisableId: take(revisable, 'revisable estimates') };
}
