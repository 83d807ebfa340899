import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { AuditEventEntity } from '../../audit/audit.entity';
import { seedStockFixture, type StockFixture } from '../../stock/stock.test-fixture';
import { seedVehicleFixture, type VehicleFixture } from '../../vehicles/vehicles.test-fixture';
import { EstimateEntity, EstimateLinkEntity } from '../estimates.entity';

// Estimates (issue 12): pricing of lines, sending with a single-use expiring link, the customer's
// approval and decline without an account, revisions, the approval state of a job, and who sees what.

type Agent = Awaited<ReturnType<typeof signedInAgent>>;

let ctx: TestContext;
let shopId: string;
let owner: Agent;
let mechanic: Agent;
let viewer: Agent;
let outsider: Agent;
let mechanicId: string;
let vehicles: VehicleFixture;
let stock: StockFixture;
let mechanicsJobId: string;
let othersJobId: string;
let ownerLogin: { email: string; password: string };

const url = (path = '') => `/api/shops/${shopId}/estimates${path}`;
/** The token from the last e-mail's link (it sits in the URL fragment). */
const lastToken = () => {
  const text = ctx.mailer.outbox.at(-1)!.text;
  const match = /\/estimate-approval#([A-Za-z0-9_-]{43})/.exec(text);
  if (!match) throw new Error(`No approval link in: ${text}`);
  return match[1]!;
};

beforeAll(async () => {
  ctx = await createTestContext();
  const shop = await seedShop(ctx);
  const other = await seedShop(ctx, ['owner']);
  shopId = shop.shop.id;
  mechanicId = shop.byRole.mechanic.id;
  vehicles = await seedVehicleFixture(ctx.db, shopId, ctx.env.uploadsDir, 0);
  stock = await seedStockFixture(ctx.db, shopId, 0);
  ownerLogin = { email: shop.byRole.owner.email, password: shop.password };
  owner = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
  mechanic = await signedInAgent(ctx.app, shop.byRole.mechanic.email, shop.password);
  viewer = await signedInAgent(ctx.app, shop.byRole.viewer.email, shop.password);
  outsider = await signedInAgent(ctx.app, other.byRole.owner.email, other.password);
  const job = async (title: string, assigneeIds: string[]) => {
    const res = await owner.post(`/api/shops/${shopId}/jobs`).set(csrf).send({ vehicleId: vehicles.vehicleId, title, customerRequest: 'Estimate test', assigneeIds, templateIds: [] });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body.id as string;
  };
  mechanicsJobId = await job('Rebuild the carburettor', [mechanicId]);
  othersJobId = await job('Respray the tank', []);
}, 60_000);
afterAll(() => ctx.close());

describe('building an estimate', () => {
  let estimateId: string;

  it('prices part lines from the pricing rules, labour at the shop rate, and totals with tax (worked by hand)', async () => {
    const res = await owner.post(url()).set(csrf).send({
      jobId: mechanicsJobId,
      note: 'Parts may take a week.',
      lines: [
        { kind: 'part', partId: stock.partId, description: 'Float needle', quantity: 2 },
        { kind: 'labour', description: 'Strip, clean and rebuild', quantity: '2.5' },
        { kind: 'other', description: 'Workshop consumables', quantity: 1, unitPriceMinor: 1234 },
      ],
    });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    // By hand, default rules (cost + 40 %, no rounding), standard rate 20 %, labour £60.00/h:
    //   part: unit cost 250 (the stock fixture's receipt) × 1.40 = 350; 2 × 350 = 700 net, tax 140
    //   labour: 2.5 h × 6 000 = 15 000 net, tax 3 000
    //   other: 1 × 1 234 = 1 234 net, tax 246.8 → 247 (decision 015, per line)
    //   net 16 934, tax 3 387, gross 20 321
    expect(res.body.lines.map((l: { unitPriceMinor: number; priceBasis: string; netMinor: number; taxMinor: number }) => [l.unitPriceMinor, l.priceBasis, l.netMinor, l.taxMinor])).toEqual([
      [350, 'default-markup', 700, 140],
      [6000, 'labour-rate', 15000, 3000],
      [1234, 'typed', 1234, 247],
    ]);
    expect([res.body.netMinor, res.body.taxMinor, res.body.grossMinor]).toEqual([16934, 3387, 20321]);
    expect(res.body.status).toBe('draft');
    expect(res.body.reference).toMatch(/^EST-\d{6}$/);
    estimateId = res.body.id;
  });

  it('refuses a second open estimate for the same job, an other line without a price, and another shop’s part', async () => {
    expect((await owner.post(url()).set(csrf).send({ jobId: mechanicsJobId, lines: [] })).status).toBe(409);
    const noPrice = await owner.post(url()).set(csrf).send({ jobId: othersJobId, lines: [{ kind: 'other', description: 'Sundries', quantity: 1 }] });
    expect(noPrice.status).toBe(400);
    expect(noPrice.body.error.details[0].path).toEqual(['lines', 0, 'unitPriceMinor']);
    const foreign = await outsider.post(`/api/shops/${shopId}/estimates`).set(csrf).send({ jobId: othersJobId, lines: [] });
    expect(foreign.status).toBe(404);
  });

  it('lets only the owner write, and a mechanic read only the estimates of their jobs', async () => {
    expect((await mechanic.post(url()).set(csrf).send({ jobId: othersJobId, lines: [] })).status).toBe(403);
    expect((await viewer.patch(url(`/${estimateId}`)).set(csrf).send({ note: 'x' })).status).toBe(403);
    const other = await owner.post(url()).set(csrf).send({ jobId: othersJobId, lines: [{ kind: 'labour', description: 'Prepare and paint', quantity: 6 }] });
    expect(other.status).toBe(201);
    expect((await mechanic.get(url(`/${estimateId}`))).status).toBe(200);
    expect((await mechanic.get(url(`/${other.body.id}`))).status).toBe(403);
    expect((await mechanic.get(url(`/${other.body.id}/pdf`))).status).toBe(403);
    expect((await mechanic.get(url())).status).toBe(403);
    const mine = await mechanic.get(url(`/jobs/${mechanicsJobId}`));
    expect(mine.status).toBe(200);
    expect(mine.body.estimates.map((e: { id: string }) => e.id)).toEqual([estimateId]);
    expect((await mechanic.get(url(`/jobs/${othersJobId}`))).status).toBe(403);
    const all = await viewer.get(url());
    expect(all.body.estimates.map((e: { id: string }) => e.id).sort()).toEqual([estimateId, other.body.id].sort());
    expect((await outsider.get(url(`/${estimateId}`))).status).toBe(404);
  });

  it('sends the estimate by e-mail with the PDF and a link, and the customer approves it once', async () => {
    const sent = await owner.post(url(`/${estimateId}/send`)).set(csrf).send({});
    expect(sent.status, JSON.stringify(sent.body)).toBe(200);
    expect(sent.body.emailed).toBe(true);
    const mail = ctx.mailer.outbox.at(-1)!;
    expect(mail.to).toBe('fixture@harbour-works.test');
    expect(mail.attachments?.[0]?.contentType).toBe('application/pdf');
    expect(mail.attachments?.[0]?.content.subarray(0, 5).toString()).toBe('%PDF-');
    const token = lastToken();
    const anon = request(ctx.app);
    const shown = await anon.post('/api/estimate-approval/view').set(csrf).send({ token });
    expect(shown.status, JSON.stringify(shown.body)).toBe(200);
    expect(shown.body.grossMinor).toBe(20321);
    expect(shown.body).not.toHaveProperty('id');
    const wrongTotal = await anon.post('/api/estimate-approval/approve').set(csrf).send({ token, version: 1, grossMinor: 20000, name: 'Fixture Customer' });
    expect(wrongTotal.status).toBe(409);
    ctx.clock.advance(60_000);
    const approved = await anon.post('/api/estimate-approval/approve').set(csrf).send({ token, version: 1, grossMinor: 20321, name: 'Fixture Customer' });
    expect(approved.status, JSON.stringify(approved.body)).toBe(200);
    expect(approved.body).toMatchObject({ status: 'approved', version: 1, approvedAmountMinor: 20321, decidedAt: ctx.clock.now().toISOString() });
    const row = await ctx.db.reader.findOneByOrFail(EstimateEntity, { id: estimateId });
    expect(row.status).toBe('approved');
    expect(row.approvedAmountMinor).toBe(20321);
    expect(new Date(row.decidedAt!).toISOString()).toBe(ctx.clock.now().toISOString());
    const audit = await ctx.db.reader.findOneByOrFail(AuditEventEntity, { entityId: estimateId, action: 'estimate.approved' });
    expect(audit.changes).toMatchObject({ approvedAmountMinor: { after: 20321 }, version: { after: 1 } });
  });

  it('refuses a reused link and changes nothing', async () => {
    const token = lastToken();
    const anon = request(ctx.app);
    const before = await ctx.db.reader.findOneByOrFail(EstimateEntity, { id: estimateId });
    const again = await anon.post('/api/estimate-approval/decline').set(csrf).send({ token, reason: 'Changed my mind' });
    expect(again.status).toBe(410);
    expect(again.body.error.details.reason).toBe('link_used');
    expect((await anon.post('/api/estimate-approval/view').set(csrf).send({ token })).status).toBe(410);
    expect(await ctx.db.reader.findOneByOrFail(EstimateEntity, { id: estimateId })).toEqual(before);
  });

  it('shows the job within its approval, then over it when more parts are used', async () => {
    const within = await mechanic.get(url(`/jobs/${mechanicsJobId}/approval`));
    expect(within.status).toBe(200);
    expect(within.body).toMatchObject({ approved: { amountMinor: 20321, version: 1 }, actualGrossMinor: 0, overApproved: false });
    // Issue 60 parts: 60 × 350 = 21 000 net + 20 % = 25 200 gross, beyond 20 321.
    const issued = await mechanic.post(`/api/shops/${shopId}/jobs/${mechanicsJobId}/parts/issues`).set(csrf).send({ partId: stock.partId, binId: stock.binId, condition: 'new', quantity: 60 });
    expect(issued.status, JSON.stringify(issued.body)).toBeLessThan(300);
    const over = await owner.get(url(`/jobs/${mechanicsJobId}/approval`));
    expect(over.body).toMatchObject({ actualGrossMinor: 25200, overApproved: true });
    expect((await mechanic.get(url(`/jobs/${othersJobId}/approval`))).status).toBe(403);
  });

  it('revises an approved estimate as a new draft version that needs its own approval', async () => {
    const revised = await owner.post(url(`/${estimateId}/revise`)).set(csrf).send();
    expect(revised.status, JSON.stringify(revised.body)).toBe(201);
    expect(revised.body).toMatchObject({ version: 2, status: 'draft', approvedAmountMinor: null });
    expect(revised.body.reference).toMatch(/-v2$/);
    const state = await owner.get(url(`/jobs/${mechanicsJobId}/approval`));
    expect(state.body.approved.version).toBe(1);
    expect(state.body.latest.version).toBe(2);
  });
});

describe('the approval link', () => {
  let estimateId: string;
  const anon = async () => request(ctx.app);

  beforeAll(async () => {
    const res = await owner.post(url()).set(csrf).send({ jobId: othersJobId, lines: [] });
    // The job already has the open draft from the permissions test: use that one.
    const list = await owner.get(url(`?jobId=${othersJobId}`));
    estimateId = res.status === 201 ? res.body.id : list.body.estimates[0].id;
  });

  it('refuses a tampered token and changes nothing', async () => {
    const sent = await owner.post(url(`/${estimateId}/send`)).set(csrf).send({ email: 'paint.customer@harbour-works.test' });
    expect(sent.status).toBe(200);
    const token = lastToken();
    const tampered = `${token.slice(0, -1)}${token.endsWith('A') ? 'B' : 'A'}`;
    const a = await anon();
    const before = await ctx.db.reader.findOneByOrFail(EstimateEntity, { id: estimateId });
    for (const res of [
      await a.post('/api/estimate-approval/view').set(csrf).send({ token: tampered }),
      await a.post('/api/estimate-approval/approve').set(csrf).send({ token: tampered, version: 1, grossMinor: before.grossMinor, name: 'Mallory' }),
      await a.post('/api/estimate-approval/decline').set(csrf).send({ token: tampered, reason: 'Forged' }),
    ]) {
      expect(res.status).toBe(404);
    }
    expect((await a.post('/api/estimate-approval/view').set(csrf).send({ token: 'short' })).status).toBe(400);
    expect(await ctx.db.reader.findOneByOrFail(EstimateEntity, { id: estimateId })).toEqual(before);
  });

  it('refuses an expired link and changes nothing; sending again gives a new link and retires the old one', async () => {
    const token = lastToken();
    ctx.clock.advance(15 * 86_400_000); // the default link lives 14 days
    const a = await anon();
    const before = await ctx.db.reader.findOneByOrFail(EstimateEntity, { id: estimateId });
    const expired = await a.post('/api/estimate-approval/approve').set(csrf).send({ token, version: 1, grossMinor: before.grossMinor, name: 'Late Customer' });
    expect(expired.status).toBe(410);
    expect(expired.body.error.details.reason).toBe('link_expired');
    expect(await ctx.db.reader.findOneByOrFail(EstimateEntity, { id: estimateId })).toEqual(before);
    expect((await ctx.db.reader.findBy(EstimateLinkEntity, { estimateId })).every((l) => l.usedAt === null)).toBe(true);

    // Sessions time out over those days too: sign in again.
    owner = await signedInAgent(ctx.app, ownerLogin.email, ownerLogin.password);
    const resent = await owner.post(url(`/${estimateId}/send`)).set(csrf).send({ email: 'paint.customer@harbour-works.test', linkValidDays: 2 });
    expect(resent.status, JSON.stringify(resent.body)).toBe(200);
    const fresh = lastToken();
    expect(fresh).not.toBe(token);
    const old = await a.post('/api/estimate-approval/view').set(csrf).send({ token });
    expect(old.status).toBe(410);
  });

  it('records a decline with its reason', async () => {
    const a = await anon();
    const declined = await a.post('/api/estimate-approval/decline').set(csrf).send({ token: lastToken(), reason: 'Too dear for this year' });
    expect(declined.status, JSON.stringify(declined.body)).toBe(200);
    const got = await owner.get(url(`/${estimateId}`));
    expect(got.body).toMatchObject({ status: 'declined', declineReason: 'Too dear for this year', approvedAmountMinor: null });
  });
});
