// `npm run restore -- <backup folder>`: restores a backup made by `npm run backup` into the
// configured instance, which must be stopped. What was there is moved aside, not deleted.
import path from 'node:path';
import { EnvError, loadEnv } from '../config/env';
import { restoreBackup } from './backup';

const backupDir = process.argv[2];
if (!backupDir) {
  console.error('Name the backup folder: npm run restore -- data/backups/tappet-…');
  process.exit(1);
}
try {
  const env = loadEnv();
  const { replacedDir } = restoreBackup({ backupDir: path.resolve(backupDir), dataDir: env.dataDir, databasePath: env.databasePath, uploadsDir: env.uploadsDir, backupsDir: env.backupsDir });
  console.log(`Restored ${backupDir}.${replacedDir ? ` The previous database and uploads are in ${replacedDir}.` : ''} Start Tappet again; pending migrations run at start.`);
} catch (err) {
  console.error(err instanceof EnvError ? err.message : err instanceof Error ? err.message : err);
  process.exit(1);
}
