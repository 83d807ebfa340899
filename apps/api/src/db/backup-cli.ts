// `npm run backup`: an online backup of the configured instance (database + uploads), safe while
// the app runs. Written to <data>/backups/tappet-<time>/ unless a folder is given:
//   npm run backup [-- <backups folder>]
import path from 'node:path';
import { EnvError, loadEnv } from '../config/env';
import { localFileStore } from '../modules/uploads/file-store';
import { takeBackup } from './backup';

try {
  const env = loadEnv();
  const backupsDir = process.argv[2] ? path.resolve(process.argv[2]) : env.backupsDir;
  const { dir, manifest } = await takeBackup({ databasePath: env.databasePath, files: localFileStore(env.uploadsDir), backupsDir });
  console.log(`Backed up to ${dir}: database ${(manifest.database.bytes / 2 ** 20).toFixed(1)} MB, ${manifest.uploads.files} uploaded files.`);
} catch (err) {
  console.error(err instanceof EnvError ? err.message : err instanceof Error ? err.message : err);
  process.exit(1);
}
