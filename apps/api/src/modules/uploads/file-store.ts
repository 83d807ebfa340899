import fs from 'node:fs';
import path from 'node:path';
import { randomUUID } from 'node:crypto';
import type { Readable } from 'node:stream';

/**
 * Where uploaded bytes live. Keys are made by the server (never from a client's file name), with
 * the shop's id first, so one shop's files sit under one prefix. Every module that reads or writes
 * uploads goes through this interface, so several API processes can share one store (an object
 * store, say) instead of each writing to its own disk; the folder store below is the default.
 */
export interface FileStore {
  /** Stores `data` under `key`; refuses to overwrite an existing key. */
  put(key: string, data: Buffer): Promise<void>;
  /** The bytes under `key`; throws {@link FileMissingError} when there are none. */
  read(key: string): Promise<Buffer>;
  /** Removes `key`; a missing key is not an error (clean-up after a failure may run twice). */
  remove(key: string): Promise<void>;
  /** Whether something is stored under `key`. */
  exists(key: string): Promise<boolean>;
  /** The bytes under `key` as a stream, for files too big to hold (exports, backups). */
  stream(key: string): Promise<Readable>;
  /** Every key below `prefix` (a shop's id, say; '' for all), in key order. */
  list(prefix: string): AsyncIterable<string>;
}

/** Thrown by {@link FileStore.read} for a key with nothing stored. */
export class FileMissingError extends Error {
  constructor(key: string) {
    super(`No stored file under ${key}.`);
    this.name = 'FileMissingError';
  }
}

/** Keys are lower-case path segments of letters, digits and dashes, ending in a file extension. */
const keyPattern = /^[a-z0-9-]+(\/[a-z0-9-]+)*(\.[a-z0-9]+)+$/;

/** Refuses anything that is not a server-made key, so no input can reach outside the store. */
export function assertStorageKey(key: string): void {
  if (!isStorageKey(key)) throw new Error(`Not a storage key: ${JSON.stringify(key)}`);
}

function isStorageKey(key: string): boolean {
  return keyPattern.test(key) && key.length <= 200;
}

/** A prefix to list: '' or folder segments like a key's, without the file name. */
const prefixPattern = /^([a-z0-9-]+(\/[a-z0-9-]+)*)?$/;

/**
 * A {@link FileStore} in a folder on disk (env.uploadsDir), outside anything the web server
 * serves. Files are written to a temporary name and renamed, so a reader never sees half a file.
 */
export function localFileStore(rootDir: string): FileStore {
  const root = path.resolve(rootDir);
  const full = (key: string) => {
    assertStorageKey(key);
    const target = path.resolve(root, ...key.split('/'));
    // Belt and braces: the pattern already rules out "..", but the store must never leave its root.
    if (!target.startsWith(root + path.sep)) throw new Error(`Storage key outside the store: ${key}`);
    return target;
  };
  return {
    async put(key, data) {
      const target = full(key);
      await fs.promises.mkdir(path.dirname(target), { recursive: true, mode: 0o750 });
      const temp = `${target}.${randomUUID()}.part`;
      await fs.promises.writeFile(temp, data, { flag: 'wx', mode: 0o640 });
      try {
        if (fs.existsSync(target)) throw new Error(`A file is already stored under ${key}.`);
        await fs.promises.rename(temp, target);
      } catch (err) {
        await fs.promises.rm(temp, { force: true });
        throw err;
      }
    },
    async read(key) {
      try {
        return await fs.promises.readFile(full(key));
      } catch (err) {
        if ((err as NodeJS.ErrnoException).code === 'ENOENT') throw new FileMissingError(key);
        throw err;
      }
    },
    async remove(key) {
      await fs.promises.rm(full(key), { force: true });
    },
    async exists(key) {
      try {
        return (await fs.promises.stat(full(key))).isFile();
      } catch {
        return false;
      }
    },
    async stream(key) {
      const handle = await fs.promises.open(full(key), 'r').catch((err: NodeJS.ErrnoException) => {
        throw err.code === 'ENOENT' ? new FileMissingError(key) : err;
      });
      return handle.createReadStream();
    },
    async *list(prefix) {
      if (!prefixPattern.test(prefix)) throw new Error(`Not a storage prefix: ${JSON.stringify(prefix)}`);
      const keys: string[] = [];
      const walk = async (dir: string, keyDir: string) => {
        let entries: fs.Dirent[];
        try {
          entries = await fs.promises.readdir(dir, { withFileTypes: true });
        } catch (err) {
          if ((err as NodeJS.ErrnoException).code === 'ENOENT') return; // nothing stored there yet
          throw err;
        }
        for (const entry of entries) {
          const key = keyDir ? `${keyDir}/${entry.name}` : entry.name;
          // Links are not followed; half-written `.part` files and strays are not keys.
          if (entry.isDirectory()) await walk(path.join(dir, entry.name), key);
          else if (entry.isFile() && isStorageKey(key)) keys.push(key);
        }
      };
      await walk(prefix ? path.join(root, ...prefix.split('/')) : root, prefix);
      yield* keys.sort();
    },
  };
}
