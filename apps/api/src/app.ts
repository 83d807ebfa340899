import path from 'node:path';
import { fileURLToPath } from 'node:url';
import express, { type Express } from 'express';
import helmet from 'helmet';
import pino, { type Logger } from 'pino';
import type { DataSource } from 'typeorm';
import type { Env } from './config/env';
import { databaseFor } from './db/write-lock';
import { databaseRateLimitStore } from './db/rate-limit-store';
import { requestLog } from './http/request-log';
import { staticRouter } from './http/static';
import { systemClock, type Clock } from './lib/clock';
import type { Mailer } from './lib/mailer';
import type { RateLimitRule, RateLimitStore } from './lib/rate-limiter';
import { mailRequestLimit } from './middleware/rate-limits';
import { authenticate } from './middleware/authenticate';
import { csrfProtection } from './middleware/csrf';
import { apiNotFound, errorHandler } from './middleware/error-handler';
import { authRouter } from './modules/auth/auth.router';
import { catalogueRouter } from './modules/catalogue/catalogue.router';
import { createCatalogueService } from './modules/catalogue/catalogue.service';
import { lookupRouter } from './modules/lookup/lookup.router';
import { createLookupService } from './modules/lookup/lookup.service';
import { memoryPartSearchIndex } from './modules/lookup/memory-part-search-index';
import { stockRouter } from './modules/stock/stock.router';
import { createStockService } from './modules/stock/stock.service';
import { freeStockByPart } from './modules/stock/stock.queries';
import { partIdOfGtin } from './modules/barcodes/barcodes.service';
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
import { labelsRouter } from './modules/labels/labels.router';
import { countsRouter } from './modules/counts/counts.router';
import { barcodeLookupRouter, partBarcodesRouter } from './modules/barcodes/barcodes.router';
import { createBarcodesService } from './modules/barcodes/barcodes.service';
import { createCountsService } from './modules/counts/counts.service';
import { createLabelsService } from './modules/labels/labels.service';
import { createSettingsService } from './modules/settings/settings.service';
import { shopExportRouter } from './modules/shop-export/shop-export.router';
import { createShopExportService } from './modules/shop-export/shop-export.service';
import { customersRouter } from './modules/customers/customers.router';
import { createCustomersService } from './modules/customers/customers.service';
import { vehiclesRouter } from './modules/vehicles/vehicles.router';
import { createVehiclesService } from './modules/vehicles/vehicles.service';
import { checklistTemplatesRouter, jobsRouter } from './modules/jobs/jobs.router';
import { createJobsService } from './modules/jobs/jobs.service';
import { payLinkRouter, salesRouter } from './modules/sales/sales.router';
import { createSalesService } from './modules/sales/sales.service';
import { localFileStore, type FileStore } from './modules/uploads/file-store';
import { requireAuth } from './middleware/authenticate';
import type Stripe from 'stripe';
import { readOnlyPreflight } from './middleware/read-only-shop';
import { billingRouter, billingWebhookRouter } from './modules/billing/billing.router';
import { createBillingService } from './modules/billing/billing.service';
import { createStripeClient, stripeSettings } from './modules/billing/stripe-client';
import { platformRouter } from './modules/platform/platform.router';
import { createPlatformService } from './modules/platform/platform.service';
import { supportAccessRouter } from './modules/platform/support-access.router';
import { createSupportAccessService } from './modules/platform/support-access.service';
import { tenantContext } from './middleware/tenant-context';
import { createShopsService } from './modules/shops/shops.service';
import { testSupportRouter } from './modules/test-support/test-support.router';
import { buildOpenApiDocument } from './openapi/openapi';
import { purchasingRouter } from './modules/purchasing/purchasing.router';
import { createSuppliersService } from './modules/purchasing/suppliers.service';
import { createListingsImportService } from './modules/purchasing/listings-import.service';
import { createOrdersService } from './modules/purchasing/orders.service';
import { createReorderService } from './modules/purchasing/reorder.service';
import { createReturnsService } from './modules/purchasing/returns.service';
import { estimateApprovalRouter, estimatesRouter } from './modules/estimates/estimates.router';
import { createEstimatesService } from './modules/estimates/estimates.service';
import { consignmentRouter } from './modules/consignment/consignment.router';
import { createConsignmentService } from './modules/consignment/consignment.service';
import { salesReportsRouter } from './modules/sales-reports/sales-reports.router';
import { createSalesReportsService } from './modules/sales-reports/sales-reports.service';

const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../..');

export interface AppDeps {
  dataSource: DataSource;
  env: Env;
  mailer: Mailer;
  clock?: Clock;
  logger?: Logger;
  authLimits?: Partial<AuthLimits>;
  /** Rate-limit counters; default the database's, shared by every process on it. */
  rateLimitStore?: RateLimitStore;
  /** Requests that send e-mail, per person and shop and hour (default in middleware/rate-limits.ts). */
  mailRequestLimit?: RateLimitRule;
  /** The Stripe SDK client; default one built from env (the local fake outside production). */
  stripe?: Stripe;
  /** Built web app; default `dist/apps/web` in the repo. */
  webDir?: string;
  /** Shipped fonts; default `fonts/` in the repo. */
  fontsDir?: string;
  /** Where uploaded photos and documents are kept; default a folder store at env.uploadsDir. */
  fileStore?: FileStore;
}

/** POST routes that send e-mail (besides sign-in, reset and invitations, which have their own limits). */
export const mailSendingRoutes = [
  '/shops/:shopId/purchasing/orders/:orderId/send',
  '/shops/:shopId/purchasing/orders/:orderId/request-approval',
  '/platform/shops',
  '/shops/:shopId/sales/invoices/:invoiceId/email',
  '/shops/:shopId/estimates/:estimateId/send',
  '/shops/:shopId/sales/invoices/:invoiceId/credit-notes',
];

/**
 * Routes that send e-mail only when the request asks for it (an invoice issued with its e-mail, a
 * counter sale issued to a customer): counted in the same allowance only then, so a busy counter
 * is not held up by sales that e-mail nobody.
 */
export const mailSendingWhenAsked: Record<string, (body: Record<string, unknown>) => boolean> = {
  '/shops/:shopId/sales/invoices/:invoiceId/issue': (body) => body['sendEmail'] !== false,
  '/shops/:shopId/sales/counter-sales': (body) => body['issue'] !== false && Boolean(body['customerId'] || body['customerEmail']),
};

/** Builds the Express app (no listen): API, security headers, logs, the web app and fonts. */
export function createApp(deps: AppDeps): Express {
  const { env, mailer } = deps;
  const clock = deps.clock ?? systemClock;
  const logger = deps.logger ?? pino({ level: env.logLevel });
  const db = databaseFor(deps.dataSource);
  const rateLimitStore = deps.rateLimitStore ?? databaseRateLimitStore(db);
  const auth = createAuthService({ db, env, clock, mailer, limits: deps.authLimits, rateLimitStore, onMailError: (err) => logger.error({ err }, 'e-mail failed') });
  const shops = createShopsService({ db, clock });
  const catalogue = createCatalogueService({ db, clock });
  const lookup = createLookupService({ index: memoryPartSearchIndex({ reader: () => db.reader, versionOf: (shopId) => catalogue.graphOf(shopId) }), graphOf: (shopId) => catalogue.graphOf(shopId), stockOf: (shopId, partIds) => freeStockByPart(db.reader, shopId, partIds), partOfBarcode: (shopId, gtin14) => partIdOfGtin(db.reader, shopId, gtin14) });
  const stock = createStockService({ db, clock, graphOf: (shopId) => catalogue.graphOf(shopId) });
  const imports = createImportService({ db, clock, catalogue });
  const staff = createStaffService({ db, env, clock, mailer, rateLimitStore, onMailError: (err) => logger.error({ err }, 'e-mail failed') });
  const apiKeys = createApiKeysService({ db, clock });
  const audit = createAuditQueries({ db });
  const settings = createSettingsService({ db, clock });
  const counts = createCountsService({ db, clock });
  const barcodes = createBarcodesService({ db, clock });
  const labels = createLabelsService({ db, counts });
  const files = deps.fileStore ?? localFileStore(env.uploadsDir);
  const shopExport = createShopExportService({ db, clock, files });
  const customers = createCustomersService({ db, clock });
  const vehicles = createVehiclesService({ db, clock, files });
  const jobs = createJobsService({ db, clock, files });
  const stripeClient = deps.stripe ?? createStripeClient(env);
  const billing = createBillingService({ db, clock, stripe: stripeClient, webhookSecret: stripeSettings(env).webhookSecret, publicUrl: env.publicUrl });
  const sales = createSalesService({ db, clock, mailer, stripe: stripeClient, publicUrl: env.publicUrl, onMailError: (err) => logger.error({ err }, 'e-mail failed') });
  const support = createSupportAccessService({ db, clock });
  const platform = createPlatformService({ db, clock, billing, staff });
  const suppliers = createSuppliersService({ db, clock });
  const purchaseOrders = createOrdersService({ db, clock, mailer, onMailError: (err) => logger.error({ err }, 'e-mail failed') });
  const purchasing = {
    suppliers,
    listingsImport: createListingsImportService({ db, clock }),
    orders: purchaseOrders,
    reorder: createReorderService({ db, clock, catalogue, suppliers, orders: purchaseOrders }),
    returns: createReturnsService({ db, clock }),
  };
  const estimates = createEstimatesService({ db, clock, mailer, publicUrl: env.publicUrl, onMailError: (err) => logger.error({ err }, 'e-mail failed') });
  const consignment = createConsignmentService({ db, clock });
  const salesReports = createSalesReportsService({ db, clock });
  const https = env.publicUrl.startsWith('https:');

  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', env.trustProxy);

  // API answers are never cached (Cache-Control: no-store below), so an ETag would only cost a hash of every body.
  app.set('etag', false);
  app.use(requestLog(logger, (url) => url === '/api/health'));
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
  // Stripe's webhooks: signed raw bodies, so before the CSRF check and the JSON parser.
  api.use('/billing/webhook', billingWebhookRouter({ billing }));
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
  // Routes that send e-mail on the caller's behalf share one allowance per person and shop.
  const mailLimit = mailRequestLimit({ clock, store: rateLimitStore, rule: deps.mailRequestLimit });
  api.post(mailSendingRoutes, mailLimit);
  for (const [route, asksForMail] of Object.entries(mailSendingWhenAsked)) {
    api.post(route, (req, res, next) => {
      const body = typeof req.body === 'object' && req.body !== null ? (req.body as Record<string, unknown>) : {};
      // Returned, so that Express sees a failed counter (the store is the database).
      if (asksForMail(body)) return mailLimit(req, res, next);
      next();
    });
  }
  api.use('/auth', authRouter({ env, auth }));
  // The customer's pay link from an invoice e-mail (no account; sales, issue 12).
  api.use('/pay', payLinkRouter({ sales, clock, store: rateLimitStore }));
  api.use('/me', meRouter({ auth }));
  api.use('/invitations', invitationsRouter({ env, staff, auth }));
  // Before every shop route: billing state brought up to date, support grants noted (and audited).
  api.use('/shops/:shopId', readOnlyPreflight(billing), support.preflight());
  // The lookup is the busiest route (every keystroke at the counter): matched first, it skips the
  // path tests of every router below. It answers GET /parts/search only, which none of them takes.
  api.use('/shops/:shopId', lookupRouter({ db, lookup }));
  api.use('/shops/:shopId/billing', requireAuth, tenantContext(db), billingRouter({ billing }));
  api.use('/shops/:shopId/support-access', requireAuth, tenantContext(db), supportAccessRouter({ support }));
  api.use('/platform', platformRouter({ platform, billing }));
  // Shop administration, each behind the caller's (or API key's) own shop.
  api.use('/shops/:shopId/staff', requireAuth, tenantContext(db), staffRouter({ staff }));
  api.use('/shops/:shopId/api-keys', requireAuth, tenantContext(db), apiKeysRouter({ apiKeys }));
  api.use('/shops/:shopId/audit-events', requireAuth, tenantContext(db), auditRouter({ audit }));
  api.use('/shops/:shopId/audit-events.csv', requireAuth, tenantContext(db), auditCsvRouter({ audit }));
  api.use('/shops/:shopId/settings', requireAuth, tenantContext(db), settingsRouter({ settings }));
  api.use('/shops/:shopId/labels', requireAuth, tenantContext(db), labelsRouter({ labels }));
  api.use('/shops/:shopId/purchasing', requireAuth, tenantContext(db), purchasingRouter(purchasing));
  api.use('/shops/:shopId/export.zip', requireAuth, tenantContext(db), shopExportRouter({ shopExport }));
  api.use('/shops/:shopId/customers', requireAuth, tenantContext(db), customersRouter({ customers }));
  api.use('/shops/:shopId/vehicles', requireAuth, tenantContext(db), vehiclesRouter({ vehicles }));
  api.use('/shops/:shopId/jobs', requireAuth, tenantContext(db), jobsRouter({ jobs }));
  api.use('/shops/:shopId/checklist-templates', requireAuth, tenantContext(db), checklistTemplatesRouter({ jobs }));
  api.use('/shops/:shopId/stock', requireAuth, tenantContext(db), stockRouter({ stock }));
  api.use('/shops/:shopId/sales', requireAuth, tenantContext(db), salesRouter({ sales }));
  api.use('/shops/:shopId/estimates', requireAuth, tenantContext(db), estimatesRouter({ estimates }));
  api.use('/shops/:shopId/consignment', requireAuth, tenantContext(db), consignmentRouter({ consignment }));
  api.use('/shops/:shopId/sales-reports', requireAuth, tenantContext(db), salesReportsRouter({ reports: salesReports }));
  // The customer's approval link: no account, no shop tenancy, its own rate limit.
  api.use('/estimate-approval', estimateApprovalRouter({ estimates, clock, store: rateLimitStore }));
  api.use('/shops/:shopId/counts', requireAuth, tenantContext(db), countsRouter({ counts }));
  // Supplier barcodes (issue 7): before the catalogue router, which owns the rest of /parts/:partId.
  api.use('/shops/:shopId/parts/:partId/barcodes', requireAuth, tenantContext(db), partBarcodesRouter({ barcodes }));
  api.use('/shops/:shopId/barcodes', requireAuth, tenantContext(db), barcodeLookupRouter({ barcodes }));
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
