import { interchanges, linkKinds, partOrigins, partStatuses, type Fitment, type LineageGraphResponse, type LineageProblemView, type Part, type PartDetailResponse, type PartLink } from '@tappet/contracts';
import { finite, flag, handChecked, id, idOrNull, integerOrNull, list, oneOf, record, text, textOrNull } from '../../../lib/hand-check';

// The part page's two answers (the part, its lineage graph), checked by hand rather than with
// partDetailResponseSchema and lineageGraphResponseSchema: the page is opened straight from a
// search or a label's code, and loading zod (27 KB gzipped, and its start-up work) for them was
// the largest step between the page's code and its first paint on a slow phone
// (docs/decisions/027-part-page-first-load.md). part-page-checks.test.ts holds both to the
// contract's schemas, case by case and on generated answers.

type NumberQuantity = PartDetailResponse['current'][number];
type LineageNode = LineageGraphResponse['nodes'][number];
type LineageEdge = LineageGraphResponse['edges'][number];

const problemKinds = ['cycle', 'dead_end', 'unknown_number', 'invalid_quantity'] as const;

function part(v: unknown): Part {
  const p = record(v);
  return {
    id: id(p['id']),
    number: text(p['number']),
    key: text(p['key']),
    description: text(p['description']),
    origin: oneOf(partOrigins, p['origin']),
    maker: textOrNull(p['maker']),
    category: textOrNull(p['category']),
    unit: text(p['unit']),
    status: oneOf(partStatuses, p['status']),
    notes: textOrNull(p['notes']),
    supplierNumbers: list(p['supplierNumbers'], text),
    createdAt: text(p['createdAt']),
    updatedAt: text(p['updatedAt']),
  };
}

function link(v: unknown): PartLink {
  const l = record(v);
  return {
    id: id(l['id']),
    fromPartId: id(l['fromPartId']),
    fromNumber: text(l['fromNumber']),
    kind: oneOf(linkKinds, l['kind']),
    toPartId: idOrNull(l['toPartId']),
    toNumber: text(l['toNumber']),
    quantity: finite(l['quantity']),
    interchange: oneOf(interchanges, l['interchange']),
    effectiveDate: textOrNull(l['effectiveDate']),
    sourceReference: textOrNull(l['sourceReference']),
    note: textOrNull(l['note']),
  };
}

function fitment(v: unknown): Fitment {
  const f = record(v);
  return {
    id: id(f['id']),
    partId: id(f['partId']),
    marque: text(f['marque']),
    model: text(f['model']),
    yearFrom: integerOrNull(f['yearFrom']),
    yearTo: integerOrNull(f['yearTo']),
    frameFrom: textOrNull(f['frameFrom']),
    frameTo: textOrNull(f['frameTo']),
  };
}

function numberQuantity(v: unknown): NumberQuantity {
  const n = record(v);
  // Like zod's object(): the optional id comes through only when present.
  const out: NumberQuantity = { number: text(n['number']), quantity: finite(n['quantity']) };
  if (n['partId'] !== undefined) out.partId = id(n['partId']);
  return out;
}

function problem(v: unknown): LineageProblemView {
  const p = record(v);
  return { kind: oneOf(problemKinds, p['kind']), numbers: list(p['numbers'], text) };
}

/** GET …/parts/:partId, with the same `safeParse` the API client calls on a zod schema. */
export const partDetailCheck = handChecked((data): PartDetailResponse => {
  const d = record(data);
  return {
    part: part(d['part']),
    linksFrom: list(d['linksFrom'], link),
    linksTo: list(d['linksTo'], link),
    fitments: list(d['fitments'], fitment),
    current: list(d['current'], numberQuantity),
    problems: list(d['problems'], problem),
  };
});

function node(v: unknown): LineageNode {
  const n = record(v);
  return {
    partId: id(n['partId']),
    number: text(n['number']),
    description: text(n['description']),
    status: oneOf(partStatuses, n['status']),
    isCurrent: flag(n['isCurrent']),
    isFocus: flag(n['isFocus']),
    inProblem: flag(n['inProblem']),
  };
}

function edge(v: unknown): LineageEdge {
  const e = record(v);
  return { from: id(e['from']), to: id(e['to']), kind: oneOf(linkKinds, e['kind']), interchange: oneOf(interchanges, e['interchange']), quantity: finite(e['quantity']) };
}

/** GET …/parts/:partId/lineage, with the same `safeParse` the API client calls on a zod schema. */
export const lineageGraphCheck = handChecked((data): LineageGraphResponse => {
  const g = record(data);
  return { nodes: list(g['nodes'], node), edges: list(g['edges'], edge), truncated: flag(g['truncated']) };
});
