import { randomUUID } from 'node:crypto';
import sharp from 'sharp';
import type { Database } from '../../db/write-lock';
import { CustomerEntity } from '../customers/customers.entity';
import { localFileStore } from '../uploads/file-store';
import { VehicleEntity, VehicleFileEntity, VehicleStatusChangeEntity, type VehicleRow } from './vehicles.entity';

/** Ids of a few vehicles, a customer and stored files made for route tests; spares are handed out one per call. */
export interface VehicleFixture {
  customerId: string;
  vehicleId: string;
  photoId: string;
  documentId: string;
  /** A small PNG, for upload samples. */
  png: Buffer;
  /** A vehicle still at `arrived`, so a status move can be repeated. */
  nextArrivedVehicleId(): string;
  /** A stored photo of `vehicleId` that may be removed. */
  nextSpareFileId(): string;
}

/** A tiny one-page PDF, enough for file-type to recognise. */
export const tinyPdf = Buffer.from('%PDF-1.4\n1 0 obj<</Type/Catalog/Pages 2 0 R>>endobj\n2 0 obj<</Type/Pages/Kids[]/Count 0>>endobj\ntrailer<</Root 1 0 R>>\n%%EOF\n');

/** Writes a customer, vehicles and stored files into a shop, for tests that call every route as every role. */
export async function seedVehicleFixture(db: Database, shopId: string, uploadsDir: string, spare = 20): Promise<VehicleFixture> {
  const at = new Date(Date.UTC(2026, 0, 15));
  const customerId = randomUUID();
  const vehicle = (): VehicleRow => ({
    id: randomUUID(),
    shopId,
    kind: 'customer',
    marque: 'Fixture',
    model: 'Test',
    year: 1970,
    colour: null,
    frameNumber: 'FX-1200',
    engineNumber: 'FXE-1200',
    vin: null,
    vinCheckAcknowledgedByUserId: null,
    vinCheckAcknowledgedAt: null,
    condition: 'runs_needs_work',
    notes: null,
    customerId,
    acquisitionCostMinor: null,
    askingPriceMinor: null,
    status: 'arrived',
    statusSince: at,
    numbersMatching: null,
    numbersCheckedByUserId: null,
    numbersCheckedAt: null,
    numbersNote: null,
    createdAt: at,
    updatedAt: at,
  });
  const main = vehicle();
  const arrived = Array.from({ length: spare }, vehicle);
  const png = await sharp({ create: { width: 40, height: 30, channels: 3, background: '#557799' } }).png().toBuffer();
  const jpeg = await sharp(png).jpeg().toBuffer();
  const store = localFileStore(uploadsDir);
  const file = (kind: 'photo' | 'document') => {
    const id = randomUUID();
    const key = `${shopId}/vehicles/${main.id}/${id}`;
    return {
      id,
      shopId,
      vehicleId: main.id,
      kind,
      originalName: kind === 'photo' ? 'fixture.jpg' : 'fixture.pdf',
      mediaType: kind === 'photo' ? 'image/jpeg' : 'application/pdf',
      byteSize: kind === 'photo' ? jpeg.length : tinyPdf.length,
      storageKey: `${key}.${kind === 'photo' ? 'jpg' : 'pdf'}`,
      thumbnailKey: kind === 'photo' ? `${key}.thumb.jpg` : null,
      width: kind === 'photo' ? 40 : null,
      height: kind === 'photo' ? 30 : null,
      caption: null,
      byUserId: null,
      createdAt: at,
    };
  };
  const photo = file('photo');
  const document = file('document');
  const spares = Array.from({ length: spare }, () => file('photo'));
  for (const f of [photo, document, ...spares]) {
    await store.put(f.storageKey, f.kind === 'photo' ? jpeg : tinyPdf);
    if (f.thumbnailKey) await store.put(f.thumbnailKey, jpeg);
  }
  await db.write(async (manager) => {
    await manager.insert(CustomerEntity, { id: customerId, shopId, name: 'Fixture Customer', email: 'fixture@harbour-works.test', phone: null, address: null, notes: null, createdAt: at, updatedAt: at });
    await manager.insert(VehicleEntity, [main, ...arrived]);
    await manager.insert(
      VehicleStatusChangeEntity,
      [main, ...arrived].map((v) => ({ id: randomUUID(), shopId, vehicleId: v.id, fromStatus: null, toStatus: 'arrived' as const, changedAt: at, recordedAt: at, byUserId: null, note: null })),
    );
    await manager.insert(VehicleFileEntity, [photo, document, ...spares]);
  });
  const take = (ids: string[]) => () => {
    const id = ids.shift();
    if (!id) throw new Error('The vehicle fixture ran out of spare ids.');
    return id;
  };
  return { customerId, vehicleId: main.id, photoId: photo.id, documentId: document.id, png, nextArrivedVehicleId: take(arrived.map((v) => v.id)), nextSpareFileId: take(spares.map((f) => f.id)) };
}
