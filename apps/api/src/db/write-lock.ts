import { AsyncLocalStorage } from 'node:async_hooks';
import type { DataSource, EntityManager, EntitySubscriberInterface, InsertEvent, RemoveEvent, UpdateEvent } from 'typeorm';

/** Work done under the write lock, inside one transaction. Must not await network I/O. */
export type WriteWork<T> = (manager: EntityManager) => Promise<T>;

const insideWrite = new AsyncLocalStorage<Database>();
const byDataSource = new WeakMap<DataSource, Database>();

/**
 * The one {@link Database} (and so the one write lock) of a data source. Everything that writes
 * to the same SQLite connection must share it, so it is looked up here rather than constructed.
 */
export function databaseFor(dataSource: DataSource): Database {
  let db = byDataSource.get(dataSource);
  if (!db) {
    db = new Database(dataSource);
    byDataSource.set(dataSource, db);
  }
  return db;
}

/**
 * The data layer's single entry point for writes (on SQLite a FIFO lock; on PostgreSQL
 * serializable transactions retried on conflict, see {@link Database.write}).
 *
 * better-sqlite3 gives TypeORM one connection and one shared QueryRunner, so a transaction that
 * awaits lets every other caller's statements run inside it; when it rolls back, their writes
 * vanish although they were reported as saved (platform-notes.md trap 1). `write` queues callers
 * first in, first out and runs each one alone in its own transaction.
 */
export class Database {
  private tail: Promise<unknown> = Promise.resolve();

  /** Use {@link databaseFor}: two locks on one connection would not protect anything. */
  constructor(readonly dataSource: DataSource) {
    if (byDataSource.has(dataSource)) throw new Error('This data source already has a Database: use databaseFor().');
    // Entity saves and removes outside `write` fail loudly instead of joining a stranger's transaction.
    dataSource.subscribers.push(new WriteGuard(this));
  }

  /** Manager for reads. Writes go through {@link Database.write}. */
  get reader(): EntityManager {
    return this.dataSource.manager;
  }

  /**
   * Runs `work` in a transaction once every earlier writer has finished. The transaction commits
   * when `work` resolves and rolls back when it throws; the result or error is passed on.
   */
  write<T>(work: WriteWork<T>): Promise<T> {
    if (insideWrite.getStore() === this) {
      // Queuing here would wait for ourselves forever.
      return Promise.reject(new Error('db.write() called inside db.write(): use the manager you were given.'));
    }
    if (this.dataSource.options.type === 'postgres') return this.track(this.writeSerializable(work));
    const run = () => insideWrite.run(this, () => this.dataSource.transaction((manager) => work(manager)));
    const result = this.tail.then(run);
    // The queue continues whatever the outcome of this writer.
    this.tail = result.catch(() => undefined);
    return result;
  }

  private readonly inFlight = new Set<Promise<unknown>>();

  private track<T>(promise: Promise<T>): Promise<T> {
    this.inFlight.add(promise);
    const forget = () => this.inFlight.delete(promise);
    promise.then(forget, forget);
    return promise;
  }

  /**
   * PostgreSQL (decision 019): a pool of connections, each transaction on its own QueryRunner, so
   * no queue. Every write transaction is SERIALIZABLE: the database aborts one of two that would
   * interleave unsafely (holds on the last units, MAX(number) + 1, overlapping receipts) with
   * SQLSTATE 40001, and `work` is simply run again on a fresh transaction. That is safe because
   * `work` only touches the database (no network I/O inside a write, as on SQLite).
   */
  private async writeSerializable<T>(work: WriteWork<T>): Promise<T> {
    for (let attempt = 1; ; attempt++) {
      await this.writerSlot();
      try {
        return await insideWrite.run(this, () => this.dataSource.transaction('SERIALIZABLE', (manager) => work(manager)));
      } catch (err) {
        if (attempt >= maxSerializableAttempts || !isRetryable(err)) throw err;
      } finally {
        this.releaseWriterSlot();
      }
      // Random back-off so that the transactions that collided do not collide again in step.
      await new Promise((resolve) => setTimeout(resolve, Math.random() * 5 * attempt));
    }
  }

  private writers = 0;
  private readonly waitingWriters: Array<() => void> = [];

  /**
   * At most {@link concurrentWriters} transactions at once, fewer than the pool's connections:
   * work inside a write may still read through `reader` (another pooled connection), and with
   * every connection held by a writer waiting for one, the pool would starve for ever.
   */
  private writerSlot(): Promise<void> {
    if (this.writers < concurrentWriters) {
      this.writers++;
      return Promise.resolve();
    }
    return new Promise((resolve) => this.waitingWriters.push(resolve));
  }

  private releaseWriterSlot(): void {
    const next = this.waitingWriters.shift();
    if (next) next(); // the slot passes straight to the next writer
    else this.writers--;
  }

  /** True while the current async context holds this database's write lock. */
  isWriting(): boolean {
    return insideWrite.getStore() === this;
  }

  /** Resolves once every queued writer has finished (used at shutdown). */
  async drain(): Promise<void> {
    while (this.inFlight.size > 0) await Promise.allSettled([...this.inFlight]);
    let seen: Promise<unknown>;
    do {
      seen = this.tail;
      await seen;
    } while (seen !== this.tail);
  }
}

const maxSerializableAttempts = 20;

/** Half of the pool's 10 connections (data-source.ts), leaving the rest for reads. */
const concurrentWriters = 5;

/**
 * Serialization failure or deadlock: PostgreSQL asks the client to run the transaction again. A
 * unique violation too: two transactions taking the same `MAX(seq) + 1` may be told 23505 rather
 * than 40001; run again, one of them takes the next number. A genuine duplicate fails again and
 * its error is passed on (services check for duplicates before writing, so none relies on 23505).
 */
function isRetryable(err: unknown): boolean {
  const code = (err as { code?: unknown; driverError?: { code?: unknown } }).driverError?.code ?? (err as { code?: unknown }).code;
  return code === '40001' || code === '40P01' || code === '23505';
}

class WriteGuard implements EntitySubscriberInterface {
  constructor(private readonly db: Database) {}

  private check(): void {
    if (!this.db.isWriting()) throw new Error('Write outside db.write(): route every write through the write lock.');
  }

  beforeInsert(_event: InsertEvent<unknown>): void {
    this.check();
  }

  beforeUpdate(_event: UpdateEvent<unknown>): void {
    this.check();
  }

  beforeRemove(_event: RemoveEvent<unknown>): void {
    this.check();
  }
}
