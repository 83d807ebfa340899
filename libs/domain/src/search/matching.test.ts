import { describe, expect, it } from 'vitest';
import { matchDescription, wordsOf } from './description';
import { matchNumber, type PartNumberEntry } from './number-match';
import { lineageReason, mergeHits, type SearchHit } from './rank';
import { trigramsOf } from './trigrams';

const own = (number: string): PartNumberEntry => ({ number, key: number.toUpperCase().replace(/[^A-Z0-9]/g, ''), source: 'own' });

describe('matchNumber', () => {
  it('ignores case, spaces, dashes, dots and slashes for an exact hit', () => {
    for (const typed of ['71-3456', '713456', '71 3456', '71.3456', '71/3456', ' 71-34-56 ']) {
      expect(matchNumber(typed, [own('71-3456')])).toEqual({ match: 'exact', reason: 'exact number', rank: 0 });
    }
    expect(matchNumber('rp3456a', [own('RP-3456-A')])?.match).toBe('exact');
  });

  it('names a supplier or equivalent number that matched exactly, after the own number', () => {
    const supplier: PartNumberEntry = { number: '12-345', key: '12345', source: 'supplier' };
    expect(matchNumber('12345', [own('71-3456'), supplier])).toEqual({ match: 'exact', reason: 'supplier number 12-345', rank: 1 });
    expect(matchNumber('EQ-9', [{ number: 'EQ/9', key: 'EQ9', source: 'equivalent' }])?.reason).toBe('equivalent number EQ/9');
  });

  it('finds a number typed without its prefix, ahead of other numbers containing it', () => {
    const prefixless = matchNumber('3456', [own('71-3456')]);
    const inside = matchNumber('3456', [own('71-34567')]);
    expect(prefixless).toEqual({ match: 'partial', reason: 'number contains 3456', rank: 0 });
    expect(inside?.match).toBe('partial');
    expect(inside!.rank).toBeGreaterThan(prefixless!.rank);
  });

  it('forgives one typo under 8 characters and two from 8 on, with O for zero and I for one', () => {
    expect(matchNumber('71-3465', [own('71-3456')])).toEqual({ match: 'fuzzy', reason: 'close to 71-3456 (1 typo)', rank: 1 });
    expect(matchNumber('71-3565', [own('71-3456')])).toBeNull();
    expect(matchNumber('GK-1244OO', [own('GK-124400')])).toEqual({ match: 'exact', reason: 'exact number, reading O as 0 and I as 1', rank: 2 });
    expect(matchNumber('GK-1245OO', [own('GK-124400')])?.reason).toBe('close to GK-124400 (1 typo)');
    expect(matchNumber('GK-1254OI', [own('GK-124400')])).toEqual({ match: 'fuzzy', reason: 'close to GK-124400 (2 typos)', rank: 2 });
    expect(matchNumber('GK-2154OI', [own('GK-124400')])).toBeNull();
  });

  it('only matches the start of numbers for queries under 3 characters', () => {
    expect(matchNumber('71', [own('71-3456')])?.reason).toBe('number starts with 71');
    expect(matchNumber('34', [own('71-3456')])).toBeNull();
    expect(matchNumber('--', [own('71-3456')])).toBeNull();
  });
});

describe('matchDescription', () => {
  it('matches words in any order, the last one as a prefix', () => {
    expect(matchDescription('cable clutch', 'Clutch cable, inner')).toEqual({ words: ['cable', 'clutch'], typos: 0 });
    expect(matchDescription('clutch ca', 'Clutch cable, inner')).toEqual({ words: ['clutch', 'cable'], typos: 0 });
    expect(matchDescription('clutch hose', 'Clutch cable, inner')).toBeNull();
  });

  it('forgives typos only in words of 5 letters or more', () => {
    expect(matchDescription('cltuch cable', 'Clutch cable')).toEqual({ words: ['clutch', 'cable'], typos: 1 });
    expect(matchDescription('gaskte', 'Head gasket')?.typos).toBe(1);
    expect(matchDescription('hesd gasket', 'Head gasket')).toBeNull();
    expect(matchDescription('carburetor', 'Carburettor float')?.typos).toBe(1);
    expect(matchDescription('crbretor', 'Carburettor float')).toBeNull();
  });

  it('splits words on anything but letters and digits', () => {
    expect(wordsOf('Gasket, head (set)/2')).toEqual(['gasket', 'head', 'set', '2']);
    expect(matchDescription('', 'Head gasket')).toBeNull();
  });
});

describe('mergeHits', () => {
  it('keeps each part once with its best hit, ordered exact, lineage, partial, fuzzy, and cut at the limit', () => {
    const hits: SearchHit[] = [
      { partId: 'f', match: 'fuzzy', reason: 'f', rank: 1 },
      { partId: 'p', match: 'partial', reason: 'p2', rank: 2 },
      { partId: 'p', match: 'partial', reason: 'p0', rank: 0 },
      { partId: 'l', match: 'lineage', reason: 'l', rank: 0 },
      { partId: 'e', match: 'exact', reason: 'e', rank: 0 },
      { partId: 'l', match: 'fuzzy', reason: 'l-fuzzy', rank: 0 },
      { partId: 'g', match: 'fuzzy', reason: 'g', rank: 1, tieBreak: 0.1 },
    ];
    expect(mergeHits(hits, 10).map((h) => `${h.partId}:${h.reason}`)).toEqual(['e:e', 'l:l', 'p:p0', 'g:g', 'f:f']);
    expect(mergeHits(hits, 2).map((h) => h.partId)).toEqual(['e', 'l']);
  });
});

describe('lineageReason', () => {
  it('says in plain words how a relative fills the number', () => {
    expect(lineageReason('71-3456', ['replaced_by:one_way 71-3456 → 72-3456'], false)).toBe('replaces 71-3456');
    expect(lineageReason('71-3456', ['equivalent:one_way 71-3456 → RP-3456'], false)).toBe('can stand in for 71-3456 (one way)');
    expect(lineageReason('71-3456', ['equivalent:both 71-3456 → RP-3456'], false)).toBe('can stand in for 71-3456 (both ways)');
    expect(lineageReason('72-3456', ['replaced_by:both 71-3456 → 72-3456, used in reverse'], false)).toBe('older part that fits where 72-3456 does');
    expect(lineageReason('71-3456', ['replaced_by:with_changes 71-3456 → 72-3456', 'replaced_by:one_way 72-3456 → 73-3456'], true)).toBe('replaces 71-3456 (through 2 links), needs changes');
  });
});

describe('trigramsOf', () => {
  it('lists distinct trigrams in order', () => {
    expect(trigramsOf('713456')).toEqual(['713', '134', '345', '456']);
    expect(trigramsOf('AAAA')).toEqual(['AAA']);
    expect(trigramsOf('AB')).toEqual([]);
  });
});
