import { EntitySchema } from 'typeorm';
import type { PurchaseOrderStatus, SupplierReturnKind } from '@tappet/contracts';

/** A supplier the shop buys from. Prices and the minimum order value are in `currency`. */
export interface SupplierRow {
  id: string;
  shopId: string;
  name: string;
  nameKey: string;
  email: string | null;
  currency: string;
  leadTimeDays: number;
  leadTimeSdDays: number | null;
  minOrderValueMinor: number;
  notes: string | null;
  active: boolean;
  createdAt: Date;
  updatedAt: Date;
}

export const SupplierEntity = new EntitySchema<SupplierRow>({
  name: 'Supplier',
  tableName: 'suppliers',
  columns: {
    id: { type: 'varchar', length: 36, primary: true },
    shopId: { type: 'varchar', length: 36, name: 'shop_id' },
    name: { type: 'varchar', length: 120 },
    nameKey: { type: 'varchar', length: 120, name: 'name_key' },
    email: { type: 'varchar', length: 254, nullable: true },
    currency: { type: 'varchar', length: 3 },
    leadTimeDays: { type: 'integer', name: 'lead_time_days' },
    leadTimeSdDays: { type: 'real', name: 'lead_time_sd_days', nullable: true },
    minOrderValueMinor: { type: 'integer', name: 'min_order_value_minor' },
    notes: { type: 'varchar', length: 1000, nullable: true },
    active: { type: 'boolean' },
    createdAt: { type: 'datetime', name: 'created_at' },
    updatedAt: { type: 'datetime', name: 'updated_at' },
  },
});

/** What one supplier sells one part for, in packs, with a minimum and optionally its own lead time. */
export interface ListingRow {
  id: string;
  shopId: string;
  supplierId: string;
  partId: string;
  supplierNumber: string | null;
  priceMinor: number;
  packSize: number;
  minOrderQty: number;
  leadTimeDays: number | null;
  /** Last unit price paid, in the shop's currency, and when it arrived. */
  lastPaidUnitMinor: number | null;
  lastPaidAt: Date | null;
  createdAt: Date;
  updatedAt: Date;
}

export const ListingEntity = new EntitySchema<ListingRow>({
  name: 'SupplierListing',
  tableName: 'supplier_listings',
  columns: {
    id: { type: 'varchar', length: 36, primary: true },
    shopId: { type: 'varchar', length: 36, name: 'shop_id' },
    supplierId: { type: 'varchar', length: 36, name: 'supplier_id' },
    partId: { type: 'varchar', length: 36, name: 'part_id' },
    supplierNumber: { type: 'varchar', length: 40, name: 'supplier_number', nullable: true },
    priceMinor: { type: 'integer', name: 'price_minor' },
    packSize: { type: 'integer', name: 'pack_size' },
    minOrderQty: { type: 'integer', name: 'min_order_qty' },
    leadTimeDays: { type: 'integer', name: 'lead_time_days', nullable: true },
    lastPaidUnitMinor: { type: 'integer', name: 'last_paid_unit_minor', nullable: true },
    lastPaidAt: { type: 'datetime', name: 'last_paid_at', nullable: true },
    createdAt: { type: 'datetime', name: 'created_at' },
    updatedAt: { type: 'datetime', name: 'updated_at' },
  },
});

/** Per-part purchasing choices: the preferred supplier and a minimum/maximum set by hand. */
export interface PartPurchasingRow {
  shopId: string;
  partId: string;
  preferredSupplierId: string | null;
  minQty: number | null;
  maxQty: number | null;
  updatedAt: Date;
}

export const PartPurchasingEntity = new EntitySchema<PartPurchasingRow>({
  name: 'PartPurchasing',
  tableName: 'part_purchasing',
  columns: {
    shopId: { type: 'varchar', length: 36, name: 'shop_id', primary: true },
    partId: { type: 'varchar', length: 36, name: 'part_id', primary: true },
    preferredSupplierId: { type: 'varchar', length: 36, name: 'preferred_supplier_id', nullable: true },
    minQty: { type: 'integer', name: 'min_qty', nullable: true },
    maxQty: { type: 'integer', name: 'max_qty', nullable: true },
    updatedAt: { type: 'datetime', name: 'updated_at' },
  },
});

/** The reorder list's own settings (service level and costs live in the shop settings). */
export interface PurchasingSettingsRow {
  shopId: string;
  demandWindowDays: number;
  deadStockDays: number;
  updatedAt: Date;
}

export const PurchasingSettingsEntity = new EntitySchema<PurchasingSettingsRow>({
  name: 'PurchasingSettings',
  tableName: 'purchasing_settings',
  columns: {
    shopId: { type: 'varchar', length: 36, name: 'shop_id', primary: true },
    demandWindowDays: { type: 'integer', name: 'demand_window_days' },
    deadStockDays: { type: 'integer', name: 'dead_stock_days' },
    updatedAt: { type: 'datetime', name: 'updated_at' },
  },
});

/**
 * A purchase order. Amounts are in the order's currency; `exchangeRate` (a decimal string: shop
 * currency units per unit of the order's currency) turns them into the shop's, `totalShopMinor`.
 */
export interface PurchaseOrderRow {
  id: string;
  shopId: string;
  number: number;
  supplierId: string;
  status: PurchaseOrderStatus;
  currency: string;
  exchangeRate: string;
  totalMinor: number;
  totalShopMinor: number;
  note: string | null;
  createdByUserId: string | null;
  approvalRequestedAt: Date | null;
  approvedByUserId: string | null;
  approvedAt: Date | null;
  rejectionReason: string | null;
  sentAt: Date | null;
  closedReason: string | null;
  closedAt: Date | null;
  createdAt: Date;
  updatedAt: Date;
}

export const PurchaseOrderEntity = new EntitySchema<PurchaseOrderRow>({
  name: 'PurchaseOrder',
  tableName: 'purchase_orders',
  columns: {
    id: { type: 'varchar', length: 36, primary: true },
    shopId: { type: 'varchar', length: 36, name: 'shop_id' },
    number: { type: 'integer' },
    supplierId: { type: 'varchar', length: 36, name: 'supplier_id' },
    status: { type: 'varchar', length: 20 },
    currency: { type: 'varchar', length: 3 },
    exchangeRate: { type: 'varchar', length: 24, name: 'exchange_rate' },
    totalMinor: { type: 'integer', name: 'total_minor' },
    totalShopMinor: { type: 'integer', name: 'total_shop_minor' },
    note: { type: 'varchar', length: 1000, nullable: true },
    createdByUserId: { type: 'varchar', length: 36, name: 'created_by_user_id', nullable: true },
    approvalRequestedAt: { type: 'datetime', name: 'approval_requested_at', nullable: true },
    approvedByUserId: { type: 'varchar', length: 36, name: 'approved_by_user_id', nullable: true },
    approvedAt: { type: 'datetime', name: 'approved_at', nullable: true },
    rejectionReason: { type: 'varchar', length: 500, name: 'rejection_reason', nullable: true },
    sentAt: { type: 'datetime', name: 'sent_at', nullable: true },
    closedReason: { type: 'varchar', length: 500, name: 'closed_reason', nullable: true },
    closedAt: { type: 'datetime', name: 'closed_at', nullable: true },
    createdAt: { type: 'datetime', name: 'created_at' },
    updatedAt: { type: 'datetime', name: 'updated_at' },
  },
});

/** One line of an order. Outstanding = quantity − received − cancelled (a closed back-order). */
export interface PurchaseOrderLineRow {
  id: string;
  shopId: string;
  orderId: string;
  position: number;
  partId: string;
  supplierNumber: string | null;
  description: string;
  quantity: number;
  receivedQuantity: number;
  cancelledQuantity: number;
  unitPriceMinor: number;
  coreDepositMinor: number;
  purpose: string | null;
  /** The job's special order this line buys for (jobs module); what arrives is held for that job. */
  specialOrderId: string | null;
}

export const PurchaseOrderLineEntity = new EntitySchema<PurchaseOrderLineRow>({
  name: 'PurchaseOrderLine',
  tableName: 'purchase_order_lines',
  columns: {
    id: { type: 'varchar', length: 36, primary: true },
    shopId: { type: 'varchar', length: 36, name: 'shop_id' },
    orderId: { type: 'varchar', length: 36, name: 'order_id' },
    position: { type: 'integer' },
    partId: { type: 'varchar', length: 36, name: 'part_id' },
    supplierNumber: { type: 'varchar', length: 40, name: 'supplier_number', nullable: true },
    description: { type: 'varchar', length: 200 },
    quantity: { type: 'integer' },
    receivedQuantity: { type: 'integer', name: 'received_quantity' },
    cancelledQuantity: { type: 'integer', name: 'cancelled_quantity' },
    unitPriceMinor: { type: 'integer', name: 'unit_price_minor' },
    coreDepositMinor: { type: 'integer', name: 'core_deposit_minor' },
    purpose: { type: 'varchar', length: 200, nullable: true },
    specialOrderId: { type: 'varchar', length: 36, name: 'special_order_id', nullable: true },
  },
});

/** Goods received against an order line, into a bin, at the price paid. */
export interface PurchaseReceiptRow {
  id: string;
  shopId: string;
  orderId: string;
  lineId: string;
  binId: string;
  condition: string;
  quantity: number;
  unitPriceMinor: number;
  unitCostShopMinor: number;
  movementId: string | null;
  userId: string | null;
  receivedAt: Date;
}

export const PurchaseReceiptEntity = new EntitySchema<PurchaseReceiptRow>({
  name: 'PurchaseReceipt',
  tableName: 'purchase_receipts',
  columns: {
    id: { type: 'varchar', length: 36, primary: true },
    shopId: { type: 'varchar', length: 36, name: 'shop_id' },
    orderId: { type: 'varchar', length: 36, name: 'order_id' },
    lineId: { type: 'varchar', length: 36, name: 'line_id' },
    binId: { type: 'varchar', length: 36, name: 'bin_id' },
    condition: { type: 'varchar', length: 20 },
    quantity: { type: 'integer' },
    unitPriceMinor: { type: 'integer', name: 'unit_price_minor' },
    unitCostShopMinor: { type: 'integer', name: 'unit_cost_shop_minor' },
    movementId: { type: 'varchar', length: 36, name: 'movement_id', nullable: true },
    userId: { type: 'varchar', length: 36, name: 'user_id', nullable: true },
    receivedAt: { type: 'datetime', name: 'received_at' },
  },
});

/** A return to a supplier (faulty or wrong parts) or a core sent back, tracked until credited. */
export interface SupplierReturnRow {
  id: string;
  shopId: string;
  kind: SupplierReturnKind;
  supplierId: string;
  orderId: string | null;
  lineId: string | null;
  partId: string;
  binId: string | null;
  condition: string | null;
  quantity: number;
  reason: string;
  expectedCreditMinor: number;
  currency: string;
  status: 'open' | 'credited';
  creditedMinor: number | null;
  creditReference: string | null;
  creditedAt: Date | null;
  createdByUserId: string | null;
  createdAt: Date;
}

export const SupplierReturnEntity = new EntitySchema<SupplierReturnRow>({
  name: 'SupplierReturn',
  tableName: 'supplier_returns',
  columns: {
    id: { type: 'varchar', length: 36, primary: true },
    shopId: { type: 'varchar', length: 36, name: 'shop_id' },
    kind: { type: 'varchar', length: 10 },
    supplierId: { type: 'varchar', length: 36, name: 'supplier_id' },
    orderId: { type: 'varchar', length: 36, name: 'order_id', nullable: true },
    lineId: { type: 'varchar', length: 36, name: 'line_id', nullable: true },
    partId: { type: 'varchar', length: 36, name: 'part_id' },
    binId: { type: 'varchar', length: 36, name: 'bin_id', nullable: true },
    condition: { type: 'varchar', length: 20, nullable: true },
    quantity: { type: 'integer' },
    reason: { type: 'varchar', length: 500 },
    expectedCreditMinor: { type: 'integer', name: 'expected_credit_minor' },
    currency: { type: 'varchar', length: 3 },
    status: { type: 'varchar', length: 10 },
    creditedMinor: { type: 'integer', name: 'credited_minor', nullable: true },
    creditReference: { type: 'varchar', length: 120, name: 'credit_reference', nullable: true },
    creditedAt: { type: 'datetime', name: 'credited_at', nullable: true },
    createdByUserId: { type: 'varchar', length: 36, name: 'created_by_user_id', nullable: true },
    createdAt: { type: 'datetime', name: 'created_at' },
  },
});

/** The purchasing module's entity schemas, for the data source. */
export const purchasingEntities = [SupplierEntity, ListingEntity, PartPurchasingEntity, PurchasingSettingsEntity, PurchaseOrderEntity, PurchaseOrderLineEntity, PurchaseReceiptEntity, SupplierReturnEntity];
