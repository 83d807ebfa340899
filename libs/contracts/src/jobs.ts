import { z } from 'zod';
import { cautionIds, itemKinds, itemResults, isUnitId } from '@tappet/domain';
import { idSchema } from './common';
import { pressureUnits } from './settings';
import { stockConditionSchema, holdSchema } from './stock';

// Jobs and checklists: the work done on a vehicle (issue 10).

/**
 * Where a job stands. `done` needs every safety-critical checklist item recorded and not failed,
 * unless the owner signed the item off; `done` can be reopened.
 */
export const jobStatuses = ['open', 'in_progress', 'waiting_parts', 'done', 'cancelled'] as const;
export const jobStatusSchema = z.enum(jobStatuses, { error: 'Use open, in_progress, waiting_parts, done or cancelled.' });
export type JobStatus = z.infer<typeof jobStatusSchema>;

/** The moves a job may make from each status. */
export const jobStatusMoves: Readonly<Record<JobStatus, readonly JobStatus[]>> = {
  open: ['in_progress', 'waiting_parts', 'cancelled'],
  in_progress: ['waiting_parts', 'done', 'cancelled'],
  waiting_parts: ['in_progress', 'cancelled'],
  done: ['in_progress'],
  cancelled: ['open'],
};

/** People's words for the statuses (the web app and the job sheet). */
export const jobStatusWords: Record<JobStatus, string> = {
  open: 'Open',
  in_progress: 'In progress',
  waiting_parts: 'Waiting for parts',
  done: 'Done',
  cancelled: 'Cancelled',
};

export const itemResultSchema = z.enum(itemResults, { error: 'Use ok, advise, fail or na.' });
export type ChecklistItemResult = z.infer<typeof itemResultSchema>;
export const itemResultWords: Record<ChecklistItemResult, string> = { ok: 'OK', advise: 'Advise', fail: 'Fail', na: 'Not applicable' };

const text = (max: number, label: string) => z.string().trim().max(max, `${label} has at most ${max} characters.`);
const optionalText = (max: number, label: string) =>
  text(max, label)
    .nullish()
    .transform((v) => (v ? v : null));

/** A calendar date, YYYY-MM-DD. */
export const jobDateSchema = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date such as 2026-03-14.')
  .refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)) && new Date(`${s}T00:00:00Z`).toISOString().startsWith(s), 'That date does not exist.');

const assigneeIdsSchema = z
  .array(idSchema)
  .max(10, 'Assign at most 10 people.')
  .refine((ids) => new Set(ids).size === ids.length, 'Each person is assigned once.');

// ── Jobs ──────────────────────────────────────────────────────────────────────────────────────

export const jobInputSchema = z
  .object({
    vehicleId: idSchema,
    title: text(120, 'The title').min(3, 'Give the job a title of at least 3 characters.'),
    customerRequest: text(2000, 'What the customer asked for'),
    assigneeIds: assigneeIdsSchema.default([]),
    dueOn: jobDateSchema.nullish().transform((v) => v ?? null),
    notes: optionalText(4000, 'The notes'),
    /** Checklists to start on the job straight away. */
    templateIds: z.array(idSchema).max(5).default([]),
  })
  .strict();
export type JobInput = z.input<typeof jobInputSchema>;

export const jobUpdateSchema = z
  .object({
    title: text(120, 'The title').min(3, 'Give the job a title of at least 3 characters.'),
    customerRequest: text(2000, 'What the customer asked for'),
    assigneeIds: assigneeIdsSchema,
    dueOn: jobDateSchema.nullable(),
    notes: optionalText(4000, 'The notes'),
  })
  .partial()
  .strict()
  .refine((v) => Object.keys(v).length > 0, 'Change at least one field.');
export type JobUpdate = z.input<typeof jobUpdateSchema>;

export const jobStatusMoveSchema = z.object({ to: jobStatusSchema, note: optionalText(500, 'The note') }).strict();
export type JobStatusMove = z.input<typeof jobStatusMoveSchema>;

export const jobListQuerySchema = z
  .object({
    status: jobStatusSchema.optional(),
    /** `me` for the caller's own jobs, or a member's user id. */
    assignee: z.union([z.literal('me'), idSchema]).optional(),
    vehicleId: idSchema.optional(),
    /** Include done and cancelled jobs (left out by default). */
    closed: z.enum(['true', 'false']).default('false').transform((v) => v === 'true'),
  })
  .strict();
export type JobListQuery = z.input<typeof jobListQuerySchema>;

export const jobIdParamsSchema = z.object({ shopId: idSchema, jobId: idSchema }).strict();
export const checklistParamsSchema = z.object({ shopId: idSchema, jobId: idSchema, checklistId: idSchema }).strict();
export const checklistItemParamsSchema = z.object({ shopId: idSchema, jobId: idSchema, checklistId: idSchema, itemKey: z.string().regex(/^[a-z0-9-]{1,40}$/) }).strict();
export const holdParamsSchema = z.object({ shopId: idSchema, jobId: idSchema, holdId: idSchema }).strict();
export const labourParamsSchema = z.object({ shopId: idSchema, jobId: idSchema, entryId: idSchema }).strict();
export const jobFileParamsSchema = z.object({ shopId: idSchema, jobId: idSchema, fileId: idSchema }).strict();
export const templateIdParamsSchema = z.object({ shopId: idSchema, templateId: idSchema }).strict();

const personSchema = z.object({ id: idSchema, name: z.string() });

export const jobSummarySchema = z.object({
  id: idSchema,
  number: z.number().int(),
  title: z.string(),
  customerRequest: z.string(),
  status: jobStatusSchema,
  dueOn: z.string().nullable(),
  vehicle: z.object({ id: idSchema, marque: z.string(), model: z.string(), year: z.number().int().nullable(), frameNumber: z.string().nullable() }),
  assignees: z.array(personSchema),
  /** Checklist items recorded / all items, over every checklist on the job. */
  progress: z.object({ recorded: z.number().int(), total: z.number().int() }),
  /** Safety-critical items that stop the job being marked done. */
  blockerCount: z.number().int(),
  createdAt: z.string(),
  updatedAt: z.string(),
  startedAt: z.string().nullable(),
  completedAt: z.string().nullable(),
});
export type JobSummary = z.infer<typeof jobSummarySchema>;
/** The most jobs one list answer holds, newest first: the vehicle's page lists all of its own. */
export const jobListLimit = 500;
export const jobListResponseSchema = z.object({
  jobs: z.array(jobSummarySchema),
  /** True when more jobs match than the answer holds (the newest `jobListLimit`). */
  truncated: z.boolean().optional(),
});
export type JobListResponse = z.infer<typeof jobListResponseSchema>;

// ── Checklist templates ───────────────────────────────────────────────────────────────────────

export const templateItemSchema = z
  .object({
    key: z.string().regex(/^[a-z0-9-]{1,40}$/, 'A key is 1–40 lower-case letters, digits and dashes.'),
    section: text(60, 'The section').min(1, 'Name the section.'),
    label: text(200, 'The item').min(3, 'Describe the item in at least 3 characters.'),
    guidance: optionalText(500, 'The guidance'),
    kind: z.enum(itemKinds),
    safety: z.boolean(),
    cautions: z.array(z.enum(cautionIds)).max(cautionIds.length).default([]),
    unit: z
      .string()
      .refine((u) => isUnitId(u), 'Use a unit Tappet knows (mm, in, kPa, psi, bar, …).')
      .nullish()
      .transform((v) => v ?? null),
    min: z.number().finite().nullish().transform((v) => v ?? null),
    max: z.number().finite().nullish().transform((v) => v ?? null),
    outsideFails: z.boolean().default(false),
  })
  .strict()
  .refine((i) => i.min === null || i.max === null || i.min <= i.max, { message: 'The lowest expected value is above the highest.', path: ['min'] })
  .refine((i) => i.kind !== 'measure' || i.unit !== null, { message: 'A measured item needs a unit.', path: ['unit'] })
  .refine((i) => i.kind !== 'compression' || i.unit === null || i.unit === 'kPa', { message: 'Compression ranges are kept in kPa.', path: ['unit'] });
export type TemplateItem = z.output<typeof templateItemSchema>;
export type TemplateItemInput = z.input<typeof templateItemSchema>;

export const templateInputSchema = z
  .object({
    name: text(120, 'The name').min(3, 'Name the template (at least 3 characters).'),
    description: text(500, 'The description').default(''),
    items: z
      .array(templateItemSchema)
      .min(1, 'A template needs at least one item.')
      .max(200, 'At most 200 items.')
      .refine((items) => new Set(items.map((i) => i.key)).size === items.length, 'Each item key is used once.'),
  })
  .strict();
export type TemplateInput = z.input<typeof templateInputSchema>;
export const templateUpdateSchema = z
  .object({ name: templateInputSchema.shape.name, description: templateInputSchema.shape.description, items: templateInputSchema.shape.items, archived: z.boolean() })
  .partial()
  .strict()
  .refine((v) => Object.keys(v).length > 0, 'Change at least one field.');
export type TemplateUpdate = z.input<typeof templateUpdateSchema>;

export const templateSchema = z.object({
  id: idSchema,
  name: z.string(),
  description: z.string(),
  items: z.array(z.object({ key: z.string(), section: z.string(), label: z.string(), guidance: z.string().nullable(), kind: z.enum(itemKinds), safety: z.boolean(), cautions: z.array(z.enum(cautionIds)), unit: z.string().nullable(), min: z.number().nullable(), max: z.number().nullable(), outsideFails: z.boolean() })),
  archived: z.boolean(),
  updatedAt: z.string(),
});
export type ChecklistTemplate = z.infer<typeof templateSchema>;
export const templateListResponseSchema = z.object({ templates: z.array(templateSchema) });
export type TemplateListResponse = z.infer<typeof templateListResponseSchema>;

// ── Checklists on a job ───────────────────────────────────────────────────────────────────────

export const startChecklistSchema = z.object({ templateId: idSchema }).strict();

const measurementValue = z.number({ error: 'Enter a number.' }).finite().min(0, 'Use zero or more.').max(1_000_000, 'That value is too large.');

/** Recording one item. Which extra fields apply depends on the item's kind. */
export const recordItemSchema = z
  .object({
    result: itemResultSchema,
    note: optionalText(1000, 'The note'),
    /** For a `measure` item, in the item's unit. */
    value: measurementValue.nullish().transform((v) => v ?? null),
    /** For a `compression` item: one reading per cylinder, in `unit`. */
    compression: z
      .object({ unit: z.enum(pressureUnits), readings: z.array(measurementValue).min(1, 'Enter a reading for each cylinder.').max(16, 'At most 16 cylinders.') })
      .strict()
      .nullish()
      .transform((v) => v ?? null),
    /** For a `tyre_date` item: the DOT code of each tyre. */
    tyres: z
      .array(z.object({ position: text(30, 'The position').min(1, 'Say which tyre.'), code: text(40, 'The DOT code').min(1, 'Enter the DOT code.') }).strict())
      .max(8, 'At most 8 tyres.')
      .nullish()
      .transform((v) => v ?? null),
    /** A photo already uploaded to this job. */
    photoFileId: idSchema.nullish().transform((v) => v ?? null),
  })
  .strict();
export type RecordItemInput = z.input<typeof recordItemSchema>;

export const tyreReadingSchema = z.object({ position: z.string(), code: z.string(), verdict: z.enum(['ok', 'advise', 'fail', 'unreadable']), ageYears: z.number().nullable(), pre2000: z.boolean() });

export const itemRecordSchema = z.object({
  result: itemResultSchema,
  note: z.string().nullable(),
  value: z.number().nullable(),
  /** Compression readings, stored in kPa. */
  compressionKPa: z.array(z.number()).nullable(),
  compressionSpreadPercent: z.number().nullable(),
  tyres: z.array(tyreReadingSchema).nullable(),
  /** What the rules suggested when it was recorded (null: no rule applies). */
  suggested: itemResultSchema.nullable(),
  photoFileId: idSchema.nullable(),
  recordedBy: personSchema.nullable(),
  recordedAt: z.string(),
});
export type ItemRecord = z.infer<typeof itemRecordSchema>;

export const signOffSchema = z.object({
  id: idSchema,
  checklistId: idSchema,
  itemKey: z.string(),
  reason: z.string(),
  customerToldHow: z.string(),
  signedBy: personSchema.nullable(),
  signedAt: z.string(),
});
export type SignOff = z.infer<typeof signOffSchema>;

export const checklistSchema = z.object({
  id: idSchema,
  templateId: idSchema.nullable(),
  name: z.string(),
  items: templateSchema.shape.items,
  records: z.record(z.string(), itemRecordSchema),
  completedAt: z.string().nullable(),
  completedBy: personSchema.nullable(),
  createdAt: z.string(),
});
export type Checklist = z.infer<typeof checklistSchema>;

/** The owner's sign-off of a safety-critical item left failed or unrecorded. */
export const signOffInputSchema = z
  .object({
    checklistId: idSchema,
    itemKey: z.string().regex(/^[a-z0-9-]{1,40}$/),
    reason: text(1000, 'The reason').min(10, 'Give the reason in at least 10 characters.'),
    /** The customer was told; how and when, in words. */
    customerTold: z.literal(true, { error: 'Sign-off needs a record that the customer was told.' }),
    customerToldHow: text(500, 'How the customer was told').min(5, 'Say how and when the customer was told.'),
  })
  .strict();
export type SignOffInput = z.input<typeof signOffInputSchema>;

// ── Parts, special orders, labour, files ──────────────────────────────────────────────────────

const quantity = z.number().int('Use whole units.').min(1, 'Use 1 or more.').max(10_000, 'At most 10 000.');

export const jobHoldInputSchema = z.object({ partId: idSchema, binId: idSchema, condition: stockConditionSchema, quantity }).strict();
export type JobHoldInput = z.input<typeof jobHoldInputSchema>;
export const jobIssueInputSchema = z.union([
  z.object({ holdId: idSchema, quantity }).strict(),
  z.object({ partId: idSchema, binId: idSchema, condition: stockConditionSchema, quantity }).strict(),
]);
export type JobIssueInput = z.input<typeof jobIssueInputSchema>;
export const jobReturnInputSchema = z.object({ partId: idSchema, binId: idSchema, condition: stockConditionSchema, quantity }).strict();
export type JobReturnInput = z.input<typeof jobReturnInputSchema>;

export const specialOrderInputSchema = z.object({ partId: idSchema, quantity, note: optionalText(500, 'The note') }).strict();
export type SpecialOrderInput = z.input<typeof specialOrderInputSchema>;
export const specialOrderStatuses = ['open', 'ordered', 'received', 'cancelled'] as const;
export const specialOrderSchema = z.object({
  id: idSchema,
  jobId: idSchema,
  partId: idSchema,
  partNumber: z.string(),
  partDescription: z.string(),
  quantity: z.number().int(),
  note: z.string().nullable(),
  status: z.enum(specialOrderStatuses),
  createdAt: z.string(),
  createdBy: personSchema.nullable(),
});
export type SpecialOrder = z.infer<typeof specialOrderSchema>;

/** A stock movement to or from the job, as recorded by the stock ledger. */
export const jobPartMovementSchema = z.object({
  id: idSchema,
  kind: z.enum(['issued', 'returned']),
  partId: idSchema,
  partNumber: z.string(),
  partDescription: z.string(),
  binId: idSchema,
  condition: stockConditionSchema,
  /** Units to the job (issued positive, returned negative). */
  quantity: z.number().int(),
  /** Cost moved to the job in minor units (issued positive, returned negative). */
  costMinor: z.number().int(),
  at: z.string(),
  byName: z.string().nullable(),
});
export type JobPartMovement = z.infer<typeof jobPartMovementSchema>;

/** A part on the job, netted over issues and returns: what an invoice will bill. */
export const jobPartLineSchema = z.object({
  partId: idSchema,
  partNumber: z.string(),
  partDescription: z.string(),
  quantity: z.number().int(),
  costMinor: z.number().int(),
});
export type JobPartLine = z.infer<typeof jobPartLineSchema>;

export const labourInputSchema = z
  .object({
    userId: idSchema,
    workedOn: jobDateSchema,
    /** Whole minutes (the web app enters hours and converts). */
    minutes: z.number().int('Use whole minutes.').min(1, 'Use at least 1 minute.').max(24 * 60, 'At most 24 hours in one entry.'),
    description: text(500, 'The description').min(2, 'Say what was done.'),
  })
  .strict();
export type LabourInput = z.input<typeof labourInputSchema>;
export const labourEntrySchema = z.object({
  id: idSchema,
  user: personSchema,
  workedOn: z.string(),
  minutes: z.number().int(),
  description: z.string(),
  /** The shop's labour rate when the entry was made, minor units per hour. */
  rateMinorPerHour: z.number().int(),
  costMinor: z.number().int(),
  createdAt: z.string(),
});
export type LabourEntry = z.infer<typeof labourEntrySchema>;

export const jobFileSchema = z.object({
  id: idSchema,
  originalName: z.string(),
  mediaType: z.string(),
  byteSize: z.number().int(),
  checklistId: idSchema.nullable(),
  itemKey: z.string().nullable(),
  caption: z.string().nullable(),
  uploadedBy: personSchema.nullable(),
  createdAt: z.string(),
});
export type JobFile = z.infer<typeof jobFileSchema>;
export const jobFileFieldsSchema = z
  .object({
    checklistId: idSchema.optional(),
    itemKey: z.string().regex(/^[a-z0-9-]{1,40}$/).optional(),
    caption: optionalText(200, 'The caption'),
  })
  .strict();
export const jobFilesResponseSchema = z.object({ files: z.array(jobFileSchema) });

export const handOverBlockerSchema = z.object({ checklistId: idSchema, checklistName: z.string(), key: z.string(), label: z.string(), reason: z.enum(['failed', 'unrecorded']) });
export type JobBlocker = z.infer<typeof handOverBlockerSchema>;

export const jobCostSchema = z.object({ currency: z.string(), partsMinor: z.number().int(), labourMinor: z.number().int(), totalMinor: z.number().int(), labourMinutes: z.number().int() });
export type JobCost = z.infer<typeof jobCostSchema>;

export const jobDetailSchema = jobSummarySchema.extend({
  notes: z.string().nullable(),
  createdBy: personSchema.nullable(),
  checklists: z.array(checklistSchema),
  signOffs: z.array(signOffSchema),
  blockers: z.array(handOverBlockerSchema),
  holds: z.array(holdSchema),
  movements: z.array(jobPartMovementSchema),
  partLines: z.array(jobPartLineSchema),
  specialOrders: z.array(specialOrderSchema),
  labour: z.array(labourEntrySchema),
  files: z.array(jobFileSchema),
  cost: jobCostSchema,
  /** The status moves possible from here. */
  moves: z.array(jobStatusSchema),
});
export type JobDetail = z.infer<typeof jobDetailSchema>;

// ── A vehicle's cost and margin (shop stock) ─────────────────────────────────────────────────

/** One job's cost on a vehicle: parts at the cost they left stock at, labour at the rate booked. */
export const vehicleJobCostSchema = z.object({
  jobId: idSchema,
  number: z.number().int(),
  title: z.string(),
  status: jobStatusSchema,
  partsMinor: z.number().int(),
  labourMinor: z.number().int(),
  totalMinor: z.number().int(),
});
export type VehicleJobCost = z.infer<typeof vehicleJobCostSchema>;

/**
 * What a vehicle has cost the shop: the acquisition cost (shop stock) plus every job on it, against
 * the asking price. `marginMinor` is null unless both the asking price and the acquisition cost are
 * known; `marginPercent` is the margin as a percentage of the asking price.
 */
export const vehicleCostsSchema = z.object({
  vehicleId: idSchema,
  kind: z.string(),
  currency: z.string(),
  acquisitionCostMinor: z.number().int().nullable(),
  askingPriceMinor: z.number().int().nullable(),
  jobs: z.array(vehicleJobCostSchema),
  jobsMinor: z.number().int(),
  totalCostMinor: z.number().int(),
  marginMinor: z.number().int().nullable(),
  marginPercent: z.number().nullable(),
});
export type VehicleCosts = z.infer<typeof vehicleCostsSchema>;
