import { holdStatuses, stockConditions, valuationMethods, type FillOptionStock, type Hold, type PartStockResponse, type SerialItem, type StockSummary } from '@tappet/contracts';
import { finite, finiteOrNull, flag, handChecked, id, idOrNull, integer, list, oneOf, record, text, textOrNull } from '../../../lib/hand-check';

// A part's stock answer (GET …/stock/parts/:partId), checked by hand rather than with
// partStockResponseSchema: with the purchasing and price answers, it was what still brought zod
// and three contract modules to the part page (docs/decisions/029-part-panels-without-zod.md).
// part-panel-checks.test.ts holds it to the contract's schema, case by case and on generated answers.

type Valuation = PartStockResponse['valuation'][number];
type SummaryLine = StockSummary['lines'][number];
type OptionPart = FillOptionStock['parts'][number];

function summaryLine(v: unknown): SummaryLine {
  const l = record(v);
  return { binId: id(l['binId']), binCode: text(l['binCode']), condition: oneOf(stockConditions, l['condition']), onHand: integer(l['onHand']), held: integer(l['held']), free: integer(l['free']) };
}

function stockSummary(v: unknown): StockSummary {
  const s = record(v);
  return { onHand: integer(s['onHand']), held: integer(s['held']), free: integer(s['free']), lines: list(s['lines'], summaryLine) };
}

function hold(v: unknown): Hold {
  const h = record(v);
  return {
    id: id(h['id']),
    partId: id(h['partId']),
    partNumber: text(h['partNumber']),
    partDescription: text(h['partDescription']),
    binId: id(h['binId']),
    binCode: text(h['binCode']),
    condition: oneOf(stockConditions, h['condition']),
    quantity: integer(h['quantity']),
    purpose: text(h['purpose']),
    jobId: idOrNull(h['jobId']),
    status: oneOf(holdStatuses, h['status']),
    createdAt: text(h['createdAt']),
    createdByName: textOrNull(h['createdByName']),
    closedAt: textOrNull(h['closedAt']),
  };
}

function serial(v: unknown): SerialItem {
  const s = record(v);
  return {
    id: id(s['id']),
    serial: text(s['serial']),
    binId: idOrNull(s['binId']),
    binCode: textOrNull(s['binCode']),
    condition: oneOf(stockConditions, s['condition']),
    costMinor: integer(s['costMinor']),
    inStock: flag(s['inStock']),
    receivedAt: text(s['receivedAt']),
  };
}

function valuation(v: unknown): Valuation {
  const x = record(v);
  return {
    condition: oneOf(stockConditions, x['condition']),
    method: oneOf(valuationMethods, x['method']),
    quantity: integer(x['quantity']),
    valueMinor: integer(x['valueMinor']),
    unitCostMinor: finiteOrNull(x['unitCostMinor']),
  };
}

function optionPart(v: unknown): OptionPart {
  const p = record(v);
  return { partId: id(p['partId']), number: text(p['number']), description: text(p['description']), quantity: finite(p['quantity']), stock: stockSummary(p['stock']) };
}

function fillOption(v: unknown): FillOptionStock {
  const o = record(v);
  return { via: list(o['via'], text), needsChanges: flag(o['needsChanges']), parts: list(o['parts'], optionPart) };
}

/** GET …/stock/parts/:partId, with the same `safeParse` the API client calls on a zod schema. */
export const partStockCheck = handChecked((data): PartStockResponse => {
  const d = record(data);
  return {
    partId: id(d['partId']),
    number: text(d['number']),
    stock: stockSummary(d['stock']),
    holds: list(d['holds'], hold),
    serials: list(d['serials'], serial),
    valuation: list(d['valuation'], valuation),
    fillOptions: list(d['fillOptions'], fillOption),
    currency: text(d['currency']),
  };
});
