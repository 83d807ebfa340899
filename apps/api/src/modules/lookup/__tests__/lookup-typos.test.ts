import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { partSearchQuerySchema } from '@tappet/contracts';
import { normalisePartNumber, seededRandom } from '@tappet/domain';
import { createTestContext, onPostgres, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { PartEntity } from '../../catalogue/catalogue.entity';
import { createCatalogueService } from '../../catalogue/catalogue.service';
import { createLookupService, type LookupService } from '../lookup.service';
import { databasePartSearchIndex } from '../postgres-part-search-index';

let ctx: TestContext;
let lookup: LookupService;
let shopId: string;
const catalogue: Array<{ id: string; number: string }> = [];


/** Every printed number one edit from `number` on its normalised key: removed, added, changed or swapped characters. */
function oneEditVariants(key: string, alphabet: string): string[] {
  const out = new Set<string>();
  for (let i = 0; i <= key.length; i++) {
    for (const c of alphabet) out.add(key.slice(0, i) + c + key.slice(i));
    if (i < key.length) {
      out.add(key.slice(0, i) + key.slice(i + 1));
      for (const c of alphabet) if (c !== key[i]) out.add(key.slice(0, i) + c + key.slice(i + 1));
    }
    if (i + 1 < key.length) out.add(key.slice(0, i) + key[i + 1] + key[i] + key.slice(i + 2));
  }
  out.delete(key);
  return [...out].filter((v) => v.length > 0);
}

beforeAll(async () => {
  ctx = await createTestContext();
  const shop = await seedShop(ctx, ['mechanic']);
  shopId = shop.shop.id;
  const rnd = seededRandom(1971);
  const pick = (chars: string) => chars[Math.floor(rnd() * chars.length)]!;
  const letters = 'ABCDEFGHJKLMNPRSTUVWXYZ';
  const numbers = new Set<string>();
  // Numbers shaped like the demo catalogue's: "71-3456", "GK-1244", "VM/00871", "BRK-55120".
  while (numbers.size < 100) {
    const shape = numbers.size % 4;
    const digits = (n: number) => Array.from({ length: n }, () => pick('0123456789')).join('');
    if (shape === 0) numbers.add(`${digits(2)}-${digits(4)}`);
    else if (shape === 1) numbers.add(`${pick(letters)}${pick(letters)}-${digits(4)}`);
    else if (shape === 2) numbers.add(`${pick(letters)}${pick(letters)}/${digits(5)}`);
    else numbers.add(`${pick(letters)}${pick(letters)}${pick(letters)}-${digits(5)}`);
  }
  const at = new Date();
  const rows = [...numbers].map((number) => ({ id: randomUUID(), shopId, number, key: normalisePartNumber(number), description: `Generated part ${number}`, origin: 'genuine' as const, maker: null, category: null, unit: 'each', status: 'available' as const, notes: null, createdAt: at, updatedAt: at }));
  await ctx.db.write((manager) => manager.insert(PartEntity, rows).then(() => undefined));
  catalogue.push(...rows.map((r) => ({ id: r.id, number: r.number })));
  lookup = createLookupService({ index: databasePartSearchIndex(() => ctx.db.reader), graphOf: createCatalogueService({ db: ctx.db, clock: ctx.clock }).graphOf });
  // The HTTP route answers the same as the service.
  const agent = await signedInAgent(ctx.app, shop.byRole.mechanic.email, shop.password);
  const res = await agent.get(`/api/shops/${shopId}/parts/search`).query({ q: catalogue[0]!.number });
  expect(res.body.results[0].id).toBe(catalogue[0]!.id);
  expect((await request(ctx.app).get(`/api/shops/${shopId}/parts/search`).query({ q: 'x' })).status).toBe(401);
});
afterAll(() => ctx.close());

describe('typo recall', () => {
  it('every one-edit variant of 100 generated numbers finds its part in the top 3', async () => {
    const misses: string[] = [];
    let tried = 0;
    for (const part of catalogue) {
      // Changed and added characters: digits at both ends of the range, the lookalike letters O and I, two others.
      for (const variant of oneEditVariants(normalisePartNumber(part.number), '09OIAX')) {
        tried++;
        const { results } = await lookup.search(shopId, partSearchQuerySchema.parse({ q: variant, limit: 3 }));
        if (!results.some((r) => r.id === part.id)) misses.push(`${variant} → ${part.number}: ${results.map((r) => r.number).join(', ')}`);
      }
    }
    expect(tried).toBeGreaterThan(9_000);
    expect(misses.slice(0, 20)).toEqual([]);
    // Thousands of searches one after another: on PostgreSQL each is several network round trips, so more time (recall is what is tested, not speed).
  }, onPostgres() ? 900_000 : 120_000);
});
