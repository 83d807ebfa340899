import { EntitySchema } from 'typeorm';

/** A supplier barcode (GTIN) attached to a part; `gtin14` is the code zero-padded to 14 digits. */
export interface PartBarcodeRow {
  id: string;
  shopId: string;
  partId: string;
  code: string;
  gtin14: string;
  createdAt: Date;
  createdByUserId: string | null;
}

export const PartBarcodeEntity = new EntitySchema<PartBarcodeRow>({
  name: 'PartBarcode',
  tableName: 'part_barcodes',
  columns: {
    id: { type: 'varchar', length: 36, primary: true },
    shopId: { type: 'varchar', length: 36, name: 'shop_id' },
    partId: { type: 'varchar', length: 36, name: 'part_id' },
    code: { type: 'varchar', length: 14 },
    gtin14: { type: 'varchar', length: 14 },
    createdAt: { type: 'datetime', name: 'created_at' },
    createdByUserId: { type: 'varchar', length: 36, name: 'created_by_user_id', nullable: true },
  },
});

export const barcodeEntities = [PartBarcodeEntity];
