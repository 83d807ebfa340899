import { z } from 'zod';
import {
  checklistItemParamsSchema,
  checklistParamsSchema,
  holdParamsSchema,
  jobDetailSchema,
  jobFileFieldsSchema,
  jobFileParamsSchema,
  jobFilesResponseSchema,
  jobHoldInputSchema,
  jobIdParamsSchema,
  jobInputSchema,
  jobIssueInputSchema,
  jobListQuerySchema,
  jobListResponseSchema,
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
  templateListResponseSchema,
  templateSchema,
  templateUpdateSchema,
} from '@tappet/contracts';
import type { RouteDoc } from '../../openapi/openapi';

const tag = 'jobs';
const read = { 404: 'Not a member of that shop, or no such job in it' };
const write = { 403: 'Not allowed for this role (a mechanic works only on jobs assigned to them)', 404: 'Not a member of that shop, or an id (in the URL or body) not in it', 409: 'The job is done or cancelled, or the move is not possible (details.reason)' };
const base = (path: string) => `/api/shops/{shopId}/jobs${path}`;
const binary = z.string().meta({ format: 'binary' });

/** The jobs and checklist-template routes for the OpenAPI document. */
export const jobRouteDocs: RouteDoc[] = [
  { method: 'get', path: base(''), summary: 'Jobs, newest first: the board, or one person’s (assignee=me); done and cancelled with closed=true', tag, auth: true, params: shopIdParamsSchema, query: jobListQuerySchema, response: jobListResponseSchema, errors: read },
  { method: 'post', path: base(''), summary: 'Open a job on a vehicle, assign people, optionally start checklists (owner)', tag, auth: true, params: shopIdParamsSchema, body: jobInputSchema, response: jobDetailSchema, status: 201, errors: write },
  { method: 'get', path: base('/{jobId}'), summary: 'A job with its checklists, sign-offs, blockers, parts, labour, photos and cost', tag, auth: true, params: jobIdParamsSchema, response: jobDetailSchema, errors: read },
  { method: 'patch', path: base('/{jobId}'), summary: 'Change a job; changing who is assigned is the owner’s', tag, auth: true, params: jobIdParamsSchema, body: jobUpdateSchema, response: jobDetailSchema, errors: write },
  { method: 'post', path: base('/{jobId}/status'), summary: 'Move a job to another status; done is refused (409 safety_blockers) while a safety-critical item is failed or unrecorded and not signed off', tag, auth: true, params: jobIdParamsSchema, body: jobStatusMoveSchema, response: jobDetailSchema, errors: write },
  { method: 'post', path: base('/{jobId}/checklists'), summary: 'Start a checklist from a template (its items are copied)', tag, auth: true, params: jobIdParamsSchema, body: startChecklistSchema, response: jobDetailSchema, status: 201, errors: write },
  { method: 'put', path: base('/{jobId}/checklists/{checklistId}/items/{itemKey}'), summary: 'Record one item: result, note, readings (compression per cylinder stored in kPa, tyre DOT codes read per 49 CFR 574.5), photo', tag, auth: true, params: checklistItemParamsSchema, body: recordItemSchema, response: jobDetailSchema, errors: { ...write, 400: 'Readings missing for the kind of item, or a result milder than the readings give' } },
  { method: 'post', path: base('/{jobId}/checklists/{checklistId}/complete'), summary: 'Complete a checklist once every item is recorded (who and when are kept)', tag, auth: true, params: checklistParamsSchema, response: jobDetailSchema, errors: write },
  { method: 'post', path: base('/{jobId}/sign-offs'), summary: 'Owner’s sign-off of a failed or unrecorded safety-critical item, with the reason and how the customer was told', tag, auth: true, params: jobIdParamsSchema, body: signOffInputSchema, response: jobDetailSchema, status: 201, errors: write },
  { method: 'post', path: base('/{jobId}/parts/holds'), summary: 'Hold free stock for the job', tag, auth: true, params: jobIdParamsSchema, body: jobHoldInputSchema, response: jobDetailSchema, status: 201, errors: write },
  { method: 'post', path: base('/{jobId}/parts/holds/{holdId}/release'), summary: 'Release one of the job’s holds', tag, auth: true, params: holdParamsSchema, response: jobDetailSchema, errors: write },
  { method: 'post', path: base('/{jobId}/parts/issues'), summary: 'Issue stock to the job, from one of its holds or from free stock', tag, auth: true, params: jobIdParamsSchema, body: jobIssueInputSchema, response: jobDetailSchema, status: 201, errors: write },
  { method: 'post', path: base('/{jobId}/parts/returns'), summary: 'Return parts from the job to a bin (at most what the job has)', tag, auth: true, params: jobIdParamsSchema, body: jobReturnInputSchema, response: jobDetailSchema, status: 201, errors: write },
  { method: 'post', path: base('/{jobId}/special-orders'), summary: 'Record a part the job needs that is not in stock (for purchasing’s reorder list)', tag, auth: true, params: jobIdParamsSchema, body: specialOrderInputSchema, response: jobDetailSchema, status: 201, errors: write },
  { method: 'post', path: base('/{jobId}/labour'), summary: 'Record time on the job at the shop’s labour rate (a mechanic books their own)', tag, auth: true, params: jobIdParamsSchema, body: labourInputSchema, response: jobDetailSchema, status: 201, errors: write },
  { method: 'delete', path: base('/{jobId}/labour/{entryId}'), summary: 'Remove a labour entry', tag, auth: true, params: labourParamsSchema, response: jobDetailSchema, errors: write },
  {
    method: 'post',
    path: base('/{jobId}/files'),
    summary: 'Upload photos of the job or of one checklist item (form field "files"; JPEG, PNG, WebP; re-encoded)',
    tag,
    auth: true,
    params: jobIdParamsSchema,
    body: jobFileFieldsSchema.extend({ files: z.array(binary) }),
    bodyType: 'multipart/form-data',
    response: jobFilesResponseSchema,
    status: 201,
    errors: { ...write, 413: 'A file is larger than the limit', 415: 'A file is not a photo (by its content)' },
  },
  { method: 'get', path: base('/{jobId}/files/{fileId}/content'), summary: 'A stored photo of the job', tag, auth: true, params: jobFileParamsSchema, response: binary, responseType: '*/*', errors: read },
  { method: 'get', path: base('/{jobId}/files/{fileId}/thumbnail'), summary: 'The thumbnail of a photo of the job', tag, auth: true, params: jobFileParamsSchema, response: binary, responseType: 'image/jpeg', errors: read },
  { method: 'get', path: '/api/shops/{shopId}/checklist-templates', summary: 'Checklist templates (a new shop starts with Tappet’s recommissioning and pre-sale templates)', tag, auth: true, params: shopIdParamsSchema, response: templateListResponseSchema, errors: read },
  { method: 'post', path: '/api/shops/{shopId}/checklist-templates', summary: 'Create a checklist template (owner)', tag, auth: true, params: shopIdParamsSchema, body: templateInputSchema, response: templateSchema, status: 201, errors: write },
  { method: 'patch', path: '/api/shops/{shopId}/checklist-templates/{templateId}', summary: 'Change or archive a template (checklists already started keep their items)', tag, auth: true, params: templateIdParamsSchema, body: templateUpdateSchema, response: templateSchema, errors: write },
];
