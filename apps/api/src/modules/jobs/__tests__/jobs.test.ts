import { randomUUID } from 'node:crypto';
import { jobListLimit } from '@tappet/contracts';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEventEntity } from '../../audit/audit.entity';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { seedStockFixture, type StockFixture } from '../../stock/stock.test-fixture';
import { seedVehicleFixture, type VehicleFixture } from '../../vehicles/vehicles.test-fixture';
import { JobEntity } from '../jobs.entity';
import { openSpecialOrders, vehicleHandOverBlockers } from '../jobs.service';

type Agent = Awaited<ReturnType<typeof signedInAgent>>;

let ctx: TestContext;
let shopId: string;
let ids: { owner: string; mechanic: string; otherOwner: string };
let owner: Agent;
let mechanic: Agent;
let viewer: Agent;
let buyer: Agent;
let outsider: Agent;
let vehicles: VehicleFixture;
let stock: StockFixture;
let otherVehicleId: string;
let otherShopId: string;
let templates: Array<{ id: string; name: string; items: Array<{ key: string; safety: boolean; kind: string }> }>;

beforeAll(async () => {
  ctx = await createTestContext();
  const shop = await seedShop(ctx);
  const other = await seedShop(ctx, ['owner']);
  shopId = shop.shop.id;
  ids = { owner: shop.byRole.owner.id, mechanic: shop.byRole.mechanic.id, otherOwner: other.byRole.owner.id };
  vehicles = await seedVehicleFixture(ctx.db, shopId, ctx.env.uploadsDir, 2);
  otherShopId = other.shop.id;
  otherVehicleId = (await seedVehicleFixture(ctx.db, other.shop.id, ctx.env.uploadsDir, 0)).vehicleId;
  stock = await seedStockFixture(ctx.db, shopId, 0);
  owner = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
  mechanic = await signedInAgent(ctx.app, shop.byRole.mechanic.email, shop.password);
  viewer = await signedInAgent(ctx.app, shop.byRole.viewer.email, shop.password);
  buyer = await signedInAgent(ctx.app, shop.byRole.buyer.email, shop.password);
  outsider = await signedInAgent(ctx.app, other.byRole.owner.email, other.password);
  const list = await viewer.get(`/api/shops/${shopId}/checklist-templates`);
  expect(list.status).toBe(200);
  templates = list.body.templates;
}, 60_000);
afterAll(() => ctx.close());

const url = (path = '') => `/api/shops/${shopId}/jobs${path}`;
const recommissioning = () => templates.find((t) => t.name.startsWith('Recommissioning'))!;

async function newJob(assigneeIds: string[], templateIds: string[] = [recommissioning().id]) {
  const res = await owner.post(url()).set(csrf).send({ vehicleId: vehicles.vehicleId, title: 'Recommission after storage', customerRequest: 'Stood in a barn for twelve years; get it running.', assigneeIds, templateIds });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as { id: string; number: number; checklists: Array<{ id: string; items: Array<{ key: string; safety: boolean }> }> };
}

describe('shipped templates', () => {
  it('gives a new shop Tappet’s recommissioning and pre-sale templates once', async () => {
    expect(templates.map((t) => t.name).sort()).toEqual(['Pre-sale inspection', 'Recommissioning after storage']);
    const again = await owner.get(`/api/shops/${shopId}/checklist-templates`);
    expect(again.body.templates).toHaveLength(2);
  });
  it('lets the owner edit a template, not a mechanic', async () => {
    const t = recommissioning();
    expect((await mechanic.patch(`/api/shops/${shopId}/checklist-templates/${t.id}`).set(csrf).send({ description: 'Mine now' })).status).toBe(403);
    const ok = await owner.patch(`/api/shops/${shopId}/checklist-templates/${t.id}`).set(csrf).send({ description: 'Our own wording.' });
    expect(ok.status).toBe(200);
    expect(ok.body.description).toBe('Our own wording.');
    const bad = await owner.post(`/api/shops/${shopId}/checklist-templates`).set(csrf).send({ name: 'Bad', items: [{ key: 'a', section: 'S', label: 'Thing', kind: 'measure', safety: false }] });
    expect(bad.status).toBe(400);
  });
});

describe('jobs on a vehicle', () => {
  it('opens a numbered job with its assignee and checklist, audited', async () => {
    const job = await newJob([ids.mechanic]);
    expect(job.number).toBeGreaterThan(0);
    expect(job.checklists).toHaveLength(1);
    const events = await ctx.db.reader.find(AuditEventEntity, { where: { shopId, action: 'job.created', entityId: job.id } });
    expect(events).toHaveLength(1);
  });

  it('refuses another shop’s vehicle or person with 404 and writes nothing', async () => {
    const before = await ctx.db.reader.count(JobEntity);
    const foreignVehicle = await owner.post(url()).set(csrf).send({ vehicleId: otherVehicleId, title: 'Nope job', customerRequest: '' });
    expect(foreignVehicle.status).toBe(404);
    const foreignPerson = await owner.post(url()).set(csrf).send({ vehicleId: vehicles.vehicleId, title: 'Nope job', customerRequest: '', assigneeIds: [ids.otherOwner] });
    expect(foreignPerson.status).toBe(404);
    expect(await ctx.db.reader.count(JobEntity)).toBe(before);
  });

  it('answers 404 to another shop and lets a mechanic not create jobs', async () => {
    const job = await newJob([]);
    expect((await outsider.get(url(`/${job.id}`))).status).toBe(404);
    expect((await mechanic.post(url()).set(csrf).send({ vehicleId: vehicles.vehicleId, title: 'My own job', customerRequest: '' })).status).toBe(403);
  });

  it('lists my jobs for a mechanic and the whole board for the owner', async () => {
    const mine = await newJob([ids.mechanic], []);
    const notMine = await newJob([ids.owner], []);
    const my = await mechanic.get(url('?assignee=me'));
    const myIds = my.body.jobs.map((j: { id: string }) => j.id);
    expect(myIds).toContain(mine.id);
    expect(myIds).not.toContain(notMine.id);
    const board = await owner.get(url());
    expect(board.body.jobs.map((j: { id: string }) => j.id)).toEqual(expect.arrayContaining([mine.id, notMine.id]));
  });

  it('says when more jobs match than one list holds, and lists the newest', async () => {
    // The other shop has no jobs of its own tests: fill it past the limit in one write.
    const at = new Date('2026-11-01T09:00:00Z');
    const rows = Array.from({ length: jobListLimit + 1 }, (_, i) => ({
      id: randomUUID(),
      shopId: otherShopId,
      number: i + 1,
      vehicleId: otherVehicleId,
      title: `Service ${i + 1}`,
      customerRequest: '',
      status: 'open' as const,
      dueOn: null,
      notes: null,
      createdByUserId: null,
      createdAt: at,
      updatedAt: at,
      startedAt: null,
      completedAt: null,
    }));
    await ctx.db.write((m) => m.insert(JobEntity, rows));
    const full = await outsider.get(`/api/shops/${otherShopId}/jobs`);
    expect(full.status).toBe(200);
    expect(full.body.truncated).toBe(true);
    expect(full.body.jobs).toHaveLength(jobListLimit);
    expect(full.body.jobs[0].number).toBe(jobListLimit + 1);
    // Narrowed below the limit, the answer is whole.
    const few = await owner.get(url());
    expect(few.body.truncated).toBe(false);
  });

  it('lets a mechanic change only jobs assigned to them (CASL condition), not reassign them; a viewer or buyer only reads', async () => {
    const mine = await newJob([ids.mechanic], []);
    const notMine = await newJob([ids.owner], []);
    expect((await mechanic.patch(url(`/${mine.id}`)).set(csrf).send({ notes: 'Seized front caliper.' })).status).toBe(200);
    expect((await mechanic.patch(url(`/${notMine.id}`)).set(csrf).send({ notes: 'Not my job.' })).status).toBe(403);
    expect((await mechanic.patch(url(`/${mine.id}`)).set(csrf).send({ assigneeIds: [] })).status).toBe(403);
    expect((await viewer.patch(url(`/${mine.id}`)).set(csrf).send({ notes: 'x' })).status).toBe(403);
    expect((await buyer.post(url(`/${mine.id}/status`)).set(csrf).send({ to: 'in_progress' })).status).toBe(403);
    expect((await viewer.get(url(`/${mine.id}`))).status).toBe(200);
  });
});

describe('checklists', () => {
  it('stores compression in kPa whatever unit it is entered in (NIST SP 811: 1 psi = 6.894 757 kPa)', async () => {
    const job = await newJob([ids.mechanic]);
    const c = job.checklists[0]!;
    const res = await mechanic.put(url(`/${job.id}/checklists/${c.id}/items/compression`)).set(csrf).send({ result: 'ok', compression: { unit: 'psi', readings: [120, 118] } });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const record = res.body.checklists[0].records.compression;
    expect(record.compressionKPa[0]).toBeCloseTo(827.3709, 3);
    expect(record.compressionKPa[1]).toBeCloseTo(813.5814, 3);
    expect(record.suggested).toBe('ok');
    // 90 psi is below the template's 690 kPa minimum: at least "advise".
    const low = await mechanic.put(url(`/${job.id}/checklists/${c.id}/items/compression`)).set(csrf).send({ result: 'ok', compression: { unit: 'bar', readings: [6.2, 8] } });
    expect(low.status).toBe(400);
  });

  it('fails a three-digit DOT code (made before 2000, 49 CFR 574.5) and refuses to mark it OK', async () => {
    const job = await newJob([ids.mechanic]);
    const c = job.checklists[0]!;
    const path = url(`/${job.id}/checklists/${c.id}/items/tyre-age`);
    const tyres = [
      { position: 'Front', code: 'DOT AB12 CD3 2319' },
      { position: 'Rear', code: 'DOT XY 239' },
    ];
    const ok = await mechanic.put(path).set(csrf).send({ result: 'ok', tyres });
    expect(ok.status).toBe(400);
    expect(ok.body.error.message).toContain('Fail');
    const fail = await mechanic.put(path).set(csrf).send({ result: 'fail', tyres, note: 'Rear tyre predates 2000.' });
    expect(fail.status).toBe(200);
    const record = fail.body.checklists[0].records['tyre-age'];
    expect(record.tyres[1]).toMatchObject({ verdict: 'fail', pre2000: true });
    expect(record.tyres[0].verdict).toBe('advise'); // week 23 of 2019, over 6 years on 15 Jan 2026
    const unreadable = await mechanic.put(path).set(csrf).send({ result: 'fail', tyres: [{ position: 'Front', code: '12' }] });
    expect(unreadable.status).toBe(400);
  });

  it('blocks done while a safety item is failed or unrecorded, until fixed or signed off by the owner', async () => {
    const job = await newJob([ids.mechanic]);
    const c = job.checklists[0]!;
    const safetyKeys = c.items.filter((i) => i.safety).map((i) => i.key);
    expect((await mechanic.post(url(`/${job.id}/status`)).set(csrf).send({ to: 'in_progress' })).status).toBe(200);
    for (const item of c.items) {
      const body = item.key === 'tyre-age' ? { result: 'ok', tyres: [{ position: 'Front', code: '2324' }] } : item.key === 'compression' ? { result: 'ok', compression: { unit: 'kPa', readings: [900] } } : item.key === 'brake-friction' ? { result: 'ok', value: 4.5 } : { result: 'ok' };
      if (item.key === 'brake-hydraulics') continue;
      const res = await mechanic.put(url(`/${job.id}/checklists/${c.id}/items/${item.key}`)).set(csrf).send(body);
      expect(res.status, `${item.key}: ${JSON.stringify(res.body)}`).toBe(200);
    }
    await mechanic.put(url(`/${job.id}/checklists/${c.id}/items/brake-hydraulics`)).set(csrf).send({ result: 'fail', note: 'Front caliper seized.' });
    const blocked = await mechanic.post(url(`/${job.id}/status`)).set(csrf).send({ to: 'done' });
    expect(blocked.status).toBe(409);
    expect(blocked.body.error.details.reason).toBe('safety_blockers');
    expect(blocked.body.error.details.blockers.map((b: { key: string; reason: string }) => [b.key, b.reason])).toEqual([['brake-hydraulics', 'failed']]);
    expect(safetyKeys).toContain('brake-hydraulics');
    const forVehicle = await vehicleHandOverBlockers(ctx.db.reader, shopId, vehicles.vehicleId);
    expect(forVehicle.some((b) => b.jobId === job.id && b.key === 'brake-hydraulics')).toBe(true);

    // A mechanic cannot sign off; the owner can, with a reason and how the customer was told.
    const signOff = { checklistId: c.id, itemKey: 'brake-hydraulics', reason: 'Customer collects on a trailer; caliper to be done at home.', customerTold: true, customerToldHow: 'Phoned the customer on 15 Jan.' };
    expect((await mechanic.post(url(`/${job.id}/sign-offs`)).set(csrf).send(signOff)).status).toBe(403);
    expect((await owner.post(url(`/${job.id}/sign-offs`)).set(csrf).send({ ...signOff, customerTold: false })).status).toBe(400);
    expect((await owner.post(url(`/${job.id}/sign-offs`)).set(csrf).send({ ...signOff, itemKey: 'lights' })).status).toBe(409);
    const signed = await owner.post(url(`/${job.id}/sign-offs`)).set(csrf).send(signOff);
    expect(signed.status).toBe(201);
    expect(signed.body.blockers).toEqual([]);
    // The item stays failed on record, with its sign-off beside it.
    expect(signed.body.checklists[0].records['brake-hydraulics'].result).toBe('fail');
    expect(signed.body.signOffs[0]).toMatchObject({ itemKey: 'brake-hydraulics', customerToldHow: 'Phoned the customer on 15 Jan.' });
    const done = await mechanic.post(url(`/${job.id}/status`)).set(csrf).send({ to: 'done' });
    expect(done.status).toBe(200);
    expect(done.body.completedAt).not.toBeNull();
  });

  it('completes a checklist only when every item is recorded, and locks it', async () => {
    const job = await newJob([ids.mechanic]);
    const c = job.checklists[0]!;
    const early = await mechanic.post(url(`/${job.id}/checklists/${c.id}/complete`)).set(csrf);
    expect(early.status).toBe(409);
    expect(early.body.error.details.reason).toBe('items_unrecorded');
    for (const item of c.items) {
      await mechanic.put(url(`/${job.id}/checklists/${c.id}/items/${item.key}`)).set(csrf).send({ result: 'na' });
    }
    const complete = await mechanic.post(url(`/${job.id}/checklists/${c.id}/complete`)).set(csrf);
    expect(complete.status).toBe(200);
    expect(complete.body.checklists[0].completedBy.id).toBe(ids.mechanic);
    expect((await mechanic.put(url(`/${job.id}/checklists/${c.id}/items/lights`)).set(csrf).send({ result: 'ok' })).status).toBe(409);
  });
});

describe('parts and labour', () => {
  it('holds, issues and returns parts through the stock ledger, and costs them to the job', async () => {
    const job = await newJob([ids.mechanic], []);
    const line = { partId: stock.partId, binId: stock.binId, condition: 'new' };
    const held = await mechanic.post(url(`/${job.id}/parts/holds`)).set(csrf).send({ ...line, quantity: 3 });
    expect(held.status, JSON.stringify(held.body)).toBe(201);
    const hold = held.body.holds[0];
    expect(hold).toMatchObject({ jobId: job.id, quantity: 3, status: 'active' });
    const issued = await mechanic.post(url(`/${job.id}/parts/issues`)).set(csrf).send({ holdId: hold.id, quantity: 2 });
    expect(issued.status, JSON.stringify(issued.body)).toBe(201);
    expect(issued.body.partLines).toEqual([expect.objectContaining({ partId: stock.partId, quantity: 2, costMinor: 500 })]);
    const tooMany = await mechanic.post(url(`/${job.id}/parts/returns`)).set(csrf).send({ ...line, quantity: 3 });
    expect(tooMany.status).toBe(409);
    const returned = await mechanic.post(url(`/${job.id}/parts/returns`)).set(csrf).send({ ...line, quantity: 1 });
    expect(returned.status).toBe(201);
    expect(returned.body.partLines[0]).toMatchObject({ quantity: 1, costMinor: 250 });
    expect(returned.body.cost.partsMinor).toBe(250);
    const released = await mechanic.post(url(`/${job.id}/parts/holds/${hold.id}/release`)).set(csrf);
    expect(released.status).toBe(200);
    expect(released.body.holds[0].status).toBe('released');
  });

  it('refuses parts on someone else’s job (403) and a hold of another job (404)', async () => {
    const notMine = await newJob([ids.owner], []);
    const line = { partId: stock.partId, binId: stock.binId, condition: 'new', quantity: 1 };
    expect((await mechanic.post(url(`/${notMine.id}/parts/holds`)).set(csrf).send(line)).status).toBe(403);
    const mine = await newJob([ids.mechanic], []);
    const held = await owner.post(url(`/${notMine.id}/parts/holds`)).set(csrf).send(line);
    expect((await mechanic.post(url(`/${mine.id}/parts/issues`)).set(csrf).send({ holdId: held.body.holds[0].id, quantity: 1 })).status).toBe(404);
  });

  it('books labour at the shop rate; a mechanic books only their own time', async () => {
    const job = await newJob([ids.mechanic], []);
    const own = await mechanic.post(url(`/${job.id}/labour`)).set(csrf).send({ userId: ids.mechanic, workedOn: '2026-01-15', minutes: 90, description: 'Stripped and cleaned carburettors' });
    expect(own.status).toBe(201);
    // Default rate 60.00 an hour: 1.5 h = 90.00.
    expect(own.body.labour[0]).toMatchObject({ minutes: 90, rateMinorPerHour: 6000, costMinor: 9000 });
    expect(own.body.cost).toMatchObject({ labourMinor: 9000, labourMinutes: 90 });
    expect((await mechanic.post(url(`/${job.id}/labour`)).set(csrf).send({ userId: ids.owner, workedOn: '2026-01-15', minutes: 30, description: 'Not mine' })).status).toBe(403);
    expect((await owner.post(url(`/${job.id}/labour`)).set(csrf).send({ userId: ids.otherOwner, workedOn: '2026-01-15', minutes: 30, description: 'Outsider' })).status).toBe(404);
  });

  it('records a special order for purchasing to pick up', async () => {
    const job = await newJob([ids.mechanic], []);
    const res = await mechanic.post(url(`/${job.id}/special-orders`)).set(csrf).send({ partId: stock.partId, quantity: 2, note: 'Need a pair' });
    expect(res.status).toBe(201);
    const open = await openSpecialOrders(ctx.db.reader, shopId);
    expect(open).toEqual(expect.arrayContaining([expect.objectContaining({ jobId: job.id, partId: stock.partId, quantity: 2, jobNumber: job.number })]));
  });
});
