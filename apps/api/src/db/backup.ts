import { createRequire } from 'node:module';
import fs from 'node:fs';
import path from 'node:path';
import { pipeline } from 'node:stream/promises';
import type { FileStore } from '../modules/uploads/file-store';
import type { SqliteHandle } from './data-source';

// Online backup and restore of one Tappet instance: the SQLite database (through SQLite's backup
// API, so a running app keeps reading and writing) and the uploads, read through the file store. `npm run backup` and
// `npm run restore` (tools/scripts) call these.

interface RawDatabase extends SqliteHandle {
  prepare(sql: string): { all(): unknown[]; run(): unknown };
  close(): void;
}
type DatabaseConstructor = new (file: string, options?: { readonly?: boolean; fileMustExist?: boolean }) => RawDatabase;
// better-sqlite3 ships no type declarations; this is the slice of it used here.
const Database = createRequire(import.meta.url)('better-sqlite3') as DatabaseConstructor;

export interface BackupManifest {
  takenAt: string;
  database: { file: string; bytes: number; migrations: string[] };
  uploads: { files: number; bytes: number };
}

/** What is checked in a backup before anything is restored from it. */
export class BackupError extends Error {}

/** The pid file a running API keeps in its data folder (written at listen, removed at shutdown). */
export const pidFileName = 'tappet.pid';

/** Whether an API process is running on this data folder (its pid file names a live process). */
export function runningInstance(dataDir: string): number | null {
  const file = path.join(dataDir, pidFileName);
  if (!fs.existsSync(file)) return null;
  const pid = Number(fs.readFileSync(file, 'utf8').trim());
  if (!Number.isInteger(pid) || pid <= 0) return null;
  try {
    process.kill(pid, 0);
    return pid;
  } catch (err) {
    // EPERM: the process exists but belongs to someone else; it still holds the database.
    return (err as NodeJS.ErrnoException).code === 'EPERM' ? pid : null;
  }
}

function copyTree(from: string, to: string): { files: number; bytes: number } {
  let files = 0;
  let bytes = 0;
  if (!fs.existsSync(from)) return { files, bytes };
  fs.mkdirSync(to, { recursive: true });
  for (const entry of fs.readdirSync(from, { withFileTypes: true })) {
    const source = path.join(from, entry.name);
    const target = path.join(to, entry.name);
    if (entry.isDirectory()) {
      const sub = copyTree(source, target);
      files += sub.files;
      bytes += sub.bytes;
    } else if (entry.isFile()) {
      fs.copyFileSync(source, target);
      files++;
      bytes += fs.statSync(target).size;
    }
  }
  return { files, bytes };
}

/** Copies every stored upload into `to`, one file per key, streamed. */
async function copyStore(files: FileStore, to: string): Promise<{ files: number; bytes: number }> {
  let count = 0;
  let bytes = 0;
  for await (const key of files.list('')) {
    const target = path.join(to, ...key.split('/'));
    fs.mkdirSync(path.dirname(target), { recursive: true });
    await pipeline(await files.stream(key), fs.createWriteStream(target, { flags: 'wx' }));
    count++;
    bytes += fs.statSync(target).size;
  }
  return { files: count, bytes };
}

function integrityOk(file: string): boolean {
  const db = new Database(file, { readonly: true, fileMustExist: true });
  try {
    return db.pragma('integrity_check', { simple: true }) === 'ok';
  } finally {
    db.close();
  }
}

/**
 * Takes an online backup into `<backupsDir>/tappet-<time>/`: the database with `VACUUM INTO`, which
 * copies one read transaction's snapshot (WAL lets the app keep writing meanwhile; the page-by-page
 * backup API would restart on every write the app makes), then the uploads. The database comes
 * first: an upload's file is written before its row commits, so every file a row in the snapshot
 * names is already on disk when the uploads are copied.
 */
export async function takeBackup(options: { databasePath: string; files: FileStore; backupsDir: string; now?: Date }): Promise<{ dir: string; manifest: BackupManifest }> {
  const now = options.now ?? new Date();
  const dir = path.join(options.backupsDir, `tappet-${now.toISOString().replace(/[:.]/g, '-')}`);
  fs.mkdirSync(dir, { recursive: true });
  const target = path.join(dir, 'tappet.sqlite');
  const source = new Database(options.databasePath, { fileMustExist: true });
  try {
    source.pragma('busy_timeout = 5000');
    source.prepare(`VACUUM INTO '${target.replace(/'/g, "''")}'`).run();
  } finally {
    source.close();
  }
  if (!integrityOk(target)) throw new BackupError(`The backup in ${dir} fails SQLite's integrity check.`);
  const copy = new Database(target, { readonly: true, fileMustExist: true });
  const migrations = (copy.prepare('SELECT name FROM migrations ORDER BY id').all() as Array<{ name: string }>).map((m) => m.name);
  copy.close();
  const uploads = await copyStore(options.files, path.join(dir, 'uploads'));
  const manifest: BackupManifest = { takenAt: now.toISOString(), database: { file: 'tappet.sqlite', bytes: fs.statSync(target).size, migrations }, uploads };
  fs.writeFileSync(path.join(dir, 'manifest.json'), `${JSON.stringify(manifest, null, 2)}\n`);
  return { dir, manifest };
}

/**
 * Restores a backup folder into a stopped instance. Refuses while an API runs on the data folder
 * and when the backup fails its integrity check. What was there before is moved aside (never
 * deleted) into `<backupsDir>/replaced-<time>/`, so a restore can itself be undone. Uploads go back
 * into the local uploads folder: restoring is the one-machine tool, like the SQLite file itself.
 */
export function restoreBackup(options: { backupDir: string; dataDir: string; databasePath: string; uploadsDir: string; backupsDir: string; now?: Date }): { replacedDir: string | null } {
  const running = runningInstance(options.dataDir);
  if (running !== null) throw new BackupError(`Tappet is running on this data folder (process ${running}). Stop it first, then restore.`);
  const manifestFile = path.join(options.backupDir, 'manifest.json');
  const database = path.join(options.backupDir, 'tappet.sqlite');
  if (!fs.existsSync(manifestFile) || !fs.existsSync(database)) throw new BackupError(`${options.backupDir} is not a Tappet backup (no manifest.json and tappet.sqlite).`);
  if (!integrityOk(database)) throw new BackupError(`The backup's database fails SQLite's integrity check; nothing was restored.`);

  const now = options.now ?? new Date();
  let replacedDir: string | null = null;
  const existing = [options.databasePath, `${options.databasePath}-wal`, `${options.databasePath}-shm`, options.uploadsDir].filter((f) => fs.existsSync(f));
  if (existing.length > 0) {
    replacedDir = path.join(options.backupsDir, `replaced-${now.toISOString().replace(/[:.]/g, '-')}`);
    fs.mkdirSync(replacedDir, { recursive: true });
    for (const f of existing) fs.renameSync(f, path.join(replacedDir, path.basename(f)));
  }
  fs.mkdirSync(path.dirname(options.databasePath), { recursive: true });
  fs.copyFileSync(database, options.databasePath);
  copyTree(path.join(options.backupDir, 'uploads'), options.uploadsDir);
  return { replacedDir };
}
