// Starts the API: configuration, database (migrated after a backup), mailer, app, listen; and a
// graceful shutdown. The mail sink and the seed are started by the lead's start script, not here.
import fs from 'node:fs';
import type { Server } from 'node:http';
import path from 'node:path';
import { createApp } from './app';
import { EnvError, loadEnv, type Env } from './config/env';
import { createDataSource, databaseLocation } from './db/data-source';
import { migrateWithBackup } from './db/migrate';
import { databaseFor } from './db/write-lock';
import { pidFileName } from './db/backup';
import { createSmtpMailer } from './lib/mailer';

function readEnv(): Env {
  try {
    return loadEnv();
  } catch (err) {
    if (err instanceof EnvError) {
      console.error(err.message);
      process.exit(1);
    }
    throw err;
  }
}

async function main(): Promise<void> {
  const env = readEnv();
  // On SQLite the driver creates the folder with the file; on PostgreSQL it still holds the pid file and uploads.
  fs.mkdirSync(env.dataDir, { recursive: true });
  const dataSource = createDataSource(databaseLocation(env));
  await dataSource.initialize();
  const migrated = await migrateWithBackup(dataSource, env.backupsDir);
  if (migrated.backupPath) console.log(`Backed up the database to ${migrated.backupPath} before migrating.`);
  if (migrated.applied.length) console.log(`Applied migrations: ${migrated.applied.join(', ')}`);

  const app = createApp({ dataSource, env, mailer: createSmtpMailer(env) });
  // The pid file tells `npm run restore` that this data folder is in use.
  const pidFile = path.join(env.dataDir, pidFileName);
  const server: Server = app.listen(env.port, () => {
    fs.writeFileSync(pidFile, `${process.pid}\n`);
    console.log(`Tappet (${env.mode} mode) is listening on ${env.publicUrl}`);
  });
  server.on('error', (err: NodeJS.ErrnoException) => {
    console.error(err.code === 'EADDRINUSE' ? `Port ${env.port} is in use: stop the other program or set PORT.` : `Cannot listen on port ${env.port}: ${err.message}`);
    process.exit(1);
  });

  let stopping = false;
  const shutdown = (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`${signal}: finishing requests in flight, then stopping.`);
    // Stop accepting; close() resolves once in-flight requests have been answered.
    server.close(() => {
      // Let queued writes commit, then close the database cleanly (WAL checkpoint).
      databaseFor(dataSource)
        .drain()
        .then(() => dataSource.destroy())
        .then(() => fs.rmSync(pidFile, { force: true }))
        .then(
          () => process.exit(0),
          (err: unknown) => {
            console.error('Closing the database failed:', err);
            process.exit(1);
          },
        );
    });
    server.closeIdleConnections();
    // A request that never ends must not keep the process alive forever.
    setTimeout(() => {
      console.error('Requests still running after 10 s; stopping anyway.');
      process.exit(1);
    }, 10_000).unref();
  };
  process.on('SIGTERM', () => shutdown('SIGTERM'));
  process.on('SIGINT', () => shutdown('SIGINT'));
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
