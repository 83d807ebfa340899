import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { normalisePartNumber, partNumberSegments } from './normalise';

describe('normalisePartNumber', () => {
  it.each([
    ['71-3456', '713456'],
    ['71 3456', '713456'],
    ['71.3456', '713456'],
    [' rx-88/b ', 'RX88B'],
    ['gk_12-a', 'GK12A'],
    ['', ''],
    ['--..//', ''],
  ])('%j -> %j', (printed, expected) => {
    expect(normalisePartNumber(printed)).toBe(expected);
  });

  it('folds full-width and compatibility characters with NFKC', () => {
    // U+FF17 U+FF11 U+FF0D ... full-width "71-3456"; U+2460 circled digit one folds to "1".
    expect(normalisePartNumber('\uFF17\uFF11\uFF0D\uFF13\uFF14\uFF15\uFF16')).toBe('713456');
    expect(normalisePartNumber('AB\u2460')).toBe('AB1');
    // The "fi" ligature U+FB01 is two letters after NFKC.
    expect(normalisePartNumber('\uFB01-9')).toBe('FI9');
  });

  it('drops letters that are not A-Z rather than guessing a transliteration', () => {
    expect(normalisePartNumber('Δ-12é')).toBe('12');
  });

  const alnum = fc.string({ unit: fc.constantFrom(...'ABCDEFGHIJKLMNOPQRSTUVWXYZ0123456789abcdefghijklmnopqrstuvwxyz'.split('')) });

  it('property: idempotent, and the output is only A-Z 0-9', () => {
    fc.assert(
      fc.property(fc.string({ unit: 'binary' }), (printed) => {
        const once = normalisePartNumber(printed);
        expect(once).toMatch(/^[A-Z0-9]*$/);
        expect(normalisePartNumber(once)).toBe(once);
      }),
    );
  });

  it('property: separators and case are ignored', () => {
    const separator = fc.string({ unit: fc.constantFrom(' ', '-', '.', '/', '_', '\t', '·', '–'), maxLength: 3 });
    fc.assert(
      fc.property(alnum, fc.array(separator, { maxLength: 40 }), (core, seps) => {
        const chars = core.split('');
        const spaced = chars.map((c, i) => `${seps[i] ?? ''}${i % 2 ? c.toLowerCase() : c.toUpperCase()}`).join('');
        expect(normalisePartNumber(spaced)).toBe(core.toUpperCase());
      }),
    );
  });

  it('property: full-width forms normalise like their ASCII forms', () => {
    fc.assert(
      fc.property(alnum, (core) => {
        // ASCII 0x21-0x7E map to full-width at +0xFEE0.
        const wide = [...core].map((c) => String.fromCharCode(c.charCodeAt(0) + 0xfee0)).join('');
        expect(normalisePartNumber(wide)).toBe(normalisePartNumber(core));
      }),
    );
  });
});

describe('partNumberSegments', () => {
  it.each([
    ['71-3456', '3456'],
    ['71 3456', '3456'],
    ['71-3456-a', '3456A'],
    ['gk.12/40', '1240'],
    ['713456', null],
    ['-3456', null],
    ['71-', null],
    ['', null],
  ])('%j -> %j', (printed, expected) => {
    expect(partNumberSegments(printed)).toBe(expected);
  });

  it('property: the rest is a suffix of the normalised number', () => {
    fc.assert(
      fc.property(fc.string(), (printed) => {
        const rest = partNumberSegments(printed);
        if (rest !== null) {
          expect(rest).toMatch(/^[A-Z0-9]+$/);
          const whole = normalisePartNumber(printed);
          expect(whole.endsWith(rest)).toBe(true);
          expect(whole.length).toBeGreaterThan(rest.length);
        }
      }),
    );
  });
});
