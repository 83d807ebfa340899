import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { csrf } from '../../../test-support/test-app';
import { AuditEventEntity } from '../../audit/audit.entity';
import { expectStatus, stockWorld, type StockWorld } from '../../stock/__tests__/helpers';

// GS1 check digits (GS1 General Specifications §7.9.1). Published examples: the GTIN-13
// 629104150021|3 worked example and the UPC-A 03600024145|7 example, as in libs/domain's
// gs1.test.ts (which also checks against the cdigit library); wrong ones made by changing the last digit.
let w: StockWorld;
let other: StockWorld;
beforeAll(async () => {
  w = await stockWorld();
  other = await stockWorld(w.ctx);
});
afterAll(() => w.ctx.close());

const url = (world: StockWorld, rest: string) => `/api/shops/${world.shopId}${rest}`;

describe('supplier barcodes', () => {
  it('attaches a valid GTIN, refuses a wrong check digit naming the right one, and finds the part by scan', async () => {
    const part = await w.addPart('WP-77', { description: 'Water pump' });
    const ok = await w.as.buyer.post(url(w, `/parts/${part}/barcodes`)).set(csrf).send({ code: '6291041500213' });
    expectStatus(ok, 201);
    expect(ok.body).toMatchObject({ code: '6291041500213', kind: 'GTIN-13', partId: part });

    const wrong = await w.as.buyer.post(url(w, `/parts/${part}/barcodes`)).set(csrf).send({ code: '6291041500214' });
    expectStatus(wrong, 400);
    expect(wrong.body.error.details).toEqual({ reason: 'check_digit', expected: '3' });
    expectStatus(await w.as.buyer.post(url(w, `/parts/${part}/barcodes`)).set(csrf).send({ code: '12345' }), 400);

    // UPC-A, typed with spaces; found again in its 13-digit (leading zero) form.
    expectStatus(await w.as.owner.post(url(w, `/parts/${part}/barcodes`)).set(csrf).send({ code: '0 36000 24145 7' }), 201);
    const found = await w.as.viewer.get(url(w, '/barcodes/0036000241457'));
    expectStatus(found, 200);
    expect(found.body.part).toMatchObject({ id: part, number: 'WP-77' });
    expect(found.body.barcode.code).toBe('036000241457');

    const list = await w.as.mechanic.get(url(w, `/parts/${part}/barcodes`));
    expect(list.body.barcodes.map((b: { kind: string }) => b.kind)).toEqual(['GTIN-13', 'GTIN-12']);
  });

  it('a valid code on no part answers 404 barcode_unknown (to offer attaching it); an invalid one 400', async () => {
    const unknown = await w.as.viewer.get(url(w, '/barcodes/12345670'));
    expectStatus(unknown, 404);
    expect(unknown.body.error.details).toEqual({ reason: 'barcode_unknown', code: '12345670' });
    expectStatus(await w.as.viewer.get(url(w, '/barcodes/12345671')), 400);
  });

  it('a code sits on one part of a shop; another shop may use it; roles and tenancy hold; writes are audited', async () => {
    const a = await w.addPart('BC-A');
    const b = await w.addPart('BC-B');
    expectStatus(await w.as.owner.post(url(w, `/parts/${a}/barcodes`)).set(csrf).send({ code: '12345670' }), 201);
    const taken = await w.as.owner.post(url(w, `/parts/${b}/barcodes`)).set(csrf).send({ code: '12345670' });
    expectStatus(taken, 409);
    expect(taken.body.error.message).toContain('BC-A');

    const theirs = await other.addPart('BC-OTHER');
    expectStatus(await other.as.owner.post(url(other, `/parts/${theirs}/barcodes`)).set(csrf).send({ code: '12345670' }), 201);
    expect((await other.as.owner.get(url(other, '/barcodes/12345670'))).body.part.id).toBe(theirs);
    expectStatus(await other.as.owner.post(url(other, `/parts/${a}/barcodes`)).set(csrf).send({ code: '036000241457' }), 404);

    expectStatus(await w.as.mechanic.post(url(w, `/parts/${b}/barcodes`)).set(csrf).send({ code: '036000241457' }), 403);
    expectStatus(await w.as.viewer.post(url(w, `/parts/${b}/barcodes`)).set(csrf).send({ code: '036000241457' }), 403);

    const list = await w.as.owner.get(url(w, `/parts/${a}/barcodes`));
    const id = list.body.barcodes[0].id as string;
    expectStatus(await other.as.owner.delete(url(other, `/parts/${a}/barcodes/${id}`)).set(csrf), 404);
    expectStatus(await w.as.mechanic.delete(url(w, `/parts/${a}/barcodes/${id}`)).set(csrf), 403);
    expectStatus(await w.as.buyer.delete(url(w, `/parts/${a}/barcodes/${id}`)).set(csrf), 204);
    expectStatus(await w.as.owner.get(url(w, '/barcodes/12345670')), 404);

    const events = await w.ctx.db.reader.find(AuditEventEntity, { where: { shopId: w.shopId, entityId: a } });
    expect(events.map((e) => e.action)).toEqual(expect.arrayContaining(['part.barcode_attached', 'part.barcode_detached']));
  });

  it('the lookup finds a part by its supplier barcode, scanned in any of its forms, and only in its own shop', async () => {
    const part = await w.addPart('CB-40', { description: 'Carburettor float bowl gasket' });
    // EAN-8 9638507|4, the widely cited EAN-8 example (from memory; its check digit is verified by libs/domain).
    expectStatus(await w.as.buyer.post(url(w, `/parts/${part}/barcodes`)).set(csrf).send({ code: '96385074' }), 201);
    for (const typed of ['96385074', '0000 0096 3850 74']) {
      const res = await w.as.mechanic.get(url(w, `/parts/search?q=${encodeURIComponent(typed)}`));
      expectStatus(res, 200);
      expect(res.body.results[0]).toMatchObject({ id: part, number: 'CB-40', match: 'exact', reason: `supplier barcode ${typed.replace(/\s/g, '')}` });
    }
    const elsewhere = await other.as.mechanic.get(url(other, '/parts/search?q=96385074'));
    expect(elsewhere.body.results.map((r: { id: string }) => r.id)).not.toContain(part);
    // A wrong check digit is just a number typed: no barcode match.
    const wrong = await w.as.mechanic.get(url(w, '/parts/search?q=96385075'));
    expect(wrong.body.results.filter((r: { reason: string }) => r.reason.startsWith('supplier barcode'))).toEqual([]);
  });
});
