// Vitest global setup for the api project: migrate once into a template SQLite file; each test
// file copies it (test-support/test-app.ts) instead of migrating again.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import { createDataSource, sqliteHandle } from '../db/data-source';
import { migrateWithBackup } from '../db/migrate';

declare module 'vitest' {
  export interface ProvidedContext {
    templateDbPath: string;
  }
}

export default async function setup(project: TestProject) {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'tappet-api-template-'));
  const file = path.join(dir, 'template.sqlite');
  const dataSource = createDataSource(file);
  await dataSource.initialize();
  await migrateWithBackup(dataSource, path.join(dir, 'backups'));
  // Fold the WAL into the main file so that a plain file copy is complete.
  sqliteHandle(dataSource).pragma('wal_checkpoint(TRUNCATE)');
  await dataSource.destroy();
  project.provide('templateDbPath', file);
  return () => fs.rmSync(dir, { recursive: true, force: true });
}
