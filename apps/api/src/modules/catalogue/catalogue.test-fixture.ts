import { randomUUID } from 'node:crypto';
import type { Database } from '../../db/write-lock';
import { FitmentEntity, PartEntity, PartLinkEntity } from './catalogue.entity';

/** Ids of a small catalogue made for route tests; links and fitments are handed out one per call so deletes can repeat. */
export interface CatalogueFixture {
  partId: string;
  otherPartId: string;
  nextLinkId(): string;
  nextFitmentId(): string;
}

/**
 * Writes two parts, `spare` links between them (to distinct numbers) and `spare` fitments into a
 * shop, for tests that call every route as every role.
 */
export async function seedCatalogueFixture(db: Database, shopId: string, spare = 20): Promise<CatalogueFixture> {
  const at = new Date(Date.UTC(2026, 0, 15));
  const part = (number: string) => ({ id: randomUUID(), shopId, number, key: number.replace(/[^A-Z0-9]/g, ''), description: `Fixture part ${number}`, origin: 'genuine' as const, maker: null, category: 'Fixture', unit: 'each', status: 'available' as const, notes: null, createdAt: at, updatedAt: at });
  const a = part('FX-1000');
  const b = part('FX-2000');
  const linkIds = Array.from({ length: spare }, () => randomUUID());
  const fitmentIds = Array.from({ length: spare }, () => randomUUID());
  await db.write(async (manager) => {
    await manager.insert(PartEntity, [a, b]);
    await manager.insert(
      PartLinkEntity,
      linkIds.map((id, i) => ({ id, shopId, fromPartId: a.id, kind: 'equivalent' as const, toPartId: null, toNumber: `FX-9${String(i).padStart(3, '0')}`, toKey: `FX9${String(i).padStart(3, '0')}`, quantity: 1, interchange: 'both' as const, effectiveDate: null, sourceReference: null, note: null })),
    );
    await manager.insert(FitmentEntity, fitmentIds.map((id) => ({ id, shopId, partId: a.id, marque: 'Fixture', model: 'Test', yearFrom: 1968, yearTo: 1972, frameFrom: null, frameTo: null })));
  });
  const take = (ids: string[]) => () => {
    const id = ids.shift();
    if (!id) throw new Error('The catalogue fixture ran out of spare ids.');
    return id;
  };
  return { partId: a.id, otherPartId: b.id, nextLinkId: take(linkIds), nextFitmentId: take(fitmentIds) };
}
