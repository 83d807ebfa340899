import { gs1CheckDigit } from '@tappet/domain';
import type { Database } from '../../db/write-lock';
import { FakeClock } from '../../lib/clock';
import { createBarcodesService } from './barcodes.service';

/** A valid GTIN-13 (right GS1 check digit) that is new every call, for attach samples. */
export function freshGtin13(): string {
  const body = `2${String(Math.floor(Math.random() * 1e11)).padStart(11, '0')}`;
  return body + gs1CheckDigit(body)!;
}

/** Barcodes on a part for route tests; spares are handed out one per call so detaching can repeat. */
export interface BarcodesFixture {
  /** A code attached to `partId`, for the scan lookup. */
  code: string;
  nextBarcodeId(): string;
}

export async function seedBarcodesFixture(db: Database, shopId: string, partId: string, spare = 12): Promise<BarcodesFixture> {
  const barcodes = createBarcodesService({ db, clock: new FakeClock() });
  const actor = { userId: null };
  const main = await barcodes.attach(shopId, partId, freshGtin13(), actor);
  const ids: string[] = [];
  for (let i = 0; i < spare; i++) ids.push((await barcodes.attach(shopId, partId, freshGtin13(), actor)).id);
  return {
    code: main.code,
    nextBarcodeId: () => {
      const id = ids.shift();
      if (!id) throw new Error('The barcodes fixture ran out of spare barcodes.');
      return id;
    },
  };
}
