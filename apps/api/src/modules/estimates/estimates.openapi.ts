import { z } from 'zod';
import {
  approveEstimateSchema,
  createEstimateSchema,
  declineEstimateSchema,
  estimateIdParamsSchema,
  estimateJobParamsSchema,
  estimateListQuerySchema,
  estimateStatuses,
  sendEstimateSchema,
  shopIdParamsSchema,
  updateEstimateSchema,
  viewEstimateApprovalSchema,
} from '@tappet/contracts';
import type { RouteDoc } from '../../openapi/openapi';

const tag = 'estimates';
const base = (path: string) => `/api/shops/{shopId}/estimates${path}`;
const read = { 403: 'A mechanic reading an estimate of a job not assigned to them', 404: 'Not a member of that shop, or no such estimate in it' };
const write = { 403: 'Only the owner writes and sends estimates', 404: 'Not a member of that shop, or an id (in the URL or body) not in it' };
const link = { 404: 'Unknown (or altered) link', 410: 'The link was used, replaced by a newer one, or has expired (details.reason)', 429: 'Too many requests from this address (see Retry-After)' };

const money = z.number().int().meta({ description: 'Minor units (pence, cents)' });
const totals = { netMinor: money, taxMinor: money, grossMinor: money, taxByRate: z.array(z.object({ ratePercent: z.number(), netMinor: money, taxMinor: money })) };
const line = z.looseObject({ kind: z.enum(['part', 'labour', 'other']), description: z.string(), quantity: z.string(), unitPriceMinor: money, taxRatePercent: z.number(), netMinor: money, taxMinor: money, grossMinor: money });
export const estimateResponseSchema = z
  .looseObject({ id: z.string(), reference: z.string(), version: z.number().int(), jobId: z.string(), status: z.enum(estimateStatuses), currency: z.string(), lines: z.array(line), ...totals, approvedAmountMinor: money.nullable(), declineReason: z.string().nullable(), decidedAt: z.string().nullable() })
  .meta({ id: 'Estimate' });
const approvalStateSchema = z.looseObject({ jobId: z.string(), currency: z.string(), approved: z.looseObject({ amountMinor: money, version: z.number().int() }).nullable(), actualGrossMinor: money, overApproved: z.boolean() });
const publicEstimateSchema = z.looseObject({ shopName: z.string(), reference: z.string(), version: z.number().int(), jobTitle: z.string(), vehicle: z.string(), currency: z.string(), lines: z.array(line), ...totals, expiresAt: z.string() });
const decisionSchema = z.object({ status: z.enum(['approved', 'declined']), reference: z.string(), version: z.number().int(), decidedAt: z.string(), approvedAmountMinor: money.nullable() });

/** The estimates routes and the customer's approval link for the OpenAPI document. */
export const estimateRouteDocs: RouteDoc[] = [
  { method: 'get', path: base(''), summary: 'List estimates (owners, buyers, viewers)', tag, auth: true, params: shopIdParamsSchema, query: estimateListQuerySchema, response: z.object({ estimates: z.array(estimateResponseSchema) }), errors: read },
  { method: 'get', path: base('/jobs/{jobId}'), summary: 'A job’s estimates, newest first (a mechanic: jobs assigned to them)', tag, auth: true, params: estimateJobParamsSchema, response: z.object({ estimates: z.array(estimateResponseSchema) }), errors: read },
  { method: 'post', path: base(''), summary: 'Draft an estimate for a job: parts at their sell prices, labour at the shop rate', tag, auth: true, params: shopIdParamsSchema, body: createEstimateSchema, response: estimateResponseSchema, status: 201, errors: { ...write, 409: 'The job already has an estimate in progress' } },
  { method: 'get', path: base('/jobs/{jobId}/approval'), summary: 'Approved amount of a job against its latest estimate and actual sell value', tag, auth: true, params: estimateJobParamsSchema, response: approvalStateSchema, errors: read },
  { method: 'get', path: base('/{estimateId}'), summary: 'One estimate', tag, auth: true, params: estimateIdParamsSchema, response: estimateResponseSchema, errors: read },
  { method: 'get', path: base('/{estimateId}/pdf'), summary: 'The estimate as PDF', tag, auth: true, params: estimateIdParamsSchema, responseType: 'application/pdf', response: z.string(), errors: read },
  { method: 'patch', path: base('/{estimateId}'), summary: 'Change a draft estimate (lines are replaced)', tag, auth: true, params: estimateIdParamsSchema, body: updateEstimateSchema, response: estimateResponseSchema, errors: { ...write, 409: 'Only drafts change' } },
  { method: 'post', path: base('/{estimateId}/send'), summary: 'E-mail the estimate as PDF with a new single-use approval link', tag, auth: true, params: estimateIdParamsSchema, body: sendEstimateSchema, response: z.object({ estimate: estimateResponseSchema, emailed: z.boolean() }), errors: { ...write, 409: 'Not a draft or sent estimate, or no lines' } },
  { method: 'post', path: base('/{estimateId}/revise'), summary: 'A new draft version of the estimate (a sent one is superseded)', tag, auth: true, params: estimateIdParamsSchema, response: estimateResponseSchema, status: 201, errors: { ...write, 409: 'Not the newest version, or another estimate of the job is in progress' } },
  { method: 'post', path: '/api/estimate-approval/view', summary: 'The customer’s view of an e-mailed estimate (no account; the token is the credential)', tag, auth: false, body: viewEstimateApprovalSchema, response: publicEstimateSchema, errors: link },
  { method: 'post', path: '/api/estimate-approval/approve', summary: 'The customer approves the version and total they saw; the link is used up', tag, auth: false, body: approveEstimateSchema, response: decisionSchema, errors: { ...link, 409: 'The estimate changed since it was opened' } },
  { method: 'post', path: '/api/estimate-approval/decline', summary: 'The customer declines with a reason; the link is used up', tag, auth: false, body: declineEstimateSchema, response: decisionSchema, errors: link },
];
