import fs from 'node:fs';
import path from 'node:path';
import { randomUUID } from 'node:crypto';

/**
 * Where uploaded bytes live. Keys are made by the server (never from a client's file name), with
 * the shop's id first, so one shop's files sit under one prefix. A later issue adds other stores
 * (object storage); callers only see this interface.
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
  if (!keyPattern.test(key) || key.length > 200) throw new Error(`Not a storage key: ${JSON.stringify(key)}`);
}

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
  };
}
