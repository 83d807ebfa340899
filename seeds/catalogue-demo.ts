/* eslint-disable @nx/enforce-module-boundaries -- the seed writes through the API's own entities (see demo.ts) */
import type { EntityManager } from 'typeorm';
import { normalisePartNumber, seededRandom } from '@tappet/domain';
import { FitmentEntity, PartEntity, PartLinkEntity, PartSupplierNumberEntity, type FitmentRow, type PartLinkRow, type PartRow } from '../apps/api/src/modules/catalogue/catalogue.entity';
import { recordAudit } from '../apps/api/src/modules/audit/audit.service';

// An invented catalogue for the demo shops: invented marques, models, makers and suppliers of
// 1960s–70s motorcycles. Generated from a seeded PRNG, so every seed gives the same catalogue.

/** mulberry32: a small, well-known seeded PRNG; returns numbers in [0, 1). */
function prng(seed: number) {
  const next = seededRandom(seed);
  return {
    next,
    int: (min: number, max: number) => min + Math.floor(next() * (max - min + 1)),
    pick: <T>(list: readonly T[]): T => list[Math.floor(next() * list.length)]!,
    chance: (p: number) => next() < p,
    /** A version-4-shaped UUID from the PRNG, so ids are the same on every seed too. */
    uuid: () => {
      const hex = Array.from({ length: 32 }, () => Math.floor(next() * 16).toString(16));
      hex[12] = '4';
      hex[16] = ((Math.floor(next() * 4) + 8) as number).toString(16);
      const h = hex.join('');
      return `${h.slice(0, 8)}-${h.slice(8, 12)}-${h.slice(12, 16)}-${h.slice(16, 20)}-${h.slice(20)}`;
    },
  };
}

type Rng = ReturnType<typeof prng>;

interface Marque {
  name: string;
  models: Array<{ name: string; from: number; to: number; framePrefix: string }>;
  /** Builds the marque's style of part number from a serial. */
  number: (rng: Rng, serial: number) => string;
}

const marques: Marque[] = [
  {
    name: 'Corran',
    models: [
      { name: 'Tern 250', from: 1962, to: 1968, framePrefix: 'CT' },
      { name: 'Tern 350', from: 1964, to: 1971, framePrefix: 'CT' },
      { name: 'Dunlin 500', from: 1967, to: 1974, framePrefix: 'CD' },
    ],
    number: (rng, serial) => `${rng.pick(['64', '67', '70', '71'])}-${String(3000 + serial).padStart(4, '0')}`,
  },
  {
    name: 'Velmark',
    models: [
      { name: 'Vesper 175', from: 1960, to: 1966, framePrefix: 'VV' },
      { name: 'Vesper 250', from: 1963, to: 1970, framePrefix: 'VV' },
      { name: 'Valdor 650', from: 1968, to: 1975, framePrefix: 'VD' },
    ],
    number: (_rng, serial) => `VM/${String(400 + serial).padStart(5, '0')}`,
  },
  {
    name: 'Astley-Pike',
    models: [
      { name: 'Plover 125', from: 1961, to: 1967, framePrefix: 'AP' },
      { name: 'Heron 500', from: 1965, to: 1972, framePrefix: 'AH' },
      { name: 'Curlew 650', from: 1969, to: 1976, framePrefix: 'AC' },
    ],
    number: (_rng, serial) => `0${2 + (serial % 7)}-${String(100 + serial).padStart(3, '0')}`,
  },
];

const descriptions: Record<string, string[]> = {
  Engine: ['Piston, standard', 'Piston ring set', 'Gudgeon pin', 'Small-end bush', 'Valve spring, outer', 'Valve guide', 'Rocker spindle', 'Cam follower', 'Pushrod', 'Timing pinion', 'Oil pump body', 'Big-end shell pair'],
  Clutch: ['Clutch plate, friction', 'Clutch plate, plain', 'Clutch spring', 'Clutch pushrod', 'Clutch centre nut'],
  Gearbox: ['Kickstart spring', 'Gear selector fork', 'Layshaft bush', 'Mainshaft sleeve gear', 'Gear lever rubber'],
  Electrics: ['Contact breaker set', 'Condenser', 'Ignition coil', 'Headlamp rim', 'Rectifier', 'Horn push'],
  Brakes: ['Brake shoe pair', 'Brake cam', 'Brake cable, rear', 'Brake pedal spring'],
  'Frame & forks': ['Fork seal', 'Fork bush, upper', 'Steering head bearing', 'Swinging arm bush', 'Centre stand spring'],
  Fuel: ['Float needle', 'Main jet', 'Tank tap', 'Carburettor flange gasket', 'Throttle slide'],
  Exhaust: ['Exhaust clamp', 'Silencer baffle', 'Exhaust port gasket'],
  'Gaskets & seals': ['Head gasket', 'Barrel base gasket', 'Rocker cover gasket', 'Primary chaincase gasket', 'Crankcase oil seal'],
};
const categories = Object.keys(descriptions);

/** Invented suppliers of reproduction and pattern parts, with their numbering styles. */
const suppliers = [
  { name: 'Marrick Spares', prefix: 'MS ' },
  { name: 'Hollin Pattern Co.', prefix: 'HP-' },
  { name: 'Tarnwell Reproductions', prefix: 'TR/' },
];

interface Catalogue {
  parts: PartRow[];
  links: PartLinkRow[];
  fitments: FitmentRow[];
  supplierNumbers: Array<{ shopId: string; partId: string; number: string; key: string }>;
}

/** Builds the invented catalogue of one shop (pure: no database). `size` is the number of base parts per marque. */
export function buildDemoCatalogue(shopId: string, at: Date, options: { seed: number; size: number; marques?: number }): Catalogue {
  const rng = prng(options.seed);
  const out: Catalogue = { parts: [], links: [], fitments: [], supplierNumbers: [] };
  const keys = new Set<string>();

  const part = (number: string, description: string, fields: Partial<PartRow> = {}): PartRow => {
    const key = normalisePartNumber(number);
    if (keys.has(key)) throw new Error(`demo catalogue: duplicate number ${number}`);
    keys.add(key);
    const row: PartRow = { id: rng.uuid(), shopId, number, key, description, origin: 'genuine', maker: null, category: null, unit: 'each', status: 'available', notes: null, createdAt: at, updatedAt: at, ...fields };
    out.parts.push(row);
    return row;
  };
  const link = (from: PartRow, kind: PartLinkRow['kind'], to: PartRow, fields: Partial<PartLinkRow> = {}) => {
    out.links.push({ id: rng.uuid(), shopId, fromPartId: from.id, kind, toPartId: to.id, toNumber: to.number, toKey: to.key, quantity: 1, interchange: 'both', effectiveDate: null, sourceReference: null, note: null, ...fields });
  };
  const fit = (p: PartRow, marque: Marque, frames: boolean) => {
    for (const model of marque.models.filter(() => rng.chance(0.6)).slice(0, 2)) {
      const from = rng.int(model.from, model.to - 1);
      const withFrames = frames && rng.chance(0.25);
      const low = rng.int(100, 400) * 10;
      out.fitments.push({
        id: rng.uuid(),
        shopId,
        partId: p.id,
        marque: marque.name,
        model: model.name,
        yearFrom: from,
        yearTo: rng.int(from, model.to),
        frameFrom: withFrames ? `${model.framePrefix} ${low}` : null,
        frameTo: withFrames && rng.chance(0.5) ? `${model.framePrefix} ${low + rng.int(50, 400) * 10}` : null,
      });
    }
  };
  const bulletin = () => `Service sheet ${rng.int(10, 240)}`;
  const date = () => `${rng.int(1962, 1976)}-${String(rng.int(1, 12)).padStart(2, '0')}-01`;

  let serial = 0;
  for (const marque of marques.slice(0, options.marques ?? marques.length)) {
    const base: PartRow[] = [];
    for (let i = 0; i < options.size; i++) {
      const category = rng.pick(categories);
      let number = marque.number(rng, serial++);
      while (keys.has(normalisePartNumber(number))) number = marque.number(rng, serial++);
      const p = part(number, rng.pick(descriptions[category]!), { maker: marque.name, category });
      base.push(p);
      fit(p, marque, true);
    }
    // Supersession chains, two to four links long; older numbers often no longer available.
    for (const start of base.filter(() => rng.chance(0.2))) {
      let current = start;
      const length = rng.int(1, 3);
      for (let step = 0; step < length; step++) {
        const next = part(`${start.number}${String.fromCharCode(65 + step)}`, current.description, { maker: marque.name, category: current.category });
        link(current, 'replaced_by', next, { interchange: rng.chance(0.2) ? 'one_way' : 'both', effectiveDate: date(), sourceReference: bulletin() });
        if (rng.chance(0.5)) current.status = 'nla';
        fit(next, marque, false);
        current = next;
      }
    }
    // Reproductions and pattern parts from the suppliers, as equivalents.
    for (const genuine of base.filter(() => rng.chance(0.15))) {
      const supplier = rng.pick(suppliers);
      let reproNumber = `${supplier.prefix}${rng.int(1000, 9999)}`;
      while (keys.has(normalisePartNumber(reproNumber))) reproNumber = `${supplier.prefix}${rng.int(1000, 9999)}`;
      const repro = part(reproNumber, `${genuine.description} (reproduction)`, {
        origin: rng.chance(0.7) ? 'reproduction' : 'pattern',
        maker: supplier.name,
        category: genuine.category,
      });
      link(genuine, 'equivalent', repro, { interchange: rng.chance(0.3) ? 'one_way' : 'both', note: rng.chance(0.3) ? 'Check the fit before painting' : null });
      // Some suppliers print a catalogue number of their own beside the part number.
      if (rng.chance(0.5)) {
        const number = `${supplier.name.split(' ')[0]!.toUpperCase()} ${rng.int(100, 999)}`;
        out.supplierNumbers.push({ shopId, partId: repro.id, number, key: normalisePartNumber(number) });
      }
    }
  }

  // The named cases the demo shows, with numbers that are easy to find.
  const corran = marques[0]!;
  const gasketKit = part('71-9000', 'Top-end gasket set, Tern 350', { maker: 'Corran', category: 'Gaskets & seals', unit: 'set', notes: 'Contents as listed on service sheet 88.' });
  const kitParts = [part('71-9001', 'Head gasket, Tern 350', { maker: 'Corran', category: 'Gaskets & seals' }), part('71-9002', 'Barrel base gasket, Tern 350', { maker: 'Corran', category: 'Gaskets & seals' }), part('71-9003', 'Rocker cover gasket, Tern 350', { maker: 'Corran', category: 'Gaskets & seals' })];
  kitParts.forEach((k, i) => link(gasketKit, 'kit_contains', k, { quantity: i === 2 ? 2 : 1 }));
  const oldGaskets = part('64-9000', 'Decoke gasket set, early Tern', { maker: 'Corran', category: 'Gaskets & seals', unit: 'set', status: 'nla' });
  link(oldGaskets, 'replaced_by', gasketKit, { effectiveDate: '1969-09-01', sourceReference: 'Service sheet 88' });
  fit(gasketKit, corran, false);

  // A split: a one-piece footrest hanger became a hanger and a separate rubber (two needed).
  const hanger = part('67-4410', 'Footrest hanger with rubber', { maker: 'Corran', category: 'Frame & forks', status: 'nla' });
  const hangerNew = part('70-4411', 'Footrest hanger', { maker: 'Corran', category: 'Frame & forks' });
  const rubber = part('70-4412', 'Footrest rubber', { maker: 'Corran', category: 'Frame & forks' });
  link(hanger, 'replaced_by', hangerNew, { effectiveDate: '1970-02-01', sourceReference: 'Service sheet 131' });
  link(hanger, 'replaced_by', rubber, { quantity: 2, effectiveDate: '1970-02-01', sourceReference: 'Service sheet 131' });

  // A merge: left and right fork dust covers replaced by one cover that fits either side.
  const left = part('VM/00871', 'Fork dust cover, left', { maker: 'Velmark', category: 'Frame & forks', status: 'nla' });
  const right = part('VM/00872', 'Fork dust cover, right', { maker: 'Velmark', category: 'Frame & forks', status: 'nla' });
  const either = part('VM/00880', 'Fork dust cover, either side', { maker: 'Velmark', category: 'Frame & forks' });
  link(left, 'replaced_by', either, { sourceReference: 'Parts list 1968 amendment 3' });
  link(right, 'replaced_by', either, { sourceReference: 'Parts list 1968 amendment 3' });

  // One way: a thicker clutch plate works in early clutches, the thin one never in late ones.
  const thin = part('VM/01240', 'Clutch plate, friction, 3 mm', { maker: 'Velmark', category: 'Clutch' });
  const thick = part('VM/01241', 'Clutch plate, friction, 3.5 mm', { maker: 'Velmark', category: 'Clutch' });
  link(thin, 'replaced_by', thick, { interchange: 'one_way', effectiveDate: '1969-05-01', note: 'Thick plate fits early baskets; not the reverse.' });

  // With changes: a 12-volt rectifier replaces the 6-volt one only after the loom is changed.
  const six = part('02-517', 'Rectifier, 6 volt', { maker: 'Astley-Pike', category: 'Electrics', status: 'nla' });
  const twelve = part('02-518', 'Rectifier, 12 volt', { maker: 'Astley-Pike', category: 'Electrics' });
  link(six, 'replaced_by', twelve, { interchange: 'with_changes', note: 'Needs the 12 volt loom and coil.' });
  const repro12 = part('TR/5180', 'Rectifier, 12 volt (reproduction)', { origin: 'reproduction', maker: 'Tarnwell Reproductions', category: 'Electrics' });
  link(twelve, 'equivalent', repro12);

  // A dead end: nothing available replaces or stands in for this tank badge.
  part('03-740', 'Tank badge, Heron 500, chrome', { maker: 'Astley-Pike', category: 'Cycle parts', status: 'nla', notes: 'Ask at autojumbles.' });

  // A data problem left in on purpose: two numbers that claim to replace each other.
  const loopA = part('70-6620', 'Speedometer cable', { maker: 'Corran', category: 'Electrics' });
  const loopB = part('71-6620', 'Speedometer cable, long', { maker: 'Corran', category: 'Electrics' });
  link(loopA, 'replaced_by', loopB, { sourceReference: 'Dealer note' });
  link(loopB, 'replaced_by', loopA, { sourceReference: 'Dealer note' });

  return out;
}

/**
 * Writes the demo catalogues inside the seed's write: a few hundred parts at Harbour Works and a
 * small one at Brackenfold Garage. Audited as one event per shop.
 */
export async function seedCatalogueDemo(manager: EntityManager, shops: { harbour: string; brackenfold: string }, at: Date): Promise<void> {
  const catalogues = [
    { shopId: shops.harbour, catalogue: buildDemoCatalogue(shops.harbour, at, { seed: 1971, size: 90 }) },
    { shopId: shops.brackenfold, catalogue: buildDemoCatalogue(shops.brackenfold, at, { seed: 1966, size: 12, marques: 1 }) },
  ];
  for (const { shopId, catalogue } of catalogues) {
    const batches = <T>(rows: T[]) => Array.from({ length: Math.ceil(rows.length / 100) }, (_, i) => rows.slice(i * 100, i * 100 + 100));
    for (const b of batches(catalogue.parts)) await manager.insert(PartEntity, b);
    for (const b of batches(catalogue.supplierNumbers)) await manager.insert(PartSupplierNumberEntity, b);
    for (const b of batches(catalogue.links)) await manager.insert(PartLinkEntity, b);
    for (const b of batches(catalogue.fitments)) await manager.insert(FitmentEntity, b);
    await recordAudit(manager, {
      shopId,
      actor: { userId: null, ip: null },
      action: 'catalogue.seeded',
      entity: 'import',
      entityId: null,
      changes: { parts: { before: 0, after: catalogue.parts.length }, links: { before: 0, after: catalogue.links.length } },
      at,
    });
  }
}
