// Vitest global setup for the api project: migrate once into a template SQLite file (or, with
// TAPPET_TEST_DB=postgres, a template PostgreSQL database); each test file copies it
// (test-support/test-app.ts) instead of migrating again.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import pg from 'pg';
import { createDataSource, sqliteHandle } from '../db/data-source';
import { migrateWithBackup } from '../db/migrate';

declare module 'vitest' {
  export interface ProvidedContext {
    templateDbPath: string;
    /** Set when the suite runs on PostgreSQL: the server's admin URL and the template's name. */
    postgres: { adminUrl: string; template: string } | null;
  }
}

/** The PostgreSQL server the suite runs on (tools/scripts/postgres-for-tests.mjs), or null for SQLite. */
export function testPostgresAdminUrl(): string | null {
  if (process.env['TAPPET_TEST_DB'] !== 'postgres') return null;
  const url = process.env['TAPPET_TEST_PG_URL'];
  if (!url) throw new Error('TAPPET_TEST_DB=postgres needs TAPPET_TEST_PG_URL: run through `npm run test:api:pg`.');
  return url;
}

/** The URL of database `name` on the server at `adminUrl`. */
export function databaseUrl(adminUrl: string, name: string): string {
  const url = new URL(adminUrl);
  url.pathname = `/${name}`;
  return url.toString();
}

async function setupPostgres(project: TestProject, adminUrl: string) {
  const template = `tappet_template_${process.pid}`;
  const admin = new pg.Client(adminUrl);
  await admin.connect();
  await admin.query(`DROP DATABASE IF EXISTS ${template}`);
  await admin.query(`CREATE DATABASE ${template}`);
  const dataSource = createDataSource(databaseUrl(adminUrl, template));
  await dataSource.initialize();
  await migrateWithBackup(dataSource, os.tmpdir());
  await dataSource.destroy();
  project.provide('postgres', { adminUrl, template });
  project.provide('templateDbPath', '');
  return async () => {
    await admin.query(`DROP DATABASE IF EXISTS ${template} WITH (FORCE)`);
    await admin.end();
  };
}

export default async function setup(project: TestProject) {
  const adminUrl = testPostgresAdminUrl();
  if (adminUrl) return setupPostgres(project, adminUrl);
  project.provide('postgres', null);
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
