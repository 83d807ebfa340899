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
 * The data layer's single entry point for writes.
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
    const run = () => insideWrite.run(this, () => this.dataSource.transaction((manager) => work(manager)));
    const result = this.tail.then(run);
    // The queue continues whatever the outcome of this writer.
    this.tail = result.catch(() => undefined);
    return result;
  }

  /** True while the current async context holds this database's write lock. */
  isWriting(): boolean {
    return insideWrite.getStore() === this;
  }

  /** Resolves once every queued writer has finished (used at shutdown). */
  async drain(): Promise<void> {
    let seen: Promise<unknown>;
    do {
      seen = this.tail;
      await seen;
    } while (seen !== this.tail);
  }
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
