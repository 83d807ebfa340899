import { EntitySchema } from 'typeorm';

/** A shop's customer: an owner of vehicles the shop works on, or a consignor. Shop-owned. */
export interface CustomerRow {
  id: string;
  shopId: string;
  name: string;
  email: string | null;
  phone: string | null;
  address: string | null;
  notes: string | null;
  createdAt: Date;
  updatedAt: Date;
}

export const CustomerEntity = new EntitySchema<CustomerRow>({
  name: 'Customer',
  tableName: 'customers',
  columns: {
    id: { type: 'varchar', length: 36, primary: true },
    shopId: { type: 'varchar', length: 36, name: 'shop_id' },
    name: { type: 'varchar', length: 120 },
    email: { type: 'varchar', length: 254, nullable: true },
    phone: { type: 'varchar', length: 40, nullable: true },
    address: { type: 'varchar', length: 500, nullable: true },
    notes: { type: 'varchar', length: 2000, nullable: true },
    createdAt: { type: 'datetime', name: 'created_at' },
    updatedAt: { type: 'datetime', name: 'updated_at' },
  },
});
