// Helpers for API tests: a fresh database copied from the migrated template, the app on it, a
// fake clock and a mailer that keeps messages.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import type { Express } from 'express';
import type { ShopRole } from '@tappet/contracts';
import { randomUUID } from 'node:crypto';
import { inject } from 'vitest';
import pg from 'pg';
import { databaseUrl } from './global-setup';
import pino from 'pino';
import { createApp, type AppDeps } from '../app';
import { loadEnv, type Env } from '../config/env';
import { createDataSource } from '../db/data-source';
import { databaseFor, type Database } from '../db/write-lock';
import { FakeClock } from '../lib/clock';
import { createMemoryMailer } from '../lib/mailer';
import { createShopWithUsers } from '../modules/test-support/test-support.service';

export interface TestContext {
  app: Express;
  db: Database;
  env: Env;
  clock: FakeClock;
  mailer: ReturnType<typeof createMemoryMailer>;
  close(): Promise<void>;
}

/** True when the suite runs on PostgreSQL (`npm run test:api:pg`). */
export const onPostgres = () => inject('postgres') !== null;

/** A database of its own copied from the PostgreSQL template (CREATE DATABASE … TEMPLATE), opened. */
async function openPostgresTestDatabase(server: { adminUrl: string; template: string }, dir: string) {
  const name = `tappet_test_${randomUUID().replace(/-/g, '')}`;
  const admin = new pg.Client(server.adminUrl);
  await admin.connect();
  try {
    await admin.query(`CREATE DATABASE ${name} TEMPLATE ${server.template}`);
  } finally {
    await admin.end();
  }
  const dataSource = createDataSource(databaseUrl(server.adminUrl, name));
  await dataSource.initialize();
  return {
    dir,
    dataSource,
    db: databaseFor(dataSource),
    async close() {
      await dataSource.destroy();
      const dropper = new pg.Client(server.adminUrl);
      await dropper.connect();
      await dropper.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`).finally(() => dropper.end());
      fs.rmSync(dir, { recursive: true, force: true });
    },
  };
}

/** Copies the template database to a temp file (or PostgreSQL database) of its own and opens it. */
export async function openTestDatabase() {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'tappet-api-test-'));
  const server = inject('postgres');
  if (server) return openPostgresTestDatabase(server, dir);
  const file = path.join(dir, 'tappet.sqlite');
  fs.copyFileSync(inject('templateDbPath'), file);
  const dataSource = createDataSource(file);
  await dataSource.initialize();
  return {
    dir,
    dataSource,
    db: databaseFor(dataSource),
    async close() {
      await dataSource.destroy();
      fs.rmSync(dir, { recursive: true, force: true });
    },
  };
}

/** A test environment; `overrides` are raw variables as in process.env. */
export function testEnv(overrides: Record<string, string> = {}, dataDir = os.tmpdir()): Env {
  return loadEnv({ TAPPET_MODE: 'test', TAPPET_DATA_DIR: dataDir, PUBLIC_URL: 'http://tappet.test', ...overrides });
}

/** The app on its own fresh database. */
export async function createTestContext(options: { env?: Record<string, string>; deps?: Partial<AppDeps> } = {}): Promise<TestContext> {
  const database = await openTestDatabase();
  const env = testEnv(options.env, database.dir);
  const clock = new FakeClock();
  const mailer = createMemoryMailer();
  const app = createApp({ dataSource: database.dataSource, env, mailer, clock, logger: pino({ level: 'silent' }), ...options.deps });
  return { app, db: database.db, env, clock, mailer, close: database.close };
}

/**
 * A second app on the same database (file or PostgreSQL database), with its own connection, write lock and services, as a
 * second API process would have it (same env, so the same uploads folder too). Close it before
 * `ctx.close()`.
 */
export async function openSecondInstance(ctx: TestContext, deps: Partial<AppDeps> = {}): Promise<{ app: Express; db: Database; close(): Promise<void> }> {
  // The same database as the first instance: its PostgreSQL URL, or its SQLite file.
  const options = ctx.db.dataSource.options;
  const dataSource = createDataSource(options.type === 'postgres' ? String(options.url) : String(options.database));
  await dataSource.initialize();
  const app = createApp({ dataSource, env: ctx.env, mailer: ctx.mailer, clock: ctx.clock, logger: pino({ level: 'silent' }), ...deps });
  return { app, db: databaseFor(dataSource), close: () => dataSource.destroy() };
}

/** Creates a shop with one user per role; returns the shop, users by role and the password. */
export async function seedShop(ctx: Pick<TestContext, 'db' | 'clock'>, roles: ShopRole[] = ['owner', 'mechanic', 'buyer', 'viewer']) {
  const created = await createShopWithUsers(ctx.db, ctx.clock, { roles });
  const byRole = Object.fromEntries(created.users.map((u) => [u.role, u])) as Record<ShopRole, (typeof created.users)[number]>;
  return { ...created, byRole };
}

/** A supertest agent signed in as `email`; requests that change data need `.set(csrf)`. */
export async function signedInAgent(app: Express, email: string, password: string) {
  const agent = request.agent(app);
  const res = await agent.post('/api/auth/sign-in').set(csrf).send({ email, password });
  if (res.status !== 200) throw new Error(`sign-in as ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  return agent;
}

/** The header every state-changing request must carry. */
export const csrf = { 'X-CSRF': '1' } as const;

/** The session token from a response's Set-Cookie header, or null. */
export function sessionTokenFrom(res: request.Response, name = 'tappet_session'): string | null {
  const cookies = ([] as string[]).concat(res.headers['set-cookie'] ?? []);
  for (const c of cookies) {
    const [pair] = c.split(';');
    if (pair?.startsWith(`${name}=`)) return decodeURIComponent(pair.slice(name.length + 1)) || null;
  }
  return null;
}
