import { Router, type Request } from 'express';
import {
  approveEstimateSchema,
  createEstimateSchema,
  declineEstimateSchema,
  estimateIdParamsSchema,
  estimateJobParamsSchema,
  estimateListQuerySchema,
  sendEstimateSchema,
  shopIdParamsSchema,
  updateEstimateSchema,
  viewEstimateApprovalSchema,
} from '@tappet/contracts';
import type { Clock } from '../../lib/clock';
import type { RateLimitRule, RateLimitStore } from '../../lib/rate-limiter';
import { addressRateLimit } from '../../middleware/rate-limits';
import { auditActorOf } from '../../middleware/authenticate';
import { authorize, shopOf } from '../../middleware/tenant-context';
import { bodyOf, validate } from '../../middleware/validate';
import { contentDisposition } from '../vehicles/vehicles.router';
import type { EstimatesService } from './estimates.service';

const shopIdOf = (req: Request) => shopOf(req).shop.id;
const param = (req: Request, name: string) => req.params[name] as string;

/**
 * /api/shops/:shopId/estimates (behind requireAuth and tenantContext). Owners write and send;
 * buyers and viewers read; a mechanic reads the estimates of the jobs assigned to them.
 */
export function estimatesRouter(deps: { estimates: EstimatesService }): Router {
  const { estimates } = deps;
  const router = Router({ mergeParams: true });

  // The whole list: owners, buyers and viewers. A mechanic reads a job's estimates below.
  router.get('/', validate({ params: shopIdParamsSchema, query: estimateListQuerySchema }), async (req, res) => {
    authorize(req, 'read', 'Estimate', { assigneeIds: [] });
    res.json({ estimates: await estimates.list(shopIdOf(req), { jobId: (req.query as { jobId?: string }).jobId }) });
  });
  // One job's estimates, for anyone who may read that job's estimates (a mechanic: their jobs).
  router.get('/jobs/:jobId', validate({ params: estimateJobParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Estimate', { assigneeIds: await estimates.jobAssigneeIds(shopIdOf(req), param(req, 'jobId')) });
    res.json({ estimates: await estimates.list(shopIdOf(req), { jobId: param(req, 'jobId') }) });
  });
  router.post('/', validate({ params: shopIdParamsSchema, body: createEstimateSchema }), async (req, res) => {
    authorize(req, 'create', 'Estimate');
    res.status(201).json(await estimates.create(shopIdOf(req), bodyOf(createEstimateSchema, req), auditActorOf(req)));
  });
  router.get('/jobs/:jobId/approval', validate({ params: estimateJobParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Estimate', { assigneeIds: await estimates.jobAssigneeIds(shopIdOf(req), param(req, 'jobId')) });
    res.json(await estimates.approvalState(shopIdOf(req), param(req, 'jobId')));
  });
  router.get('/:estimateId', validate({ params: estimateIdParamsSchema }), async (req, res) => {
    const { estimate, assigneeIds } = await estimates.get(shopIdOf(req), param(req, 'estimateId'));
    authorize(req, 'read', 'Estimate', { assigneeIds });
    res.json(estimate);
  });
  router.get('/:estimateId/pdf', validate({ params: estimateIdParamsSchema }), async (req, res) => {
    const pdf = await estimates.pdf(shopIdOf(req), param(req, 'estimateId'));
    authorize(req, 'read', 'Estimate', { assigneeIds: pdf.assigneeIds });
    res.setHeader('Content-Type', 'application/pdf');
    res.setHeader('Content-Disposition', contentDisposition('inline', pdf.filename));
    res.send(pdf.content);
  });
  router.patch('/:estimateId', validate({ params: estimateIdParamsSchema, body: updateEstimateSchema }), async (req, res) => {
    authorize(req, 'update', 'Estimate');
    res.json(await estimates.update(shopIdOf(req), param(req, 'estimateId'), bodyOf(updateEstimateSchema, req), auditActorOf(req)));
  });
  router.post('/:estimateId/send', validate({ params: estimateIdParamsSchema, body: sendEstimateSchema }), async (req, res) => {
    authorize(req, 'send', 'Estimate');
    res.json(await estimates.send(shopIdOf(req), param(req, 'estimateId'), bodyOf(sendEstimateSchema, req), auditActorOf(req)));
  });
  router.post('/:estimateId/revise', validate({ params: estimateIdParamsSchema }), async (req, res) => {
    authorize(req, 'create', 'Estimate');
    res.status(201).json(await estimates.revise(shopIdOf(req), param(req, 'estimateId'), auditActorOf(req)));
  });
  return router;
}

/** Requests per address to the public approval routes. */
export const defaultApprovalLimit: RateLimitRule = { limit: 60, windowMs: 15 * 60_000 };

/**
 * /api/estimate-approval: the customer's side of an e-mailed estimate, without an account and
 * outside any shop's tenancy. The token is the only credential; it travels in the body (never in
 * a path, so no log keeps it). Every request counts against a per-address limit.
 */
export function estimateApprovalRouter(deps: { estimates: EstimatesService; clock: Clock; store: RateLimitStore; limit?: RateLimitRule }): Router {
  const { estimates } = deps;
  const router = Router();
  const limited = addressRateLimit({ name: 'estimate-approval', rule: deps.limit ?? defaultApprovalLimit, clock: deps.clock, store: deps.store });
  router.post('/view', limited, validate({ body: viewEstimateApprovalSchema }), async (req, res) => {
    res.json(await estimates.publicView(bodyOf(viewEstimateApprovalSchema, req).token));
  });
  router.post('/approve', limited, validate({ body: approveEstimateSchema }), async (req, res) => {
    res.json(await estimates.approve(bodyOf(approveEstimateSchema, req), req.ip ?? null));
  });
  router.post('/decline', limited, validate({ body: declineEstimateSchema }), async (req, res) => {
    res.json(await estimates.decline(bodyOf(declineEstimateSchema, req), req.ip ?? null));
  });
  return router;
}
