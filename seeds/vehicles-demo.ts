/* eslint-disable @nx/enforce-module-boundaries -- the seed writes through the API's own data layer
   (entities, file store, upload pipeline); see docs/decisions/002-module-boundaries.md. */
import { randomUUID } from 'node:crypto';
import { PDFDocument, StandardFonts, rgb } from 'pdf-lib';
import sharp from 'sharp';
import type { EntityManager } from 'typeorm';
import type { OdometerUnit, VehicleCondition, VehicleKind, VehicleStatus } from '@tappet/contracts';
import { recordAudit } from '../apps/api/src/modules/audit/audit.service';
import { CustomerEntity, type CustomerRow } from '../apps/api/src/modules/customers/customers.entity';
import { localFileStore } from '../apps/api/src/modules/uploads/file-store';
import { prepareUpload } from '../apps/api/src/modules/uploads/upload-pipeline';
import { OdometerReadingEntity, VehicleEntity, VehicleFileEntity, VehicleStatusChangeEntity, type VehicleFileRow, type VehicleRow } from '../apps/api/src/modules/vehicles/vehicles.entity';

// Invented vehicles for Harbour Works, one at each status, all built before 1981 (frame and engine
// numbers, no VIN), from the demo catalogue's invented marques. Photos are drawn here as SVG and
// rendered by sharp; documents are written here with pdf-lib. Nothing is copied from anywhere.

interface DemoCustomer {
  key: string;
  name: string;
  email: string | null;
  phone: string | null;
  address: string | null;
  notes: string | null;
}

// Invented people; 01632 960xxx is a range set aside for fiction.
const customers: DemoCustomer[] = [
  { key: 'halloway', name: 'Edwin Halloway', email: 'edwin.halloway@example.test', phone: '01632 960 114', address: '3 Ropewalk Cottages, Harbourside', notes: 'Prefers a call to an e-mail.' },
  { key: 'penhale', name: 'Rosalind Penhale', email: 'r.penhale@example.test', phone: '01632 960 287', address: null, notes: null },
  { key: 'dunmore', name: 'Agnes Dunmore', email: null, phone: '01632 960 902', address: '11 Tanyard Row, Brackley Marsh', notes: 'Consigns from her late husband’s collection.' },
  { key: 'quill', name: 'Tobias Quill', email: 'tquill@example.test', phone: null, address: null, notes: null },
];

interface DemoVehicle {
  kind: VehicleKind;
  marque: string;
  model: string;
  year: number;
  colour: string;
  paint: string;
  frameNumber: string;
  engineNumber: string;
  condition: VehicleCondition;
  notes: string;
  customer: string | null;
  acquisitionCostMinor: number | null;
  askingPriceMinor: number | null;
  /** Status path from arrival, with days before the seed date for each step. */
  path: Array<[VehicleStatus, number, string | null]>;
  odometer: Array<[number, OdometerUnit, number]>;
  numbersMatching: boolean | null;
  documents: Array<'registration' | 'invoice' | 'service'>;
}

const vehicles: DemoVehicle[] = [
  {
    kind: 'customer',
    marque: 'Corran',
    model: 'Tern 350',
    year: 1967,
    colour: 'Harbour green',
    paint: '#2f6b4f',
    frameNumber: 'CT 41207',
    engineNumber: 'CTE 41207',
    condition: 'complete_project',
    notes: 'Stored in a barn since 1994. Owner wants it recommissioned: tyres, hoses and brake hydraulics first.',
    customer: 'halloway',
    acquisitionCostMinor: null,
    askingPriceMinor: null,
    path: [['arrived', 1, 'Delivered on a trailer']],
    odometer: [[18_420, 'mi', 1]],
    numbersMatching: null,
    documents: ['registration'],
  },
  {
    kind: 'shop_stock',
    marque: 'Velmark',
    model: 'Valdor 650',
    year: 1971,
    colour: 'Signal red',
    paint: '#a3322a',
    frameNumber: 'VD 7-20391',
    engineNumber: 'VD7E 20391',
    condition: 'runs_needs_work',
    notes: 'Bought at a club auction. Runs on one cylinder; gearbox selector feels notchy.',
    customer: null,
    acquisitionCostMinor: 215_000,
    askingPriceMinor: null,
    path: [
      ['arrived', 9, null],
      ['assessing', 6, null],
    ],
    odometer: [[31_777, 'mi', 9]],
    numbersMatching: true,
    documents: ['invoice'],
  },
  {
    kind: 'customer',
    marque: 'Astley-Pike',
    model: 'Heron 500',
    year: 1968,
    colour: 'Pewter and cream',
    paint: '#7d8a92',
    frameNumber: 'AH 5512',
    engineNumber: 'AHE 5512',
    condition: 'runs_needs_work',
    notes: 'Full engine rebuild agreed with the owner; new main bearings on order.',
    customer: 'penhale',
    acquisitionCostMinor: null,
    askingPriceMinor: null,
    path: [
      ['arrived', 30, null],
      ['assessing', 28, null],
      ['in_work', 21, 'Estimate approved by phone'],
    ],
    odometer: [[44_012, 'km', 30]],
    numbersMatching: true,
    documents: ['registration', 'service'],
  },
  {
    kind: 'consignment',
    marque: 'Corran',
    model: 'Dunlin 500',
    year: 1972,
    colour: 'Gloss black',
    paint: '#1e1e22',
    frameNumber: 'CD 30877',
    engineNumber: 'CDE 30877',
    condition: 'sorted_rider',
    notes: 'On consignment for twelve weeks. Serviced and new tyres fitted before sale.',
    customer: 'dunmore',
    acquisitionCostMinor: null,
    askingPriceMinor: 540_000,
    path: [
      ['arrived', 40, null],
      ['assessing', 38, null],
      ['in_work', 35, null],
      ['ready', 12, 'Pre-sale inspection done'],
      // Settled two days ago (seeds/estimates-demo.ts): settling records the sale.
      ['sold', 2, 'Sold on consignment; settled'],
    ],
    odometer: [
      [12_980, 'mi', 40],
      [13_006, 'mi', 12],
    ],
    numbersMatching: true,
    documents: ['registration', 'service'],
  },
  {
    kind: 'customer',
    marque: 'Velmark',
    model: 'Vesper 250',
    year: 1965,
    colour: 'Duck-egg blue',
    paint: '#7fb3b5',
    frameNumber: 'VV 2-8841',
    engineNumber: 'VV2E 8841',
    condition: 'sorted_rider',
    notes: 'Carburettor overhaul and new control cables.',
    customer: 'quill',
    acquisitionCostMinor: null,
    askingPriceMinor: null,
    path: [
      ['arrived', 60, null],
      ['in_work', 58, null],
      ['ready', 50, null],
      ['handed_over', 48, 'Collected by the owner'],
    ],
    odometer: [
      [27_305, 'mi', 60],
      [27_318, 'mi', 50],
    ],
    numbersMatching: false,
    documents: ['invoice'],
  },
  {
    kind: 'shop_stock',
    marque: 'Astley-Pike',
    model: 'Curlew 650',
    year: 1974,
    colour: 'Burnt orange',
    paint: '#b8612a',
    frameNumber: 'AC 60214',
    engineNumber: 'ACE 60214',
    condition: 'freshly_restored',
    notes: 'Restored in the shop over the winter. Sold to a club member.',
    customer: null,
    acquisitionCostMinor: 310_000,
    askingPriceMinor: 625_000,
    path: [
      ['arrived', 200, null],
      ['assessing', 198, null],
      ['in_work', 190, null],
      ['ready', 25, null],
      ['sold', 15, 'Sold with six months’ parts warranty'],
    ],
    odometer: [
      [51_200, 'km', 200],
      [51_231, 'km', 25],
    ],
    numbersMatching: true,
    documents: ['invoice', 'service'],
  },
  {
    kind: 'customer',
    marque: 'Velmark',
    model: 'Kittiwake 175',
    year: 1963,
    colour: 'Dove grey',
    paint: '#8a8f94',
    frameNumber: 'VK 1-08812',
    engineNumber: 'VKE 08812',
    condition: 'sorted_rider',
    notes: 'Annual service, new chain and sprockets. Waiting for its owner to collect it.',
    customer: 'halloway',
    acquisitionCostMinor: null,
    askingPriceMinor: null,
    path: [
      ['arrived', 6, null],
      ['in_work', 5, null],
      ['ready', 1, 'Service done; owner told by phone'],
    ],
    odometer: [[22_310, 'mi', 6]],
    numbersMatching: null,
    documents: ['service'],
  },
];

/** A motorcycle in profile, drawn for the demo: wheels with spokes, frame, tank in the vehicle's paint. */
function motorcycleSvg(paint: string, variant: number): string {
  const ground = variant === 0 ? '#d9d2c3' : '#c9c2b3';
  const wall = variant === 0 ? '#efe9dc' : '#e4ddcc';
  const spokes = (cx: number, cy: number) =>
    Array.from({ length: 12 }, (_, i) => {
      const a = (i * Math.PI) / 6;
      return `<line x1="${cx}" y1="${cy}" x2="${(cx + 92 * Math.cos(a)).toFixed(1)}" y2="${(cy + 92 * Math.sin(a)).toFixed(1)}" stroke="#8a8a8a" stroke-width="3"/>`;
    }).join('');
  const wheel = (cx: number) => `<circle cx="${cx}" cy="600" r="120" fill="none" stroke="#222" stroke-width="26"/><circle cx="${cx}" cy="600" r="96" fill="none" stroke="#b0b0b0" stroke-width="6"/>${spokes(cx, 600)}<circle cx="${cx}" cy="600" r="16" fill="#555"/>`;
  const flip = variant === 1 ? 'transform="translate(1200,0) scale(-1,1)"' : '';
  return `<svg xmlns="http://www.w3.org/2000/svg" width="1200" height="800" viewBox="0 0 1200 800">
  <rect width="1200" height="800" fill="${wall}"/>
  <rect y="560" width="1200" height="240" fill="${ground}"/>
  <rect x="0" y="556" width="1200" height="8" fill="#b9b1a0"/>
  <g ${flip}>
    ${wheel(300)}${wheel(900)}
    <path d="M300 600 L470 420 L760 420 L900 600" fill="none" stroke="#333" stroke-width="18" stroke-linejoin="round"/>
    <path d="M470 420 L560 600 L700 600 L760 420" fill="none" stroke="#333" stroke-width="14"/>
    <rect x="540" y="470" width="140" height="120" rx="18" fill="#6e6e6e"/>
    <rect x="555" y="440" width="110" height="40" rx="6" fill="#8d8d8d"/>
    <path d="M480 400 Q560 330 700 360 L720 420 L480 420 Z" fill="${paint}" stroke="#111" stroke-width="4"/>
    <path d="M720 400 L860 396 Q880 400 870 420 L730 424 Z" fill="#2b2420"/>
    <path d="M860 600 L980 560" stroke="#9a9a9a" stroke-width="16" stroke-linecap="round"/>
    <path d="M620 600 Q760 640 1000 610" fill="none" stroke="#c8c8c8" stroke-width="14" stroke-linecap="round"/>
    <path d="M300 600 L400 330" stroke="#333" stroke-width="14"/>
    <path d="M370 330 L460 300" stroke="#222" stroke-width="10" stroke-linecap="round"/>
    <circle cx="390" cy="360" r="26" fill="#e8e0b0" stroke="#222" stroke-width="6"/>
    <path d="M210 560 Q300 470 390 560" fill="none" stroke="${paint}" stroke-width="14"/>
    <path d="M810 560 Q900 470 990 560" fill="none" stroke="${paint}" stroke-width="14"/>
  </g>
</svg>`;
}

const documentTitles = { registration: 'Registration record (demo facsimile)', invoice: 'Purchase invoice (demo)', service: 'Earlier service record (demo)' } as const;

/** A one-page invented document for the demo, written with pdf-lib. */
async function demoPdf(kind: keyof typeof documentTitles, v: DemoVehicle, owner: string | null): Promise<Buffer> {
  const pdf = await PDFDocument.create();
  pdf.setTitle(`${documentTitles[kind]} — ${v.marque} ${v.model}`);
  pdf.setProducer('Tappet demo seed');
  const page = pdf.addPage([595, 842]);
  const font = await pdf.embedFont(StandardFonts.Helvetica);
  const bold = await pdf.embedFont(StandardFonts.HelveticaBold);
  const mono = await pdf.embedFont(StandardFonts.Courier);
  page.drawRectangle({ x: 40, y: 40, width: 515, height: 762, borderColor: rgb(0.2, 0.2, 0.2), borderWidth: 1 });
  page.drawText(documentTitles[kind], { x: 60, y: 770, size: 18, font: bold });
  page.drawText('Invented for the Tappet demo. Not a real document.', { x: 60, y: 748, size: 10, font, color: rgb(0.45, 0.1, 0.1) });
  const lines: Array<[string, string]> = [
    ['Marque and model', `${v.marque} ${v.model}`],
    ['Year of manufacture', String(v.year)],
    ['Colour', v.colour],
    ['Frame number', v.frameNumber],
    ['Engine number', v.engineNumber],
    ['Keeper', owner ?? 'Harbour Works (shop stock)'],
  ];
  if (kind === 'invoice') lines.push(['Amount', v.acquisitionCostMinor !== null ? `£${(v.acquisitionCostMinor / 100).toFixed(2)}` : 'see workshop file']);
  if (kind === 'service') lines.push(['Work recorded', 'Oil and filter changed; tappets set; chain adjusted.']);
  lines.forEach(([label, value], i) => {
    const y = 700 - i * 30;
    page.drawText(label, { x: 60, y, size: 11, font });
    page.drawText(value, { x: 230, y, size: 12, font: /number/.test(label) ? mono : bold });
  });
  return Buffer.from(await pdf.save());
}

/** Photos and documents of the demo vehicles, made before the database write (the slow part). */
export interface VehiclesDemoMedia {
  photos: Array<Array<Awaited<ReturnType<typeof prepareUpload>>>>;
  documents: Array<Array<{ kind: keyof typeof documentTitles; data: Buffer }>>;
}

/** Renders every demo photo (sharp from SVG, through the upload pipeline) and document (pdf-lib). */
export async function renderVehiclesDemoMedia(): Promise<VehiclesDemoMedia> {
  const photos = [];
  const documents = [];
  for (const v of vehicles) {
    const owner = customers.find((c) => c.key === v.customer)?.name ?? null;
    const shots = [];
    for (const variant of [0, 1]) {
      const jpeg = await sharp(Buffer.from(motorcycleSvg(v.paint, variant))).jpeg({ quality: 82 }).toBuffer();
      shots.push(await prepareUpload({ buffer: jpeg, originalname: `${v.model.toLowerCase().replace(/\s+/g, '-')}-${variant === 0 ? 'left' : 'right'}.jpg` }));
    }
    photos.push(shots);
    const docs = [];
    for (const kind of v.documents) docs.push({ kind, data: await demoPdf(kind, v, owner) });
    documents.push(docs);
  }
  return { photos, documents };
}

/** A file to write to the store once the rows have committed. */
export interface DemoStoredFile {
  key: string;
  data: Buffer;
}

/**
 * Writes the demo customers and vehicles of one shop, with status histories, readings, numbers
 * checks, file rows and audit events (inside the caller's write). Returns the bytes to store.
 */
export async function seedVehiclesDemo(manager: EntityManager, shopId: string, people: { owner: string; mechanic: string }, at: Date, media: VehiclesDemoMedia): Promise<DemoStoredFile[]> {
  const daysAgo = (n: number, hour = 9) => new Date(Date.UTC(at.getUTCFullYear(), at.getUTCMonth(), at.getUTCDate() - n, hour, 30));
  const toStore: DemoStoredFile[] = [];
  const customerIds = new Map<string, string>();
  for (const c of customers) {
    const row: CustomerRow = { id: randomUUID(), shopId, name: c.name, email: c.email, phone: c.phone, address: c.address, notes: c.notes, createdAt: daysAgo(220), updatedAt: daysAgo(220) };
    customerIds.set(c.key, row.id);
    await manager.insert(CustomerEntity, row);
    await recordAudit(manager, { shopId, actor: { userId: people.owner }, action: 'customer.created', entity: 'customer', entityId: row.id, changes: { name: { before: null, after: c.name } }, at: row.createdAt });
  }
  for (const [i, v] of vehicles.entries()) {
    const first = v.path[0];
    const last = v.path.at(-1);
    if (!first || !last) continue;
    const row: VehicleRow = {
      id: randomUUID(),
      shopId,
      kind: v.kind,
      marque: v.marque,
      model: v.model,
      year: v.year,
      colour: v.colour,
      frameNumber: v.frameNumber,
      engineNumber: v.engineNumber,
      vin: null,
      vinCheckAcknowledgedByUserId: null,
      vinCheckAcknowledgedAt: null,
      condition: v.condition,
      notes: v.notes,
      customerId: v.customer ? (customerIds.get(v.customer) ?? null) : null,
      acquisitionCostMinor: v.acquisitionCostMinor,
      askingPriceMinor: v.askingPriceMinor,
      status: last[0],
      statusSince: daysAgo(last[1], 15),
      numbersMatching: v.numbersMatching,
      numbersCheckedByUserId: v.numbersMatching === null ? null : people.mechanic,
      numbersCheckedAt: v.numbersMatching === null ? null : daysAgo(first[1] - 1, 11),
      numbersNote: v.numbersMatching === false ? 'Engine number differs from the registration record: a replacement engine fitted in the 1980s.' : v.numbersMatching ? 'Checked against the registration record.' : null,
      createdAt: daysAgo(first[1]),
      updatedAt: daysAgo(last[1], 15),
    };
    await manager.insert(VehicleEntity, row);
    await recordAudit(manager, { shopId, actor: { userId: people.mechanic }, action: 'vehicle.created', entity: 'vehicle', entityId: row.id, changes: { marque: { before: null, after: v.marque }, model: { before: null, after: v.model } }, at: row.createdAt });
    let previous: VehicleStatus | null = null;
    for (const [status, days, note] of v.path) {
      const changedAt = previous === null ? daysAgo(days) : daysAgo(days, 15);
      await manager.insert(VehicleStatusChangeEntity, { id: randomUUID(), shopId, vehicleId: row.id, fromStatus: previous, toStatus: status, changedAt, recordedAt: changedAt, byUserId: people.mechanic, note });
      if (previous !== null) await recordAudit(manager, { shopId, actor: { userId: people.mechanic }, action: 'vehicle.status_changed', entity: 'vehicle', entityId: row.id, changes: { status: { before: previous, after: status } }, at: changedAt });
      previous = status;
    }
    for (const [value, unit, days] of v.odometer) {
      const readOn = daysAgo(days).toISOString().slice(0, 10);
      await manager.insert(OdometerReadingEntity, { id: randomUUID(), shopId, vehicleId: row.id, value, unit, readOn, note: null, byUserId: people.mechanic, createdAt: daysAgo(days, 10) });
    }
    const files: VehicleFileRow[] = [];
    for (const photo of media.photos[i] ?? []) {
      const id = randomUUID();
      const base = `${shopId}/vehicles/${row.id}/${id}`;
      files.push({ id, shopId, vehicleId: row.id, kind: 'photo', originalName: photo.originalName, mediaType: photo.mediaType, byteSize: photo.data.length, storageKey: `${base}.${photo.extension}`, thumbnailKey: photo.thumbnail ? `${base}.thumb.jpg` : null, width: photo.width, height: photo.height, caption: files.length === 0 ? 'On arrival' : null, byUserId: people.mechanic, createdAt: daysAgo(first[1], 10) });
      toStore.push({ key: `${base}.${photo.extension}`, data: photo.data });
      if (photo.thumbnail) toStore.push({ key: `${base}.thumb.jpg`, data: photo.thumbnail });
    }
    for (const doc of media.documents[i] ?? []) {
      const id = randomUUID();
      const key = `${shopId}/vehicles/${row.id}/${id}.pdf`;
      files.push({ id, shopId, vehicleId: row.id, kind: 'document', originalName: `${doc.kind}-${v.frameNumber.replace(/[^A-Za-z0-9]+/g, '-').toLowerCase()}.pdf`, mediaType: 'application/pdf', byteSize: doc.data.length, storageKey: key, thumbnailKey: null, width: null, height: null, caption: documentTitles[doc.kind], byUserId: people.owner, createdAt: daysAgo(first[1], 12) });
      toStore.push({ key, data: doc.data });
    }
    if (files.length) await manager.insert(VehicleFileEntity, files);
  }
  return toStore;
}

/** Writes the demo files into the uploads folder (after the rows have committed). */
export async function storeVehiclesDemoFiles(uploadsDir: string, files: DemoStoredFile[]): Promise<void> {
  const store = localFileStore(uploadsDir);
  for (const f of files) if (!(await store.exists(f.key))) await store.put(f.key, f.data);
}
