import { describe, expect, it } from 'vitest';
import { LineageInputError, UnknownPartError } from './lineage-index';
import { buildLineageGraph, LineageGraph } from './lineage-graph';
import { type CanFillResult, type LineageLink, type LineagePart } from './types';
import { equivalent, idOf, kitContains, part, replacedBy, toUnknown } from './testing/catalogue';

/** Option part sets as "number×quantity" strings, for readable expectations. */
function optionSets(result: CanFillResult): string[][] {
  return result.options.map((option) => option.parts.map((p) => `${p.number}×${p.exactQuantity}`).sort());
}

function current(graph: LineageGraph, number: string): string[] {
  return graph.currentParts(idOf(number)).current.map((p) => `${p.number}×${p.exactQuantity}`).sort();
}

describe('currentParts', () => {
  it('follows a chain of several replacements to its end, multiplying quantities', () => {
    const graph = buildLineageGraph(
      [part('71-1000', 'nla'), part('71-1001', 'nla'), part('71-1002', 'nla'), part('71-1003')],
      [replacedBy('71-1000', '71-1001'), replacedBy('71-1001', '71-1002', { quantity: 2 }), replacedBy('71-1002', '71-1003', { quantity: 3 })],
    );
    const result = graph.currentParts(idOf('71-1000'));
    expect(result.current).toEqual([{ partId: idOf('71-1003'), number: '71-1003', quantity: 6, exactQuantity: '6' }]);
    expect(result.unresolved).toEqual([]);
    expect(result.problems).toEqual([]);
    expect(current(graph, '71-1002')).toEqual(['71-1003×3']);
  });

  it('gives a part with no onward replacement as its own current part', () => {
    const graph = buildLineageGraph([part('71-2000'), part('71-2001')], [replacedBy('71-2000', '71-2001')]);
    expect(current(graph, '71-2001')).toEqual(['71-2001×1']);
  });

  it('gives every piece of a split, needed together', () => {
    const graph = buildLineageGraph(
      [part('52-100', 'nla'), part('52-101'), part('52-102')],
      [replacedBy('52-100', '52-101'), replacedBy('52-100', '52-102', { quantity: 2 })],
    );
    expect(current(graph, '52-100')).toEqual(['52-101×1', '52-102×2']);
  });

  it('sums quantities where two paths reach the same part (a merge)', () => {
    // 52-200 splits into 52-201 and 52-202 (×2); both were later replaced by 52-210.
    const graph = buildLineageGraph(
      [part('52-200', 'nla'), part('52-201', 'nla'), part('52-202', 'nla'), part('52-210')],
      [
        replacedBy('52-200', '52-201'),
        replacedBy('52-200', '52-202', { quantity: 2 }),
        replacedBy('52-201', '52-210'),
        replacedBy('52-202', '52-210', { quantity: 3 }),
      ],
    );
    expect(current(graph, '52-200')).toEqual(['52-210×7']);
  });

  it('keeps quantities exact through halves and their inverses', () => {
    // 30-1 → ½ × 30-2 → 3 × 30-3 → 2 × 30-4, all interchangeable both ways.
    const graph = buildLineageGraph(
      [part('30-1'), part('30-2'), part('30-3'), part('30-4')],
      [replacedBy('30-1', '30-2', { quantity: 0.5 }), replacedBy('30-2', '30-3', { quantity: 3 }), replacedBy('30-3', '30-4', { quantity: 2 })],
    );
    expect(current(graph, '30-1')).toEqual(['30-4×3']);
    expect(current(graph, '30-2')).toEqual(['30-4×6']);
    // Backwards, one 30-4 is ½ 30-3, ⅙ 30-2 and ⅓ 30-1: exact, though ⅙ and ⅓ are not exact doubles.
    const back = graph.canFill(idOf('30-4')).options.map((o) => `${o.parts[0]?.number}×${o.parts[0]?.exactQuantity}`);
    expect(back).toEqual(['30-4×1', '30-3×1/2', '30-2×1/6', '30-1×1/3']);
    expect(graph.canFill(idOf('30-4')).options[3]?.parts[0]?.quantity).toBeCloseTo(1 / 3, 15);
  });

  it('treats a kit as a current part', () => {
    const graph = buildLineageGraph([part('40-1', 'nla'), part('40-K'), part('40-2')], [replacedBy('40-1', '40-K'), kitContains('40-K', '40-2', 4)]);
    expect(current(graph, '40-1')).toEqual(['40-K×1']);
  });

  it('stops at a cycle, reports it and lists the quantity as unresolved', () => {
    const graph = buildLineageGraph(
      [part('60-1', 'nla'), part('60-2', 'nla'), part('60-3', 'nla'), part('60-4', 'nla'), part('60-9')],
      [replacedBy('60-1', '60-2', { quantity: 2 }), replacedBy('60-2', '60-3'), replacedBy('60-3', '60-4'), replacedBy('60-4', '60-2'), replacedBy('60-3', '60-9')],
    );
    const result = graph.currentParts(idOf('60-1'));
    expect(result.current).toEqual([]);
    expect(result.unresolved).toEqual([{ partId: idOf('60-2'), number: '60-2', quantity: 2, exactQuantity: '2', reason: 'cycle' }]);
    expect(result.problems).toEqual([{ kind: 'cycle', numbers: ['60-2', '60-3', '60-4'], partIds: [idOf('60-2'), idOf('60-3'), idOf('60-4')] }]);
  });

  it('stops at a self-link', () => {
    const graph = buildLineageGraph([part('61-1', 'nla')], [replacedBy('61-1', '61-1')]);
    const result = graph.currentParts(idOf('61-1'));
    expect(result.current).toEqual([]);
    expect(result.unresolved.map((u) => u.reason)).toEqual(['cycle']);
    expect(result.problems).toEqual([{ kind: 'cycle', numbers: ['61-1'], partIds: [idOf('61-1')] }]);
  });

  it('reports a replacement by a number not in the catalogue, and its quantity as unresolved', () => {
    const graph = buildLineageGraph([part('62-1', 'nla'), part('62-2')], [replacedBy('62-1', '62-2'), toUnknown('replaced_by', '62-1', '62-9', { quantity: 2, id: 'L7' })]);
    const result = graph.currentParts(idOf('62-1'));
    expect(result.current.map((p) => p.number)).toEqual(['62-2']);
    expect(result.unresolved).toEqual([{ partId: null, number: '62-9', quantity: 2, exactQuantity: '2', reason: 'unknown_number' }]);
    expect(result.problems).toEqual([{ kind: 'unknown_number', numbers: ['62-9'], partIds: [idOf('62-1')], linkIds: ['L7'] }]);
  });

  it('ignores a link with an unusable quantity and reports it', () => {
    const graph = buildLineageGraph([part('63-1', 'nla'), part('63-2')], [replacedBy('63-1', '63-2', { quantity: 0 })]);
    const result = graph.currentParts(idOf('63-1'));
    expect(result.current).toEqual([]);
    expect(result.unresolved.map((u) => [u.number, u.reason])).toEqual([['63-2', 'invalid_quantity']]);
    expect(result.problems.map((p) => p.kind)).toEqual(['invalid_quantity']);
  });

  it('reports a dead end when the current part is nla and nothing can stand in for it', () => {
    const graph = buildLineageGraph([part('64-1', 'nla'), part('64-2', 'nla')], [replacedBy('64-1', '64-2', { interchange: 'one_way' })]);
    const result = graph.currentParts(idOf('64-1'));
    expect(result.current.map((p) => p.number)).toEqual(['64-2']);
    expect(result.problems).toEqual([{ kind: 'dead_end', numbers: ['64-1', '64-2'], partIds: [idOf('64-1'), idOf('64-2')] }]);
  });
});

describe('kitContents', () => {
  const parts = [part('K-1'), part('K-2'), part('80-1'), part('80-2'), part('80-3')];
  // K-1 holds 2 × 80-1 and 2 × sub-kit K-2; K-2 holds 3 × 80-2 and 1 × 80-1.
  const links = [kitContains('K-1', '80-1', 2), kitContains('K-1', 'K-2', 2), kitContains('K-2', '80-2', 3), kitContains('K-2', '80-1')];

  it('lists lines depth first with multiplied quantities, and totals per component', () => {
    const result = buildLineageGraph(parts, links).kitContents(idOf('K-1'));
    expect(result.items.map((i) => [i.number, i.exactQuantity, i.depth, i.parentPartId, i.isKit])).toEqual([
      ['80-1', '2', 1, idOf('K-1'), false],
      ['K-2', '2', 1, idOf('K-1'), true],
      ['80-2', '6', 2, idOf('K-2'), false],
      ['80-1', '2', 2, idOf('K-2'), false],
    ]);
    expect(result.totals.map((t) => [t.number, t.quantity]).sort()).toEqual([
      ['80-1', 4],
      ['80-2', 6],
    ]);
    expect(result.truncated).toBe(false);
    expect(result.problems).toEqual([]);
  });

  it('is empty for a part that is not a kit', () => {
    const result = buildLineageGraph(parts, links).kitContents(idOf('80-3'));
    expect(result.items).toEqual([]);
    expect(result.totals).toEqual([]);
  });

  it('does not loop on a kit that contains itself, and reports the cycle', () => {
    const graph = buildLineageGraph(parts, [...links, kitContains('K-2', 'K-1')]);
    const result = graph.kitContents(idOf('K-1'));
    expect(result.items.map((i) => i.number)).toEqual(['80-1', 'K-2', '80-2', '80-1', 'K-1']);
    expect(result.problems).toEqual([{ kind: 'cycle', numbers: ['K-1', 'K-2'], partIds: [idOf('K-1'), idOf('K-2')] }]);
  });

  it('cuts a huge expansion off at 1000 lines and says so', () => {
    // Four levels of sub-kits, each holding 6 kits of the next level: 6 + 36 + 216 + 1296 lines.
    const levels = ['KA', 'KB', 'KC', 'KD', 'KE'];
    const parts = levels.map((level) => part(level));
    const links = levels.slice(0, -1).map((level, i) => kitContains(level, levels[i + 1]!, 1));
    const repeated = links.flatMap((link) => Array.from({ length: 6 }, () => link));
    const result = buildLineageGraph(parts, repeated).kitContents(idOf('KA'));
    expect(result.truncated).toBe(true);
    expect(result.items).toHaveLength(1000);
    expect(result.problems).toEqual([]);
  });

  it('lists a line for a number not in the catalogue as unresolved', () => {
    const graph = buildLineageGraph(parts, [...links, toUnknown('kit_contains', 'K-2', '80-77', { quantity: 5 })]);
    const result = graph.kitContents(idOf('K-1'));
    expect(result.unresolved).toEqual([{ partId: null, number: '80-77', quantity: 10, exactQuantity: '10', reason: 'unknown_number' }]);
    expect(result.problems.map((p) => p.kind)).toEqual(['unknown_number']);
  });
});

describe('canFill', () => {
  it('offers the part itself when available, and newer parts along the chain', () => {
    const graph = buildLineageGraph(
      [part('10-1'), part('10-2', 'nla'), part('10-3')],
      [replacedBy('10-1', '10-2', { interchange: 'one_way' }), replacedBy('10-2', '10-3', { interchange: 'both', quantity: 2 })],
    );
    const result = graph.canFill(idOf('10-1'));
    expect(optionSets(result)).toEqual([['10-1×1'], ['10-3×2']]);
    expect(result.options[0]?.via).toEqual([]);
    expect(result.options[1]?.via).toEqual(['replaced_by:one_way 10-1 → 10-2', 'replaced_by:both 10-2 → 10-3 ×2']);
    expect(result.truncated).toBe(false);
  });

  it('never offers an nla part', () => {
    const graph = buildLineageGraph([part('11-1', 'nla'), part('11-2', 'nla')], [replacedBy('11-1', '11-2')]);
    expect(graph.canFill(idOf('11-1')).options).toEqual([]);
  });

  it('uses a one_way replacement only forwards', () => {
    const graph = buildLineageGraph([part('12-1'), part('12-2')], [replacedBy('12-1', '12-2', { interchange: 'one_way' })]);
    expect(optionSets(graph.canFill(idOf('12-1')))).toEqual([['12-1×1'], ['12-2×1']]);
    expect(optionSets(graph.canFill(idOf('12-2')))).toEqual([['12-2×1']]);
  });

  it('uses a both-ways replacement backwards at the inverse quantity', () => {
    // 13-1 was replaced by two 13-2: one 13-2 is filled by half a 13-1.
    const graph = buildLineageGraph([part('13-1'), part('13-2')], [replacedBy('13-1', '13-2', { quantity: 2 })]);
    const result = graph.canFill(idOf('13-2'));
    expect(optionSets(result)).toEqual([['13-2×1'], ['13-1×1/2']]);
    expect(result.options[1]?.parts[0]?.quantity).toBe(0.5);
    expect(result.options[1]?.via).toEqual(['replaced_by:both 13-1 → 13-2 ×2, used in reverse']);
  });

  it('flags a with_changes replacement and lists it after options needing no changes', () => {
    const graph = buildLineageGraph(
      [part('14-1', 'nla'), part('14-2'), part('14-3')],
      [replacedBy('14-1', '14-2', { interchange: 'with_changes' }), equivalent('14-1', '14-3')],
    );
    const result = graph.canFill(idOf('14-1'));
    expect(result.options.map((o) => [o.parts[0]?.number, o.needsChanges])).toEqual([
      ['14-3', false],
      ['14-2', true],
    ]);
    // And never backwards: the older part is not an option for the newer one.
    expect(optionSets(graph.canFill(idOf('14-2')))).toEqual([['14-2×1']]);
  });

  it('carries needsChanges along the rest of the path', () => {
    const graph = buildLineageGraph(
      [part('15-1', 'nla'), part('15-2', 'nla'), part('15-3')],
      [replacedBy('15-1', '15-2', { interchange: 'with_changes' }), replacedBy('15-2', '15-3', { interchange: 'both' })],
    );
    expect(graph.canFill(idOf('15-1')).options.map((o) => [o.parts[0]?.number, o.needsChanges])).toEqual([['15-3', true]]);
  });

  it('prefers a path without changes to a shorter one with changes', () => {
    const graph = buildLineageGraph(
      [part('16-1', 'nla'), part('16-2', 'nla'), part('16-3')],
      [replacedBy('16-1', '16-3', { interchange: 'with_changes' }), equivalent('16-1', '16-2'), equivalent('16-2', '16-3', { interchange: 'one_way' })],
    );
    const [only] = graph.canFill(idOf('16-1')).options;
    expect(only?.needsChanges).toBe(false);
    expect(only?.via).toHaveLength(2);
  });

  it('uses equivalents both ways when "both", and only from→to when "one_way"', () => {
    const graph = buildLineageGraph(
      [part('20-1'), part('RX-20'), part('RX-21')],
      [equivalent('20-1', 'RX-20', { interchange: 'both' }), equivalent('20-1', 'RX-21', { interchange: 'one_way' })],
    );
    expect(optionSets(graph.canFill(idOf('20-1')))).toEqual([['20-1×1'], ['RX-20×1'], ['RX-21×1']]);
    expect(optionSets(graph.canFill(idOf('RX-20')))).toEqual([['RX-20×1'], ['20-1×1'], ['RX-21×1']]);
    // RX-21 may stand in for 20-1, never the reverse.
    expect(optionSets(graph.canFill(idOf('RX-21')))).toEqual([['RX-21×1']]);
  });

  it('offers an equivalent of a current part, transitively', () => {
    const graph = buildLineageGraph(
      [part('21-1', 'nla'), part('21-2', 'nla'), part('RX-21')],
      [replacedBy('21-1', '21-2', { interchange: 'one_way', quantity: 2 }), equivalent('21-2', 'RX-21', { interchange: 'one_way' })],
    );
    const result = graph.canFill(idOf('21-1'));
    expect(optionSets(result)).toEqual([['RX-21×2']]);
    expect(result.options[0]?.via).toEqual(['replaced_by:one_way 21-1 → 21-2 ×2', 'equivalent:one_way 21-2 → RX-21']);
  });

  it('offers the pieces of a split as one option', () => {
    const graph = buildLineageGraph(
      [part('22-1', 'nla'), part('22-2'), part('22-3')],
      [replacedBy('22-1', '22-2', { interchange: 'one_way' }), replacedBy('22-1', '22-3', { quantity: 2, interchange: 'one_way' })],
    );
    const result = graph.canFill(idOf('22-1'));
    expect(optionSets(result)).toEqual([['22-2×1', '22-3×2']]);
    expect(result.options[0]?.via).toEqual(['replaced_by:split 22-1 → 22-2 (one_way) + 2×22-3 (one_way)']);
    // A piece alone is not filled by its older, one-piece part.
    expect(optionSets(graph.canFill(idOf('22-2')))).toEqual([['22-2×1']]);
  });

  it('does not offer a split when one piece cannot be filled', () => {
    const graph = buildLineageGraph([part('23-1', 'nla'), part('23-2'), part('23-3', 'nla')], [replacedBy('23-1', '23-2'), replacedBy('23-1', '23-3')]);
    expect(graph.canFill(idOf('23-1')).options).toEqual([]);
  });

  it('combines the options of split pieces, capped and flagged as truncated', () => {
    const parts = [part('24-1', 'nla'), part('24-2'), part('24-3'), part('RX-242'), part('RX-243')];
    const links = [replacedBy('24-1', '24-2'), replacedBy('24-1', '24-3'), equivalent('24-2', 'RX-242'), equivalent('24-3', 'RX-243')];
    const graph = buildLineageGraph(parts, links);
    expect(optionSets(graph.canFill(idOf('24-1'))).sort()).toEqual(
      [
        ['24-2×1', '24-3×1'],
        ['24-2×1', 'RX-243×1'],
        ['24-3×1', 'RX-242×1'],
        ['RX-242×1', 'RX-243×1'],
      ].sort(),
    );
    const capped = graph.canFill(idOf('24-1'), { maxOptions: 3 });
    expect(capped.options).toHaveLength(3);
    expect(capped.truncated).toBe(true);
  });

  it('sums a part that fills two pieces of a split', () => {
    const graph = buildLineageGraph(
      [part('25-1', 'nla'), part('25-2', 'nla'), part('25-3', 'nla'), part('25-9')],
      [replacedBy('25-1', '25-2'), replacedBy('25-1', '25-3', { quantity: 2 }), replacedBy('25-2', '25-9'), replacedBy('25-3', '25-9')],
    );
    expect(optionSets(graph.canFill(idOf('25-1')))).toEqual([['25-9×3']]);
  });

  it('terminates on cycles and offers what the cycle reaches', () => {
    const graph = buildLineageGraph(
      [part('26-1', 'nla'), part('26-2', 'nla'), part('RX-26')],
      [replacedBy('26-1', '26-2'), replacedBy('26-2', '26-1'), equivalent('26-2', 'RX-26')],
    );
    expect(optionSets(graph.canFill(idOf('26-1')))).toEqual([['RX-26×1']]);
  });

  it('dedupes options with the same parts', () => {
    // Two routes to 27-3: directly as an equivalent and through 27-2.
    const graph = buildLineageGraph(
      [part('27-1', 'nla'), part('27-2', 'nla'), part('27-3')],
      [replacedBy('27-1', '27-2'), equivalent('27-1', '27-3'), replacedBy('27-2', '27-3')],
    );
    expect(optionSets(graph.canFill(idOf('27-1')))).toEqual([['27-3×1']]);
  });
});

describe('problems', () => {
  const parts: LineagePart[] = [
    part('90-1', 'nla'),
    part('90-2', 'nla'),
    part('90-3', 'nla'),
    part('91-1', 'nla'),
    part('91-2', 'nla'),
    part('92-1'),
    part('93-1', 'nla'),
    part('93-2', 'nla'),
    part('K-9'),
  ];
  const links: LineageLink[] = [
    // 90-1 → 90-2 → 90-3, all nla, one way: a dead end at 90-3.
    replacedBy('90-1', '90-2', { interchange: 'one_way' }),
    replacedBy('90-2', '90-3', { interchange: 'one_way' }),
    // 91-1 ↔ 91-2: a cycle.
    replacedBy('91-1', '91-2'),
    replacedBy('91-2', '91-1'),
    // 92-1 points at a number nobody has.
    toUnknown('equivalent', '92-1', '92-X', { id: 'eq-1' }),
    // 93-1 replaced by itself.
    replacedBy('93-1', '93-1'),
    // 93-2 is nla and its replacement is not in the catalogue: also a dead end.
    toUnknown('replaced_by', '93-2', '93-X'),
    // A kit containing itself.
    kitContains('K-9', 'K-9'),
  ];
  const graph = buildLineageGraph(parts, links);

  it('reports every problem of the catalogue, each cycle once', () => {
    const problems = graph.problems();
    expect(problems.filter((p) => p.kind === 'cycle').map((p) => p.numbers)).toEqual(expect.arrayContaining([['91-1', '91-2'], ['93-1'], ['K-9']]));
    expect(problems.filter((p) => p.kind === 'cycle')).toHaveLength(3);
    expect(problems.filter((p) => p.kind === 'dead_end').map((p) => p.numbers)).toEqual(
      expect.arrayContaining([
        ['90-1', '90-2', '90-3'],
        ['93-2'],
      ]),
    );
    // 91-x and 93-1 are stuck too, but in cycles: those are reported as cycles, not dead ends.
    expect(problems.filter((p) => p.kind === 'dead_end')).toHaveLength(2);
    expect(problems.filter((p) => p.kind === 'unknown_number').map((p) => p.numbers)).toEqual(expect.arrayContaining([['92-X'], ['93-X']]));
    expect(problems).toHaveLength(7);
    expect(graph.problems()).toBe(problems);
  });

  it('reports the problems of one part', () => {
    expect(graph.problemsFor(idOf('90-2'))).toEqual([{ kind: 'dead_end', numbers: ['90-1', '90-2', '90-3'], partIds: [idOf('90-1'), idOf('90-2'), idOf('90-3')] }]);
    expect(graph.problemsFor(idOf('91-2')).map((p) => p.kind)).toEqual(['cycle']);
    expect(graph.problemsFor(idOf('92-1'))).toEqual([{ kind: 'unknown_number', numbers: ['92-X'], partIds: [idOf('92-1')], linkIds: ['eq-1'] }]);
    expect(graph.problemsFor(idOf('K-9')).map((p) => p.numbers)).toEqual([['K-9']]);
  });

  it('is not a dead end when an older both-ways part is still available', () => {
    const ok = buildLineageGraph([part('94-1'), part('94-2', 'nla')], [replacedBy('94-1', '94-2', { interchange: 'both' })]);
    expect(ok.problems()).toEqual([]);
    const stuck = buildLineageGraph([part('94-1'), part('94-2', 'nla')], [replacedBy('94-1', '94-2', { interchange: 'one_way' })]);
    expect(stuck.problems()).toEqual([{ kind: 'dead_end', numbers: ['94-2'], partIds: [idOf('94-2')] }]);
  });
});

describe('neighbourhood', () => {
  const parts = [part('50-0', 'nla'), part('50-1', 'nla'), part('50-2'), part('RX-50'), part('K-50'), part('50-9')];
  const links = [
    replacedBy('50-0', '50-1', { id: 'a' }),
    replacedBy('50-1', '50-2', { id: 'b', quantity: 2 }),
    equivalent('50-2', 'RX-50', { id: 'c' }),
    kitContains('K-50', '50-1'),
    toUnknown('equivalent', '50-1', '50-Z', { id: 'd' }),
  ];
  const graph = buildLineageGraph(parts, links);

  it('gives ancestors, descendants, equivalents, kits and unknown numbers, with marks', () => {
    const picture = graph.neighbourhood(idOf('50-1'));
    expect(picture.truncated).toBe(false);
    const byNumber = new Map(picture.nodes.map((n) => [n.number, n]));
    expect([...byNumber.keys()].sort()).toEqual(['50-0', '50-1', '50-2', '50-Z', 'K-50', 'RX-50']);
    expect(byNumber.get('50-1')?.isStart).toBe(true);
    expect(byNumber.get('50-2')).toMatchObject({ isCurrent: true, resolvesStart: true });
    expect(byNumber.get('RX-50')).toMatchObject({ isCurrent: true, resolvesStart: false });
    expect(byNumber.get('50-0')).toMatchObject({ isCurrent: false, resolvesStart: false });
    expect(byNumber.get('50-Z')).toMatchObject({ partId: null, status: null, key: 'unknown:50Z' });
    expect(picture.edges.map((e) => `${e.kind} ${e.from}->${e.to}`).sort()).toEqual(
      [
        `replaced_by ${idOf('50-0')}->${idOf('50-1')}`,
        `replaced_by ${idOf('50-1')}->${idOf('50-2')}`,
        `equivalent ${idOf('50-2')}->${idOf('RX-50')}`,
        `kit_contains ${idOf('K-50')}->${idOf('50-1')}`,
        `equivalent ${idOf('50-1')}->unknown:50Z`,
      ].sort(),
    );
    expect(picture.edges.find((e) => e.key === 'b')).toMatchObject({ quantity: 2, exactQuantity: '2' });
  });

  it('stays within maxNodes, keeps the way forward, and says it was truncated', () => {
    const picture = graph.neighbourhood(idOf('50-0'), { maxNodes: 3 });
    expect(picture.nodes.map((n) => n.number)).toEqual(['50-0', '50-1', '50-2']);
    expect(picture.truncated).toBe(true);
    // Edges only between nodes in the picture.
    const keys = new Set(picture.nodes.map((n) => n.key));
    for (const edge of picture.edges) expect(keys.has(edge.from) && keys.has(edge.to)).toBe(true);
  });
});

describe('input contract', () => {
  it('throws UnknownPartError for an id not in the graph', () => {
    const graph = buildLineageGraph([part('1')], []);
    expect(() => graph.currentParts('nope')).toThrow(UnknownPartError);
    expect(() => graph.canFill('nope')).toThrow(UnknownPartError);
  });

  it('throws LineageInputError for duplicate ids and links from unknown ids', () => {
    expect(() => buildLineageGraph([part('1'), part('1')], [])).toThrow(LineageInputError);
    expect(() => buildLineageGraph([part('1')], [replacedBy('2', '1')])).toThrow(LineageInputError);
  });

  it('finds parts by normalised number', () => {
    const graph = new LineageGraph([part('71-3456'), part('713456', 'nla'), part('71-3457')], []);
    expect(graph.partIdsByNumber('71 34.56')).toEqual([idOf('71-3456'), idOf('713456')]);
    expect(graph.partIdsByNumber('99')).toEqual([]);
    expect(graph.size).toBe(3);
    expect(graph.hasPart(idOf('71-3457'))).toBe(true);
  });
});
