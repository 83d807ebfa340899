import { Readable } from 'node:stream';
import yazl from 'yazl';
import { liveTables } from '../../db/live-tables';
import type { Database } from '../../db/write-lock';
import type { Clock } from '../../lib/clock';
import { recordAudit, type AuditActor } from '../audit/audit.service';
import { csvLine } from '../audit/csv';
import type { Shop } from '../shops/shops.entity';
import type { FileStore } from '../uploads/file-store';

/** Columns that hold secrets (password, token and key hashes) are never exported. */
export function isSecretColumn(name: string): boolean {
  return /(^|_)hash$/i.test(name) || /password|secret/i.test(name);
}

/** A table to export and how to page through it. */
export interface ExportTable {
  name: string;
  columns: string[];
  /** The single primary-key column used for keyset paging, or null (then offset paging). */
  keyColumn: string | null;
}

/**
 * Every shop-owned table, found in the live schema (any table with a `shop_id` column), so tables
 * added by later migrations are exported without a change here.
 */
export async function shopOwnedTables(db: Database): Promise<ExportTable[]> {
  return (await liveTables(db.dataSource))
    .filter((t) => t.columns.includes('shop_id'))
    .map((t) => ({ name: t.name, columns: t.columns.filter((c) => !isSecretColumn(c)), keyColumn: t.primary.length === 1 ? (t.primary[0] ?? null) : null }))
    .sort((a, b) => a.name.localeCompare(b.name));
}

/** CSV of one table's rows for one shop, read `pageSize` rows at a time. */
export async function* tableCsv(db: Database, table: ExportTable, shopId: string, pageSize = 1000): AsyncGenerator<Buffer> {
  const esc = (name: string) => db.dataSource.driver.escape(name);
  yield Buffer.from(csvLine(table.columns));
  let after: unknown = undefined;
  for (let offset = 0; ; offset += pageSize) {
    const qb = db.reader.createQueryBuilder().from(table.name, 't').where(`t.${esc('shop_id')} = :shopId`, { shopId });
    for (const c of table.columns) qb.addSelect(`t.${esc(c)}`, c);
    if (table.keyColumn) {
      qb.addSelect(`t.${esc(table.keyColumn)}`, '__key').orderBy(`t.${esc(table.keyColumn)}`, 'ASC');
      if (after !== undefined) qb.andWhere(`t.${esc(table.keyColumn)} > :after`, { after });
    } else {
      qb.offset(offset);
    }
    const rows = await qb.limit(pageSize).getRawMany<Record<string, unknown>>();
    if (rows.length > 0) yield Buffer.from(rows.map((r) => csvLine(table.columns.map((c) => r[c]))).join(''));
    if (rows.length < pageSize) return;
    after = rows.at(-1)?.['__key'];
  }
}

const readme = [
  'Tappet shop export',
  '',
  'tables/<table>.csv   every table that belongs to the shop, one row per record (UTF-8, RFC 4180).',
  'tables/shop.csv      the shop itself; tables/users.csv the people who are or were its members.',
  'uploads/             the files uploaded to the shop (photos, documents).',
  '',
  "Secrets (password, token and key hashes) are never exported. Cells that a spreadsheet would run as a formula start with '.",
  '',
].join('\n');

/** The whole-shop export: one streamed zip with a CSV per shop-owned table plus the uploads. */
export function createShopExportService(deps: { db: Database; clock: Clock; files: FileStore; pageSize?: number }) {
  const { db, clock, files } = deps;
  return {
    /** Records the export in the audit log and returns the zip as a stream (nothing is buffered whole). */
    async zip(shop: Shop, actor: AuditActor): Promise<NodeJS.ReadableStream> {
      const tables = await shopOwnedTables(db);
      const uploads: string[] = [];
      for await (const key of files.list(shop.id)) uploads.push(key);
      await db.write((manager) =>
        recordAudit(manager, { shopId: shop.id, actor, action: 'shop.exported', entity: 'shop', entityId: shop.id, changes: { tables: { before: null, after: tables.length }, uploads: { before: null, after: uploads.length } }, at: clock.now() }),
      );
      const zip = new yazl.ZipFile();
      const mtime = clock.now();
      zip.addBuffer(Buffer.from(readme), 'README.txt', { mtime });
      const shopTable: ExportTable = { name: 'shops', columns: ['id', 'name', 'slug', 'billing_state', 'created_at'], keyColumn: 'id' };
      zip.addReadStreamLazy('tables/shop.csv', { mtime }, (cb) => cb(null, Readable.from(singleRowCsv(shopTable, 'id', shop.id))));
      zip.addReadStreamLazy('tables/users.csv', { mtime }, (cb) => cb(null, Readable.from(memberUsersCsv(shop.id))));
      for (const table of tables) {
        // Lazy: each table is read only when the zip reaches it, a page at a time.
        zip.addReadStreamLazy(`tables/${table.name}.csv`, { mtime }, (cb) => cb(null, Readable.from(tableCsv(db, table, shop.id, deps.pageSize))));
      }
      for (const key of uploads) {
        zip.addReadStreamLazy(`uploads/${key.slice(shop.id.length + 1)}`, { mtime }, (cb) => files.stream(key).then((stream) => cb(null, stream), (err: Error) => cb(err, undefined as never)));
      }
      zip.end();
      return zip.outputStream;
    },
  };

  async function* singleRowCsv(table: ExportTable, keyColumn: string, id: string): AsyncGenerator<Buffer> {
    const esc = (name: string) => db.dataSource.driver.escape(name);
    const qb = db.reader.createQueryBuilder().from(table.name, 't').where(`t.${esc(keyColumn)} = :id`, { id });
    for (const c of table.columns) qb.addSelect(`t.${esc(c)}`, c);
    const rows = await qb.getRawMany<Record<string, unknown>>();
    yield Buffer.from(csvLine(table.columns) + rows.map((r) => csvLine(table.columns.map((c) => r[c]))).join(''));
  }

  /** The shop's members' accounts: name and e-mail only, never the password hash. */
  async function* memberUsersCsv(shopId: string): AsyncGenerator<Buffer> {
    const esc = (name: string) => db.dataSource.driver.escape(name);
    const rows = await db.reader
      .createQueryBuilder()
      .from('users', 'u')
      .innerJoin('memberships', 'm', `m.${esc('user_id')} = u.${esc('id')}`)
      .select(`u.${esc('id')}`, 'id')
      .addSelect(`u.${esc('name')}`, 'name')
      .addSelect(`u.${esc('email')}`, 'email')
      .addSelect(`u.${esc('created_at')}`, 'created_at')
      .where(`m.${esc('shop_id')} = :shopId`, { shopId })
      .orderBy(`u.${esc('email')}`, 'ASC')
      .getRawMany<Record<string, unknown>>();
    yield Buffer.from(csvLine(['id', 'name', 'email', 'created_at']) + rows.map((r) => csvLine([r['id'], r['name'], r['email'], r['created_at']])).join(''));
  }
}

export type ShopExportService = ReturnType<typeof createShopExportService>;
