import { lineageGraphResponseSchema, partDetailResponseSchema } from '@tappet/contracts';
import { describe, it } from 'vitest';
import { expectAgreement, expectAgreementOnEveryChange } from '../../../testing/hand-check-agreement';
import { lineageGraphCheck, partDetailCheck } from './part-page-checks';

const ids = ['3f2b8c1e-5d4a-4c6b-9e7f-1a2b3c4d5e6f', '9a8b7c6d-5e4f-4a3b-8c2d-1e0f9a8b7c6d', '00000000-0000-0000-0000-000000000000', 'ffffffff-ffff-ffff-ffff-ffffffffffff'] as const;

const part = {
  id: ids[0],
  number: 'QX 1044/B',
  key: 'QX1044B',
  description: 'Float chamber gasket',
  origin: 'genuine',
  maker: 'Orrin Components',
  category: null,
  unit: 'each',
  status: 'nla',
  notes: null,
  supplierNumbers: ['OC-1044', '77-210'],
  createdAt: '2026-01-05T09:00:00.000Z',
  updatedAt: '2026-02-11T14:30:00.000Z',
};
const link = {
  id: ids[1],
  fromPartId: ids[0],
  fromNumber: 'QX 1044/B',
  kind: 'replaced_by',
  toPartId: null,
  toNumber: 'QX 1044/C',
  quantity: 1.5,
  interchange: 'with_changes',
  effectiveDate: '1971-04-01',
  sourceReference: 'Service letter 12',
  note: null,
};
const fitment = { id: ids[2], partId: ids[0], marque: 'Corran', model: 'Tern 1300', yearFrom: 1968, yearTo: null, frameFrom: 'T13-0001', frameTo: null };
const detail = {
  part,
  linksFrom: [link],
  linksTo: [{ ...link, id: ids[3], toPartId: ids[0], kind: 'equivalent', interchange: 'both' }],
  fitments: [fitment],
  current: [{ partId: ids[1], number: 'QX 1044/C', quantity: 2 }, { number: 'QX 9', quantity: 1 }],
  problems: [{ kind: 'unknown_number', numbers: ['QX 9'] }],
};
const lineage = {
  nodes: [
    { partId: ids[0], number: 'QX 1044/B', description: 'Float chamber gasket', status: 'nla', isCurrent: false, isFocus: true, inProblem: false },
    { partId: ids[1], number: 'QX 1044/C', description: 'Gasket set', status: 'available', isCurrent: true, isFocus: false, inProblem: true },
  ],
  edges: [{ from: ids[0], to: ids[1], kind: 'kit_contains', interchange: 'one_way', quantity: 3 }],
  truncated: false,
};

type Json = unknown;

/** Each case: a change to a good part answer; the hand check must agree with the contract's schema. */
const detailCases: Array<[string, (d: typeof detail) => Json]> = [
  ['the good answer', (d) => d],
  ['empty lists', (d) => ({ ...d, linksFrom: [], linksTo: [], fitments: [], current: [], problems: [] })],
  ['extra keys (dropped)', (d) => ({ ...d, extra: 1, part: { ...d.part, extra: 2 }, linksFrom: [{ ...link, extra: 3 }], current: [{ number: 'A', quantity: 1, extra: 4 }] })],
  ['not an object', () => 'part'],
  ['null', () => null],
  ['an array', (d) => [d]],
  ['part missing', ({ part: _, ...d }) => d],
  ['part id not a uuid', (d) => ({ ...d, part: { ...d.part, id: 'p-1' } })],
  ['part id of version 9', (d) => ({ ...d, part: { ...d.part, id: '3f2b8c1e-5d4a-9c6b-9e7f-1a2b3c4d5e6f' } })],
  ['unknown origin', (d) => ({ ...d, part: { ...d.part, origin: 'replica' } })],
  ['unknown status', (d) => ({ ...d, part: { ...d.part, status: 'gone' } })],
  ['maker missing', (d) => ({ ...d, part: { ...d.part, maker: undefined } })],
  ['supplier numbers holding a number', (d) => ({ ...d, part: { ...d.part, supplierNumbers: ['A', 7] } })],
  ['supplier numbers a string', (d) => ({ ...d, part: { ...d.part, supplierNumbers: 'A' } })],
  ['link to no part', (d) => ({ ...d, linksFrom: [{ ...link, toPartId: undefined }] })],
  ['link quantity a string', (d) => ({ ...d, linksFrom: [{ ...link, quantity: '1' }] })],
  ['unknown link kind', (d) => ({ ...d, linksTo: [{ ...link, kind: 'supersedes' }] })],
  ['unknown interchange', (d) => ({ ...d, linksTo: [{ ...link, interchange: 'never' }] })],
  ['fitment year fractional', (d) => ({ ...d, fitments: [{ ...fitment, yearFrom: 1968.5 }] })],
  ['fitment year a string', (d) => ({ ...d, fitments: [{ ...fitment, yearTo: '1970' }] })],
  ['current without a number', (d) => ({ ...d, current: [{ partId: ids[1], quantity: 1 }] })],
  ['current with a bad id', (d) => ({ ...d, current: [{ partId: 'x', number: 'A', quantity: 1 }] })],
  ['current with a null id', (d) => ({ ...d, current: [{ partId: null, number: 'A', quantity: 1 }] })],
  ['unknown problem kind', (d) => ({ ...d, problems: [{ kind: 'loop', numbers: [] }] })],
  ['problems an object', (d) => ({ ...d, problems: {} })],
];

const lineageCases: Array<[string, (g: typeof lineage) => Json]> = [
  ['the good answer', (g) => g],
  ['an empty graph', () => ({ nodes: [], edges: [], truncated: true })],
  ['extra keys (dropped)', (g) => ({ ...g, extra: 1, nodes: g.nodes.map((n) => ({ ...n, extra: 2 })), edges: g.edges.map((e) => ({ ...e, extra: 3 })) })],
  ['null', () => null],
  ['truncated missing', ({ truncated: _, ...g }) => g],
  ['truncated a string', (g) => ({ ...g, truncated: 'false' })],
  ['node id not a uuid', (g) => ({ ...g, nodes: [{ ...g.nodes[0], partId: 'n1' }] })],
  ['node flag null', (g) => ({ ...g, nodes: [{ ...g.nodes[0], isCurrent: null }] })],
  ['node unknown status', (g) => ({ ...g, nodes: [{ ...g.nodes[0], status: 'lost' }] })],
  ['edge quantity missing', (g) => ({ ...g, edges: [{ ...g.edges[0], quantity: undefined }] })],
  ['edge unknown kind', (g) => ({ ...g, edges: [{ ...g.edges[0], kind: 'fits' }] })],
  ['edges an object', (g) => ({ ...g, edges: { 0: g.edges[0] } })],
];

describe('the hand-written part page checks', () => {
  it.each(detailCases)('the part check agrees with the contract schema: %s', (_name, change) => {
    expectAgreement(partDetailCheck, partDetailResponseSchema, change(structuredClone(detail)));
  });

  it.each(lineageCases)('the lineage check agrees with the contract schema: %s', (_name, change) => {
    expectAgreement(lineageGraphCheck, lineageGraphResponseSchema, change(structuredClone(lineage)));
  });

  // Property: whatever single value of a good answer is changed or removed, both checks still
  // agree with the contract's schemas (and give the same result when they accept).
  it('agrees with the contract schemas when any one value of an answer is changed', () => {
    const nearMisses = ['nla', 'genuine', 'both', 'cycle', 'replaced_by', ids[1], 'QX-1'];
    expectAgreementOnEveryChange(partDetailCheck, partDetailResponseSchema, detail, nearMisses);
    expectAgreementOnEveryChange(lineageGraphCheck, lineageGraphResponseSchema, lineage, nearMisses);
  });
});
