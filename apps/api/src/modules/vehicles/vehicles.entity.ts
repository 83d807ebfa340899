import { EntitySchema } from 'typeorm';
import type { OdometerUnit, VehicleCondition, VehicleFileKind, VehicleKind, VehicleStatus } from '@tappet/contracts';

/** A vehicle in (or through) the shop. Shop-owned; `customerId` points at a customer of the same shop. */
export interface VehicleRow {
  id: string;
  shopId: string;
  kind: VehicleKind;
  marque: string;
  model: string;
  year: number | null;
  colour: string | null;
  frameNumber: string | null;
  engineNumber: string | null;
  vin: string | null;
  /** Set when someone kept a 17-character VIN whose check digit fails, after the warning. */
  vinCheckAcknowledgedByUserId: string | null;
  vinCheckAcknowledgedAt: Date | null;
  condition: VehicleCondition | null;
  notes: string | null;
  customerId: string | null;
  acquisitionCostMinor: number | null;
  askingPriceMinor: number | null;
  status: VehicleStatus;
  statusSince: Date;
  numbersMatching: boolean | null;
  numbersCheckedByUserId: string | null;
  numbersCheckedAt: Date | null;
  numbersNote: string | null;
  createdAt: Date;
  updatedAt: Date;
}

const id = { type: 'varchar', length: 36 } as const;
const userRef = (name: string) => ({ type: 'varchar', length: 36, name, nullable: true }) as const;

export const VehicleEntity = new EntitySchema<VehicleRow>({
  name: 'Vehicle',
  tableName: 'vehicles',
  columns: {
    id: { ...id, primary: true },
    shopId: { ...id, name: 'shop_id' },
    kind: { type: 'varchar', length: 20 },
    marque: { type: 'varchar', length: 60 },
    model: { type: 'varchar', length: 80 },
    year: { type: 'integer', nullable: true },
    colour: { type: 'varchar', length: 60, nullable: true },
    frameNumber: { type: 'varchar', length: 40, name: 'frame_number', nullable: true },
    engineNumber: { type: 'varchar', length: 40, name: 'engine_number', nullable: true },
    vin: { type: 'varchar', length: 17, nullable: true },
    vinCheckAcknowledgedByUserId: userRef('vin_check_acknowledged_by_user_id'),
    vinCheckAcknowledgedAt: { type: 'datetime', name: 'vin_check_acknowledged_at', nullable: true },
    condition: { type: 'varchar', length: 30, nullable: true },
    notes: { type: 'varchar', length: 4000, nullable: true },
    customerId: userRef('customer_id'),
    acquisitionCostMinor: { type: 'integer', name: 'acquisition_cost_minor', nullable: true },
    askingPriceMinor: { type: 'integer', name: 'asking_price_minor', nullable: true },
    status: { type: 'varchar', length: 20 },
    statusSince: { type: 'datetime', name: 'status_since' },
    numbersMatching: { type: 'boolean', name: 'numbers_matching', nullable: true },
    numbersCheckedByUserId: userRef('numbers_checked_by_user_id'),
    numbersCheckedAt: { type: 'datetime', name: 'numbers_checked_at', nullable: true },
    numbersNote: { type: 'varchar', length: 500, name: 'numbers_note', nullable: true },
    createdAt: { type: 'datetime', name: 'created_at' },
    updatedAt: { type: 'datetime', name: 'updated_at' },
  },
});

/** One move of a vehicle from status to status; `fromStatus` is null for its arrival. */
export interface VehicleStatusChangeRow {
  id: string;
  shopId: string;
  vehicleId: string;
  fromStatus: VehicleStatus | null;
  toStatus: VehicleStatus;
  /** When it happened (may be earlier than recorded). */
  changedAt: Date;
  recordedAt: Date;
  byUserId: string | null;
  note: string | null;
}

export const VehicleStatusChangeEntity = new EntitySchema<VehicleStatusChangeRow>({
  name: 'VehicleStatusChange',
  tableName: 'vehicle_status_changes',
  columns: {
    id: { ...id, primary: true },
    shopId: { ...id, name: 'shop_id' },
    vehicleId: { ...id, name: 'vehicle_id' },
    fromStatus: { type: 'varchar', length: 20, name: 'from_status', nullable: true },
    toStatus: { type: 'varchar', length: 20, name: 'to_status' },
    changedAt: { type: 'datetime', name: 'changed_at' },
    recordedAt: { type: 'datetime', name: 'recorded_at' },
    byUserId: userRef('by_user_id'),
    note: { type: 'varchar', length: 500, nullable: true },
  },
});

/** An odometer reading as read off the clock, in its own unit. */
export interface OdometerReadingRow {
  id: string;
  shopId: string;
  vehicleId: string;
  value: number;
  unit: OdometerUnit;
  readOn: string;
  note: string | null;
  byUserId: string | null;
  createdAt: Date;
}

export const OdometerReadingEntity = new EntitySchema<OdometerReadingRow>({
  name: 'OdometerReading',
  tableName: 'odometer_readings',
  columns: {
    id: { ...id, primary: true },
    shopId: { ...id, name: 'shop_id' },
    vehicleId: { ...id, name: 'vehicle_id' },
    value: { type: 'integer' },
    unit: { type: 'varchar', length: 2 },
    readOn: { type: 'varchar', length: 10, name: 'read_on' },
    note: { type: 'varchar', length: 200, nullable: true },
    byUserId: userRef('by_user_id'),
    createdAt: { type: 'datetime', name: 'created_at' },
  },
});

/** A photo or document of a vehicle; the bytes live in the file store under `storageKey`. */
export interface VehicleFileRow {
  id: string;
  shopId: string;
  vehicleId: string;
  kind: VehicleFileKind;
  originalName: string;
  mediaType: string;
  byteSize: number;
  storageKey: string;
  thumbnailKey: string | null;
  width: number | null;
  height: number | null;
  caption: string | null;
  byUserId: string | null;
  createdAt: Date;
}

export const VehicleFileEntity = new EntitySchema<VehicleFileRow>({
  name: 'VehicleFile',
  tableName: 'vehicle_files',
  columns: {
    id: { ...id, primary: true },
    shopId: { ...id, name: 'shop_id' },
    vehicleId: { ...id, name: 'vehicle_id' },
    kind: { type: 'varchar', length: 10 },
    originalName: { type: 'varchar', length: 200, name: 'original_name' },
    mediaType: { type: 'varchar', length: 60, name: 'media_type' },
    byteSize: { type: 'integer', name: 'byte_size' },
    storageKey: { type: 'varchar', length: 200, name: 'storage_key' },
    thumbnailKey: { type: 'varchar', length: 200, name: 'thumbnail_key', nullable: true },
    width: { type: 'integer', nullable: true },
    height: { type: 'integer', nullable: true },
    caption: { type: 'varchar', length: 200, nullable: true },
    byUserId: userRef('by_user_id'),
    createdAt: { type: 'datetime', name: 'created_at' },
  },
});

/** The vehicles module's entity schemas, for the data source. */
export const vehicleEntities = [VehicleEntity, VehicleStatusChangeEntity, OdometerReadingEntity, VehicleFileEntity];
