import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { EnvError, loadEnv } from './env';

const productionEnv = {
  NODE_ENV: 'production',
  PUBLIC_URL: 'https://tappet.example.test',
  SMTP_HOST: 'smtp.example.test',
  SMTP_PORT: '587',
  SMTP_FROM: 'Tappet <no-reply@example.test>',
  STRIPE_SECRET_KEY: 'sk_test_placeholder',
  STRIPE_WEBHOOK_SECRET: 'whsec_placeholder',
};

function problemsOf(source: Record<string, string>): string[] {
  try {
    loadEnv(source);
  } catch (err) {
    if (err instanceof EnvError) return err.problems;
    throw err;
  }
  return [];
}

describe('loadEnv', () => {
  it('needs nothing in demo mode and points mail at the local sink', () => {
    const env = loadEnv({}, '/srv/tappet');
    expect(env.mode).toBe('demo');
    expect(env.port).toBe(3000);
    expect(env.dataDir).toBe(path.resolve('/srv/tappet/data'));
    expect(env.databasePath).toBe(path.resolve('/srv/tappet/data/tappet.sqlite'));
    expect(env.uploadsDir).toBe(path.resolve('/srv/tappet/data/uploads'));
    expect(env.publicUrl).toBe('http://localhost:3000');
    expect(env.smtp).toMatchObject({ host: '127.0.0.1', port: 1025 });
    expect(env.mailSinkHttpPort).toBe(1080);
    expect(env.session).toEqual({ idleTimeoutMs: 2 * 3600_000, absoluteTimeoutMs: 12 * 3600_000 });
  });

  it('follows PORT and TAPPET_DATA_DIR', () => {
    const env = loadEnv({ PORT: '4100', TAPPET_DATA_DIR: '/tmp/tappet-x' });
    expect(env.port).toBe(4100);
    expect(env.publicUrl).toBe('http://localhost:4100');
    expect(env.databasePath).toBe('/tmp/tappet-x/tappet.sqlite');
  });

  it('uses the SQLite file unless DATABASE_URL names a PostgreSQL database', () => {
    expect(loadEnv({}).databaseUrl).toBeNull();
    expect(loadEnv({ DATABASE_URL: ' ' }).databaseUrl).toBeNull();
    expect(loadEnv({ DATABASE_URL: 'postgres://tappet@db.internal:5432/tappet' }).databaseUrl).toBe('postgres://tappet@db.internal:5432/tappet');
    expect(loadEnv({ DATABASE_URL: 'postgresql://db.internal/tappet' }).databaseUrl).toBe('postgresql://db.internal/tappet');
    expect(problemsOf({ DATABASE_URL: 'mysql://db.internal/tappet' })).toEqual(['DATABASE_URL: DATABASE_URL must be a postgres:// URL (leave it unset for the SQLite file)']);
  });

  it('refuses to start in production, naming every missing setting', () => {
    const problems = problemsOf({ NODE_ENV: 'production' });
    expect(problems).toEqual([
      'PUBLIC_URL is required in production',
      'SMTP_HOST is required in production',
      'SMTP_PORT is required in production',
      'SMTP_FROM is required in production',
      'STRIPE_SECRET_KEY is required in production',
      'STRIPE_WEBHOOK_SECRET is required in production',
    ]);
    expect(() => loadEnv({ NODE_ENV: 'production' })).toThrow(/Tappet cannot start.*\n.*PUBLIC_URL/);
  });

  it('names only what is missing', () => {
    const { STRIPE_WEBHOOK_SECRET: _s, SMTP_HOST: _h, ...rest } = productionEnv;
    expect(problemsOf(rest)).toEqual(['SMTP_HOST is required in production', 'STRIPE_WEBHOOK_SECRET is required in production']);
  });

  it('treats TAPPET_MODE=production like NODE_ENV=production, and NODE_ENV=production wins over demo', () => {
    expect(problemsOf({ TAPPET_MODE: 'production' })).toHaveLength(6);
    expect(problemsOf({ NODE_ENV: 'production', TAPPET_MODE: 'demo' })).toHaveLength(6);
  });

  it('starts in production when everything is set', () => {
    const env = loadEnv(productionEnv);
    expect(env.mode).toBe('production');
    expect(env.publicUrl).toBe('https://tappet.example.test');
    expect(env.stripe.secretKey).toBe('sk_test_placeholder');
  });

  it('reports invalid values by name', () => {
    expect(problemsOf({ PORT: 'eighty' })).toEqual([expect.stringMatching(/^PORT: PORT must be a port number/)]);
    expect(problemsOf({ TAPPET_MODE: 'staging' })).toEqual([expect.stringMatching(/TAPPET_MODE must be demo, test or production/)]);
    expect(problemsOf({ PUBLIC_URL: 'tappet.test' })).toEqual([expect.stringMatching(/PUBLIC_URL must be an absolute/)]);
    expect(problemsOf({ SMTP_USER: 'mailer' })).toEqual(['SMTP_USER and SMTP_PASS must be set together (or neither)']);
  });
});
