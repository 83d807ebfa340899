import { z } from 'zod';
import { idSchema } from './common';
import { vehicleStatuses, type VehicleStatus } from './constants/vehicles';
import { distanceUnits } from './settings';

export * from './constants/vehicles';

// Vehicles: records, identification, odometer readings, status through the shop, documents and
// photos, and parts that fit (issue 9).

export const vehicleKinds = ['customer', 'shop_stock', 'consignment'] as const;
export const vehicleKindSchema = z.enum(vehicleKinds, { error: 'Use customer, shop_stock or consignment.' });
export type VehicleKind = z.infer<typeof vehicleKindSchema>;

export const vehicleStatusSchema = z.enum(vehicleStatuses, { error: 'Use arrived, assessing, in_work, ready, handed_over or sold.' });

/**
 * Moves a vehicle may make from each status. Work can go back a step (a ready machine that fails
 * its last look goes back into work) and a vehicle that was handed over can come back in.
 */
export const vehicleStatusMoves: Readonly<Record<VehicleStatus, readonly VehicleStatus[]>> = {
  arrived: ['assessing', 'in_work', 'handed_over'],
  assessing: ['in_work', 'ready', 'handed_over'],
  in_work: ['assessing', 'ready'],
  ready: ['in_work', 'handed_over', 'sold'],
  handed_over: ['arrived'],
  sold: [],
};

/** The statuses that end a stay, by kind: shop stock is sold, a customer's vehicle handed back. */
export const closingStatusesByKind: Readonly<Record<VehicleKind, readonly VehicleStatus[]>> = {
  customer: ['handed_over'],
  shop_stock: ['sold'],
  consignment: ['handed_over', 'sold'],
};

/** Whether a vehicle of `kind` may move from `from` to `to`. */
export function canMoveVehicle(kind: VehicleKind, from: VehicleStatus, to: VehicleStatus): boolean {
  if (!vehicleStatusMoves[from].includes(to)) return false;
  if ((to === 'handed_over' || to === 'sold') && !closingStatusesByKind[kind].includes(to)) return false;
  return true;
}

/**
 * Tappet's own condition words, from a heap of parts to a freshly finished machine. Described in
 * the shop's terms rather than as grades, so nobody reads them as a valuation.
 */
export const vehicleConditions = ['incomplete', 'complete_project', 'runs_needs_work', 'sorted_rider', 'freshly_restored'] as const;
export const vehicleConditionSchema = z.enum(vehicleConditions, { error: 'Pick one of the condition words.' });
export type VehicleCondition = z.infer<typeof vehicleConditionSchema>;

export const odometerUnitSchema = z.enum(distanceUnits, { error: 'Use mi or km.' });
export type OdometerUnit = z.infer<typeof odometerUnitSchema>;

const text = (max: number, label: string) => z.string().trim().max(max, `${label} has at most ${max} characters.`);
const optionalText = (max: number, label: string) =>
  text(max, label)
    .nullish()
    .transform((v) => (v ? v : null));

/** A calendar date, YYYY-MM-DD. */
export const vehicleDateSchema = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date such as 2026-03-14.').refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)) && new Date(`${s}T00:00:00Z`).toISOString().startsWith(s), 'That date does not exist.');

/**
 * The VIN field: letters and digits only, upper-cased, and never I, O or Q (49 CFR 565 leaves them
 * out because they read as 1 and 0). Empty means none. The check digit is checked by the API for
 * 17-character VINs (a failure needs `acknowledgeCheckDigit`).
 */
export const vinFieldSchema = z
  .string()
  .trim()
  .transform((s) => s.toUpperCase().replace(/[\s-]/g, ''))
  .pipe(
    z
      .string()
      .max(17, 'A VIN has at most 17 characters.')
      .refine((s) => !/[IOQ]/.test(s), 'A VIN never contains the letters I, O or Q: check whether it is 1 or 0.')
      .refine((s) => /^[A-Z0-9]*$/.test(s), 'A VIN has letters and digits only.'),
  )
  .nullish()
  .transform((v) => (v ? v : null));

/** Free-form frame or engine number as stamped (older vehicles follow no standard). */
const stampedNumber = (label: string) => optionalText(40, label);

/** Money in the shop's currency, in minor units (pence, cents). */
export const vehicleMoneySchema = z.number().int('Whole minor units (pence, cents) only.').min(0, 'Money cannot be negative.').max(100_000_000_000, 'That amount is too large.');

export const odometerInputSchema = z
  .object({
    value: z.number().int('Enter the reading in whole miles or kilometres.').min(0, 'A reading cannot be negative.').max(9_999_999, 'That reading is too large.'),
    unit: odometerUnitSchema,
    readOn: vehicleDateSchema,
    note: optionalText(200, 'The note'),
  })
  .strict();
export type OdometerInput = z.input<typeof odometerInputSchema>;

const vehicleFields = {
  kind: vehicleKindSchema,
  marque: text(60, 'The marque').min(1, 'Enter the marque.'),
  model: text(80, 'The model').min(1, 'Enter the model.'),
  year: z.number().int('Enter the year as four digits.').min(1885, 'Enter a year from 1885 on.').max(2100, 'Enter a real year.').nullable(),
  colour: optionalText(60, 'The colour'),
  frameNumber: stampedNumber('The frame number'),
  engineNumber: stampedNumber('The engine number'),
  vin: vinFieldSchema,
  condition: vehicleConditionSchema.nullable(),
  notes: optionalText(4000, 'The notes'),
  customerId: idSchema.nullable(),
  acquisitionCostMinor: vehicleMoneySchema.nullable(),
  askingPriceMinor: vehicleMoneySchema.nullable(),
};

/** Fields that only some roles may set (mechanics may not touch money). */
export const vehicleMoneyFields = ['acquisitionCostMinor', 'askingPriceMinor'] as const;

export const vehicleInputSchema = z
  .object({
    ...vehicleFields,
    year: vehicleFields.year.default(null),
    colour: vehicleFields.colour.default(null),
    frameNumber: vehicleFields.frameNumber.default(null),
    engineNumber: vehicleFields.engineNumber.default(null),
    vin: vehicleFields.vin.default(null),
    condition: vehicleFields.condition.default(null),
    notes: vehicleFields.notes.default(null),
    customerId: vehicleFields.customerId.default(null),
    acquisitionCostMinor: vehicleFields.acquisitionCostMinor.default(null),
    askingPriceMinor: vehicleFields.askingPriceMinor.default(null),
    /** Set to keep a 17-character VIN whose check digit does not match (after the warning). */
    acknowledgeCheckDigit: z.boolean().default(false),
    /** The reading on arrival, if known. */
    odometer: odometerInputSchema.nullish(),
    /** The date it came in; today if left out. */
    arrivedOn: vehicleDateSchema.nullish(),
  })
  .strict();
export type VehicleInput = z.input<typeof vehicleInputSchema>;

export const vehicleUpdateSchema = z
  .object({ ...vehicleFields, acknowledgeCheckDigit: z.boolean().optional() })
  .partial()
  .strict();
export type VehicleUpdate = z.input<typeof vehicleUpdateSchema>;

export const statusMoveInputSchema = z
  .object({
    to: vehicleStatusSchema,
    /** When it happened; now if left out. Never in the future. */
    at: z.iso.datetime({ offset: true, error: 'Use a date and time such as 2026-03-14T09:30:00Z.' }).optional(),
    note: optionalText(500, 'The note'),
  })
  .strict();
export type StatusMoveInput = z.input<typeof statusMoveInputSchema>;

export const numbersCheckInputSchema = z
  .object({
    /** True: frame and engine numbers agree with the documents; false: they do not. */
    matching: z.boolean(),
    note: optionalText(500, 'The note'),
  })
  .strict();
export type NumbersCheckInput = z.input<typeof numbersCheckInputSchema>;

const personRef = z.object({ id: z.string(), name: z.string() });

export const odometerReadingSchema = z.object({
  id: idSchema,
  value: z.number().int(),
  unit: odometerUnitSchema,
  readOn: z.string(),
  note: z.string().nullable(),
  recordedBy: personRef.nullable(),
  createdAt: z.string(),
});
export type OdometerReading = z.infer<typeof odometerReadingSchema>;

/** How the VIN stands: checked and passed, kept despite a failing check digit, or nothing to check. */
export const vinCheckStates = ['passed', 'acknowledged_failure', 'not_checked'] as const;

export const vehicleSchema = z.object({
  id: idSchema,
  kind: vehicleKindSchema,
  marque: z.string(),
  model: z.string(),
  year: z.number().int().nullable(),
  colour: z.string().nullable(),
  frameNumber: z.string().nullable(),
  engineNumber: z.string().nullable(),
  vin: z.string().nullable(),
  vinCheck: z.enum(vinCheckStates),
  condition: vehicleConditionSchema.nullable(),
  notes: z.string().nullable(),
  customer: z.object({ id: idSchema, name: z.string() }).nullable(),
  acquisitionCostMinor: z.number().int().nullable(),
  askingPriceMinor: z.number().int().nullable(),
  currency: z.string(),
  status: vehicleStatusSchema,
  statusSince: z.string(),
  numbersMatching: z.boolean().nullable(),
  numbersCheckedBy: personRef.nullable(),
  numbersCheckedAt: z.string().nullable(),
  numbersNote: z.string().nullable(),
  latestOdometer: odometerReadingSchema.nullable(),
  photoCount: z.number().int(),
  coverPhotoId: idSchema.nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type Vehicle = z.infer<typeof vehicleSchema>;

export const vehicleFileKinds = ['photo', 'document'] as const;
export const vehicleFileKindSchema = z.enum(vehicleFileKinds);
export type VehicleFileKind = z.infer<typeof vehicleFileKindSchema>;

export const vehicleFileSchema = z.object({
  id: idSchema,
  kind: vehicleFileKindSchema,
  /** The name it was uploaded with (for people; never used as a path). */
  originalName: z.string(),
  mediaType: z.string(),
  byteSize: z.number().int(),
  width: z.number().int().nullable(),
  height: z.number().int().nullable(),
  caption: z.string().nullable(),
  hasThumbnail: z.boolean(),
  uploadedBy: personRef.nullable(),
  createdAt: z.string(),
});
export type VehicleFile = z.infer<typeof vehicleFileSchema>;

export const statusChangeSchema = z.object({
  id: idSchema,
  from: vehicleStatusSchema.nullable(),
  to: vehicleStatusSchema,
  at: z.string(),
  note: z.string().nullable(),
  by: personRef.nullable(),
});
export type StatusChange = z.infer<typeof statusChangeSchema>;

export const vehicleDetailSchema = vehicleSchema.extend({
  odometerReadings: z.array(odometerReadingSchema),
  files: z.array(vehicleFileSchema),
  statusHistory: z.array(statusChangeSchema),
  /** Statuses this vehicle may move to now. */
  nextStatuses: z.array(vehicleStatusSchema),
});
export type VehicleDetail = z.infer<typeof vehicleDetailSchema>;

export const vehicleIdParamsSchema = z.object({ shopId: idSchema, vehicleId: idSchema }).strict();
export const vehicleFileParamsSchema = z.object({ shopId: idSchema, vehicleId: idSchema, fileId: idSchema }).strict();

export const vehicleListQuerySchema = z
  .object({
    kind: vehicleKindSchema.optional(),
    status: vehicleStatusSchema.optional(),
    marque: z.string().trim().max(60).optional(),
    q: z.string().trim().max(80).optional(),
    customerId: idSchema.optional(),
    page: z.coerce.number().int().min(1).default(1),
    pageSize: z.coerce.number().int().min(1).max(100).default(25),
  })
  .strict();

export const vehicleListResponseSchema = z.object({
  items: z.array(vehicleSchema),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
  /** Every marque in the shop's vehicles, for the filter. */
  marques: z.array(z.string()),
});
export type VehicleListResponse = z.infer<typeof vehicleListResponseSchema>;

export const timelineEntrySchema = z.object({
  kind: z.enum(['created', 'status', 'odometer', 'document', 'photo', 'numbers_check', 'job']),
  at: z.string(),
  title: z.string(),
  detail: z.string().nullable(),
  by: personRef.nullable(),
  refId: z.string().nullable(),
});
export type TimelineEntry = z.infer<typeof timelineEntrySchema>;
export const timelineResponseSchema = z.object({ entries: z.array(timelineEntrySchema) });

export const fileUploadFieldsSchema = z
  .object({
    caption: optionalText(200, 'The caption'),
  })
  .strict();

export const fileUploadResponseSchema = z.object({ files: z.array(vehicleFileSchema) });

export const fitmentMatchSchema = z.object({
  partId: idSchema,
  number: z.string(),
  description: z.string(),
  origin: z.string(),
  status: z.string(),
  fitment: z.object({ yearFrom: z.number().int().nullable(), yearTo: z.number().int().nullable(), frameFrom: z.string().nullable(), frameTo: z.string().nullable() }),
  /** 'yes' when the frame number lies in the range (or there is none), 'unknown' when it cannot be compared or is missing. */
  frameMatch: z.enum(['yes', 'unknown']),
  /** Free quantity on hand (on hand less held), or null while stock is not known. */
  freeStock: z.number().nullable(),
  /** Bins holding free stock of the part, e.g. "A-03 (new)". */
  bins: z.array(z.string()),
});
export type FitmentMatch = z.infer<typeof fitmentMatchSchema>;
export const vehicleFitmentResponseSchema = z.object({ parts: z.array(fitmentMatchSchema), stockKnown: z.boolean() });
export type VehicleFitmentResponse = z.infer<typeof vehicleFitmentResponseSchema>;

/** `?download=1` asks for a photo as a download instead of inline. */
export const vehicleFileContentQuerySchema = z.object({ download: z.literal('1').optional() }).strict();
