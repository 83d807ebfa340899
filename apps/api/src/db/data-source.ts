import { DataSource, type EntitySchema } from 'typeorm';
import { UserEntity } from '../modules/users/users.entity';
import { MembershipEntity, ShopEntity } from '../modules/shops/shops.entity';
import { PasswordResetTokenEntity, SessionEntity } from '../modules/auth/auth.entity';
import { AuditEventEntity } from '../modules/audit/audit.entity';
import { InitialSchema1764633600000 } from './migrations/1764633600000-initial-schema';
import { Catalogue1764720000000 } from './migrations/1764720000000-catalogue';
import { catalogueEntities } from '../modules/catalogue/catalogue.entity';
import { ShopAdministration1764806400000 } from './migrations/1764806400000-shop-administration';
import { PartSearch1764900000000 } from './migrations/1764900000000-part-search';
import { InvitationEntity } from '../modules/staff/staff.entity';
import { ApiKeyEntity } from '../modules/api-keys/api-keys.entity';
import { ShopSettingsEntity } from '../modules/settings/settings.entity';
import { billingEntities } from '../modules/billing/billing.entity';
import { Billing1765200000000 } from './migrations/1765200000000-billing';
import { Vehicles1765100000000 } from './migrations/1765100000000-vehicles';
import { CustomerEntity } from '../modules/customers/customers.entity';
import { vehicleEntities } from '../modules/vehicles/vehicles.entity';
import { Stock1765000000000 } from './migrations/1765000000000-stock';
import { stockEntities } from '../modules/stock/stock.entity';
import { Purchasing1765400000000 } from './migrations/1765400000000-purchasing';
import { purchasingEntities } from '../modules/purchasing/purchasing.entity';
import { Jobs1765500000000 } from './migrations/1765500000000-jobs';
import { PurchaseSpecialOrders1766000000000 } from './migrations/1766000000000-purchase-special-orders';
import { SharedState1766100000000 } from './migrations/1766100000000-shared-state';
import { StockMovementsByKind1766200000000 } from './migrations/1766200000000-stock-movements-by-kind';
import { jobEntities } from '../modules/jobs/jobs.entity';
import { StockCounts1765600000000 } from './migrations/1765600000000-stock-counts';
import { countEntities } from '../modules/counts/counts.entity';
import { barcodeEntities } from '../modules/barcodes/barcodes.entity';
import { Sales1765700000000 } from './migrations/1765700000000-sales';
import { salesEntities } from '../modules/sales/sales.entity';
import { EstimatesAndConsignment1765800000000 } from './migrations/1765800000000-estimates-and-consignment';
import { estimateEntities } from '../modules/estimates/estimates.entity';
import { consignmentEntities } from '../modules/consignment/consignment.entity';
import { postgresMigrations } from './migrations/postgres';
import { installPostgresDialect, pgNumberTypes, postgresEntity } from './postgres-dialect';

/** The few better-sqlite3 methods we call (the package ships no type declarations). */
export interface SqliteHandle {
  pragma(source: string, options?: { simple?: boolean }): unknown;
  backup(destination: string): Promise<unknown>;
  exec(sql: string): unknown;
}

/** Every entity schema the app knows. */
export const entities = [UserEntity, ShopEntity, MembershipEntity, SessionEntity, PasswordResetTokenEntity, AuditEventEntity, ...catalogueEntities, InvitationEntity, ApiKeyEntity, ShopSettingsEntity, CustomerEntity, ...vehicleEntities, ...billingEntities, ...stockEntities, ...purchasingEntities, ...jobEntities, ...salesEntities, ...countEntities, ...barcodeEntities, ...estimateEntities, ...consignmentEntities];

/** Committed migrations, in order. Passed as classes: globs do not survive bundling or tsx. */
export const migrations = [InitialSchema1764633600000, Catalogue1764720000000, ShopAdministration1764806400000, PartSearch1764900000000, Stock1765000000000, Vehicles1765100000000, Billing1765200000000, Purchasing1765400000000, Jobs1765500000000, StockCounts1765600000000, Sales1765700000000, EstimatesAndConsignment1765800000000, PurchaseSpecialOrders1766000000000, SharedState1766100000000, StockMovementsByKind1766200000000];

/**
 * Pragmas set on every connection. Set here rather than through `enableWAL` so that
 * `synchronous` is the same on first boot and on restarts (platform-notes.md trap 3).
 */
export function prepareSqlite(db: SqliteHandle): void {
  db.pragma('journal_mode = WAL');
  db.pragma('synchronous = NORMAL');
  db.pragma('temp_store = MEMORY');
  db.pragma('foreign_keys = ON');
  db.pragma('busy_timeout = 5000');
}

/** Where the data lives: DATABASE_URL when set, else the SQLite file. */
export function databaseLocation(env: { databasePath: string; databaseUrl: string | null }): string {
  return env.databaseUrl ?? env.databasePath;
}

const isPostgresUrl = (location: string) => /^postgres(ql)?:\/\//.test(location);

/** True when the data source talks to PostgreSQL (several connections, no write lock needed). */
export function isPostgres(dataSource: DataSource): boolean {
  return dataSource.options.type === 'postgres';
}

/**
 * Creates (does not initialise) the TypeORM data source for a SQLite file path or a
 * `postgres://` URL: the same entities (mapped by postgres-dialect.ts), each database's migrations.
 */
export function createDataSource(location: string): DataSource {
  if (isPostgresUrl(location)) return createPostgresDataSource(location);
  return new DataSource({
    type: 'better-sqlite3',
    database: location,
    entities,
    migrations,
    migrationsRun: false,
    migrationsTransactionMode: 'each',
    synchronize: false,
    logging: false,
    timeout: 5000,
    prepareDatabase: prepareSqlite,
  });
}

function createPostgresDataSource(url: string): DataSource {
  const dataSource = new DataSource({
    type: 'postgres',
    url,
    entities: entities.map((e) => postgresEntity(e as EntitySchema<unknown>)),
    migrations: postgresMigrations,
    migrationsRun: false,
    migrationsTransactionMode: 'each',
    synchronize: false,
    logging: false,
    // Passed to pg's Pool: numbers parsed as on SQLite; times are compared as UTC text anyway.
    extra: { types: pgNumberTypes, max: 10, options: '-c timezone=UTC' },
  });
  installPostgresDialect(dataSource);
  return dataSource;
}

/** The raw better-sqlite3 handle behind a data source (for backups and pragmas). */
export function sqliteHandle(dataSource: DataSource): SqliteHandle {
  return (dataSource.driver as unknown as { databaseConnection: SqliteHandle }).databaseConnection;
}
