import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { foldedTyposWithin, foldedTyposWithinKeyOrTail, foldLookalikes, osaDistance, partNumberDistance, typoTolerance, typosWithin } from './distance';

const keyChar = fc.constantFrom(...'ABCDEFGHIJKLMNOPQRSTUVWXYZ0123456789'.split(''));
const key = fc.string({ unit: keyChar, minLength: 1, maxLength: 14 });

/** Every key one edit away from `k`: deletion, insertion, substitution, neighbour swap. */
function singleEdits(k: string, alphabet = 'AZ09OI'): string[] {
  const out: string[] = [];
  for (let i = 0; i < k.length; i++) out.push(k.slice(0, i) + k.slice(i + 1));
  for (let i = 0; i <= k.length; i++) for (const c of alphabet) out.push(k.slice(0, i) + c + k.slice(i));
  for (let i = 0; i < k.length; i++) for (const c of alphabet) if (c !== k[i]) out.push(k.slice(0, i) + c + k.slice(i + 1));
  for (let i = 0; i + 1 < k.length; i++) out.push(k.slice(0, i) + k[i + 1] + k[i] + k.slice(i + 2));
  return out;
}

describe('osaDistance', () => {
  it.each([
    ['', '', 0],
    ['ABC', '', 3],
    ['713456', '713465', 1],
    ['713456', '71345', 1],
    ['713456', '7134567', 1],
    ['713456', '713556', 1],
    ['KITTEN', 'SITTING', 3],
    // Optimal string alignment, not the unrestricted distance: "CA" → "ABC" is 3 here (2 with the full one).
    ['CA', 'ABC', 3],
  ])('%j ↔ %j = %i', (a, b, d) => {
    expect(osaDistance(a, b)).toBe(d);
    expect(osaDistance(b, a)).toBe(d);
  });

  it('stops at the bound and answers max + 1', () => {
    expect(osaDistance('AAAAAAAA', 'BBBBBBBB', 2)).toBe(3);
    expect(osaDistance('A', 'ABCDEFG', 1)).toBe(2);
    expect(osaDistance('713456', '713465', 1)).toBe(1);
  });
});

describe('partNumberDistance', () => {
  it('reads letter O as zero and letter I as one', () => {
    expect(foldLookalikes('7I3O56')).toBe('713056');
    expect(partNumberDistance('7I3O56', '713056')).toBe(0);
    expect(partNumberDistance('7I3O56', '713057')).toBe(1);
  });

  it('property: symmetric', () => {
    fc.assert(
      fc.property(key, key, (a, b) => {
        expect(partNumberDistance(a, b)).toBe(partNumberDistance(b, a));
      }),
    );
  });

  it('property: zero exactly when equal after folding', () => {
    fc.assert(
      fc.property(key, key, (a, b) => {
        expect(partNumberDistance(a, b) === 0).toBe(foldLookalikes(a) === foldLookalikes(b));
      }),
    );
    fc.assert(
      fc.property(key, (a) => {
        expect(partNumberDistance(a, a.replace(/0/g, 'O').replace(/1/g, 'I'))).toBe(0);
      }),
    );
  });

  it('property: never more than the longer length, never less than the length gap', () => {
    fc.assert(
      fc.property(fc.string({ unit: keyChar, maxLength: 14 }), fc.string({ unit: keyChar, maxLength: 14 }), (a, b) => {
        const d = partNumberDistance(a, b);
        expect(d).toBeLessThanOrEqual(Math.max(a.length, b.length));
        expect(d).toBeGreaterThanOrEqual(Math.abs(a.length - b.length));
      }),
    );
  });

  it('property: the bounded answer agrees with the exact one', () => {
    fc.assert(
      fc.property(key, key, fc.integer({ min: 0, max: 4 }), (a, b, max) => {
        const exact = partNumberDistance(a, b);
        expect(partNumberDistance(a, b, max)).toBe(exact <= max ? exact : max + 1);
      }),
    );
  });
});

describe('typo tolerance', () => {
  it('forgives 1 under 8 characters and 2 from 8 on', () => {
    expect([1, 7, 8, 20].map(typoTolerance)).toEqual([1, 1, 2, 2]);
    expect(typosWithin('71346', '713456')).toBe(1);
    expect(typosWithin('71346', '7134567')).toBeNull();
    expect(typosWithin('GK1244', 'GK124400')).toBe(2);
    expect(typosWithin('GK1244', 'GK1244001')).toBeNull();
  });

  it('property: every single-edit variant of a key is within tolerance', () => {
    fc.assert(
      fc.property(key, (k) => {
        for (const variant of singleEdits(k)) {
          const d = typosWithin(variant, k);
          expect(d).not.toBeNull();
          expect(d).toBeLessThanOrEqual(1);
        }
      }),
      { numRuns: 200 },
    );
  });
});

describe('foldedTyposWithinKeyOrTail', () => {
  /** The definition it replaces: the whole key, then every tail of `minTail` characters or more, one distance each. */
  const reference = (typed: string, k: string, minTail: number) => {
    if (foldedTyposWithin(typed, k) !== null) return true;
    for (let j = 1; k.length - j >= minTail; j++) if (foldedTyposWithin(typed, k.slice(j)) !== null) return true;
    return false;
  };
  // A small alphabet so near keys, swaps and shared tails are common.
  const near = fc.string({ unit: fc.constantFrom(...'AB01CX'.split('')), minLength: 0, maxLength: 12 });

  it('answers as the whole key and each of its tails measured one by one', () => {
    fc.assert(
      fc.property(near, near, fc.string({ unit: fc.constantFrom(' ', 'X'), maxLength: 3 }), fc.integer({ min: 1, max: 4 }), (typed, k, pad, minTail) => {
        // The key sits inside a longer text (as in the index's space-separated keys).
        const text = `${pad} ${k} ${pad}`;
        const start = pad.length + 1;
        expect(foldedTyposWithinKeyOrTail(typed, text, start, start + k.length, minTail)).toBe(k.length > 0 && reference(typed, k, minTail));
      }),
      { numRuns: 5000 },
    );
  });

  it('finds a number typed without its prefix, with a typo, and refuses one too far', () => {
    expect(foldedTyposWithinKeyOrTail('3465', '713456', 0, 6, 3)).toBe(true);
    expect(foldedTyposWithinKeyOrTail('KV12345', ' 71 KV12354 ', 4, 11, 3)).toBe(true);
    expect(foldedTyposWithinKeyOrTail('9999', '713456', 0, 6, 3)).toBe(false);
  });
});
