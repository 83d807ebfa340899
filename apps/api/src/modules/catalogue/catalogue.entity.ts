import { EntitySchema } from 'typeorm';
import type { PartOrigin, PartStatusValue } from '@tappet/contracts';

/** A part number a shop has met. Shop-owned; `key` is the normalised number, unique per shop. */
export interface PartRow {
  id: string;
  shopId: string;
  number: string;
  key: string;
  description: string;
  origin: PartOrigin;
  maker: string | null;
  category: string | null;
  unit: string;
  status: PartStatusValue;
  notes: string | null;
  createdAt: Date;
  updatedAt: Date;
}

export const PartEntity = new EntitySchema<PartRow>({
  name: 'Part',
  tableName: 'parts',
  columns: {
    id: { type: 'varchar', length: 36, primary: true },
    shopId: { type: 'varchar', length: 36, name: 'shop_id' },
    number: { type: 'varchar', length: 40 },
    key: { type: 'varchar', length: 40 },
    description: { type: 'varchar', length: 200 },
    origin: { type: 'varchar', length: 20 },
    maker: { type: 'varchar', length: 80, nullable: true },
    category: { type: 'varchar', length: 60, nullable: true },
    unit: { type: 'varchar', length: 20 },
    status: { type: 'varchar', length: 20 },
    notes: { type: 'varchar', length: 2000, nullable: true },
    createdAt: { type: 'datetime', name: 'created_at' },
    updatedAt: { type: 'datetime', name: 'updated_at' },
  },
});

/** A number a supplier uses for one of the shop's parts. */
export interface PartSupplierNumberRow {
  shopId: string;
  partId: string;
  number: string;
  key: string;
}

export const PartSupplierNumberEntity = new EntitySchema<PartSupplierNumberRow>({
  name: 'PartSupplierNumber',
  tableName: 'part_supplier_numbers',
  columns: {
    shopId: { type: 'varchar', length: 36, name: 'shop_id', primary: true },
    partId: { type: 'varchar', length: 36, name: 'part_id', primary: true },
    key: { type: 'varchar', length: 40, primary: true },
    number: { type: 'varchar', length: 40 },
  },
});

/** A link between two numbers; `toPartId` is null while `toNumber` is not in the catalogue. */
export interface PartLinkRow {
  id: string;
  shopId: string;
  fromPartId: string;
  kind: 'replaced_by' | 'kit_contains' | 'equivalent';
  toPartId: string | null;
  toNumber: string;
  toKey: string;
  quantity: number;
  interchange: 'both' | 'one_way' | 'with_changes';
  effectiveDate: string | null;
  sourceReference: string | null;
  note: string | null;
}

export const PartLinkEntity = new EntitySchema<PartLinkRow>({
  name: 'PartLink',
  tableName: 'part_links',
  columns: {
    id: { type: 'varchar', length: 36, primary: true },
    shopId: { type: 'varchar', length: 36, name: 'shop_id' },
    fromPartId: { type: 'varchar', length: 36, name: 'from_part_id' },
    kind: { type: 'varchar', length: 20 },
    toPartId: { type: 'varchar', length: 36, name: 'to_part_id', nullable: true },
    toNumber: { type: 'varchar', length: 40, name: 'to_number' },
    toKey: { type: 'varchar', length: 40, name: 'to_key' },
    quantity: { type: 'real' },
    interchange: { type: 'varchar', length: 20 },
    effectiveDate: { type: 'varchar', length: 10, name: 'effective_date', nullable: true },
    sourceReference: { type: 'varchar', length: 120, name: 'source_reference', nullable: true },
    note: { type: 'varchar', length: 500, nullable: true },
  },
});

/** A part fits a marque and model over years, optionally only between frame numbers. */
export interface FitmentRow {
  id: string;
  shopId: string;
  partId: string;
  marque: string;
  model: string;
  yearFrom: number | null;
  yearTo: number | null;
  frameFrom: string | null;
  frameTo: string | null;
}

export const FitmentEntity = new EntitySchema<FitmentRow>({
  name: 'Fitment',
  tableName: 'fitments',
  columns: {
    id: { type: 'varchar', length: 36, primary: true },
    shopId: { type: 'varchar', length: 36, name: 'shop_id' },
    partId: { type: 'varchar', length: 36, name: 'part_id' },
    marque: { type: 'varchar', length: 60 },
    model: { type: 'varchar', length: 80 },
    yearFrom: { type: 'integer', name: 'year_from', nullable: true },
    yearTo: { type: 'integer', name: 'year_to', nullable: true },
    frameFrom: { type: 'varchar', length: 40, name: 'frame_from', nullable: true },
    frameTo: { type: 'varchar', length: 40, name: 'frame_to', nullable: true },
  },
});

/** The catalogue's entity schemas, for the data source. */
export const catalogueEntities = [PartEntity, PartSupplierNumberEntity, PartLinkEntity, FitmentEntity];
