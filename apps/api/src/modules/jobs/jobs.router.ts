import { Router, type Request, type Response } from 'express';
import {
  checklistItemParamsSchema,
  checklistParamsSchema,
  holdParamsSchema,
  jobFileFieldsSchema,
  jobFileParamsSchema,
  jobHoldInputSchema,
  jobIdParamsSchema,
  jobInputSchema,
  jobIssueInputSchema,
  jobListQuerySchema,
  jobReturnInputSchema,
  jobStatusMoveSchema,
  jobUpdateSchema,
  labourInputSchema,
  labourParamsSchema,
  recordItemSchema,
  shopIdParamsSchema,
  signOffInputSchema,
  specialOrderInputSchema,
  startChecklistSchema,
  templateIdParamsSchema,
  templateInputSchema,
  templateUpdateSchema,
} from '@tappet/contracts';
import type { Action } from '@tappet/permissions';
import { auditActorOf } from '../../middleware/authenticate';
import { authorize, shopOf } from '../../middleware/tenant-context';
import { bodyOf, validate } from '../../middleware/validate';
import { memoryUpload, vehicleUploadLimits, type UploadLimits } from '../uploads/upload-middleware';
import { prepareUpload, UploadRejected, type PreparedUpload } from '../uploads/upload-pipeline';
import { contentDisposition } from '../vehicles/vehicles.router';
import type { JobListFilters, JobsService } from './jobs.service';

const ids = (req: Request) => ({ shopId: shopOf(req).shop.id, jobId: req.params['jobId'] as string });
const callerId = (req: Request) => auditActorOf(req).userId;

/**
 * /api/shops/:shopId/jobs (behind requireAuth and tenantContext). Everyone in the shop reads;
 * the owner creates jobs and assigns people; a mechanic changes, holds and issues only on jobs
 * they are assigned to (the CASL condition on `assigneeIds`); only the owner signs off a
 * safety-critical item.
 */
export function jobsRouter(deps: { jobs: JobsService; uploadLimits?: UploadLimits }): Router {
  const { jobs } = deps;
  const router = Router({ mergeParams: true });
  const upload = memoryUpload('files', deps.uploadLimits ?? vehicleUploadLimits);

  /** Loads the job's assignees (404 for a job not in the shop) and checks `action` against them. */
  async function authorizeOnJob(req: Request, action: Action): Promise<void> {
    const { shopId, jobId } = ids(req);
    const assigneeIds = await jobs.assigneeIds(shopId, jobId);
    authorize(req, action, 'Job', { assigneeIds });
  }

  router.get('/', validate({ params: shopIdParamsSchema, query: jobListQuerySchema }), async (req, res) => {
    authorize(req, 'read', 'Job');
    res.json(await jobs.list(shopOf(req).shop.id, req.query as unknown as JobListFilters, callerId(req)));
  });

  router.post('/', validate({ params: shopIdParamsSchema, body: jobInputSchema }), async (req, res) => {
    authorize(req, 'create', 'Job');
    res.status(201).json(await jobs.create(shopOf(req).shop.id, bodyOf(jobInputSchema, req), auditActorOf(req)));
  });

  router.get('/:jobId', validate({ params: jobIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Job');
    const { shopId, jobId } = ids(req);
    res.json(await jobs.detail(shopId, jobId));
  });

  router.get('/:jobId/sheet.pdf', validate({ params: jobIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Job');
    const { shopId, jobId } = ids(req);
    const sheet = await jobs.sheet(shopId, jobId);
    res.setHeader('Content-Type', 'application/pdf');
    res.setHeader('Content-Disposition', contentDisposition('inline', sheet.fileName));
    res.setHeader('X-Content-Type-Options', 'nosniff');
    res.setHeader('Cache-Control', 'private, no-store');
    res.send(sheet.content);
  });

  router.patch('/:jobId', validate({ params: jobIdParamsSchema, body: jobUpdateSchema }), async (req, res) => {
    await authorizeOnJob(req, 'update');
    const body = bodyOf(jobUpdateSchema, req);
    // Who works on a job is decided by whoever hands out work (the owner), not by the assignee.
    if (body.assigneeIds) authorize(req, 'create', 'Job');
    const { shopId, jobId } = ids(req);
    res.json(await jobs.update(shopId, jobId, body, auditActorOf(req)));
  });

  router.post('/:jobId/status', validate({ params: jobIdParamsSchema, body: jobStatusMoveSchema }), async (req, res) => {
    await authorizeOnJob(req, 'update');
    const { shopId, jobId } = ids(req);
    res.json(await jobs.moveStatus(shopId, jobId, bodyOf(jobStatusMoveSchema, req), auditActorOf(req)));
  });

  router.post('/:jobId/checklists', validate({ params: jobIdParamsSchema, body: startChecklistSchema }), async (req, res) => {
    await authorizeOnJob(req, 'update');
    const { shopId, jobId } = ids(req);
    res.status(201).json(await jobs.startChecklist(shopId, jobId, bodyOf(startChecklistSchema, req).templateId, auditActorOf(req)));
  });

  router.put('/:jobId/checklists/:checklistId/items/:itemKey', validate({ params: checklistItemParamsSchema, body: recordItemSchema }), async (req, res) => {
    await authorizeOnJob(req, 'update');
    const { shopId, jobId } = ids(req);
    res.json(await jobs.recordItem(shopId, jobId, req.params['checklistId'] as string, req.params['itemKey'] as string, bodyOf(recordItemSchema, req), auditActorOf(req)));
  });

  router.post('/:jobId/checklists/:checklistId/complete', validate({ params: checklistParamsSchema }), async (req, res) => {
    await authorizeOnJob(req, 'update');
    const { shopId, jobId } = ids(req);
    res.json(await jobs.completeChecklist(shopId, jobId, req.params['checklistId'] as string, auditActorOf(req)));
  });

  router.post('/:jobId/sign-offs', validate({ params: jobIdParamsSchema, body: signOffInputSchema }), async (req, res) => {
    await authorizeOnJob(req, 'signOff');
    const { shopId, jobId } = ids(req);
    res.status(201).json(await jobs.signOff(shopId, jobId, bodyOf(signOffInputSchema, req), auditActorOf(req)));
  });

  router.post('/:jobId/parts/holds', validate({ params: jobIdParamsSchema, body: jobHoldInputSchema }), async (req, res) => {
    await authorizeOnJob(req, 'hold');
    authorize(req, 'hold', 'Stock');
    const { shopId, jobId } = ids(req);
    res.status(201).json(await jobs.holdPart(shopId, jobId, bodyOf(jobHoldInputSchema, req), auditActorOf(req)));
  });

  router.post('/:jobId/parts/holds/:holdId/release', validate({ params: holdParamsSchema }), async (req, res) => {
    await authorizeOnJob(req, 'hold');
    authorize(req, 'hold', 'Stock');
    const { shopId, jobId } = ids(req);
    res.json(await jobs.releasePartHold(shopId, jobId, req.params['holdId'] as string, auditActorOf(req)));
  });

  router.post('/:jobId/parts/issues', validate({ params: jobIdParamsSchema, body: jobIssueInputSchema }), async (req, res) => {
    await authorizeOnJob(req, 'issue');
    authorize(req, 'issue', 'Stock');
    const { shopId, jobId } = ids(req);
    res.status(201).json(await jobs.issuePart(shopId, jobId, bodyOf(jobIssueInputSchema, req), auditActorOf(req)));
  });

  router.post('/:jobId/parts/returns', validate({ params: jobIdParamsSchema, body: jobReturnInputSchema }), async (req, res) => {
    await authorizeOnJob(req, 'issue');
    authorize(req, 'issue', 'Stock');
    const { shopId, jobId } = ids(req);
    res.status(201).json(await jobs.returnPart(shopId, jobId, bodyOf(jobReturnInputSchema, req), auditActorOf(req)));
  });

  router.post('/:jobId/special-orders', validate({ params: jobIdParamsSchema, body: specialOrderInputSchema }), async (req, res) => {
    await authorizeOnJob(req, 'update');
    const { shopId, jobId } = ids(req);
    res.status(201).json(await jobs.addSpecialOrder(shopId, jobId, bodyOf(specialOrderInputSchema, req), auditActorOf(req)));
  });

  router.post('/:jobId/labour', validate({ params: jobIdParamsSchema, body: labourInputSchema }), async (req, res) => {
    await authorizeOnJob(req, 'update');
    const body = bodyOf(labourInputSchema, req);
    // A mechanic books their own time; booking someone else's is the owner's.
    if (body.userId !== callerId(req)) authorize(req, 'create', 'Job');
    const { shopId, jobId } = ids(req);
    res.status(201).json(await jobs.addLabour(shopId, jobId, body, auditActorOf(req)));
  });

  router.delete('/:jobId/labour/:entryId', validate({ params: labourParamsSchema }), async (req, res) => {
    await authorizeOnJob(req, 'update');
    const { shopId, jobId } = ids(req);
    const entryId = req.params['entryId'] as string;
    if ((await jobs.labourUserOf(shopId, jobId, entryId)) !== callerId(req)) authorize(req, 'create', 'Job');
    res.json(await jobs.removeLabour(shopId, jobId, entryId, auditActorOf(req)));
  });

  // Permission and the job are checked before the body is read, so a refused caller never uploads megabytes.
  router.post(
    '/:jobId/files',
    validate({ params: jobIdParamsSchema }),
    async (req, _res, next) => {
      await authorizeOnJob(req, 'update');
      next();
    },
    upload,
    async (req, res) => {
      const { shopId, jobId } = ids(req);
      const fields = jobFileFieldsSchema.parse(req.body ?? {});
      const received = (req.files ?? []) as Express.Multer.File[];
      if (received.length === 0) {
        res.status(400).json({ error: { code: 'bad_request', message: 'Choose at least one photo to upload (form field "files").' } });
        return;
      }
      const prepared: PreparedUpload[] = [];
      for (const file of received) {
        const p = await prepareUpload(file);
        if (p.kind !== 'photo') throw new UploadRejected(415, `“${p.originalName}” is not a photo: a job takes photos (JPEG, PNG or WebP).`);
        prepared.push(p);
      }
      res.status(201).json({ files: await jobs.addFiles(shopId, jobId, prepared, fields, auditActorOf(req)) });
    },
  );

  const sendFile = (variant: 'original' | 'thumbnail') => async (req: Request, res: Response) => {
    authorize(req, 'read', 'Job');
    const { shopId, jobId } = ids(req);
    const { row, data } = await jobs.readFile(shopId, jobId, req.params['fileId'] as string, variant);
    res.setHeader('Content-Type', variant === 'thumbnail' ? 'image/jpeg' : row.mediaType);
    res.setHeader('Content-Length', String(data.length));
    res.setHeader('Content-Disposition', contentDisposition('inline', variant === 'thumbnail' ? `thumbnail-${row.originalName}` : row.originalName));
    res.setHeader('X-Content-Type-Options', 'nosniff');
    res.setHeader('Content-Security-Policy', "default-src 'none'; img-src 'self'; style-src 'unsafe-inline'; sandbox");
    res.setHeader('Cache-Control', 'private, max-age=300');
    res.end(data);
  };
  router.get('/:jobId/files/:fileId/content', validate({ params: jobFileParamsSchema }), sendFile('original'));
  router.get('/:jobId/files/:fileId/thumbnail', validate({ params: jobFileParamsSchema }), sendFile('thumbnail'));

  return router;
}

/**
 * /api/shops/:shopId/checklist-templates. Everyone who reads jobs reads templates; changing them
 * is part of running the shop, so it follows the shop-settings permission (the owner).
 */
export function checklistTemplatesRouter(deps: { jobs: JobsService }): Router {
  const { jobs } = deps;
  const router = Router({ mergeParams: true });

  router.get('/', validate({ params: shopIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Job');
    res.json(await jobs.listTemplates(shopOf(req).shop.id));
  });

  router.post('/', validate({ params: shopIdParamsSchema, body: templateInputSchema }), async (req, res) => {
    authorize(req, 'update', 'Settings');
    res.status(201).json(await jobs.createTemplate(shopOf(req).shop.id, bodyOf(templateInputSchema, req), auditActorOf(req)));
  });

  router.patch('/:templateId', validate({ params: templateIdParamsSchema, body: templateUpdateSchema }), async (req, res) => {
    authorize(req, 'update', 'Settings');
    res.json(await jobs.updateTemplate(shopOf(req).shop.id, req.params['templateId'] as string, bodyOf(templateUpdateSchema, req), auditActorOf(req)));
  });

  return router;
}
