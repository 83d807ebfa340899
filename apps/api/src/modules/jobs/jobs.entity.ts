import { EntitySchema } from 'typeorm';
import type { ChecklistItemResult, JobStatus, TemplateItem } from '@tappet/contracts';

const id = { type: 'varchar', length: 36 } as const;
const userRef = (name: string) => ({ type: 'varchar', length: 36, name, nullable: true }) as const;
/** JSON kept in a text column (portable to PostgreSQL as text or jsonb). */
const json = (name: string, nullable = false) => ({ type: 'simple-json', name, nullable }) as const;

/** A job on a vehicle. `number` counts up per shop (job 1, 2, …) for people to quote. */
export interface JobRow {
  id: string;
  shopId: string;
  number: number;
  vehicleId: string;
  title: string;
  customerRequest: string;
  status: JobStatus;
  dueOn: string | null;
  notes: string | null;
  createdByUserId: string | null;
  createdAt: Date;
  updatedAt: Date;
  startedAt: Date | null;
  completedAt: Date | null;
}

export const JobEntity = new EntitySchema<JobRow>({
  name: 'Job',
  tableName: 'jobs',
  columns: {
    id: { ...id, primary: true },
    shopId: { ...id, name: 'shop_id' },
    number: { type: 'integer' },
    vehicleId: { ...id, name: 'vehicle_id' },
    title: { type: 'varchar', length: 120 },
    customerRequest: { type: 'varchar', length: 2000, name: 'customer_request' },
    status: { type: 'varchar', length: 20 },
    dueOn: { type: 'varchar', length: 10, name: 'due_on', nullable: true },
    notes: { type: 'varchar', length: 4000, nullable: true },
    createdByUserId: userRef('created_by_user_id'),
    createdAt: { type: 'datetime', name: 'created_at' },
    updatedAt: { type: 'datetime', name: 'updated_at' },
    startedAt: { type: 'datetime', name: 'started_at', nullable: true },
    completedAt: { type: 'datetime', name: 'completed_at', nullable: true },
  },
});

export interface JobAssigneeRow {
  shopId: string;
  jobId: string;
  userId: string;
  assignedAt: Date;
}

export const JobAssigneeEntity = new EntitySchema<JobAssigneeRow>({
  name: 'JobAssignee',
  tableName: 'job_assignees',
  columns: {
    shopId: { ...id, name: 'shop_id' },
    jobId: { ...id, name: 'job_id', primary: true },
    userId: { ...id, name: 'user_id', primary: true },
    assignedAt: { type: 'datetime', name: 'assigned_at' },
  },
});

export interface ChecklistTemplateRow {
  id: string;
  shopId: string;
  name: string;
  description: string;
  items: TemplateItem[];
  archived: boolean;
  createdAt: Date;
  updatedAt: Date;
}

export const ChecklistTemplateEntity = new EntitySchema<ChecklistTemplateRow>({
  name: 'ChecklistTemplate',
  tableName: 'checklist_templates',
  columns: {
    id: { ...id, primary: true },
    shopId: { ...id, name: 'shop_id' },
    name: { type: 'varchar', length: 120 },
    description: { type: 'varchar', length: 500 },
    items: json('items'),
    archived: { type: 'boolean' },
    createdAt: { type: 'datetime', name: 'created_at' },
    updatedAt: { type: 'datetime', name: 'updated_at' },
  },
});

/** A checklist started on a job: the template's items are copied, so later template edits leave it alone. */
export interface JobChecklistRow {
  id: string;
  shopId: string;
  jobId: string;
  templateId: string | null;
  name: string;
  items: TemplateItem[];
  completedAt: Date | null;
  completedByUserId: string | null;
  createdAt: Date;
}

export const JobChecklistEntity = new EntitySchema<JobChecklistRow>({
  name: 'JobChecklist',
  tableName: 'job_checklists',
  columns: {
    id: { ...id, primary: true },
    shopId: { ...id, name: 'shop_id' },
    jobId: { ...id, name: 'job_id' },
    templateId: userRef('template_id'),
    name: { type: 'varchar', length: 120 },
    items: json('items'),
    completedAt: { type: 'datetime', name: 'completed_at', nullable: true },
    completedByUserId: userRef('completed_by_user_id'),
    createdAt: { type: 'datetime', name: 'created_at' },
  },
});

export interface StoredTyreReading {
  position: string;
  code: string;
  verdict: 'ok' | 'advise' | 'fail' | 'unreadable';
  ageYears: number | null;
  pre2000: boolean;
}

/** What was recorded for one item (the latest record; the audit log keeps the history). */
export interface ChecklistItemRecordRow {
  id: string;
  shopId: string;
  checklistId: string;
  itemKey: string;
  result: ChecklistItemResult;
  suggested: ChecklistItemResult | null;
  note: string | null;
  value: number | null;
  compressionKPa: number[] | null;
  tyres: StoredTyreReading[] | null;
  photoFileId: string | null;
  recordedByUserId: string | null;
  recordedAt: Date;
}

export const ChecklistItemRecordEntity = new EntitySchema<ChecklistItemRecordRow>({
  name: 'ChecklistItemRecord',
  tableName: 'checklist_item_records',
  columns: {
    id: { ...id, primary: true },
    shopId: { ...id, name: 'shop_id' },
    checklistId: { ...id, name: 'checklist_id' },
    itemKey: { type: 'varchar', length: 40, name: 'item_key' },
    result: { type: 'varchar', length: 10 },
    suggested: { type: 'varchar', length: 10, nullable: true },
    note: { type: 'varchar', length: 1000, nullable: true },
    value: { type: 'real', nullable: true },
    compressionKPa: json('compression_kpa', true),
    tyres: json('tyres', true),
    photoFileId: userRef('photo_file_id'),
    recordedByUserId: userRef('recorded_by_user_id'),
    recordedAt: { type: 'datetime', name: 'recorded_at' },
  },
});

export interface ChecklistSignOffRow {
  id: string;
  shopId: string;
  jobId: string;
  checklistId: string;
  itemKey: string;
  reason: string;
  customerToldHow: string;
  signedByUserId: string | null;
  signedAt: Date;
}

export const ChecklistSignOffEntity = new EntitySchema<ChecklistSignOffRow>({
  name: 'ChecklistSignOff',
  tableName: 'checklist_sign_offs',
  columns: {
    id: { ...id, primary: true },
    shopId: { ...id, name: 'shop_id' },
    jobId: { ...id, name: 'job_id' },
    checklistId: { ...id, name: 'checklist_id' },
    itemKey: { type: 'varchar', length: 40, name: 'item_key' },
    reason: { type: 'varchar', length: 1000 },
    customerToldHow: { type: 'varchar', length: 500, name: 'customer_told_how' },
    signedByUserId: userRef('signed_by_user_id'),
    signedAt: { type: 'datetime', name: 'signed_at' },
  },
});

export type SpecialOrderStatus = 'open' | 'ordered' | 'received' | 'cancelled';

/** A part the job needs that is not in stock: purchasing picks up the open ones. */
export interface JobSpecialOrderRow {
  id: string;
  shopId: string;
  jobId: string;
  partId: string;
  quantity: number;
  note: string | null;
  status: SpecialOrderStatus;
  createdByUserId: string | null;
  createdAt: Date;
  updatedAt: Date;
}

export const JobSpecialOrderEntity = new EntitySchema<JobSpecialOrderRow>({
  name: 'JobSpecialOrder',
  tableName: 'job_special_orders',
  columns: {
    id: { ...id, primary: true },
    shopId: { ...id, name: 'shop_id' },
    jobId: { ...id, name: 'job_id' },
    partId: { ...id, name: 'part_id' },
    quantity: { type: 'integer' },
    note: { type: 'varchar', length: 500, nullable: true },
    status: { type: 'varchar', length: 10 },
    createdByUserId: userRef('created_by_user_id'),
    createdAt: { type: 'datetime', name: 'created_at' },
    updatedAt: { type: 'datetime', name: 'updated_at' },
  },
});

/** Time a person spent on a job, at the shop's rate when it was recorded. */
export interface LabourEntryRow {
  id: string;
  shopId: string;
  jobId: string;
  userId: string;
  workedOn: string;
  minutes: number;
  description: string;
  rateMinorPerHour: number;
  createdByUserId: string | null;
  createdAt: Date;
}

export const LabourEntryEntity = new EntitySchema<LabourEntryRow>({
  name: 'LabourEntry',
  tableName: 'labour_entries',
  columns: {
    id: { ...id, primary: true },
    shopId: { ...id, name: 'shop_id' },
    jobId: { ...id, name: 'job_id' },
    userId: { ...id, name: 'user_id' },
    workedOn: { type: 'varchar', length: 10, name: 'worked_on' },
    minutes: { type: 'integer' },
    description: { type: 'varchar', length: 500 },
    rateMinorPerHour: { type: 'integer', name: 'rate_minor_per_hour' },
    createdByUserId: userRef('created_by_user_id'),
    createdAt: { type: 'datetime', name: 'created_at' },
  },
});

/** A photo of a job (optionally of one checklist item); the bytes live in the file store. */
export interface JobFileRow {
  id: string;
  shopId: string;
  jobId: string;
  checklistId: string | null;
  itemKey: string | null;
  originalName: string;
  mediaType: string;
  byteSize: number;
  storageKey: string;
  thumbnailKey: string | null;
  caption: string | null;
  byUserId: string | null;
  createdAt: Date;
}

export const JobFileEntity = new EntitySchema<JobFileRow>({
  name: 'JobFile',
  tableName: 'job_files',
  columns: {
    id: { ...id, primary: true },
    shopId: { ...id, name: 'shop_id' },
    jobId: { ...id, name: 'job_id' },
    checklistId: userRef('checklist_id'),
    itemKey: { type: 'varchar', length: 40, name: 'item_key', nullable: true },
    originalName: { type: 'varchar', length: 200, name: 'original_name' },
    mediaType: { type: 'varchar', length: 60, name: 'media_type' },
    byteSize: { type: 'integer', name: 'byte_size' },
    storageKey: { type: 'varchar', length: 200, name: 'storage_key' },
    thumbnailKey: { type: 'varchar', length: 200, name: 'thumbnail_key', nullable: true },
    caption: { type: 'varchar', length: 200, nullable: true },
    byUserId: userRef('by_user_id'),
    createdAt: { type: 'datetime', name: 'created_at' },
  },
});

/** The jobs module's entity schemas, for the data source. */
export const jobEntities = [JobEntity, JobAssigneeEntity, ChecklistTemplateEntity, JobChecklistEntity, ChecklistItemRecordEntity, ChecklistSignOffEntity, JobSpecialOrderEntity, LabourEntryEntity, JobFileEntity];
