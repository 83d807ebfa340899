import path from 'node:path';
import { fileURLToPath } from 'node:url';
import express, { type Express } from 'express';
import helmet from 'helmet';
import { pinoHttp } from 'pino-http';
import pino, { type Logger } from 'pino';
import type { DataSource } from 'typeorm';
import type { Env } from './config/env';
import { databaseFor } from './db/write-lock';
import { staticRouter } from './http/static';
import { systemClock, type Clock } from './lib/clock';
import type { Mailer } from './lib/mailer';
import type { RateLimitStore } from './lib/rate-limiter';
import { authenticate } from './middleware/authenticate';
import { csrfProtection } from './middleware/csrf';
import { apiNotFound, errorHandler } from './middleware/error-handler';
import { authRouter } from './modules/auth/auth.router';
import { catalogueRouter } from './modules/catalogue/catalogue.router';
import { createCatalogueService } from './modules/catalogue/catalogue.service';
import { lookupRouter } from './modules/lookup/lookup.router';
import { createLookupService } from './modules/lookup/lookup.service';
import { sqlitePartSearchIndex } from './modules/lookup/part-search-index';
import { createImportService } from './modules/catalogue/imports/import.service';
import { createAuthService, type AuthLimits } from './modules/auth/auth.service';
import { meRouter } from './modules/me/me.router';
import { shopsRouter } from './modules/shops/shops.router';
import { apiKeysRouter } from './modules/api-keys/api-keys.router';
import { createApiKeysService } from './modules/api-keys/api-keys.service';
import { invitationsRouter, staffRouter } from './modules/staff/staff.router';
import { createStaffService } from './modules/staff/staff.service';
import { auditCsvRouter, auditRouter } from './modules/audit/audit.router';
import { createAuditQueries } from './modules/audit/audit.query';
import { settingsRouter } from './modules/settings/settings.router';
import { createSettingsService } from './modules/settings/settings.service';
import { shopExportRouter } from './modules/shop-export/shop-export.router';
import { createShopExportService } from './modules/shop-export/shop-export.service';
import { requireAuth } from './middleware/authenticate';
import { tenantContext } from './middleware/tenant-context';
import { createShopsService } from './modules/shops/shops.service';
import { testSupportRouter } from './modules/test-support/test-support.router';
import { buildOpenApiDocument } from './openapi/openapi';

const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../..');

export interface AppDeps {
  dataSource: DataSource;
  env: Env;
  mailer: Mailer;
  clock?: Clock;
  logger?: Logger;
  authLimits?: Partial<AuthLimits>;
  rateLimitStore?: RateLimitStore;
  /** Built web app; default `dist/apps/web` in the repo. */
  webDir?: string;
  /** Shipped fonts; default `fonts/` in the repo. */
  fontsDir?: string;
}

/** Builds the Express app (no listen): API, security headers, logs, the web app and fonts. */
export function createApp(deps: AppDeps): Express {
  const { env, mailer } = deps;
  const clock = deps.clock ?? systemClock;
  const logger = deps.logger ?? pino({ level: env.logLevel });
  const db = databaseFor(deps.dataSource);
  const auth = createAuthService({ db, env, clock, mailer, limits: deps.authLimits, rateLimitStore: deps.rateLimitStore, onMailError: (err) => logger.error({ err }, 'e-mail failed') });
  const shops = createShopsService({ db, clock });
  const catalogue = createCatalogueService({ db, clock });
  const lookup = createLookupService({ index: sqlitePartSearchIndex(() => db.reader), graphOf: (shopId) => catalogue.graphOf(shopId) });
  const imports = createImportService({ db, clock, catalogue });
  const staff = createStaffService({ db, env, clock, mailer, rateLimitStore: deps.rateLimitStore, onMailError: (err) => logger.error({ err }, 'e-mail failed') });
  const apiKeys = createApiKeysService({ db, clock });
  const audit = createAuditQueries({ db });
  const settings = createSettingsService({ db, clock });
  const shopExport = createShopExportService({ db, clock, uploadsDir: env.uploadsDir });
  const https = env.publicUrl.startsWith('https:');

  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', env.trustProxy);

  app.use(
    pinoHttp({
      logger,
      // Method, path and status only: no headers (cookies), no query strings (reset tokens), no invitation tokens.
      serializers: {
        req: (req: { id: unknown; method: string; url: string }) => ({ id: req.id, method: req.method, path: req.url.split('?')[0]?.replace(/^\/api\/invitations\/(?!accept$)[^/]+/, '/api/invitations/[token]') }),
        res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
      },
      autoLogging: { ignore: (req) => req.url === '/api/health' },
    }),
  );
  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'"],
          styleSrc: ["'self'"],
          fontSrc: ["'self'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          connectSrc: ["'self'"],
          objectSrc: ["'none'"],
          baseUri: ["'self'"],
          formAction: ["'self'"],
          frameAncestors: ["'none'"],
          // Only over https: it would break a plain-http demo on a LAN address.
          ...(https ? { upgradeInsecureRequests: [] } : {}),
        },
      },
      strictTransportSecurity: https ? { maxAge: 15_552_000, includeSubDomains: true } : false,
      crossOriginEmbedderPolicy: false,
    }),
  );

  const api = express.Router();
  api.use((_req, res, next) => {
    res.setHeader('Cache-Control', 'no-store');
    next();
  });
  api.use(csrfProtection(env));
  api.use(express.json({ limit: '100kb', type: 'application/json' }));
  api.get('/health', (_req, res) => {
    res.json({ status: 'ok' });
  });
  const openapi = buildOpenApiDocument({ testSupport: env.mode === 'test', serverUrl: env.publicUrl });
  api.get('/openapi.json', (_req, res) => {
    res.json(openapi);
  });
  api.use(authenticate(env, auth, apiKeys));
  api.use('/auth', authRouter({ env, auth }));
  api.use('/me', meRouter({ auth }));
  api.use('/invitations', invitationsRouter({ env, staff, auth }));
  // Shop administration, each behind the caller's (or API key's) own shop.
  api.use('/shops/:shopId/staff', requireAuth, tenantContext(db), staffRouter({ staff }));
  api.use('/shops/:shopId/api-keys', requireAuth, tenantContext(db), apiKeysRouter({ apiKeys }));
  api.use('/shops/:shopId/audit-events', requireAuth, tenantContext(db), auditRouter({ audit }));
  api.use('/shops/:shopId/audit-events.csv', requireAuth, tenantContext(db), auditCsvRouter({ audit }));
  api.use('/shops/:shopId/settings', requireAuth, tenantContext(db), settingsRouter({ settings }));
  api.use('/shops/:shopId/export.zip', requireAuth, tenantContext(db), shopExportRouter({ shopExport }));
  api.use('/shops/:shopId', lookupRouter({ db, lookup }));
  api.use('/shops/:shopId', catalogueRouter({ db, catalogue, imports }));
  api.use('/shops', shopsRouter({ db, shops }));
  if (env.mode === 'test') {
    api.use('/test-support', testSupportRouter({ db, clock }));
  }
  api.use(apiNotFound);

  app.use('/api', api);
  app.use(staticRouter({ webDir: deps.webDir ?? path.join(repoRoot, 'dist/apps/web'), fontsDir: deps.fontsDir ?? path.join(repoRoot, 'fonts') }));
  app.use(errorHandler((err, msg) => logger.error({ err }, msg)));
  return app;
}
