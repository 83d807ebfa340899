// The authorisation matrix: every API route, as data, with who may call it. Shop routes take
// their expectation from libs/permissions (the one definition of roles), so this checks the API
// against it; a route mounted without an entry here fails the last test.
import { randomUUID } from 'node:crypto';
import request from 'supertest';
import type { Test } from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { defineAbilityFor, subjectOf, type Action, type AppAbility, type SubjectName } from '@tappet/permissions';
import type { ShopRole } from '@tappet/contracts';
import { mountedApiRoutes } from '../test-support/mounted-routes';
import { databaseDigest } from '../test-support/database-digest';
import { mailSendingRoutes, mailSendingWhenAsked } from '../app';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../test-support/test-app';
import { createShopWithUsers } from '../modules/test-support/test-support.service';
import { seedCatalogueFixture, type CatalogueFixture } from '../modules/catalogue/catalogue.test-fixture';
import { seedShopAdminFixture, type ShopAdminFixture } from '../modules/staff/shop-admin.test-fixture';
import { seedLabelBin } from '../modules/labels/labels.test-fixture';
import { seedStockFixture, type StockFixture } from '../modules/stock/stock.test-fixture';
import { seedVehicleFixture, tinyPdf, type VehicleFixture } from '../modules/vehicles/vehicles.test-fixture';
import { AuditEventEntity } from '../modules/audit/audit.entity';
import { seedPurchasingFixture, type PurchasingFixture } from '../modules/purchasing/purchasing.test-fixture';
// eslint-disable-next-line @nx/enforce-module-boundaries -- the repo's own fake Stripe API (tools/), for checkout and portal routes.
import { startFakeStripe, type FakeStripe } from '../../../../tools/fake-stripe/server.ts';
import { seedPlatformFixture, type PlatformFixture } from '../modules/platform/platform.test-fixture';
import { seedJobsFixture, type JobsFixture } from '../modules/jobs/jobs.test-fixture';
import { seedCountsFixture, type CountsFixture } from '../modules/counts/counts.test-fixture';
import { freshGtin13, seedBarcodesFixture, type BarcodesFixture } from '../modules/barcodes/barcodes.test-fixture';
import { seedSalesMatrixFixture, type SalesMatrixFixture } from '../modules/sales/sales.test-fixture';
import { seedEstimatesFixture, type EstimatesFixture } from '../modules/estimates/estimates.test-fixture';
import { seedConsignmentFixture, type ConsignmentFixture } from '../modules/consignment/consignment.test-fixture';

type Persona = 'anonymous' | ShopRole | 'outsider' | 'platformAdmin' | 'apiKey';
/** `apiKey`: a key of the shop with the highest role a key may carry (buyer), sent as a Bearer token. */
const personas: Persona[] = ['anonymous', 'owner', 'mechanic', 'buyer', 'viewer', 'outsider', 'platformAdmin', 'apiKey'];

interface World {
  shopId: string;
  /** Sign-in of each persona. */
  people: Record<Exclude<Persona, 'anonymous' | 'apiKey'>, { email: string; password: string }>;
  /** The secret of the shop's buyer API key. */
  apiKeySecret: string;
  catalogue: CatalogueFixture;
  admin: ShopAdminFixture;
  purchasing: PurchasingFixture;
  /** A bin holding the catalogue fixture's part, for label routes. */
  labelBinId: string;
  vehicles: VehicleFixture;
  stock: StockFixture;
  /** Plans, shops to suspend, a read-only shop, support grants (issue 11). */
  platform: PlatformFixture;
  /** Jobs on the vehicle fixture, assigned to nobody (issue 10); seeded after vehicles and stock. */
  jobs: JobsFixture;
  mechanicId: string;
  /** Stock counts (issue 7): one open on labelBinId with its line counted, spare open ones, an empty bin to start more on. */
  counts: CountsFixture;
  countBinId: string;
  /** A purchase receipt, for receipt labels (issue 7). */
  receiptId: string;
  /** Supplier barcodes on the catalogue fixture's part (issue 7). */
  barcodes: BarcodesFixture;
  /** Invoices, drafts, jobs to invoice and a shop-stock vehicle (sales, issue 12). */
  sales: SalesMatrixFixture;
  /** Estimates on jobs of the vehicle fixture, and consigned vehicles of its customer (issue 12). */
  estimates: EstimatesFixture;
  consignment: ConsignmentFixture;
}

type Access =
  /** Anyone, signed in or not; `status` is the answer to the sample request. */
  | { kind: 'public'; status: number }
  /** Any signed-in person. */
  | { kind: 'signed-in'; status: number }
  /** Members of the shop in the request; others get 404. */
  | { kind: 'member'; status: number }
  /** Members whose ability allows `action` on `subject`; other members 403, non-members 404. */
  | { kind: 'ability'; action: Action; subject: SubjectName; status: number; field?: string }
  /** Platform admins only; everyone else signed in gets 403. */
  | { kind: 'platform'; status: number };

interface Entry {
  access: Access;
  call(agent: TestAgent<Test> | ReturnType<typeof request>, world: World): Test;
}

const matrix: Record<string, Entry> = {
  'GET /api/health': { access: { kind: 'public', status: 200 }, call: (a) => a.get('/api/health') },
  'GET /api/openapi.json': { access: { kind: 'public', status: 200 }, call: (a) => a.get('/api/openapi.json') },
  // Billing, support access and the platform console (issue 11).
  // No signature: reachable by anyone, refused with 400 and nothing changed.
  'POST /api/billing/webhook': { access: { kind: 'public', status: 400 }, call: (a) => a.post('/api/billing/webhook').set('Content-Type', 'application/json').send('{"id":"evt_matrix"}') },
  'GET /api/shops/:shopId/billing/status': { access: { kind: 'ability', action: 'read', subject: 'Shop', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/billing/status`) },
  'GET /api/shops/:shopId/billing': { access: { kind: 'ability', action: 'read', subject: 'Billing', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/billing`) },
  'POST /api/shops/:shopId/billing/checkout': {
    access: { kind: 'ability', action: 'update', subject: 'Billing', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/billing/checkout`).set(csrf).send({ planId: w.platform.planId }),
  },
  // Runs after checkout, which gave the shop its Stripe customer.
  'POST /api/shops/:shopId/billing/portal': { access: { kind: 'ability', action: 'update', subject: 'Billing', status: 200 }, call: (a, w) => a.post(`/api/shops/${w.shopId}/billing/portal`).set(csrf) },
  'GET /api/shops/:shopId/support-access': { access: { kind: 'ability', action: 'read', subject: 'SupportAccess', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/support-access`) },
  'POST /api/shops/:shopId/support-access': {
    access: { kind: 'ability', action: 'create', subject: 'SupportAccess', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/support-access`).set(csrf).send({ hours: 1 }),
  },
  // A grant is made before each of these calls (see beforeEach), except for the admin without one.
  'DELETE /api/shops/:shopId/support-access': { access: { kind: 'ability', action: 'delete', subject: 'SupportAccess', status: 200 }, call: (a, w) => a.delete(`/api/shops/${w.shopId}/support-access`).set(csrf) },
  'GET /api/platform/shops': { access: { kind: 'platform', status: 200 }, call: (a) => a.get('/api/platform/shops?q=matrix') },
  'POST /api/platform/shops': {
    access: { kind: 'platform', status: 201 },
    call: (a, w) => a.post('/api/platform/shops').set(csrf).send({ name: `Matrix Onboarded ${randomUUID().slice(0, 8)}`, planId: w.platform.planId, ownerEmail: `owner-${randomUUID()}@matrix.test` }),
  },
  'POST /api/platform/shops/:shopId/suspend': {
    access: { kind: 'platform', status: 200 },
    call: (a, w) => a.post(`/api/platform/shops/${w.platform.nextShopToSuspend()}/suspend`).set(csrf).send({ reason: 'Matrix suspension' }),
  },
  'POST /api/platform/shops/:shopId/reactivate': {
    access: { kind: 'platform', status: 200 },
    call: (a, w) => a.post(`/api/platform/shops/${w.platform.nextSuspendedShopId()}/reactivate`).set(csrf).send({ reason: 'Matrix reactivation' }),
  },
  'GET /api/platform/plans': { access: { kind: 'platform', status: 200 }, call: (a) => a.get('/api/platform/plans') },
  'POST /api/platform/plans': {
    access: { kind: 'platform', status: 201 },
    call: (a) => {
      const key = randomUUID().slice(0, 8);
      return a.post('/api/platform/plans').set(csrf).send({ name: `Matrix ${key}`, monthlyPriceMinor: 1000, currency: 'gbp', stripeLookupKey: `matrix_new_${key}`, seatLimit: 3, catalogueLimit: 100, vehicleLimit: null });
    },
  },
  'PATCH /api/platform/plans/:planId': {
    access: { kind: 'platform', status: 200 },
    call: (a, w) => a.patch(`/api/platform/plans/${w.platform.planId}`).set(csrf).send({ monthlyPriceMinor: 1000 + Math.floor(Math.random() * 1e6) }),
  },
  'POST /api/auth/sign-in': { access: { kind: 'public', status: 200 }, call: (a, w) => a.post('/api/auth/sign-in').set(csrf).send(w.people.viewer) },
  'POST /api/auth/password-reset/request': { access: { kind: 'public', status: 200 }, call: (a) => a.post('/api/auth/password-reset/request').set(csrf).send({ email: `nobody-${randomUUID()}@nowhere.test` }) },
  'POST /api/auth/password-reset/confirm': {
    // A made-up token: reachable by anyone, refused as invalid.
    access: { kind: 'public', status: 400 },
    call: (a) => a.post('/api/auth/password-reset/confirm').set(csrf).send({ token: 'x'.repeat(43), password: 'harbour lantern gearbox' }),
  },
  'POST /api/test-support/shops': { access: { kind: 'public', status: 201 }, call: (a) => a.post('/api/test-support/shops').set(csrf).send({ roles: [] }) },
  'POST /api/auth/sign-out': { access: { kind: 'signed-in', status: 200 }, call: (a) => a.post('/api/auth/sign-out').set(csrf) },
  'GET /api/me': { access: { kind: 'signed-in', status: 200 }, call: (a) => a.get('/api/me') },
  'GET /api/shops': { access: { kind: 'signed-in', status: 200 }, call: (a) => a.get('/api/shops') },
  'POST /api/me/active-shop': { access: { kind: 'member', status: 200 }, call: (a, w) => a.post('/api/me/active-shop').set(csrf).send({ shopId: w.shopId }) },
  'GET /api/shops/:shopId': { access: { kind: 'ability', action: 'read', subject: 'Shop', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}`) },
  'PATCH /api/shops/:shopId': {
    access: { kind: 'ability', action: 'update', subject: 'Shop', status: 200 },
    call: (a, w) => a.patch(`/api/shops/${w.shopId}`).set(csrf).send({ name: `Matrix Renamed Shop ${randomUUID().slice(0, 8)}` }),
  },
  // Shop administration (issue 3): staff, invitations, API keys, audit log, settings, export.
  'GET /api/shops/:shopId/staff': { access: { kind: 'ability', action: 'read', subject: 'Staff', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/staff`) },
  'POST /api/shops/:shopId/staff/invitations': {
    access: { kind: 'ability', action: 'create', subject: 'Staff', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/staff/invitations`).set(csrf).send({ email: `matrix-${randomUUID()}@harbour-works.test`, role: 'viewer' }),
  },
  'POST /api/shops/:shopId/staff/invitations/:invitationId/resend': {
    access: { kind: 'ability', action: 'update', subject: 'Staff', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/staff/invitations/${w.admin.nextInvitationId()}/resend`).set(csrf),
  },
  'DELETE /api/shops/:shopId/staff/invitations/:invitationId': {
    access: { kind: 'ability', action: 'delete', subject: 'Staff', status: 200 },
    call: (a, w) => a.delete(`/api/shops/${w.shopId}/staff/invitations/${w.admin.nextInvitationId()}`).set(csrf),
  },
  'PATCH /api/shops/:shopId/staff/:membershipId/role': {
    access: { kind: 'ability', action: 'update', subject: 'Staff', status: 200 },
    call: (a, w) => a.patch(`/api/shops/${w.shopId}/staff/${w.admin.nextRoleTargetId()}/role`).set(csrf).send({ role: 'viewer' }),
  },
  'PATCH /api/shops/:shopId/staff/:membershipId/spending-limit': {
    access: { kind: 'ability', action: 'update', subject: 'Staff', status: 200 },
    call: (a, w) => a.patch(`/api/shops/${w.shopId}/staff/${w.admin.buyerMembershipId}/spending-limit`).set(csrf).send({ spendingLimitMinor: 2000 + Math.floor(Math.random() * 1e6) }),
  },
  'POST /api/shops/:shopId/staff/:membershipId/deactivate': {
    access: { kind: 'ability', action: 'update', subject: 'Staff', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/staff/${w.admin.nextActiveMembershipId()}/deactivate`).set(csrf),
  },
  'POST /api/shops/:shopId/staff/:membershipId/reactivate': {
    access: { kind: 'ability', action: 'update', subject: 'Staff', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/staff/${w.admin.nextInactiveMembershipId()}/reactivate`).set(csrf),
  },
  // A made-up token: reachable by anyone, answered "not found".
  'GET /api/invitations/:token': { access: { kind: 'public', status: 404 }, call: (a) => a.get(`/api/invitations/${'m'.repeat(43)}`) },
  'POST /api/invitations/accept': {
    access: { kind: 'public', status: 404 },
    call: (a) => a.post('/api/invitations/accept').set(csrf).send({ token: 'm'.repeat(43), name: 'Matrix Person', password: 'harbour lantern gearbox' }),
  },
  'GET /api/shops/:shopId/api-keys': { access: { kind: 'ability', action: 'read', subject: 'ApiKey', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/api-keys`) },
  'POST /api/shops/:shopId/api-keys': {
    access: { kind: 'ability', action: 'create', subject: 'ApiKey', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/api-keys`).set(csrf).send({ label: 'Matrix key', role: 'viewer' }),
  },
  'POST /api/shops/:shopId/api-keys/:apiKeyId/revoke': {
    access: { kind: 'ability', action: 'delete', subject: 'ApiKey', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/api-keys/${w.admin.nextApiKeyId()}/revoke`).set(csrf),
  },
  'GET /api/shops/:shopId/audit-events': { access: { kind: 'ability', action: 'read', subject: 'AuditLog', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/audit-events?entity=shop`) },
  'GET /api/shops/:shopId/audit-events.csv': { access: { kind: 'ability', action: 'read', subject: 'AuditLog', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/audit-events.csv?entity=shop`) },
  'GET /api/shops/:shopId/settings': { access: { kind: 'ability', action: 'read', subject: 'Settings', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/settings`) },
  'PATCH /api/shops/:shopId/settings': {
    access: { kind: 'ability', action: 'update', subject: 'Settings', status: 200 },
    call: (a, w) => a.patch(`/api/shops/${w.shopId}/settings`).set(csrf).send({ address: `${Math.floor(Math.random() * 1e6)} Quay Lane` }),
  },
  'GET /api/shops/:shopId/export.zip': { access: { kind: 'ability', action: 'export', subject: 'ShopExport', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/export.zip`) },
  // Catalogue (issue 4).
  'GET /api/shops/:shopId/parts': { access: { kind: 'ability', action: 'read', subject: 'Part', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/parts?q=FX`) },
  'POST /api/shops/:shopId/parts': {
    access: { kind: 'ability', action: 'create', subject: 'Part', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/parts`).set(csrf).send({ number: `MX-${randomUUID().slice(0, 8)}`, description: 'Matrix part' }),
  },
  // Lookup (issue 5).
  'GET /api/shops/:shopId/parts/search': { access: { kind: 'ability', action: 'read', subject: 'Part', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/parts/search?q=FX-1OOO`) },
  'GET /api/shops/:shopId/parts/:partId': { access: { kind: 'ability', action: 'read', subject: 'Part', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/parts/${w.catalogue.partId}`) },
  'PATCH /api/shops/:shopId/parts/:partId': {
    access: { kind: 'ability', action: 'update', subject: 'Part', status: 200 },
    call: (a, w) => a.patch(`/api/shops/${w.shopId}/parts/${w.catalogue.otherPartId}`).set(csrf).send({ notes: `Matrix ${randomUUID()}` }),
  },
  'GET /api/shops/:shopId/parts/:partId/lineage': { access: { kind: 'ability', action: 'read', subject: 'Part', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/parts/${w.catalogue.partId}/lineage`) },
  'POST /api/shops/:shopId/part-links': {
    access: { kind: 'ability', action: 'create', subject: 'Part', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/part-links`).set(csrf).send({ fromPartId: w.catalogue.otherPartId, kind: 'replaced_by', toNumber: `MX-${randomUUID().slice(0, 8)}` }),
  },
  'PATCH /api/shops/:shopId/part-links/:linkId': {
    access: { kind: 'ability', action: 'update', subject: 'Part', status: 200 },
    call: (a, w) => a.patch(`/api/shops/${w.shopId}/part-links/${w.catalogue.nextLinkId()}`).set(csrf).send({ note: 'Matrix note' }),
  },
  'DELETE /api/shops/:shopId/part-links/:linkId': {
    access: { kind: 'ability', action: 'update', subject: 'Part', status: 204 },
    call: (a, w) => a.delete(`/api/shops/${w.shopId}/part-links/${w.catalogue.nextLinkId()}`).set(csrf),
  },
  'POST /api/shops/:shopId/fitments': {
    access: { kind: 'ability', action: 'create', subject: 'Part', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/fitments`).set(csrf).send({ partId: w.catalogue.partId, marque: 'Matrix', model: 'Test', yearFrom: 1970 }),
  },
  'PATCH /api/shops/:shopId/fitments/:fitmentId': {
    access: { kind: 'ability', action: 'update', subject: 'Part', status: 200 },
    call: (a, w) => a.patch(`/api/shops/${w.shopId}/fitments/${w.catalogue.nextFitmentId()}`).set(csrf).send({ yearTo: 1973 }),
  },
  'DELETE /api/shops/:shopId/fitments/:fitmentId': {
    access: { kind: 'ability', action: 'update', subject: 'Part', status: 204 },
    call: (a, w) => a.delete(`/api/shops/${w.shopId}/fitments/${w.catalogue.nextFitmentId()}`).set(csrf),
  },
  'GET /api/shops/:shopId/lineage/resolve': { access: { kind: 'ability', action: 'read', subject: 'Part', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/lineage/resolve?number=fx1000`) },
  'GET /api/shops/:shopId/catalogue/problems': { access: { kind: 'ability', action: 'read', subject: 'Part', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/catalogue/problems`) },
  'POST /api/shops/:shopId/imports': {
    access: { kind: 'ability', action: 'import', subject: 'Part', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/imports`).set(csrf).field('kind', 'parts').field('mode', 'preview').attach('file', Buffer.from('number,description\r\nMX-1,Matrix\r\n'), 'parts.csv'),
  },
  'GET /api/shops/:shopId/exports/parts.csv': { access: { kind: 'ability', action: 'read', subject: 'Part', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/exports/parts.csv`) },
  'GET /api/shops/:shopId/exports/links.csv': { access: { kind: 'ability', action: 'read', subject: 'Part', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/exports/links.csv`) },
  'GET /api/shops/:shopId/exports/fitments.csv': { access: { kind: 'ability', action: 'read', subject: 'Part', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/exports/fitments.csv`) },
  // Labels (issue 7): printing is reading parts.
  'GET /api/shops/:shopId/labels/options': { access: { kind: 'ability', action: 'read', subject: 'Part', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/labels/options`) },
  'POST /api/shops/:shopId/labels/parts': {
    access: { kind: 'ability', action: 'read', subject: 'Part', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/labels/parts`).set(csrf).send({ partIds: [w.catalogue.partId, w.catalogue.otherPartId] }),
  },
  'POST /api/shops/:shopId/labels/bins': {
    access: { kind: 'ability', action: 'read', subject: 'Bin', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/labels/bins`).set(csrf).send({ binIds: [w.labelBinId], contents: true }),
  },
  // Labels from a stock count and from purchase receipts (issue 7).
  'POST /api/shops/:shopId/labels/counts/:countId': {
    access: { kind: 'ability', action: 'read', subject: 'Bin', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/labels/counts/${w.counts.countId}`).set(csrf).send({ contents: true }),
  },
  'POST /api/shops/:shopId/labels/receipts': {
    access: { kind: 'ability', action: 'read', subject: 'PurchaseOrder', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/labels/receipts`).set(csrf).send({ receiptIds: [w.receiptId] }),
  },
  // Stock counts (issue 7).
  'GET /api/shops/:shopId/counts': { access: { kind: 'ability', action: 'read', subject: 'StockCount', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/counts?status=open`) },
  'POST /api/shops/:shopId/counts': {
    access: { kind: 'ability', action: 'create', subject: 'StockCount', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/counts`).set(csrf).send({ binIds: [w.countBinId], note: 'Matrix count' }),
  },
  'GET /api/shops/:shopId/counts/:countId': { access: { kind: 'ability', action: 'read', subject: 'StockCount', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/counts/${w.counts.countId}`) },
  'POST /api/shops/:shopId/counts/:countId/entries': {
    access: { kind: 'ability', action: 'count', subject: 'StockCount', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/counts/${w.counts.countId}/entries`).set(csrf).send({ lineId: w.counts.lineId, quantity: 3 }),
  },
  'GET /api/shops/:shopId/counts/:countId/variances': { access: { kind: 'ability', action: 'read', subject: 'StockCount', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/counts/${w.counts.countId}/variances`) },
  'POST /api/shops/:shopId/counts/:countId/post': {
    access: { kind: 'ability', action: 'approve', subject: 'StockCount', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/counts/${w.counts.nextOpenCountId()}/post`).set(csrf),
  },
  'GET /api/shops/:shopId/parts/:partId/barcodes': { access: { kind: 'ability', action: 'read', subject: 'Part', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/parts/${w.catalogue.partId}/barcodes`) },
  'POST /api/shops/:shopId/parts/:partId/barcodes': {
    access: { kind: 'ability', action: 'update', subject: 'Part', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/parts/${w.catalogue.partId}/barcodes`).set(csrf).send({ code: freshGtin13() }),
  },
  'DELETE /api/shops/:shopId/parts/:partId/barcodes/:barcodeId': {
    access: { kind: 'ability', action: 'update', subject: 'Part', status: 204 },
    call: (a, w) => a.delete(`/api/shops/${w.shopId}/parts/${w.catalogue.partId}/barcodes/${w.barcodes.nextBarcodeId()}`).set(csrf),
  },
  'GET /api/shops/:shopId/barcodes/:code': { access: { kind: 'ability', action: 'read', subject: 'Part', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/barcodes/${w.barcodes.code}`) },
  'POST /api/shops/:shopId/counts/:countId/abandon': {
    access: { kind: 'ability', action: 'update', subject: 'StockCount', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/counts/${w.counts.nextOpenCountId()}/abandon`).set(csrf),
  },  // Vehicles and customers (issue 9).
  'GET /api/shops/:shopId/customers': { access: { kind: 'ability', action: 'read', subject: 'Customer', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/customers?q=fixture`) },
  'POST /api/shops/:shopId/customers': {
    access: { kind: 'ability', action: 'create', subject: 'Customer', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/customers`).set(csrf).send({ name: `Matrix Customer ${randomUUID().slice(0, 8)}` }),
  },
  'GET /api/shops/:shopId/customers/:customerId': { access: { kind: 'ability', action: 'read', subject: 'Customer', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/customers/${w.vehicles.customerId}`) },
  'PATCH /api/shops/:shopId/customers/:customerId': {
    access: { kind: 'ability', action: 'update', subject: 'Customer', status: 200 },
    call: (a, w) => a.patch(`/api/shops/${w.shopId}/customers/${w.vehicles.customerId}`).set(csrf).send({ notes: `Matrix ${randomUUID()}` }),
  },
  // Jobs and checklists (issue 10). The fixture's jobs are assigned to nobody, so a mechanic is
  // refused (403) as the CASL condition on assigneeIds says; jobs.test.ts covers assigned ones.
  'GET /api/shops/:shopId/jobs': { access: { kind: 'ability', action: 'read', subject: 'Job', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/jobs?closed=true`) },
  'POST /api/shops/:shopId/jobs': {
    access: { kind: 'ability', action: 'create', subject: 'Job', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/jobs`).set(csrf).send({ vehicleId: w.vehicles.vehicleId, title: 'Matrix job', customerRequest: 'Matrix', assigneeIds: [w.mechanicId] }),
  },
  'GET /api/shops/:shopId/jobs/:jobId': { access: { kind: 'ability', action: 'read', subject: 'Job', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/jobs/${w.jobs.jobId}`) },
  'GET /api/shops/:shopId/vehicles/:vehicleId/costs': { access: { kind: 'ability', action: 'read', subject: 'Vehicle', field: 'margin', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/vehicles/${w.vehicles.vehicleId}/costs`) },
  'GET /api/shops/:shopId/jobs/:jobId/sheet.pdf': { access: { kind: 'ability', action: 'read', subject: 'Job', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/jobs/${w.jobs.jobId}/sheet.pdf`) },
  'PATCH /api/shops/:shopId/jobs/:jobId': {
    access: { kind: 'ability', action: 'update', subject: 'Job', status: 200 },
    call: (a, w) => a.patch(`/api/shops/${w.shopId}/jobs/${w.jobs.jobId}`).set(csrf).send({ notes: `Matrix ${randomUUID()}` }),
  },
  'POST /api/shops/:shopId/jobs/:jobId/status': {
    access: { kind: 'ability', action: 'update', subject: 'Job', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/jobs/${w.jobs.nextOpenJobId()}/status`).set(csrf).send({ to: 'in_progress' }),
  },
  'POST /api/shops/:shopId/jobs/:jobId/checklists': {
    access: { kind: 'ability', action: 'update', subject: 'Job', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/jobs/${w.jobs.jobId}/checklists`).set(csrf).send({ templateId: w.jobs.templateId }),
  },
  'PUT /api/shops/:shopId/jobs/:jobId/checklists/:checklistId/items/:itemKey': {
    access: { kind: 'ability', action: 'update', subject: 'Job', status: 200 },
    call: (a, w) => a.put(`/api/shops/${w.shopId}/jobs/${w.jobs.jobId}/checklists/${w.jobs.checklistId}/items/lights`).set(csrf).send({ result: 'ok', note: `Matrix ${randomUUID()}` }),
  },
  'POST /api/shops/:shopId/jobs/:jobId/checklists/:checklistId/complete': {
    access: { kind: 'ability', action: 'update', subject: 'Job', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/jobs/${w.jobs.jobId}/checklists/${w.jobs.nextCompletableChecklistId()}/complete`).set(csrf),
  },
  'POST /api/shops/:shopId/jobs/:jobId/sign-offs': {
    access: { kind: 'ability', action: 'signOff', subject: 'Job', status: 201 },
    call: (a, w) => {
      const item = w.jobs.nextSignOff();
      return a.post(`/api/shops/${w.shopId}/jobs/${item.jobId}/sign-offs`).set(csrf).send({ checklistId: item.checklistId, itemKey: item.itemKey, reason: 'Matrix sign-off reason', customerTold: true, customerToldHow: 'By phone' });
    },
  },
  'POST /api/shops/:shopId/jobs/:jobId/parts/holds': {
    access: { kind: 'ability', action: 'hold', subject: 'Job', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/jobs/${w.jobs.jobId}/parts/holds`).set(csrf).send({ partId: w.stock.partId, binId: w.stock.binId, condition: 'new', quantity: 1 }),
  },
  'POST /api/shops/:shopId/jobs/:jobId/parts/holds/:holdId/release': {
    access: { kind: 'ability', action: 'hold', subject: 'Job', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/jobs/${w.jobs.jobId}/parts/holds/${w.jobs.nextHoldId()}/release`).set(csrf),
  },
  'POST /api/shops/:shopId/jobs/:jobId/parts/issues': {
    access: { kind: 'ability', action: 'issue', subject: 'Job', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/jobs/${w.jobs.jobId}/parts/issues`).set(csrf).send({ partId: w.stock.partId, binId: w.stock.binId, condition: 'new', quantity: 1 }),
  },
  'POST /api/shops/:shopId/jobs/:jobId/parts/returns': {
    access: { kind: 'ability', action: 'issue', subject: 'Job', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/jobs/${w.jobs.jobId}/parts/returns`).set(csrf).send({ partId: w.stock.partId, binId: w.stock.binId, condition: 'new', quantity: 1 }),
  },
  'POST /api/shops/:shopId/jobs/:jobId/special-orders': {
    access: { kind: 'ability', action: 'update', subject: 'Job', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/jobs/${w.jobs.jobId}/special-orders`).set(csrf).send({ partId: w.stock.partId, quantity: 1 }),
  },
  'POST /api/shops/:shopId/jobs/:jobId/labour': {
    access: { kind: 'ability', action: 'update', subject: 'Job', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/jobs/${w.jobs.jobId}/labour`).set(csrf).send({ userId: w.mechanicId, workedOn: '2026-01-15', minutes: 15, description: 'Matrix labour' }),
  },
  'DELETE /api/shops/:shopId/jobs/:jobId/labour/:entryId': {
    access: { kind: 'ability', action: 'update', subject: 'Job', status: 200 },
    call: (a, w) => a.delete(`/api/shops/${w.shopId}/jobs/${w.jobs.jobId}/labour/${w.jobs.nextLabourId()}`).set(csrf),
  },
  'POST /api/shops/:shopId/jobs/:jobId/files': {
    access: { kind: 'ability', action: 'update', subject: 'Job', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/jobs/${w.jobs.jobId}/files`).set(csrf).attach('files', w.jobs.png, 'matrix.png'),
  },
  'GET /api/shops/:shopId/jobs/:jobId/files/:fileId/content': { access: { kind: 'ability', action: 'read', subject: 'Job', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/jobs/${w.jobs.jobId}/files/${w.jobs.photoId}/content`) },
  'GET /api/shops/:shopId/jobs/:jobId/files/:fileId/thumbnail': { access: { kind: 'ability', action: 'read', subject: 'Job', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/jobs/${w.jobs.jobId}/files/${w.jobs.photoId}/thumbnail`) },
  'GET /api/shops/:shopId/checklist-templates': { access: { kind: 'ability', action: 'read', subject: 'Job', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/checklist-templates`) },
  'POST /api/shops/:shopId/checklist-templates': {
    access: { kind: 'ability', action: 'update', subject: 'Settings', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/checklist-templates`).set(csrf).send({ name: `Matrix ${randomUUID().slice(0, 8)}`, items: [{ key: 'one', section: 'All', label: 'One item', kind: 'check', safety: false }] }),
  },
  'PATCH /api/shops/:shopId/checklist-templates/:templateId': {
    access: { kind: 'ability', action: 'update', subject: 'Settings', status: 200 },
    call: (a, w) => a.patch(`/api/shops/${w.shopId}/checklist-templates/${w.jobs.templateId}`).set(csrf).send({ description: `Matrix ${randomUUID()}` }),
  },
  'GET /api/shops/:shopId/vehicles': { access: { kind: 'ability', action: 'read', subject: 'Vehicle', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/vehicles?status=arrived`) },
  'POST /api/shops/:shopId/vehicles': {
    access: { kind: 'ability', action: 'create', subject: 'Vehicle', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/vehicles`).set(csrf).send({ kind: 'customer', marque: 'Matrix', model: 'Test', customerId: w.vehicles.customerId }),
  },
  'GET /api/shops/:shopId/vehicles/:vehicleId': { access: { kind: 'ability', action: 'read', subject: 'Vehicle', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/vehicles/${w.vehicles.vehicleId}`) },
  'PATCH /api/shops/:shopId/vehicles/:vehicleId': {
    access: { kind: 'ability', action: 'update', subject: 'Vehicle', status: 200 },
    call: (a, w) => a.patch(`/api/shops/${w.shopId}/vehicles/${w.vehicles.vehicleId}`).set(csrf).send({ notes: `Matrix ${randomUUID()}` }),
  },
  'POST /api/shops/:shopId/vehicles/:vehicleId/status': {
    access: { kind: 'ability', action: 'update', subject: 'Vehicle', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/vehicles/${w.vehicles.nextArrivedVehicleId()}/status`).set(csrf).send({ to: 'assessing' }),
  },
  'POST /api/shops/:shopId/vehicles/:vehicleId/odometer-readings': {
    access: { kind: 'ability', action: 'update', subject: 'Vehicle', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/vehicles/${w.vehicles.vehicleId}/odometer-readings`).set(csrf).send({ value: 12000, unit: 'mi', readOn: '2026-01-10' }),
  },
  'POST /api/shops/:shopId/vehicles/:vehicleId/numbers-check': {
    access: { kind: 'ability', action: 'update', subject: 'Vehicle', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/vehicles/${w.vehicles.vehicleId}/numbers-check`).set(csrf).send({ matching: true }),
  },
  'GET /api/shops/:shopId/vehicles/:vehicleId/timeline': { access: { kind: 'ability', action: 'read', subject: 'Vehicle', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/vehicles/${w.vehicles.vehicleId}/timeline`) },
  'GET /api/shops/:shopId/vehicles/:vehicleId/fitment': { access: { kind: 'ability', action: 'read', subject: 'Vehicle', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/vehicles/${w.vehicles.vehicleId}/fitment`) },
  'POST /api/shops/:shopId/vehicles/:vehicleId/files': {
    access: { kind: 'ability', action: 'update', subject: 'Vehicle', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/vehicles/${w.vehicles.vehicleId}/files`).set(csrf).attach('files', w.vehicles.png, 'matrix.png').attach('files', tinyPdf, 'matrix.pdf'),
  },
  'GET /api/shops/:shopId/vehicles/:vehicleId/files/:fileId/content': {
    access: { kind: 'ability', action: 'read', subject: 'Vehicle', status: 200 },
    call: (a, w) => a.get(`/api/shops/${w.shopId}/vehicles/${w.vehicles.vehicleId}/files/${w.vehicles.documentId}/content`),
  },
  'GET /api/shops/:shopId/vehicles/:vehicleId/files/:fileId/thumbnail': {
    access: { kind: 'ability', action: 'read', subject: 'Vehicle', status: 200 },
    call: (a, w) => a.get(`/api/shops/${w.shopId}/vehicles/${w.vehicles.vehicleId}/files/${w.vehicles.photoId}/thumbnail`),
  },
  'DELETE /api/shops/:shopId/vehicles/:vehicleId/files/:fileId': {
    access: { kind: 'ability', action: 'update', subject: 'Vehicle', status: 204 },
    call: (a, w) => a.delete(`/api/shops/${w.shopId}/vehicles/${w.vehicles.vehicleId}/files/${w.vehicles.nextSpareFileId()}`).set(csrf),
  },
  // Stock (issue 6).
  'GET /api/shops/:shopId/stock': { access: { kind: 'ability', action: 'read', subject: 'Stock', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/stock`) },
  'GET /api/shops/:shopId/stock/bins': { access: { kind: 'ability', action: 'read', subject: 'Bin', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/stock/bins`) },
  'POST /api/shops/:shopId/stock/bins': {
    access: { kind: 'ability', action: 'create', subject: 'Bin', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/stock/bins`).set(csrf).send({ code: `MX-${randomUUID().slice(0, 8)}` }),
  },
  'PATCH /api/shops/:shopId/stock/bins/:binId': {
    access: { kind: 'ability', action: 'update', subject: 'Bin', status: 200 },
    call: (a, w) => a.patch(`/api/shops/${w.shopId}/stock/bins/${w.stock.otherBinId}`).set(csrf).send({ description: `Matrix ${randomUUID().slice(0, 8)}` }),
  },
  'GET /api/shops/:shopId/stock/movements': { access: { kind: 'ability', action: 'read', subject: 'Stock', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/stock/movements?kind=received`) },
  'POST /api/shops/:shopId/stock/receipts': {
    access: { kind: 'ability', action: 'receive', subject: 'Stock', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/stock/receipts`).set(csrf).send({ partId: w.stock.partId, binId: w.stock.binId, condition: 'new', quantity: 1, unitCostMinor: 250 }),
  },
  'POST /api/shops/:shopId/stock/issues': {
    access: { kind: 'ability', action: 'issue', subject: 'Stock', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/stock/issues`).set(csrf).send({ partId: w.stock.partId, binId: w.stock.binId, condition: 'new', quantity: 1 }),
  },
  'POST /api/shops/:shopId/stock/returns': {
    access: { kind: 'ability', action: 'issue', subject: 'Stock', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/stock/returns`).set(csrf).send({ partId: w.stock.partId, binId: w.stock.binId, condition: 'new', quantity: 1 }),
  },
  'POST /api/shops/:shopId/stock/adjustments': {
    access: { kind: 'ability', action: 'adjust', subject: 'Stock', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/stock/adjustments`).set(csrf).send({ partId: w.stock.partId, binId: w.stock.binId, condition: 'new', quantityDelta: -1, reason: 'Matrix write-off' }),
  },
  'POST /api/shops/:shopId/stock/moves': {
    access: { kind: 'ability', action: 'move', subject: 'Stock', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/stock/moves`).set(csrf).send({ partId: w.stock.partId, condition: 'new', fromBinId: w.stock.binId, toBinId: w.stock.otherBinId, quantity: 1 }),
  },
  'POST /api/shops/:shopId/stock/counts': {
    access: { kind: 'ability', action: 'count', subject: 'Stock', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/stock/counts`).set(csrf).send({ partId: w.stock.partId, binId: w.stock.otherBinId, condition: 'new', countedQuantity: 50 }),
  },
  'GET /api/shops/:shopId/stock/holds': { access: { kind: 'ability', action: 'read', subject: 'Stock', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/stock/holds`) },
  'POST /api/shops/:shopId/stock/holds': {
    access: { kind: 'ability', action: 'hold', subject: 'Stock', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/stock/holds`).set(csrf).send({ partId: w.stock.partId, binId: w.stock.binId, condition: 'new', quantity: 1, purpose: 'Matrix hold' }),
  },
  'POST /api/shops/:shopId/stock/holds/:holdId/release': {
    access: { kind: 'ability', action: 'hold', subject: 'Stock', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/stock/holds/${w.stock.nextHoldId()}/release`).set(csrf),
  },
  'GET /api/shops/:shopId/stock/parts/:partId': { access: { kind: 'ability', action: 'read', subject: 'Stock', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/stock/parts/${w.stock.partId}`) },
  'GET /api/shops/:shopId/stock/valuation': { access: { kind: 'ability', action: 'read', subject: 'Stock', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/stock/valuation`) },
  'GET /api/shops/:shopId/stock/valuation/history': { access: { kind: 'ability', action: 'read', subject: 'Stock', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/stock/valuation/history?months=6`) },
  'GET /api/shops/:shopId/stock/valuation.csv': { access: { kind: 'ability', action: 'read', subject: 'Stock', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/stock/valuation.csv`) },
  // Purchasing (issue 8).
  'GET /api/shops/:shopId/purchasing/suppliers': { access: { kind: 'ability', action: 'read', subject: 'Supplier', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/purchasing/suppliers`) },
  'POST /api/shops/:shopId/purchasing/suppliers': {
    access: { kind: 'ability', action: 'create', subject: 'Supplier', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/purchasing/suppliers`).set(csrf).send({ name: `Matrix Supplier ${randomUUID().slice(0, 8)}`, currency: 'GBP', leadTimeDays: 5 }),
  },
  'GET /api/shops/:shopId/purchasing/suppliers/:supplierId': { access: { kind: 'ability', action: 'read', subject: 'Supplier', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/purchasing/suppliers/${w.purchasing.supplierId}`) },
  'PATCH /api/shops/:shopId/purchasing/suppliers/:supplierId': {
    access: { kind: 'ability', action: 'update', subject: 'Supplier', status: 200 },
    call: (a, w) => a.patch(`/api/shops/${w.shopId}/purchasing/suppliers/${w.purchasing.supplierId}`).set(csrf).send({ notes: `Matrix ${randomUUID()}` }),
  },
  'GET /api/shops/:shopId/purchasing/suppliers/:supplierId/listings': {
    access: { kind: 'ability', action: 'read', subject: 'Supplier', status: 200 },
    call: (a, w) => a.get(`/api/shops/${w.shopId}/purchasing/suppliers/${w.purchasing.supplierId}/listings`),
  },
  'POST /api/shops/:shopId/purchasing/suppliers/:supplierId/listings': {
    access: { kind: 'ability', action: 'update', subject: 'Supplier', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/purchasing/suppliers/${w.purchasing.supplierId}/listings`).set(csrf).send({ partId: w.purchasing.nextUnlistedPart().id, priceMinor: 123 }),
  },
  'POST /api/shops/:shopId/purchasing/listings/import': {
    access: { kind: 'ability', action: 'import', subject: 'Supplier', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/purchasing/listings/import`).set(csrf).field('mode', 'preview').attach('file', Buffer.from(`supplier,part_number,price\r\n${w.purchasing.supplierName},PF-1000,9.99\r\n`), 'listings.csv'),
  },
  'PATCH /api/shops/:shopId/purchasing/listings/:listingId': {
    access: { kind: 'ability', action: 'update', subject: 'Supplier', status: 200 },
    call: (a, w) => a.patch(`/api/shops/${w.shopId}/purchasing/listings/${w.purchasing.listingId}`).set(csrf).send({ priceMinor: 1000 + Math.floor(Math.random() * 1e6) }),
  },
  'DELETE /api/shops/:shopId/purchasing/listings/:listingId': {
    access: { kind: 'ability', action: 'update', subject: 'Supplier', status: 204 },
    call: (a, w) => a.delete(`/api/shops/${w.shopId}/purchasing/listings/${w.purchasing.nextListingId()}`).set(csrf),
  },
  'GET /api/shops/:shopId/purchasing/parts/:partId': { access: { kind: 'ability', action: 'read', subject: 'Supplier', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/purchasing/parts/${w.purchasing.partId}`) },
  'PUT /api/shops/:shopId/purchasing/parts/:partId': {
    access: { kind: 'ability', action: 'update', subject: 'Supplier', status: 200 },
    call: (a, w) => a.put(`/api/shops/${w.shopId}/purchasing/parts/${w.purchasing.partId}`).set(csrf).send({ preferredSupplierId: w.purchasing.supplierId, minQty: Math.floor(Math.random() * 1e6), maxQty: null }),
  },
  'GET /api/shops/:shopId/purchasing/settings': { access: { kind: 'ability', action: 'read', subject: 'Supplier', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/purchasing/settings`) },
  'PATCH /api/shops/:shopId/purchasing/settings': {
    access: { kind: 'ability', action: 'update', subject: 'Settings', status: 200 },
    call: (a, w) => a.patch(`/api/shops/${w.shopId}/purchasing/settings`).set(csrf).send({ demandWindowDays: 7 + Math.floor(Math.random() * 1000) }),
  },
  'GET /api/shops/:shopId/purchasing/reorder-list': { access: { kind: 'ability', action: 'read', subject: 'PurchaseOrder', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/purchasing/reorder-list`) },
  'GET /api/shops/:shopId/purchasing/orders': { access: { kind: 'ability', action: 'read', subject: 'PurchaseOrder', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/purchasing/orders?status=draft`) },
  'POST /api/shops/:shopId/purchasing/orders': {
    access: { kind: 'ability', action: 'create', subject: 'PurchaseOrder', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/purchasing/orders`).set(csrf).send({ supplierId: w.purchasing.supplierId, lines: [{ partId: w.purchasing.partId, quantity: 1 }] }),
  },
  'POST /api/shops/:shopId/purchasing/orders/from-reorder': {
    access: { kind: 'ability', action: 'create', subject: 'PurchaseOrder', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/purchasing/orders/from-reorder`).set(csrf).send({ partIds: [w.purchasing.partId] }),
  },
  'GET /api/shops/:shopId/purchasing/orders/:orderId': { access: { kind: 'ability', action: 'read', subject: 'PurchaseOrder', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/purchasing/orders/${w.purchasing.orderId}`) },
  'GET /api/shops/:shopId/purchasing/orders/:orderId/pdf': { access: { kind: 'ability', action: 'read', subject: 'PurchaseOrder', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/purchasing/orders/${w.purchasing.orderId}/pdf`) },
  'PATCH /api/shops/:shopId/purchasing/orders/:orderId': {
    access: { kind: 'ability', action: 'update', subject: 'PurchaseOrder', status: 200 },
    call: (a, w) => a.patch(`/api/shops/${w.shopId}/purchasing/orders/${w.purchasing.nextDraftId()}`).set(csrf).send({ note: 'Matrix note' }),
  },
  'POST /api/shops/:shopId/purchasing/orders/:orderId/request-approval': {
    access: { kind: 'ability', action: 'update', subject: 'PurchaseOrder', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/purchasing/orders/${w.purchasing.nextDraftId()}/request-approval`).set(csrf),
  },
  'POST /api/shops/:shopId/purchasing/orders/:orderId/approve': {
    access: { kind: 'ability', action: 'approve', subject: 'PurchaseOrder', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/purchasing/orders/${w.purchasing.nextAwaitingId()}/approve`).set(csrf),
  },
  'POST /api/shops/:shopId/purchasing/orders/:orderId/reject': {
    access: { kind: 'ability', action: 'approve', subject: 'PurchaseOrder', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/purchasing/orders/${w.purchasing.nextAwaitingId()}/reject`).set(csrf).send({ reason: 'Matrix rejection' }),
  },
  // A draft of 1,000.00, above the seeded buyer's 500.00 limit: the CASL `send` rule's spending-limit condition refuses the buyer.
  'POST /api/shops/:shopId/purchasing/orders/:orderId/send': {
    access: { kind: 'ability', action: 'send', subject: 'PurchaseOrder', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/purchasing/orders/${w.purchasing.nextDraftId()}/send`).set(csrf),
  },
  'POST /api/shops/:shopId/purchasing/orders/:orderId/cancel': {
    access: { kind: 'ability', action: 'update', subject: 'PurchaseOrder', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/purchasing/orders/${w.purchasing.nextDraftId()}/cancel`).set(csrf).send({ reason: 'Matrix cancel' }),
  },
  'POST /api/shops/:shopId/purchasing/orders/:orderId/close': {
    access: { kind: 'ability', action: 'update', subject: 'PurchaseOrder', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/purchasing/orders/${w.purchasing.nextSentId()}/close`).set(csrf).send({ reason: 'Matrix close' }),
  },
  'POST /api/shops/:shopId/purchasing/orders/:orderId/receipts': {
    access: { kind: 'ability', action: 'receive', subject: 'Stock', status: 200 },
    call: (a, w) => {
      const orderId = w.purchasing.nextSentId();
      return a.post(`/api/shops/${w.shopId}/purchasing/orders/${orderId}/receipts`).set(csrf).send({ lines: [{ lineId: w.purchasing.nextSentLineId(orderId), quantity: 1, binId: w.purchasing.binId }] });
    },
  },
  'GET /api/shops/:shopId/purchasing/returns': { access: { kind: 'ability', action: 'read', subject: 'PurchaseOrder', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/purchasing/returns`) },
  'POST /api/shops/:shopId/purchasing/returns': {
    access: { kind: 'ability', action: 'update', subject: 'PurchaseOrder', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/purchasing/returns`).set(csrf).send({ supplierId: w.purchasing.supplierId, partId: w.purchasing.partId, binId: w.purchasing.binId, quantity: 1, reason: 'Matrix return', expectedCreditMinor: 1000 }),
  },
  'POST /api/shops/:shopId/purchasing/returns/:returnId/credit': {
    access: { kind: 'ability', action: 'update', subject: 'PurchaseOrder', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/purchasing/returns/${w.purchasing.nextReturnId()}/credit`).set(csrf).send({ creditedMinor: 1000 }),
  },
  // Sales (issue 12): settings and prices, invoices, credit notes, payments, the customer's pay link.
  'GET /api/shops/:shopId/sales/settings': { access: { kind: 'ability', action: 'read', subject: 'Settings', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/sales/settings`) },
  'PUT /api/shops/:shopId/sales/settings': { access: { kind: 'ability', action: 'update', subject: 'Settings', status: 200 }, call: (a, w) => a.put(`/api/shops/${w.shopId}/sales/settings`).set(csrf).send({ taxRounding: 'per-line' }) },
  'GET /api/shops/:shopId/sales/sell-prices': { access: { kind: 'ability', action: 'read', subject: 'Part', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/sales/sell-prices`).query({ partIds: w.sales.partId }) },
  'PUT /api/shops/:shopId/sales/parts/:partId/list-price': {
    access: { kind: 'ability', action: 'update', subject: 'Settings', status: 200 },
    call: (a, w) => a.put(`/api/shops/${w.shopId}/sales/parts/${w.sales.partId}/list-price`).set(csrf).send({ listPriceMinor: null }),
  },
  'GET /api/shops/:shopId/sales/invoices': { access: { kind: 'ability', action: 'read', subject: 'Invoice', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/sales/invoices`).query({ status: 'unpaid' }) },
  'POST /api/shops/:shopId/sales/invoices': {
    access: { kind: 'ability', action: 'create', subject: 'Invoice', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/sales/invoices`).set(csrf).send({ customerName: 'Matrix', lines: [{ kind: 'other', description: 'Matrix', quantity: 1, unitPriceMinor: 100 }] }),
  },
  'POST /api/shops/:shopId/sales/invoices/from-job': { access: { kind: 'ability', action: 'create', subject: 'Invoice', status: 201 }, call: (a, w) => a.post(`/api/shops/${w.shopId}/sales/invoices/from-job`).set(csrf).send({ jobId: w.sales.nextJobId() }) },
  'POST /api/shops/:shopId/sales/invoices/from-vehicle': {
    access: { kind: 'ability', action: 'create', subject: 'Invoice', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/sales/invoices/from-vehicle`).set(csrf).send({ vehicleId: w.sales.vehicleId, customerName: 'Matrix Buyer', priceMinor: 310000 }),
  },
  'POST /api/shops/:shopId/sales/counter-sales': {
    access: { kind: 'ability', action: 'create', subject: 'Invoice', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/sales/counter-sales`).set(csrf).send({ lines: [{ partId: w.sales.partId, binId: w.sales.binId, condition: 'new', quantity: 1 }] }),
  },
  'GET /api/shops/:shopId/sales/invoices/:invoiceId': { access: { kind: 'ability', action: 'read', subject: 'Invoice', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/sales/invoices/${w.sales.payableId}`) },
  'PATCH /api/shops/:shopId/sales/invoices/:invoiceId': {
    access: { kind: 'ability', action: 'update', subject: 'Invoice', status: 200 },
    call: (a, w) => a.patch(`/api/shops/${w.shopId}/sales/invoices/${w.sales.draftId}`).set(csrf).send({ notes: `Matrix ${randomUUID().slice(0, 8)}` }),
  },
  'DELETE /api/shops/:shopId/sales/invoices/:invoiceId': { access: { kind: 'ability', action: 'delete', subject: 'Invoice', status: 204 }, call: (a, w) => a.delete(`/api/shops/${w.shopId}/sales/invoices/${w.sales.nextDraftId()}`).set(csrf) },
  'POST /api/shops/:shopId/sales/invoices/:invoiceId/issue': {
    access: { kind: 'ability', action: 'issue', subject: 'Invoice', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/sales/invoices/${w.sales.nextDraftId()}/issue`).set(csrf).send({ sendEmail: false }),
  },
  'POST /api/shops/:shopId/sales/invoices/:invoiceId/credit-notes': {
    access: { kind: 'ability', action: 'issue', subject: 'Invoice', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/sales/invoices/${w.sales.nextIssuedId()}/credit-notes`).set(csrf).send({ reason: 'Matrix credit' }),
  },
  'POST /api/shops/:shopId/sales/invoices/:invoiceId/payments': {
    access: { kind: 'ability', action: 'create', subject: 'Payment', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/sales/invoices/${w.sales.payableId}/payments`).set(csrf).send({ method: 'cash', amountMinor: 1, receivedOn: '2026-01-15' }),
  },
  'POST /api/shops/:shopId/sales/invoices/:invoiceId/card-checkout': {
    access: { kind: 'ability', action: 'create', subject: 'Payment', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/sales/invoices/${w.sales.payableId}/card-checkout`).set(csrf).send({ amountMinor: 100 }),
  },
  'GET /api/shops/:shopId/sales/invoices/:invoiceId/pdf': { access: { kind: 'ability', action: 'read', subject: 'Invoice', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/sales/invoices/${w.sales.payableId}/pdf`) },
  'POST /api/shops/:shopId/sales/invoices/:invoiceId/email': { access: { kind: 'ability', action: 'send', subject: 'Invoice', status: 200 }, call: (a, w) => a.post(`/api/shops/${w.shopId}/sales/invoices/${w.sales.payableId}/email`).set(csrf) },
  // The customer's pay link needs no account; the sample invoice is paid, so no checkout is opened.
  'GET /api/pay/:token': { access: { kind: 'public', status: 200 }, call: (a, w) => a.get(`/api/pay/${w.sales.paidToken}`) },
  'GET /api/pay/:token/done': { access: { kind: 'public', status: 200 }, call: (a, w) => a.get(`/api/pay/${w.sales.paidToken}/done`) },
  // Estimates and the customer's approval link (issue 12).
  'GET /api/shops/:shopId/estimates': { access: { kind: 'ability', action: 'read', subject: 'Estimate', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/estimates`) },
  'GET /api/shops/:shopId/estimates/jobs/:jobId': { access: { kind: 'ability', action: 'read', subject: 'Estimate', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/estimates/jobs/${w.estimates.jobId}`) },
  'POST /api/shops/:shopId/estimates': {
    access: { kind: 'ability', action: 'create', subject: 'Estimate', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/estimates`).set(csrf).send({ jobId: w.estimates.nextJobId(), lines: [{ kind: 'labour', description: 'Matrix labour', quantity: 1 }] }),
  },
  'GET /api/shops/:shopId/estimates/jobs/:jobId/approval': { access: { kind: 'ability', action: 'read', subject: 'Estimate', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/estimates/jobs/${w.estimates.jobId}/approval`) },
  'GET /api/shops/:shopId/estimates/:estimateId': { access: { kind: 'ability', action: 'read', subject: 'Estimate', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/estimates/${w.estimates.draftId}`) },
  'GET /api/shops/:shopId/estimates/:estimateId/pdf': { access: { kind: 'ability', action: 'read', subject: 'Estimate', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/estimates/${w.estimates.draftId}/pdf`) },
  'PATCH /api/shops/:shopId/estimates/:estimateId': {
    access: { kind: 'ability', action: 'update', subject: 'Estimate', status: 200 },
    call: (a, w) => a.patch(`/api/shops/${w.shopId}/estimates/${w.estimates.draftId}`).set(csrf).send({ note: `Matrix note ${randomUUID().slice(0, 8)}` }),
  },
  'POST /api/shops/:shopId/estimates/:estimateId/send': {
    access: { kind: 'ability', action: 'send', subject: 'Estimate', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/estimates/${w.estimates.sendableId}/send`).set(csrf).send({}),
  },
  'POST /api/shops/:shopId/estimates/:estimateId/revise': {
    access: { kind: 'ability', action: 'create', subject: 'Estimate', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/estimates/${w.estimates.nextRevisableId()}/revise`).set(csrf),
  },
  // Made-up tokens: reachable by anyone, refused as unknown, nothing changed (estimates tests cover real links).
  'POST /api/estimate-approval/view': { access: { kind: 'public', status: 404 }, call: (a) => a.post('/api/estimate-approval/view').set(csrf).send({ token: 'm'.repeat(43) }) },
  'POST /api/estimate-approval/approve': { access: { kind: 'public', status: 404 }, call: (a) => a.post('/api/estimate-approval/approve').set(csrf).send({ token: 'm'.repeat(43), version: 1, grossMinor: 100, name: 'Matrix' }) },
  'POST /api/estimate-approval/decline': { access: { kind: 'public', status: 404 }, call: (a) => a.post('/api/estimate-approval/decline').set(csrf).send({ token: 'm'.repeat(43), reason: 'Matrix decline' }) },
  // Consignment terms and settlements (issue 12).
  'GET /api/shops/:shopId/consignment/vehicles': { access: { kind: 'ability', action: 'read', subject: 'Consignment', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/consignment/vehicles`) },
  'GET /api/shops/:shopId/consignment/vehicles/:vehicleId': { access: { kind: 'ability', action: 'read', subject: 'Consignment', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/consignment/vehicles/${w.consignment.vehicleId}`) },
  'PUT /api/shops/:shopId/consignment/vehicles/:vehicleId/terms': {
    access: { kind: 'ability', action: 'update', subject: 'Consignment', status: 200 },
    call: (a, w) => a.put(`/api/shops/${w.shopId}/consignment/vehicles/${w.consignment.vehicleId}/terms`).set(csrf).send({ commissionKind: 'fixed', commissionFixedMinor: 50_000 + Math.floor(Math.random() * 1000), agreedOn: '2026-01-15' }),
  },
  'POST /api/shops/:shopId/consignment/vehicles/:vehicleId/settlement': {
    access: { kind: 'ability', action: 'create', subject: 'Consignment', status: 201 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/consignment/vehicles/${w.consignment.nextSettleableId()}/settlement`).set(csrf).send({ salePriceMinor: 400_000, soldOn: '2026-01-20' }),
  },
  'POST /api/shops/:shopId/consignment/vehicles/:vehicleId/settlement/payout': {
    access: { kind: 'ability', action: 'update', subject: 'Consignment', status: 200 },
    call: (a, w) => a.post(`/api/shops/${w.shopId}/consignment/vehicles/${w.consignment.nextUnpaidId()}/settlement/payout`).set(csrf).send({ paidOn: '2026-01-22', method: 'bank_transfer', reference: 'Matrix payout' }),
  },
  // Sales reports (issue 12): margins are the owner's (field-level rule on SalesReport).
  'GET /api/shops/:shopId/sales-reports/sales': { access: { kind: 'ability', action: 'read', subject: 'SalesReport', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/sales-reports/sales?period=week`) },
  'GET /api/shops/:shopId/sales-reports/sales.csv': { access: { kind: 'ability', action: 'read', subject: 'SalesReport', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/sales-reports/sales.csv`) },
  'GET /api/shops/:shopId/sales-reports/margins': { access: { kind: 'ability', action: 'manage', subject: 'SalesReport', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/sales-reports/margins`) },
  'GET /api/shops/:shopId/sales-reports/margins.csv': { access: { kind: 'ability', action: 'manage', subject: 'SalesReport', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/sales-reports/margins.csv?period=day`) },
  'GET /api/shops/:shopId/sales-reports/unpaid': { access: { kind: 'ability', action: 'read', subject: 'SalesReport', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/sales-reports/unpaid`) },
  'GET /api/shops/:shopId/sales-reports/unpaid.csv': { access: { kind: 'ability', action: 'read', subject: 'SalesReport', status: 200 }, call: (a, w) => a.get(`/api/shops/${w.shopId}/sales-reports/unpaid.csv`) },
  'GET /api/shops/:shopId/consignment/vehicles/:vehicleId/settlement/pdf': {
    access: { kind: 'ability', action: 'read', subject: 'Consignment', status: 200 },
    call: (a, w) => a.get(`/api/shops/${w.shopId}/consignment/vehicles/${w.consignment.settledVehicleId}/settlement/pdf`),
  },
};

function expectedStatus(access: Access, persona: Persona, world: World, route: string): number {
  if (access.kind === 'public') return access.status;
  if (persona === 'anonymous') return 401;
  if (persona === 'apiKey') {
    // A key is no person: personal and platform routes refuse it; in its own shop it has its role, minus administration.
    if (access.kind === 'platform' || access.kind === 'signed-in') return 401;
    if (access.kind === 'member') return / \/api\/shops\/:shopId(\/|$)/.test(route) ? access.status : 401;
    const ability = defineAbilityFor({ userId: 'u', isPlatformAdmin: false, apiKeyId: 'k' }, { shopId: world.shopId, role: 'buyer', spendingLimitMinor: null });
    return ability.can(access.action, subjectOf(access.subject, { shopId: world.shopId }), access.field) ? access.status : 403;
  }
  if (access.kind === 'platform') return persona === 'platformAdmin' ? access.status : 403;
  if (access.kind === 'signed-in') return access.status;
  const role = persona === 'outsider' || persona === 'platformAdmin' ? null : persona;
  if (role === null) return 404;
  if (access.kind === 'member') return access.status;
  const ability: AppAbility = defineAbilityFor({ userId: 'u', isPlatformAdmin: false }, { shopId: world.shopId, role, spendingLimitMinor: null });
  return ability.can(access.action, subjectOf(access.subject, { shopId: world.shopId }), access.field) ? access.status : 403;
}

let ctx: TestContext;
let world: World;
let fakeStripe: FakeStripe;
beforeAll(async () => {
  fakeStripe = await startFakeStripe({ port: 0, webhookUrl: null, webhookSecret: 'whsec_matrix_only' });
  ctx = await createTestContext({ env: { STRIPE_API_URL: fakeStripe.url } });
  const shop = await seedShop(ctx);
  const other = await seedShop(ctx, ['owner']);
  const admin = await createShopWithUsers(ctx.db, ctx.clock, { roles: [], platformAdmin: true });
  const member = (role: ShopRole) => ({ email: shop.byRole[role].email, password: shop.password });
  world = {
    shopId: shop.shop.id,
    catalogue: await seedCatalogueFixture(ctx.db, shop.shop.id),
    admin: await seedShopAdminFixture(ctx.db, shop.shop.id, shop.byRole.owner.id),
    purchasing: await seedPurchasingFixture(ctx.db, shop.shop.id),
    labelBinId: '',
    counts: null as unknown as CountsFixture,
    countBinId: '',
    receiptId: '',
    barcodes: null as unknown as BarcodesFixture,
    jobs: null as unknown as JobsFixture,
    estimates: null as unknown as EstimatesFixture,
    consignment: null as unknown as ConsignmentFixture,
    sales: null as unknown as SalesMatrixFixture,
    apiKeySecret: '',
    mechanicId: shop.byRole.mechanic.id,
    vehicles: await seedVehicleFixture(ctx.db, shop.shop.id, ctx.env.uploadsDir),
    stock: await seedStockFixture(ctx.db, shop.shop.id),
    platform: await seedPlatformFixture(ctx.db, ctx.clock),
    people: {
      owner: member('owner'),
      mechanic: member('mechanic'),
      buyer: member('buyer'),
      viewer: member('viewer'),
      outsider: { email: other.byRole.owner.email, password: other.password },
      platformAdmin: { email: admin.users[0]!.email, password: admin.password },
    },
  };
  {
    const owner = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
    const key = await owner.post(`/api/shops/${shop.shop.id}/api-keys`).set(csrf).send({ label: 'Matrix key', role: 'buyer' }).expect(201);
    world.apiKeySecret = key.body.secret as string;
  }
  world.labelBinId = await seedLabelBin(ctx.db, shop.shop.id, 'MX-BIN', [{ partId: world.catalogue.partId, onHand: 3 }]);
  world.jobs = await seedJobsFixture(ctx.db, shop.shop.id, ctx.env.uploadsDir, { vehicleId: world.vehicles.vehicleId, partId: world.stock.partId, binId: world.stock.binId, userId: world.mechanicId });
  // Stock counts and receipt labels (issue 7): the count covers the label bin (3 of the catalogue part).
  world.counts = await seedCountsFixture(ctx.db, shop.shop.id, { binId: world.labelBinId, makeBin: (code) => seedLabelBin(ctx.db, shop.shop.id, code, []) }, 32);
  world.countBinId = await seedLabelBin(ctx.db, shop.shop.id, 'MX-COUNT', []);
  world.barcodes = await seedBarcodesFixture(ctx.db, shop.shop.id, world.catalogue.partId, 20);
  world.sales = await seedSalesMatrixFixture(ctx.db, shop.shop.id, { partId: world.stock.partId, binId: world.stock.binId, vehicleId: world.vehicles.vehicleId });
  world.estimates = await seedEstimatesFixture(ctx.db, shop.shop.id, ctx.env.uploadsDir, world.vehicles.vehicleId);
  world.consignment = await seedConsignmentFixture(ctx.db, shop.shop.id, world.vehicles.customerId);
  {
    const owner = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
    const orderId = world.purchasing.nextSentId();
    const lineId = world.purchasing.nextSentLineId(orderId);
    const received = await owner.post(`/api/shops/${shop.shop.id}/purchasing/orders/${orderId}/receipts`).set(csrf).send({ lines: [{ lineId, quantity: 2, binId: world.purchasing.binId }] });
    world.receiptId = (received.body.receipts as Array<{ id: string; lineId: string }>).find((r) => r.lineId === lineId)!.id;
  }
});
afterAll(async () => {
  await ctx.close();
  await fakeStripe.close();
});

// Support grants (issue 11): none outlives its test, so a platform admin is an outsider unless a
// test gives them one; the revoke route's samples get an active grant to revoke.
let keepGrants = false;
beforeEach(async (test) => {
  if (test.task.name.startsWith('DELETE /api/shops/:shopId/support-access') && !test.task.name.endsWith('as platformAdmin')) {
    await world.platform.grantSupport(world.shopId);
  }
});
afterEach(async () => {
  if (!keepGrants) await world.platform.revokeAllGrants();
});

/** A request maker for a persona: signed in, holding the API key, or neither. */
async function agentOf(persona: Persona) {
  if (persona === 'anonymous') return request(ctx.app);
  if (persona === 'apiKey') return request.agent(ctx.app).set('Authorization', `Bearer ${world.apiKeySecret}`);
  return signedInAgent(ctx.app, world.people[persona].email, world.people[persona].password);
}

describe('authorisation matrix', () => {
  for (const [route, entry] of Object.entries(matrix)) {
    for (const persona of personas) {
      // Another shop's owner naming this shop in the URL: a 404 that changes nothing, row by row.
      const checkUnchanged = persona === 'outsider' && !route.startsWith('GET ') && expectedStatus(entry.access, persona, world, route) === 404;
      it(`${route} as ${persona}${checkUnchanged ? ', changing nothing' : ''}`, async () => {
        // Signed in first: a sign-in is itself audited.
        const agent = await agentOf(persona);
        const before = checkUnchanged ? await databaseDigest(ctx.db) : null;
        const res = await entry.call(agent, world);
        expect(res.status, JSON.stringify(res.body)).toBe(expectedStatus(entry.access, persona, world, route));
        if (before) expect(await databaseDigest(ctx.db)).toEqual(before);
      });
    }
  }

  it('has an entry for every mounted API route', () => {
    expect(Object.keys(matrix).sort()).toEqual(mountedApiRoutes(ctx.app));
  });
});

/** Write routes whose sample call records no audit event, each with the reason. Keep it short. */
const unaudited: Record<string, string> = {
  'POST /api/billing/webhook': 'the sample has no signature and must change nothing; processed events are audited (billing webhook tests)',
  'POST /api/auth/password-reset/request': 'answers alike for unknown addresses (the sample uses one); a real request is audited (auth tests)',
  'POST /api/auth/password-reset/confirm': 'the sample token is invalid; a real confirmation is audited (auth tests)',
  'POST /api/invitations/accept': 'needs a token from an e-mail; acceptance is audited (staff tests)',
  'POST /api/shops/:shopId/purchasing/orders/from-reorder': 'the sample asks for a part with nothing due, so no draft is written; each draft it writes is audited as purchase_order.created (insertDraft)',
  'POST /api/shops/:shopId/labels/parts': 'a read: renders a PDF of labels and changes nothing (POST only because a selection of ids does not fit a URL)',
  'POST /api/shops/:shopId/labels/bins': 'a read: renders a PDF of labels and changes nothing',
  'POST /api/shops/:shopId/labels/counts/:countId': 'a read: renders a PDF of the count’s bin labels and changes nothing',
  'POST /api/shops/:shopId/labels/receipts': 'a read: renders a PDF of labels for goods received and changes nothing',
  'POST /api/estimate-approval/view': 'a read: shows the estimate behind a token (POST keeps the token out of paths and logs)',
  'POST /api/estimate-approval/approve': 'the sample token is made up and must change nothing; a real approval is audited (estimates tests)',
  'POST /api/estimate-approval/decline': 'the sample token is made up and must change nothing; a real decline is audited (estimates tests)',
};

/** Samples for routes whose matrix call writes nothing on purpose (a preview), so the check has a real write. */
const auditSamples: Record<string, Entry['call']> = {
  'POST /api/shops/:shopId/purchasing/listings/import': (a, w) =>
    a.post(`/api/shops/${w.shopId}/purchasing/listings/import`).set(csrf).field('mode', 'commit').attach('file', Buffer.from(`supplier,part_number,price\r\n${w.purchasing.supplierName},${w.purchasing.nextUnlistedPart().number},9.99\r\n`), 'listings.csv'),
  'POST /api/shops/:shopId/imports': (a, w) =>
    a.post(`/api/shops/${w.shopId}/imports`).set(csrf).field('kind', 'parts').field('mode', 'commit').attach('file', Buffer.from(`number,description\r\nMX-${randomUUID().slice(0, 8)},Matrix\r\n`), 'parts.csv'),
};

/** Routes that send e-mail under an allowance of their own service instead of the shared one (app.ts). */
const mailLimitedByTheirService: Record<string, string> = {
  'POST /api/shops/:shopId/staff/invitations': 'invitations per shop and hour (staff.test.ts › is rate-limited per shop)',
  'POST /api/shops/:shopId/staff/invitations/:invitationId/resend': 'the same invitation allowance as a new invitation',
  'POST /api/auth/password-reset/request': 'per account and per address (password-reset.test.ts)',
};
/** Write routes whose successful sample put a message in the outbox. */
const sentMail = new Set<string>();

// Every write records who did what (issue 3). Calls each write route's matrix sample as the first
// persona allowed to make it and checks that at least one audit event was appended. It also notes
// which of them sent e-mail: each of those must be under an e-mail allowance (issue 13).
describe('audit coverage', () => {
  const isWrite = (route: string) => !route.startsWith('GET ') && !route.startsWith('HEAD ');
  const order: Persona[] = ['owner', 'buyer', 'mechanic', 'viewer', 'platformAdmin', 'outsider', 'anonymous'];

  it('knows every mounted write route', () => {
    const missing = mountedApiRoutes(ctx.app).filter((r) => isWrite(r) && !(r in matrix) && !(r in unaudited));
    expect(missing).toEqual([]);
  });

  for (const [route, entry] of Object.entries(matrix).filter(([r]) => isWrite(r) && !(r in unaudited))) {
    it(`${route} records an audit event`, async () => {
      const persona = order.find((p) => expectedStatus(entry.access, p, world, route) < 300);
      if (!persona) throw new Error(`No persona may call ${route}: give it a sample call that succeeds, or list it in \`unaudited\` with a reason.`);
      const agent = await agentOf(persona);
      const before = await ctx.db.reader.count(AuditEventEntity);
      const mailBefore = ctx.mailer.outbox.length;
      const res = await (auditSamples[route] ?? entry.call)(agent, world);
      expect(res.status, JSON.stringify(res.body)).toBeLessThan(300);
      expect(await ctx.db.reader.count(AuditEventEntity), `${route} wrote no audit event`).toBeGreaterThan(before);
      // Mail not awaited by the route is handed to the mailer before it answers; let it land.
      await new Promise((r) => setImmediate(r));
      if (ctx.mailer.outbox.length > mailBefore) sentMail.add(route);
    });
  }

  it('finds every route that sent e-mail under an e-mail allowance', () => {
    const limited = new Set([...mailSendingRoutes, ...Object.keys(mailSendingWhenAsked)].map((r) => `POST /api${r}`).concat(Object.keys(mailLimitedByTheirService)));
    // The check above saw mail at all (a mailer that stopped recording would prove nothing).
    expect([...sentMail]).toEqual(expect.arrayContaining(['POST /api/shops/:shopId/purchasing/orders/:orderId/send', 'POST /api/shops/:shopId/staff/invitations']));
    expect([...sentMail].filter((r) => !limited.has(r))).toEqual([]);
  });
});

// Two more personas (issue 11): a platform admin while the shop's owner grants support access, and
// the owner of a suspended (read-only) shop.
describe('platform admin with support access', () => {
  const supportAbility = (w: World) => defineAbilityFor({ userId: 'u', isPlatformAdmin: true }, { shopId: w.shopId, role: 'owner', spendingLimitMinor: null, viaSupportGrant: true });
  const expected = (access: Access, w: World): number => {
    if (access.kind === 'public' || access.kind === 'signed-in' || access.kind === 'platform') return access.status;
    // Support sees the shop's data, but is no member of it.
    if (access.kind === 'member') return 404;
    return supportAbility(w).can(access.action, subjectOf(access.subject, { shopId: w.shopId }), access.field) ? access.status : 403;
  };
  beforeAll(async () => {
    keepGrants = true;
    await world.platform.grantSupport(world.shopId);
  });
  afterAll(async () => {
    keepGrants = false;
    await world.platform.revokeAllGrants();
  });
  for (const [route, entry] of Object.entries(matrix)) {
    it(`${route} as supportAdmin`, async () => {
      const agent = await signedInAgent(ctx.app, world.people.platformAdmin.email, world.people.platformAdmin.password);
      const res = await entry.call(agent, world);
      expect(res.status, JSON.stringify(res.body)).toBe(expected(entry.access, world));
    });
  }
});

describe('owner of a suspended shop', () => {
  const isShopRoute = (route: string) => / \/api\/shops\/:shopId(\/|$)/.test(route);
  // Spare ids are not used up here: every write is refused before anything is looked up.
  const readOnlyWorld = (): World => {
    const fresh = <T extends object>(fixture: T): T =>
      new Proxy(fixture, { get: (target, key, receiver) => (typeof key === 'string' && key.startsWith('next') ? () => randomUUID() : Reflect.get(target, key, receiver)) });
    return { ...world, shopId: world.platform.readOnlyShop.shopId, catalogue: fresh(world.catalogue), admin: fresh(world.admin), vehicles: fresh(world.vehicles), stock: fresh(world.stock), platform: fresh(world.platform), counts: fresh(world.counts), barcodes: fresh(world.barcodes), sales: fresh(world.sales), estimates: fresh(world.estimates), consignment: fresh(world.consignment) };
  };
  for (const [route, entry] of Object.entries(matrix).filter(([r]) => isShopRoute(r))) {
    const write = !route.startsWith('GET ');
    const open = /\/(billing|support-access)(\/|$)/.test(route);
    it(`${route} as suspendedOwner ${write && !open ? 'is refused as read-only' : 'is not refused as read-only'}`, async () => {
      const { email, password } = world.platform.readOnlyShop.owner;
      const agent = await signedInAgent(ctx.app, email, password);
      const res = await entry.call(agent, readOnlyWorld());
      if (write && !open) {
        expect(res.status, JSON.stringify(res.body)).toBe(403);
        expect(res.body.error.details).toEqual({ reason: 'shop_read_only', billingState: 'suspended' });
        expect(res.body.error.message).toContain('Matrix suspension');
      } else {
        expect(res.body?.error?.details?.reason).not.toBe('shop_read_only');
        expect(res.status, JSON.stringify(res.body)).toBeLessThan(500);
      }
    });
  }
});
