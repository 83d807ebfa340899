import { decideReorder, demandStats, roundToPacks, substituteSupply, type SubstituteStock } from '@tappet/domain';
import { defaultShopSettings, type PurchaseOrder, type ReorderListResponse, type ReorderSuggestion, type SpecialOrderSuggestion } from '@tappet/contracts';
import type { Database } from '../../db/write-lock';
import type { Clock } from '../../lib/clock';
import type { AuditActor } from '../audit/audit.service';
import type { PartRow } from '../catalogue/catalogue.entity';
import type { CatalogueService } from '../catalogue/catalogue.service';
import { ShopSettingsEntity } from '../settings/settings.entity';
import { freeSellableStockOfShop } from '../stock/stock.queries';
import type { OrdersService } from './orders.service';
import { waitingSpecialOrders } from './special-orders';
import { PartPurchasingEntity, SupplierEntity, type ListingRow, type SupplierRow } from './purchasing.entity';
import type { SuppliersService } from './suppliers.service';

const DAY = 86_400_000;
/** Order statuses whose outstanding quantities count as stock on order (drafts too, so a drafted suggestion is not suggested again). */
const ON_ORDER = `('draft', 'awaiting_approval', 'approved', 'sent', 'partly_received')`;
/** A date as SQLite stores TypeORM datetimes, for comparisons in SQL. */
const sqlDate = (d: Date) => d.toISOString().replace('T', ' ').replace('Z', '');
const parseSqlDate = (s: string | Date) => (s instanceof Date ? s : new Date(`${s.replace(' ', 'T')}${s.endsWith('Z') ? '' : 'Z'}`));

/** What the reorder list needs of a part. */
type PartBrief = Pick<PartRow, 'id' | 'number' | 'description' | 'status'>;

/**
 * Demand on the days of the window that had any, in day order (day 0 is the window's first day).
 * Most parts are issued on a few days a year, so this is far smaller than one number per day.
 */
interface DayQuantities {
  days: number[];
  quantities: number[];
}

interface Feed {
  partId: string;
  number: string;
  /** Demand for the current part that arrived under this number, in current-part units. */
  demand: DayQuantities;
  /** Sum of `demand`, in day order. */
  total: number;
  /** Current-part units per unit of this number. */
  ratio: number;
}

/** What the reorder list needs of a supplier listing. */
type ReorderListing = Pick<ListingRow, 'id' | 'supplierId' | 'partId' | 'priceMinor' | 'packSize' | 'minOrderQty' | 'leadTimeDays' | 'lastPaidUnitMinor'>;

/**
 * The reorder list: demand history from the stock ledger (issues net of job returns; days without
 * issues count as 0) rolled up through the lineage engine into current parts, the supply that can
 * meet it, and one decision per part from libs/domain (`decideReorder`), grouped by supplier.
 */
export function createReorderService(deps: { db: Database; clock: Clock; catalogue: CatalogueService; suppliers: SuppliersService; orders: OrdersService }) {
  const { db, clock, catalogue, suppliers, orders } = deps;

  async function list(shopId: string): Promise<ReorderListResponse> {
    const now = clock.now();
    const shopSettings = await db.reader.findOne(ShopSettingsEntity, { where: { shopId } });
    const serviceLevel = shopSettings ? shopSettings.serviceLevelMilli / 1000 : defaultShopSettings.serviceLevel;
    const orderingCostMinor = shopSettings?.orderingCostMinor ?? defaultShopSettings.orderingCostMinor;
    const holdingCostRatePercent = shopSettings ? shopSettings.holdingCostRateMilliPercent / 1000 : defaultShopSettings.holdingCostRatePercent;
    const currency = shopSettings?.currency ?? defaultShopSettings.currency;
    const { demandWindowDays: window, deadStockDays } = await suppliers.settings(shopId);

    // Day 0 is the first whole day of the window; the last day is today.
    const today = Math.floor(now.getTime() / DAY) * DAY;
    const start = today - (window - 1) * DAY;
    // Summed per part and calendar day (UTC) in SQL: a busy shop has far fewer part-days than
    // movements. Times are stored as 'YYYY-MM-DD hh:mm:ss' text, so the day is the first ten
    // characters, in portable SQL (SQLite and PostgreSQL alike).
    const movements = await db.reader.query<Array<{ partId: string; day: string; delta: number }>>(
      `SELECT part_id AS partId, substr(occurred_at, 1, 10) AS day, SUM(quantity_delta) AS delta FROM stock_movements
       WHERE shop_id = ? AND kind IN ('issued', 'returned') AND condition <> 'core' AND occurred_at >= ? AND occurred_at <= ?
       GROUP BY part_id, substr(occurred_at, 1, 10)`,
      [shopId, sqlDate(new Date(start)), sqlDate(now)],
    );
    const issuedDaily = issuedByDay(movements, start, window);

    // Only the columns used, without entity hydration: over a whole catalogue that costs more than the query.
    const parts = new Map(
      (await db.reader.query<PartBrief[]>(`SELECT id, number, description, status FROM parts WHERE shop_id = ?`, [shopId])).map((p) => [p.id, p]),
    );
    const graph = await catalogue.graphOf(shopId);
    const feeds = new Map<string, Map<string, Feed>>();
    for (const [issuedId, demand] of issuedDaily) {
      const issued = parts.get(issuedId);
      if (!issued || !graph.hasPart(issuedId)) continue;
      for (const current of graph.currentParts(issuedId).current) {
        let byFeeder = feeds.get(current.partId);
        if (!byFeeder) feeds.set(current.partId, (byFeeder = new Map()));
        // Feeds are only read, so one unit per unit can share the issued days instead of copying them.
        const scaled = current.quantity === 1 ? demand : { days: demand.days, quantities: demand.quantities.map((q) => q * current.quantity) };
        byFeeder.set(issuedId, { partId: issuedId, number: issued.number, demand: scaled, total: sumOf(scaled), ratio: current.quantity });
      }
    }

    // Free stock through the stock module's query (cores are not sellable stock, so left out): one
    // grouped scan of the shop, where asking part by part re-read the lines chunk by chunk and grew
    // worse than linearly with the catalogue (docs/performance.md, reorder).
    const free = await freeSellableStockOfShop(db.reader, shopId);
    const onOrder = new Map(
      (
        await db.reader.query<Array<{ partId: string; n: number }>>(
          `SELECT l.part_id AS partId, SUM(l.quantity - l.received_quantity - l.cancelled_quantity) AS n FROM purchase_order_lines l
           JOIN purchase_orders o ON o.shop_id = l.shop_id AND o.id = l.order_id WHERE l.shop_id = ? AND o.status IN ${ON_ORDER} GROUP BY l.part_id`,
          [shopId],
        )
      ).map((r) => [r.partId, Number(r.n)]),
    );
    const pools = new Map(
      (await db.reader.query<Array<{ partId: string; q: number; v: number }>>(`SELECT part_id AS partId, SUM(quantity) AS q, SUM(value_minor) AS v FROM stock_pools WHERE shop_id = ? GROUP BY part_id`, [shopId])).map((r) => [
        r.partId,
        { quantity: Number(r.q), value: Number(r.v) },
      ]),
    );
    const manual = new Map((await db.reader.find(PartPurchasingEntity, { where: { shopId } })).map((r) => [r.partId, r]));
    const supplierRows = new Map((await db.reader.find(SupplierEntity, { where: { shopId } })).map((s) => [s.id, s]));
    const listingsByPart = new Map<string, ReorderListing[]>();
    for (const l of await listingsOf(shopId)) {
      const listings = listingsByPart.get(l.partId);
      if (listings) listings.push(l);
      else listingsByPart.set(l.partId, [l]);
    }

    const candidates = new Set<string>([...feeds.keys(), ...[...manual.values()].filter((m) => m.minQty !== null).map((m) => m.partId)]);
    const suggestions: ReorderSuggestion[] = [];
    const dates = Array.from({ length: window }, (_, i) => new Date(start + i * DAY).toISOString().slice(0, 10));
    // One day-by-day buffer for every candidate: a fresh array each was most of the list's garbage.
    const daily = new Array<number>(window).fill(0);
    for (const partId of candidates) {
      const part = parts.get(partId);
      if (!part || part.status === 'nla') continue;
      const byFeeder = feeds.get(partId) ?? new Map<string, Feed>();
      daily.fill(0);
      for (const f of byFeeder.values()) for (let k = 0; k < f.demand.days.length; k++) daily[f.demand.days[k]!]! += f.demand.quantities[k]!;
      const stats = demandStats(daily);

      const choice = chooseListing(listingsByPart.get(partId) ?? [], manual.get(partId)?.preferredSupplierId ?? null, supplierRows);
      const supplier = choice ? supplierRows.get(choice.supplierId)! : null;
      const leadTimeDays = choice?.leadTimeDays ?? supplier?.leadTimeDays ?? 14;
      const sdLeadTimeDays = supplier?.leadTimeSdDays ?? null;

      // Other parts' stock that can fill this demand (see substituteSupply in libs/domain).
      const subs: SubstituteStock[] = [];
      const full = new Set<string>();
      if (graph.hasPart(partId)) {
        for (const option of graph.canFill(partId).options) {
          const only = option.parts.length === 1 ? option.parts[0] : undefined;
          if (!only || only.partId === partId || option.needsChanges || full.has(only.partId)) continue;
          full.add(only.partId);
          const stock = free.get(only.partId) ?? 0;
          if (stock > 0) subs.push({ free: stock, unitsPerDemandUnit: only.quantity, scope: 'full' });
        }
      }
      const oneWay = new Set<string>();
      for (const f of byFeeder.values()) {
        if (f.partId === partId || full.has(f.partId)) continue;
        oneWay.add(f.partId);
        const stock = free.get(f.partId) ?? 0;
        const ownMean = f.total / window;
        if (stock > 0) subs.push({ free: stock, unitsPerDemandUnit: 1 / f.ratio, scope: 'own_demand_only', ownDemand: ownMean * leadTimeDays });
      }
      const substitutes = substituteSupply(subs);
      const freeHere = Math.max(0, free.get(partId) ?? 0);
      const ordered = onOrder.get(partId) ?? 0;
      const position = freeHere + ordered + substitutes;

      const pool = pools.get(partId);
      const unitCost = choice?.lastPaidUnitMinor ?? (pool && pool.quantity > 0 ? pool.value / pool.quantity : null) ?? (choice && supplier?.currency === currency ? choice.priceMinor : null);
      const m = manual.get(partId);
      const decision = decideReorder({
        meanDemandPerDay: stats.mean,
        sdDemandPerDay: stats.standardDeviation,
        leadTimeDays,
        sdLeadTimeDays,
        service: { serviceLevel },
        orderCostMinor: orderingCostMinor,
        holdingRatePerYear: holdingCostRatePercent / 100,
        unitCostMinor: unitCost,
        stockPosition: position,
        pack: { packSize: choice?.packSize ?? 1, minOrderQty: choice?.minOrderQty ?? 0 },
        manual: m ? { min: m.minQty, max: m.maxQty } : undefined,
      });
      if (!decision || decision.quantity === 0) continue;
      const reasons = [...decision.reasons];
      reasons.unshift(`Stock position ${round2(position)}: ${freeHere} free here, ${ordered} on order${substitutes > 0 ? `, ${round2(substitutes)} from parts that can fill it` : ''}.`);
      const older = [...byFeeder.values()].filter((f) => f.partId !== partId);
      if (older.length > 0) reasons.unshift(`Demand includes issues under ${older.map((f) => `${f.number}${f.ratio !== 1 ? ` (×${round2(f.ratio)})` : ''}`).join(', ')}, which resolve to ${part.number}.`);
      if (!supplier) reasons.push('No supplier lists this part: add a listing to order it.');
      suggestions.push({
        partId,
        partNumber: part.number,
        description: part.description,
        supplierId: supplier?.id ?? null,
        supplierName: supplier?.name ?? null,
        listingId: choice?.id ?? null,
        method: decision.method,
        demand: {
          windowDays: window,
          total: round2(daily.reduce((s, d) => s + d, 0)),
          meanPerDay: stats.mean,
          sdPerDay: stats.standardDeviation,
          fedBy: [...byFeeder.values()].map((f) => ({ partId: f.partId, number: f.number, quantity: round2(f.total), ownDemandOnly: oneWay.has(f.partId) })),
        },
        leadTime: { days: leadTimeDays, sdDays: sdLeadTimeDays },
        serviceLevel,
        z: decision.z,
        model: decision.model,
        safetyStock: decision.safetyStock,
        reorderPoint: decision.reorderPoint,
        eoq: decision.eoq,
        supply: { free: freeHere, onOrder: ordered, substitutes, position },
        wanted: decision.wanted,
        quantity: decision.quantity,
        packSize: choice?.packSize ?? 1,
        minOrderQty: choice?.minOrderQty ?? 0,
        unitPriceMinor: choice?.priceMinor ?? null,
        valueMinor: choice ? choice.priceMinor * decision.quantity : null,
        currency: supplier?.currency ?? null,
        reasons,
        history: historyOf(byFeeder, dates),
      });
    }
    suggestions.sort((a, b) => (a.supplierName ?? '\uffff').localeCompare(b.supplierName ?? '\uffff') || a.partNumber.localeCompare(b.partNumber));

    // Jobs' special orders waiting to be bought (open, or ordered on an order cancelled or closed
    // short): what is still to buy, rounded up to the supplier's pack, marked for the job. They are
    // bought whatever the stock position (free stock is shown so the buyer can hold it instead).
    const specialOrders: SpecialOrderSuggestion[] = [];
    for (const so of await waitingSpecialOrders(db.reader, shopId)) {
      const part = parts.get(so.partId);
      if (!part) continue;
      const choice = chooseListing(listingsByPart.get(so.partId) ?? [], manual.get(so.partId)?.preferredSupplierId ?? null, supplierRows);
      const supplier = choice ? supplierRows.get(choice.supplierId)! : null;
      const quantity = choice ? roundToPacks(so.remaining, { packSize: choice.packSize, minOrderQty: choice.minOrderQty }).quantity : so.remaining;
      specialOrders.push({
        specialOrderId: so.id,
        jobId: so.jobId,
        jobNumber: Number(so.jobNumber),
        partId: so.partId,
        partNumber: part.number,
        description: part.description,
        needed: so.remaining,
        quantity,
        free: free.get(so.partId) ?? 0,
        supplierId: supplier?.id ?? null,
        supplierName: supplier?.name ?? null,
        unitPriceMinor: choice?.priceMinor ?? null,
        valueMinor: choice ? choice.priceMinor * quantity : null,
        currency: supplier?.currency ?? null,
        requestedAt: so.createdAt.toISOString(),
      });
    }

    const groups = new Map<string | null, ReorderListResponse['groups'][number]>();
    for (const s of suggestions) {
      const supplier = s.supplierId ? supplierRows.get(s.supplierId)! : null;
      let g = groups.get(s.supplierId);
      if (!g) groups.set(s.supplierId, (g = { supplierId: s.supplierId, supplierName: s.supplierName, currency: s.currency, totalMinor: 0, minOrderValueMinor: supplier?.minOrderValueMinor ?? 0, shortfallMinor: 0, partIds: [], specialOrderIds: [] }));
      g.totalMinor += s.valueMinor ?? 0;
      g.partIds.push(s.partId);
    }
    for (const s of specialOrders) {
      const supplier = s.supplierId ? supplierRows.get(s.supplierId)! : null;
      let g = groups.get(s.supplierId);
      if (!g) groups.set(s.supplierId, (g = { supplierId: s.supplierId, supplierName: s.supplierName, currency: s.currency, totalMinor: 0, minOrderValueMinor: supplier?.minOrderValueMinor ?? 0, shortfallMinor: 0, partIds: [], specialOrderIds: [] }));
      g.totalMinor += s.valueMinor ?? 0;
      g.specialOrderIds.push(s.specialOrderId);
    }
    for (const g of groups.values()) g.shortfallMinor = Math.max(0, g.minOrderValueMinor - g.totalMinor);

    const health = await stockHealth(shopId, parts, pools, issuedDaily, now, window, deadStockDays);
    return {
      generatedAt: now.toISOString(),
      settings: { demandWindowDays: window, deadStockDays, serviceLevel, orderingCostMinor, holdingCostRatePercent, currency },
      suggestions,
      specialOrders,
      groups: [...groups.values()],
      ...health,
    };
  }

  /** Every listing of the shop, only the columns used and without entity hydration (a listing per part or more: it adds up). */
  async function listingsOf(shopId: string): Promise<ReorderListing[]> {
    return db.reader.query<ReorderListing[]>(
      `SELECT id, supplier_id AS supplierId, part_id AS partId, price_minor AS priceMinor, pack_size AS packSize, min_order_qty AS minOrderQty,
         lead_time_days AS leadTimeDays, last_paid_unit_minor AS lastPaidUnitMinor
       FROM supplier_listings WHERE shop_id = ?`,
      [shopId],
    );
  }

  /** Dead stock: on hand, not issued for `deadStockDays` (or never); slow movers: on hand for more than a year of the window's demand. */
  async function stockHealth(shopId: string, parts: Map<string, PartBrief>, pools: Map<string, { quantity: number; value: number }>, issuedDaily: Map<string, DayQuantities>, now: Date, window: number, deadStockDays: number) {
    const last = new Map(
      (await db.reader.query<Array<{ partId: string; at: string }>>(`SELECT part_id AS partId, MAX(occurred_at) AS at FROM stock_movements WHERE shop_id = ? AND kind = 'issued' GROUP BY part_id`, [shopId])).map((r) => [r.partId, parseSqlDate(r.at)]),
    );
    const slowMovers: ReorderListResponse['slowMovers'] = [];
    const deadStock: ReorderListResponse['deadStock'] = [];
    for (const [partId, pool] of pools) {
      const part = parts.get(partId);
      if (!part || pool.quantity <= 0) continue;
      const lastIssuedAt = last.get(partId) ?? null;
      const demand = issuedDaily.get(partId);
      const issued = demand ? sumOf(demand) : 0;
      const row = { partId, partNumber: part.number, description: part.description, onHand: pool.quantity, valueMinor: pool.value, lastIssuedAt: lastIssuedAt?.toISOString() ?? null, issuedInWindow: issued };
      if (!lastIssuedAt || now.getTime() - lastIssuedAt.getTime() > deadStockDays * DAY) deadStock.push(row);
      else if (issued === 0 || pool.quantity / (issued / window) > 365) slowMovers.push(row);
    }
    const byValue = (a: { valueMinor: number }, b: { valueMinor: number }) => b.valueMinor - a.valueMinor;
    return { slowMovers: slowMovers.sort(byValue), deadStock: deadStock.sort(byValue) };
  }

  return {
    list,

    /**
     * Turns suggestions (and jobs' special orders) into draft orders, one per supplier, at the
     * listed prices, in one transaction. A foreign-currency supplier takes the rate of its latest
     * order in that currency; what has no supplier (or no known rate) is skipped with the reason.
     * A special order's line is linked to it, so the receipt holds what arrives for the job.
     */
    async draftOrders(shopId: string, choice: { partIds: string[]; specialOrderIds: string[] }, actor: AuditActor): Promise<{ orders: PurchaseOrder[]; skipped: Array<{ partId: string; reason: string }> }> {
      const computed = await list(shopId);
      const skipped: Array<{ partId: string; reason: string }> = [];
      type Line = { partId: string; quantity: number; unitPriceMinor: number | null; specialOrderId: string | null };
      const bySupplier = new Map<string, Line[]>();
      const add = (supplierId: string, line: Line) => bySupplier.set(supplierId, [...(bySupplier.get(supplierId) ?? []), line]);
      for (const id of new Set(choice.partIds)) {
        const s = computed.suggestions.find((x) => x.partId === id);
        if (!s) skipped.push({ partId: id, reason: 'Not on the reorder list (nothing is due, or no such part in this shop).' });
        else if (!s.supplierId) skipped.push({ partId: id, reason: 'No supplier lists this part.' });
        else add(s.supplierId, { partId: s.partId, quantity: s.quantity, unitPriceMinor: s.unitPriceMinor, specialOrderId: null });
      }
      for (const id of new Set(choice.specialOrderIds)) {
        const s = computed.specialOrders.find((x) => x.specialOrderId === id);
        if (!s) skipped.push({ partId: id, reason: 'That special order is not waiting to be ordered (already ordered, or not in this shop).' });
        else if (!s.supplierId) skipped.push({ partId: s.partId, reason: `No supplier lists ${s.partNumber} (special order for job ${s.jobNumber}).` });
        else add(s.supplierId, { partId: s.partId, quantity: s.quantity, unitPriceMinor: s.unitPriceMinor, specialOrderId: s.specialOrderId });
      }
      const rates = new Map<string, string>();
      for (const supplierId of bySupplier.keys()) {
        const supplier = (await db.reader.findOne(SupplierEntity, { where: { shopId, id: supplierId } })) as SupplierRow;
        if (supplier.currency === computed.settings.currency) continue;
        const [latest] = await db.reader.query<Array<{ rate: string }>>(`SELECT exchange_rate AS rate FROM purchase_orders WHERE shop_id = ? AND currency = ? ORDER BY created_at DESC LIMIT 1`, [shopId, supplier.currency]);
        if (latest) rates.set(supplierId, latest.rate);
        else {
          for (const s of bySupplier.get(supplierId)!) skipped.push({ partId: s.partId, reason: `${supplier.name} invoices in ${supplier.currency} and no rate is known yet: write this order by hand with the rate.` });
          bySupplier.delete(supplierId);
        }
      }
      const ids = await db.write(async (manager) => {
        const out: string[] = [];
        for (const [supplierId, lines] of bySupplier) {
          out.push(
            await orders.insertDraft(
              manager,
              shopId,
              {
                supplierId,
                exchangeRate: rates.get(supplierId),
                note: 'Drafted from the reorder list.',
                lines: lines.map((l) => ({ partId: l.partId, quantity: l.quantity, unitPriceMinor: l.unitPriceMinor ?? undefined, coreDepositMinor: 0, purpose: null, specialOrderId: l.specialOrderId })),
              },
              actor,
            ),
          );
        }
        return out;
      });
      return { orders: await Promise.all(ids.map((id) => orders.get(shopId, id))), skipped };
    },
  };
}

const round2 = (n: number) => Math.round(n * 100) / 100;

/** The preferred supplier's listing, else the cheapest listing of an active supplier (ties by name). */
function chooseListing(listings: ReorderListing[], preferredSupplierId: string | null, suppliers: Map<string, SupplierRow>): ReorderListing | null {
  const usable = listings.filter((l) => suppliers.get(l.supplierId)?.active);
  const preferred = usable.find((l) => l.supplierId === preferredSupplierId);
  if (preferred) return preferred;
  return usable.sort((a, b) => a.priceMinor - b.priceMinor || suppliers.get(a.supplierId)!.name.localeCompare(suppliers.get(b.supplierId)!.name))[0] ?? null;
}

/**
 * Issues net of job returns per part and day of the window, from the ledger's per-part-and-day sums
 * (days with net returns count as 0). Every part with a movement in the window has an entry, even
 * if all its days net to 0: it is still a reorder candidate.
 */
function issuedByDay(rows: Array<{ partId: string; day: string; delta: number }>, start: number, window: number): Map<string, DayQuantities> {
  const byPart = new Map<string, DayQuantities>();
  for (const row of rows) {
    const day = Math.round((Date.parse(`${row.day}T00:00:00Z`) - start) / DAY);
    if (day < 0 || day >= window) continue;
    let demand = byPart.get(row.partId);
    if (!demand) byPart.set(row.partId, (demand = { days: [], quantities: [] }));
    demand.days.push(day);
    // Issues are negative deltas; returns from jobs (positive) are netted on the day they come back.
    demand.quantities.push(-Number(row.delta));
  }
  for (const [partId, demand] of byPart) byPart.set(partId, inDayOrder(demand));
  return byPart;
}

/** Sorted by day (rows come in no promised order), a day's quantities summed, days of 0 or less left out. */
function inDayOrder(demand: DayQuantities): DayQuantities {
  const order = demand.days.map((_, k) => k).sort((a, b) => demand.days[a]! - demand.days[b]!);
  const out: DayQuantities = { days: [], quantities: [] };
  for (let k = 0; k < order.length; ) {
    const day = demand.days[order[k]!]!;
    let quantity = 0;
    for (; k < order.length && demand.days[order[k]!] === day; k++) quantity += demand.quantities[order[k]!]!;
    if (quantity > 0) {
      out.days.push(day);
      out.quantities.push(quantity);
    }
  }
  return out;
}

/** Total demand, summed in day order (as a day-by-day sum would, so the figures do not drift). */
function sumOf(demand: DayQuantities): number {
  let total = 0;
  for (const q of demand.quantities) total += q;
  return total;
}

/** Days with demand, split by the number issued under (the chart stacks them). */
function historyOf(byFeeder: Map<string, Feed>, dates: string[]): ReorderSuggestion['history'] {
  const out: ReorderSuggestion['history'] = dates.map((date) => ({ date, byNumber: {} }));
  // Feeder by feeder, so each day's numbers keep the feeders' order.
  for (const f of byFeeder.values()) {
    const { days, quantities } = f.demand;
    for (let k = 0; k < days.length; k++) if (quantities[k]! > 0) out[days[k]!]!.byNumber[f.number] = round2(quantities[k]!);
  }
  return out;
}

export type ReorderService = ReturnType<typeof createReorderService>;
