import type { Listing, PartPurchasingResponse } from '@tappet/contracts';
import { flag, handChecked, id, idOrNull, integer, integerOrNull, list, record, text, textOrNull } from '../../../lib/hand-check';

// A part's purchasing answer (GET or PUT …/purchasing/parts/:partId), checked by hand rather than
// with partPurchasingResponseSchema, so that the part page loads no zod
// (docs/decisions/029-part-panels-without-zod.md). part-panel-checks.test.ts holds it to the
// contract's schema, case by case and on generated answers.

function listing(v: unknown): Listing {
  const l = record(v);
  return {
    id: id(l['id']),
    supplierId: id(l['supplierId']),
    supplierName: text(l['supplierName']),
    currency: text(l['currency']),
    partId: id(l['partId']),
    partNumber: text(l['partNumber']),
    partDescription: text(l['partDescription']),
    supplierNumber: textOrNull(l['supplierNumber']),
    priceMinor: integer(l['priceMinor']),
    packSize: integer(l['packSize']),
    minOrderQty: integer(l['minOrderQty']),
    leadTimeDays: integerOrNull(l['leadTimeDays']),
    lastPaidUnitMinor: integerOrNull(l['lastPaidUnitMinor']),
    lastPaidAt: textOrNull(l['lastPaidAt']),
    shopCurrency: text(l['shopCurrency']),
    preferred: flag(l['preferred']),
  };
}

/** The part's purchasing answer, with the same `safeParse` the API client calls on a zod schema. */
export const partPurchasingCheck = handChecked((data): PartPurchasingResponse => {
  const d = record(data);
  return {
    partId: id(d['partId']),
    preferredSupplierId: idOrNull(d['preferredSupplierId']),
    minQty: integerOrNull(d['minQty']),
    maxQty: integerOrNull(d['maxQty']),
    listings: list(d['listings'], listing),
  };
});
