/* eslint-disable @nx/enforce-module-boundaries -- the seed writes through the API's own entities (see demo.ts) */
import type { EntityManager } from 'typeorm';
import { closingPosition, normalisePartNumber, seededRandom } from '@tappet/domain';
import type { MovementKind, StockCondition } from '@tappet/contracts';
import { recordAudit } from '../apps/api/src/modules/audit/audit.service';
import { PartEntity, type PartRow } from '../apps/api/src/modules/catalogue/catalogue.entity';
import { BinEntity, HoldEntity, MovementEntity, SerialEntity, StockLineEntity, StockPoolEntity, type BinRow, type HoldRow, type MovementRow, type SerialRow } from '../apps/api/src/modules/stock/stock.entity';

// Invented stock for the demo shops: bins, two years of movements dated back from the seed day,
// a few held parts and serialised engines and gearboxes. The ledger is simulated in memory (the
// same valuation library as the API) and written in batches, so the seed stays fast; the demo
// test runs check:ledger over the result.

const DAY = 86_400_000;

/** A small seeded PRNG (mulberry32) so every seed gives the same stock. */
function prng(seed: number) {
  const next = seededRandom(seed);
  const uuid = () => {
    const hex = Array.from({ length: 32 }, () => Math.floor(next() * 16).toString(16));
    hex[12] = '4';
    hex[16] = (Math.floor(next() * 4) + 8).toString(16);
    const h = hex.join('');
    return `${h.slice(0, 8)}-${h.slice(8, 12)}-${h.slice(12, 16)}-${h.slice(16, 20)}-${h.slice(20)}`;
  };
  return { next, uuid, int: (min: number, max: number) => min + Math.floor(next() * (max - min + 1)), pick: <T>(list: readonly T[]): T => list[Math.floor(next() * list.length)]!, chance: (p: number) => next() < p };
}
type Rng = ReturnType<typeof prng>;

interface DemoUsers {
  owner: string | null;
  buyer: string | null;
  mechanic: string | null;
}

/** Planned event of the simulation; applied in date order. */
type Plan =
  | { at: number; kind: 'received'; part: PartRow; bin: BinRow; condition: StockCondition; quantity: number; unitCost: number; reference: string }
  | { at: number; kind: 'issued'; part: PartRow; bin: BinRow; condition: StockCondition; quantity: number; reference: string }
  | { at: number; kind: 'returned'; part: PartRow; bin: BinRow; condition: StockCondition; quantity: number; reference: string }
  | { at: number; kind: 'adjusted'; part: PartRow; bin: BinRow; condition: StockCondition; delta: number; reason: string }
  | { at: number; kind: 'moved'; part: PartRow; bin: BinRow; to: BinRow; condition: StockCondition; quantity: number }
  | { at: number; kind: 'counted'; part: PartRow; bin: BinRow; condition: StockCondition; shortBy: number };

/** Simulates one shop's ledger and writes it. */
class ShopStock {
  readonly movements: MovementRow[] = [];
  readonly lines = new Map<string, { partId: string; binId: string; condition: StockCondition; onHand: number; held: number }>();
  readonly pools = new Map<string, { partId: string; condition: StockCondition; method: 'average' | 'specific'; quantity: number; value: number }>();
  readonly holds: HoldRow[] = [];
  readonly serials: SerialRow[] = [];
  private seq = 0;

  constructor(
    readonly shopId: string,
    readonly rng: Rng,
    readonly users: DemoUsers,
    readonly now: Date,
  ) {}

  line(partId: string, binId: string, condition: StockCondition) {
    const key = `${partId}|${binId}|${condition}`;
    let l = this.lines.get(key);
    if (!l) this.lines.set(key, (l = { partId, binId, condition, onHand: 0, held: 0 }));
    return l;
  }

  pool(partId: string, condition: StockCondition) {
    const key = `${partId}|${condition}`;
    let p = this.pools.get(key);
    if (!p) this.pools.set(key, (p = { partId, condition, method: 'average', quantity: 0, value: 0 }));
    return p;
  }

  private push(at: number, kind: MovementKind, fields: Partial<MovementRow> & Pick<MovementRow, 'partId' | 'binId' | 'condition' | 'quantityDelta' | 'valueChangeMinor'>, userId: string | null): void {
    this.movements.push({
      id: this.rng.uuid(),
      shopId: this.shopId,
      seq: ++this.seq,
      kind,
      toBinId: null,
      countedQuantity: null,
      unitCostMinor: null,
      serialId: null,
      reason: null,
      reference: null,
      note: null,
      holdId: null,
      jobId: null,
      occurredAt: new Date(at),
      recordedAt: new Date(at),
      userId,
      apiKeyId: null,
      ...fields,
    });
  }

  /** Applies a planned event if the stock allows it (an issue of more than is free is skipped). */
  apply(e: Plan): void {
    const line = this.line(e.part.id, e.bin.id, e.condition);
    const pool = this.pool(e.part.id, e.condition);
    const free = line.onHand - line.held;
    const base = { partId: e.part.id, binId: e.bin.id, condition: e.condition };
    const valueOf = (m: Parameters<typeof closingPosition>[0][number]) => closingPosition([m], { quantity: pool.quantity, value: pool.value }).value - pool.value;
    switch (e.kind) {
      case 'received': {
        const change = valueOf({ kind: 'receipt', quantity: e.quantity, unitCost: e.unitCost });
        this.push(e.at, 'received', { ...base, quantityDelta: e.quantity, unitCostMinor: e.unitCost, valueChangeMinor: change, reference: e.reference }, this.users.buyer);
        line.onHand += e.quantity;
        pool.quantity += e.quantity;
        pool.value += change;
        return;
      }
      case 'issued': {
        if (e.quantity > free) return;
        const change = valueOf({ kind: 'issue', quantity: e.quantity });
        this.push(e.at, 'issued', { ...base, quantityDelta: -e.quantity, valueChangeMinor: change, reference: e.reference }, this.users.mechanic);
        line.onHand -= e.quantity;
        pool.quantity -= e.quantity;
        pool.value += change;
        return;
      }
      case 'returned': {
        if (pool.quantity === 0) return;
        const change = valueOf({ kind: 'return', quantity: e.quantity });
        this.push(e.at, 'returned', { ...base, quantityDelta: e.quantity, valueChangeMinor: change, reference: e.reference, note: 'Not needed after all' }, this.users.mechanic);
        line.onHand += e.quantity;
        pool.quantity += e.quantity;
        pool.value += change;
        return;
      }
      case 'adjusted': {
        if (-e.delta > free) return;
        const change = valueOf({ kind: 'adjustment', quantityDelta: e.delta });
        this.push(e.at, 'adjusted', { ...base, quantityDelta: e.delta, valueChangeMinor: change, reason: e.reason }, this.users.owner);
        line.onHand += e.delta;
        pool.quantity += e.delta;
        pool.value += change;
        return;
      }
      case 'moved': {
        const quantity = Math.min(e.quantity, free);
        if (quantity <= 0 || e.to.id === e.bin.id) return;
        this.push(e.at, 'moved', { ...base, toBinId: e.to.id, quantityDelta: -quantity, valueChangeMinor: 0, reference: 'Shelves re-sorted' }, this.users.buyer);
        line.onHand -= quantity;
        this.line(e.part.id, e.to.id, e.condition).onHand += quantity;
        return;
      }
      case 'counted': {
        const delta = -Math.min(e.shortBy, free);
        const change = delta === 0 ? 0 : valueOf({ kind: 'adjustment', quantityDelta: delta });
        this.push(e.at, 'counted', { ...base, quantityDelta: delta, countedQuantity: line.onHand + delta, valueChangeMinor: change, note: 'Yearly count' }, this.users.owner);
        line.onHand += delta;
        pool.quantity += delta;
        pool.value += change;
        return;
      }
    }
  }

  /** A numbered item received (and perhaps issued later), each at its own cost. */
  serialised(part: PartRow, bin: BinRow, condition: StockCondition, serial: string, cost: number, receivedAt: number, issuedAt?: { at: number; reference: string }): void {
    const item: SerialRow = { id: this.rng.uuid(), shopId: this.shopId, partId: part.id, serial, serialKey: normalisePartNumber(serial), condition, binId: bin.id, costMinor: cost, inStock: true, receivedAt: new Date(receivedAt) };
    this.serials.push(item);
    const pool = this.pool(part.id, condition);
    pool.method = 'specific';
    const line = this.line(part.id, bin.id, condition);
    this.push(receivedAt, 'received', { partId: part.id, binId: bin.id, condition, quantityDelta: 1, unitCostMinor: cost, valueChangeMinor: cost, serialId: item.id, reference: 'Bought at an autojumble' }, this.users.owner);
    line.onHand += 1;
    pool.quantity += 1;
    pool.value += cost;
    if (issuedAt) {
      this.push(issuedAt.at, 'issued', { partId: part.id, binId: bin.id, condition, quantityDelta: -1, valueChangeMinor: -cost, serialId: item.id, reference: issuedAt.reference }, this.users.mechanic);
      item.inStock = false;
      item.binId = null;
      line.onHand -= 1;
      pool.quantity -= 1;
      pool.value -= cost;
    }
  }

  hold(part: PartRow, bin: BinRow, condition: StockCondition, quantity: number, purpose: string, at: number): void {
    const line = this.line(part.id, bin.id, condition);
    if (line.onHand - line.held < quantity) return;
    line.held += quantity;
    this.holds.push({ id: this.rng.uuid(), shopId: this.shopId, partId: part.id, binId: bin.id, condition, quantity, purpose, jobId: null, status: 'active', createdByUserId: this.users.mechanic, createdAt: new Date(at), closedAt: null });
  }

  async write(manager: EntityManager, bins: BinRow[]): Promise<void> {
    const batches = <T>(rows: T[], size: number) => Array.from({ length: Math.ceil(rows.length / size) }, (_, i) => rows.slice(i * size, i * size + size));
    const at = this.now;
    for (const b of batches(bins, 100)) await manager.insert(BinEntity, b);
    for (const b of batches(this.serials, 100)) await manager.insert(SerialEntity, b);
    for (const b of batches(this.holds, 100)) await manager.insert(HoldEntity, b);
    for (const b of batches(this.movements, 150)) await manager.insert(MovementEntity, b);
    const lines = [...this.lines.values()].map((l) => ({ shopId: this.shopId, ...l, updatedAt: at }));
    for (const b of batches(lines, 200)) await manager.insert(StockLineEntity, b);
    const pools = [...this.pools.values()].map((p) => ({ shopId: this.shopId, partId: p.partId, condition: p.condition, method: p.method, quantity: p.quantity, valueMinor: p.value, updatedAt: at }));
    for (const b of batches(pools, 200)) await manager.insert(StockPoolEntity, b);
  }
}

const bin = (rng: Rng, shopId: string, code: string, description: string, at: Date): BinRow => ({ id: rng.uuid(), shopId, code, codeKey: code.toUpperCase(), description, active: true, createdAt: at, updatedAt: at });

/** Typical cost of a part of a category, in minor units. */
const costByCategory: Record<string, [number, number]> = {
  Electrics: [450, 6500],
  Brakes: [600, 4200],
  Clutch: [300, 2800],
  'Gaskets & seals': [90, 1800],
  'Frame & forks': [800, 9500],
  'Cycle parts': [500, 7800],
  Engine: [400, 12_000],
};

async function usersOf(manager: EntityManager, shopId: string): Promise<DemoUsers> {
  const rows = await manager.query<Array<{ role: string; userId: string }>>(`SELECT role, user_id AS userId FROM memberships WHERE shop_id = ? AND is_active = 1 ORDER BY created_at`, [shopId]);
  const of = (role: string) => rows.find((r) => r.role === role)?.userId ?? rows.find((r) => r.role === 'owner')?.userId ?? null;
  return { owner: of('owner'), buyer: of('buyer'), mechanic: of('mechanic') };
}

/** Plans two years of life for one part on the shelf. */
function planPart(rng: Rng, part: PartRow, bins: BinRow[], condition: StockCondition, start: number, end: number, jobNumber: () => number): Plan[] {
  const [low, high] = costByCategory[part.category ?? ''] ?? [300, 5000];
  let cost = rng.int(low, high);
  if (condition === 'used_fair' || condition === 'core') cost = Math.round(cost * 0.3);
  if (condition === 'used_good') cost = Math.round(cost * 0.5);
  if (condition === 'nos') cost = Math.round(cost * 1.4);
  const home = rng.pick(bins);
  const plans: Plan[] = [];
  let t = start + rng.int(0, 60) * DAY;
  plans.push({ at: t, kind: 'received', part, bin: home, condition, quantity: rng.int(3, 16), unitCost: cost, reference: `Delivery ${rng.int(1000, 1999)}` });
  while (true) {
    t += rng.int(12, 75) * DAY;
    if (t >= end) break;
    const roll = rng.next();
    if (roll < 0.55) plans.push({ at: t, kind: 'issued', part, bin: home, condition, quantity: rng.int(1, 3), reference: rng.chance(0.8) ? `Job ${jobNumber()}` : 'Counter sale' });
    else if (roll < 0.78 && condition !== 'nos') {
      // Prices drift up a little with each delivery.
      cost = Math.round(cost * (1 + rng.int(0, 6) / 100));
      plans.push({ at: t, kind: 'received', part, bin: home, condition, quantity: rng.int(2, 10), unitCost: cost, reference: `Delivery ${rng.int(2000, 3999)}` });
    } else if (roll < 0.83) plans.push({ at: t, kind: 'returned', part, bin: home, condition, quantity: 1, reference: `Job ${jobNumber()}` });
    else if (roll < 0.88) plans.push({ at: t, kind: 'adjusted', part, bin: home, condition, delta: -1, reason: rng.pick(['Damaged in storage', 'Found corroded, scrapped', 'Dropped, cracked']) });
    else if (roll < 0.93) plans.push({ at: t, kind: 'moved', part, bin: home, to: rng.pick(bins), condition, quantity: rng.int(1, 3) });
    else plans.push({ at: t, kind: 'counted', part, bin: home, condition, shortBy: rng.chance(0.6) ? 0 : 1 });
  }
  return plans;
}

/**
 * Writes the demo stock inside the seed's write: Harbour Works gets bins across two aisles, an
 * engine bay and a core shelf, about 130 stocked parts in several conditions with two years of
 * movements, a few active holds and serialised engines and gearboxes; Brackenfold Garage a small
 * stock of its own. Audited as one event per shop.
 */
export async function seedStockDemo(manager: EntityManager, shops: { harbour: string; brackenfold: string }, now: Date): Promise<void> {
  const end = now.getTime() - DAY;
  const start = now.getTime() - 730 * DAY;

  for (const [shopId, seed, size] of [
    [shops.harbour, 1968, 130],
    [shops.brackenfold, 1974, 12],
  ] as const) {
    const rng = prng(seed);
    const users = await usersOf(manager, shopId);
    const parts = await manager.getRepository(PartEntity).find({ where: { shopId }, order: { key: 'ASC' } });
    const byNumber = new Map(parts.map((p) => [p.number, p]));
    const stock = new ShopStock(shopId, rng, users, now);
    const bins: BinRow[] = [];
    for (const aisle of ['A', 'B', 'C'].slice(0, shopId === shops.harbour ? 3 : 1)) {
      for (let shelf = 1; shelf <= (shopId === shops.harbour ? 8 : 3); shelf++) bins.push(bin(rng, shopId, `${aisle}-${String(shelf).padStart(2, '0')}`, `Aisle ${aisle}, shelf ${shelf}`, now));
    }
    const shelves = [...bins];
    const engineBay = bin(rng, shopId, 'ENG-BAY', 'Engine bay, floor racking by the roller door', now);
    const coreShelf = bin(rng, shopId, 'CORE', 'Cores waiting to go back for exchange', now);
    bins.push(engineBay, coreShelf);

    let job = 140;
    const jobNumber = () => (job += rng.int(0, 2));
    const plans: Plan[] = [];
    const stocked = parts.filter((p) => p.status === 'available' || rng.chance(0.4)).filter(() => rng.chance(Math.min(1, size / Math.max(1, parts.length))));
    for (const part of stocked.slice(0, size)) {
      const condition: StockCondition = part.status === 'nla' ? rng.pick(['nos', 'used_good', 'used_fair'] as const) : rng.chance(0.8) ? 'new' : rng.pick(['used_good', 'reconditioned'] as const);
      plans.push(...planPart(rng, part, shelves, condition, start, end, jobNumber));
      if (rng.chance(0.08)) plans.push(...planPart(rng, part, [coreShelf], 'core', start, end, jobNumber).filter((p) => p.kind === 'received').slice(0, 1));
    }

    // The named cases the demo shows in the lookup and on the part page.
    const b04 = shelves.find((b) => b.code === 'B-04') ?? shelves[0]!;
    const shelf = (i: number) => shelves[(i + shelves.length) % shelves.length]!;
    const named: Array<[string, StockCondition, BinRow, number, number]> = [
      ['70-4411', 'new', b04, 3, 1450], // none of 67-4410, but 3 of its replacement in B-04
      ['70-4412', 'new', b04, 8, 240],
      ['71-9000', 'new', shelf(2), 4, 3850],
      ['VM/00880', 'new', shelf(5), 6, 920],
      ['TR/5180', 'new', shelf(-1), 4, 2875], // the 12 volt rectifier, reproduction
      ['VM/01241', 'nos', shelf(1), 5, 1630],
    ];
    for (const [number, condition, where, quantity, cost] of named) {
      const part = byNumber.get(number);
      if (part) plans.push({ at: start + 20 * DAY, kind: 'received', part, bin: where, condition, quantity, unitCost: cost, reference: 'Opening stock' });
    }

    plans.sort((a, b) => a.at - b.at);
    for (const p of plans) stock.apply(p);

    if (shopId === shops.harbour) {
      // Serialised engines and gearboxes, each at its own cost (parts of their own in the catalogue).
      const unit = (number: string, description: string, maker: string): PartRow => ({ id: rng.uuid(), shopId, number, key: normalisePartNumber(number), description, origin: 'genuine', maker, category: 'Engine', unit: 'each', status: 'nla', notes: 'Tracked one by one by the number stamped on the casing.', createdAt: now, updatedAt: now });
      const engine = unit('71-0350E', 'Engine unit, Tern 350, complete', 'Corran');
      const gearbox = unit('04-5004G', 'Gearbox, four-speed, Heron 500', 'Astley-Pike');
      if (!byNumber.has(engine.number) && !byNumber.has(gearbox.number)) {
        await manager.insert(PartEntity, [engine, gearbox]);
        stock.serialised(engine, engineBay, 'used_good', 'T350 10412', 185_000, start + 40 * DAY);
        stock.serialised(engine, engineBay, 'used_fair', 'T350 22071', 92_500, start + 210 * DAY);
        stock.serialised(engine, engineBay, 'reconditioned', 'T350 08816', 264_000, start + 330 * DAY, { at: start + 500 * DAY, reference: 'Job 171' });
        stock.serialised(engine, engineBay, 'reconditioned', 'T350 31150', 251_000, start + 610 * DAY);
        stock.serialised(gearbox, engineBay, 'used_good', 'H5G 4471', 58_000, start + 150 * DAY);
      }
      // Parts set aside for work in the shop.
      const purposes = ['Recommissioning, 1968 Tern 350 (customer)', 'Pre-sale inspection, blue Heron 500', 'Restoration, barn-find Velmark twin', 'Customer collecting Saturday'];
      const candidates = [...stock.lines.values()].filter((l) => l.onHand >= 2 && l.condition !== 'core');
      for (let i = 0; i < Math.min(6, candidates.length); i++) {
        const l = candidates[Math.floor((i * candidates.length) / 6)]!;
        const part = parts.find((p) => p.id === l.partId);
        const where = bins.find((b) => b.id === l.binId);
        if (part && where) stock.hold(part, where, l.condition, rng.int(1, Math.min(2, l.onHand)), purposes[i % purposes.length]!, end - rng.int(1, 20) * DAY);
      }
    }

    await stock.write(manager, bins);
    await recordAudit(manager, {
      shopId,
      actor: { userId: null, ip: null },
      action: 'stock.seeded',
      entity: 'stock',
      entityId: null,
      changes: { bins: { before: 0, after: bins.length }, movements: { before: 0, after: stock.movements.length } },
      at: now,
    });
  }
}
