import path from 'node:path';
import { z } from 'zod';

/** How the app runs: `demo` (local, fakes on), `test` (test-support routes on), `production`. */
export const tappetModes = ['demo', 'test', 'production'] as const;
export type TappetMode = (typeof tappetModes)[number];

/** Validated configuration. Read once at start-up; everything else receives it as a dependency. */
export interface Env {
  mode: TappetMode;
  port: number;
  dataDir: string;
  /** Absolute path of the SQLite file inside `dataDir` (used when `databaseUrl` is null). */
  databasePath: string;
  /** `postgres://…` from DATABASE_URL: run on PostgreSQL instead of the SQLite file. */
  databaseUrl: string | null;
  uploadsDir: string;
  backupsDir: string;
  /** Base URL of the app as people reach it, without a trailing slash; e-mail links start with it. */
  publicUrl: string;
  /** Origins (besides PUBLIC_URL's) whose browser requests may change data. */
  trustedOrigins: string[];
  /** Express `trust proxy` setting; false unless TRUST_PROXY is set. */
  trustProxy: boolean | number | string;
  smtp: { host: string; port: number; user: string | null; pass: string | null; from: string };
  /** `apiUrl` points the Stripe SDK elsewhere (the local fake); null talks to Stripe itself. */
  stripe: { secretKey: string | null; webhookSecret: string | null; apiUrl: string | null };
  mailSinkHttpPort: number;
  session: { idleTimeoutMs: number; absoluteTimeoutMs: number };
  /** pino level of the request and error log. */
  logLevel: LogLevel;
}

export const logLevels = ['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent'] as const;
export type LogLevel = (typeof logLevels)[number];

/** Thrown when the environment is unusable; `problems` names every missing or invalid variable. */
export class EnvError extends Error {
  constructor(readonly problems: string[]) {
    super(`Tappet cannot start; fix these settings:\n${problems.map((p) => `  - ${p}`).join('\n')}`);
    this.name = 'EnvError';
  }
}

const optionalText = z
  .string()
  .trim()
  .transform((s) => (s === '' ? undefined : s))
  .optional();

const port = (name: string) =>
  z
    .string()
    .regex(/^\d+$/, `${name} must be a port number`)
    .transform(Number)
    .pipe(z.number().max(65535, `${name} must be between 0 and 65535`));

const minutes = (name: string) =>
  z
    .string()
    .regex(/^\d+$/, `${name} must be a whole number of minutes`)
    .transform(Number)
    .pipe(z.number().min(1, `${name} must be at least 1`));

const rawSchema = z.object({
  NODE_ENV: optionalText,
  TAPPET_MODE: optionalText.pipe(z.enum(tappetModes, { error: 'TAPPET_MODE must be demo, test or production' }).optional()),
  PORT: optionalText.pipe(port('PORT').optional()),
  TAPPET_DATA_DIR: optionalText,
  DATABASE_URL: optionalText.pipe(
    z
      .string()
      .regex(/^postgres(ql)?:\/\/\S+$/, 'DATABASE_URL must be a postgres:// URL (leave it unset for the SQLite file)')
      .optional(),
  ),
  PUBLIC_URL: optionalText.pipe(z.url({ error: 'PUBLIC_URL must be an absolute http(s) URL', protocol: /^https?$/ }).optional()),
  TRUSTED_ORIGINS: optionalText,
  TRUST_PROXY: optionalText,
  SMTP_HOST: optionalText,
  SMTP_PORT: optionalText.pipe(port('SMTP_PORT').optional()),
  SMTP_USER: optionalText,
  SMTP_PASS: optionalText,
  SMTP_FROM: optionalText,
  STRIPE_SECRET_KEY: optionalText,
  STRIPE_WEBHOOK_SECRET: optionalText,
  STRIPE_API_URL: optionalText.pipe(z.url({ error: 'STRIPE_API_URL must be an absolute http(s) URL', protocol: /^https?$/ }).optional()),
  MAIL_SINK_HTTP_PORT: optionalText.pipe(port('MAIL_SINK_HTTP_PORT').optional()),
  SESSION_IDLE_TIMEOUT_MINUTES: optionalText.pipe(minutes('SESSION_IDLE_TIMEOUT_MINUTES').optional()),
  SESSION_ABSOLUTE_TIMEOUT_MINUTES: optionalText.pipe(minutes('SESSION_ABSOLUTE_TIMEOUT_MINUTES').optional()),
  LOG_LEVEL: optionalText.pipe(z.enum(logLevels, { error: `LOG_LEVEL must be one of ${logLevels.join(', ')}` }).optional()),
});

function parseTrustProxy(value: string | undefined): boolean | number | string {
  if (value === undefined || value === 'false') return false;
  if (value === 'true') return true;
  if (/^\d+$/.test(value)) return Number(value);
  return value; // e.g. 'loopback' or a subnet list, passed to Express as is
}

/**
 * Reads and validates the configuration. Outside production every setting has a default so that
 * `npm start` needs nothing; in production PUBLIC_URL, the SMTP settings and the Stripe keys are
 * required, and an {@link EnvError} lists every one that is missing.
 */
export function loadEnv(source: Record<string, string | undefined> = process.env, cwd = process.cwd()): Env {
  const parsed = rawSchema.safeParse(source);
  if (!parsed.success) {
    throw new EnvError(parsed.error.issues.map((i) => `${i.path.join('.') || 'environment'}: ${i.message}`));
  }
  const raw = parsed.data;
  // NODE_ENV=production always means production, whatever TAPPET_MODE says: the safe side wins.
  const mode: TappetMode = raw.NODE_ENV === 'production' ? 'production' : (raw.TAPPET_MODE ?? 'demo');
  const isProduction = mode === 'production';

  const problems: string[] = [];
  if (isProduction) {
    const required = ['PUBLIC_URL', 'SMTP_HOST', 'SMTP_PORT', 'SMTP_FROM', 'STRIPE_SECRET_KEY', 'STRIPE_WEBHOOK_SECRET'] as const;
    for (const name of required) {
      if (raw[name] === undefined) problems.push(`${name} is required in production`);
    }
  }
  if ((raw.SMTP_USER === undefined) !== (raw.SMTP_PASS === undefined)) {
    problems.push('SMTP_USER and SMTP_PASS must be set together (or neither)');
  }
  if (problems.length > 0) throw new EnvError(problems);

  const portNumber = raw.PORT ?? 3000;
  const dataDir = path.resolve(cwd, raw.TAPPET_DATA_DIR ?? './data');
  const publicUrl = (raw.PUBLIC_URL ?? `http://localhost:${portNumber}`).replace(/\/+$/, '');
  const trustedOrigins = (raw.TRUSTED_ORIGINS ?? '')
    .split(',')
    .map((s) => s.trim())
    .filter(Boolean)
    .map((s) => new URL(s).origin);

  return {
    mode,
    port: portNumber,
    dataDir,
    databasePath: path.join(dataDir, 'tappet.sqlite'),
    databaseUrl: raw.DATABASE_URL ?? null,
    uploadsDir: path.join(dataDir, 'uploads'),
    backupsDir: path.join(dataDir, 'backups'),
    publicUrl,
    trustedOrigins,
    trustProxy: parseTrustProxy(raw.TRUST_PROXY),
    smtp: {
      // Outside production the defaults point at the local mail sink (tools/mail-sink).
      host: raw.SMTP_HOST ?? '127.0.0.1',
      port: raw.SMTP_PORT ?? 1025,
      user: raw.SMTP_USER ?? null,
      pass: raw.SMTP_PASS ?? null,
      from: raw.SMTP_FROM ?? 'Tappet <no-reply@tappet.test>',
    },
    stripe: { secretKey: raw.STRIPE_SECRET_KEY ?? null, webhookSecret: raw.STRIPE_WEBHOOK_SECRET ?? null, apiUrl: raw.STRIPE_API_URL ?? null },
    mailSinkHttpPort: raw.MAIL_SINK_HTTP_PORT ?? 1080,
    session: {
      idleTimeoutMs: (raw.SESSION_IDLE_TIMEOUT_MINUTES ?? 120) * 60_000,
      absoluteTimeoutMs: (raw.SESSION_ABSOLUTE_TIMEOUT_MINUTES ?? 720) * 60_000,
    },
    // Test runs keep only what needs attention.
    logLevel: raw.LOG_LEVEL ?? (mode === 'test' ? 'warn' : 'info'),
  };
}
