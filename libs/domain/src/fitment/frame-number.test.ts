import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { compareFrameNumbers, frameInRange } from './frame-number';

describe('compareFrameNumbers', () => {
  it.each([
    ['DU-1200', 'DU-987', 1],
    ['du 987', 'DU1200', -1],
    ['DU 01200', 'du-1200', 0],
    ['T12R-4410', 'T12R 4410', 0],
    ['T12R-4410', 'T12R-4411', -1],
  ] as const)('%j vs %j -> %j', (a, b, expected) => {
    expect(compareFrameNumbers(a, b)).toBe(expected);
  });

  it('answers unknown for different series or no serial digits', () => {
    expect(compareFrameNumbers('DU-1200', 'EX-1200')).toBe('unknown');
    expect(compareFrameNumbers('DU-1200', 'DU-')).toBe('unknown');
    expect(compareFrameNumbers('ABC', 'ABC')).toBe('unknown');
    expect(compareFrameNumbers('', '12')).toBe('unknown');
  });

  it('keeps digits before a separator in the prefix', () => {
    // "AB12-345" is series AB12, serial 345; "AB12345" is series AB, serial 12345.
    expect(compareFrameNumbers('AB12-345', 'AB12 346')).toBe(-1);
    expect(compareFrameNumbers('AB12-345', 'AB12345')).toBe('unknown');
  });

  it('compares serials longer than a double can hold exactly', () => {
    // 2^53 + 1 and 2^53 are equal as doubles, not as serials.
    expect(compareFrameNumbers('X-9007199254740993', 'X-9007199254740992')).toBe(1);
    expect(compareFrameNumbers('X-123456789012345678901234567890', 'X-123456789012345678901234567891')).toBe(-1);
  });

  const prefix = fc.string({ unit: fc.constantFrom('A', 'B', 'K', 'Z', '-', ' '), maxLength: 4 }).filter((p) => /[A-Z]/.test(p) || p === '');
  const serial = fc.bigInt({ min: 0n, max: 10n ** 30n });

  it('property: same series compares like the serial numbers, and antisymmetrically', () => {
    fc.assert(
      fc.property(prefix, serial, serial, (p, x, y) => {
        const a = `${p}-${x}`;
        const b = `${p.toLowerCase()} ${y}`;
        const expected = x === y ? 0 : x < y ? -1 : 1;
        expect(compareFrameNumbers(a, b)).toBe(expected);
        const back = compareFrameNumbers(b, a);
        expect(back).toBe(expected === 0 ? 0 : -expected);
      }),
    );
  });
});

describe('frameInRange', () => {
  it('is yes with no bounds, or blank bounds', () => {
    expect(frameInRange('DU-100')).toBe('yes');
    expect(frameInRange('anything at all', null, undefined)).toBe('yes');
    expect(frameInRange('DU-100', ' ', '')).toBe('yes');
  });

  it('checks inclusive bounds', () => {
    expect(frameInRange('DU-100', 'DU-100', 'DU-200')).toBe('yes');
    expect(frameInRange('DU-200', 'DU-100', 'DU-200')).toBe('yes');
    expect(frameInRange('DU-99', 'DU-100', 'DU-200')).toBe('no');
    expect(frameInRange('DU-201', 'DU-100', 'DU-200')).toBe('no');
    expect(frameInRange('DU-150', 'DU-100')).toBe('yes');
    expect(frameInRange('DU-150', undefined, 'DU-120')).toBe('no');
  });

  it('never guesses across series', () => {
    expect(frameInRange('EX-150', 'DU-100', 'DU-200')).toBe('unknown');
    expect(frameInRange('DU-150', 'DU-100', 'EX-200')).toBe('unknown');
    expect(frameInRange('no serial', 'DU-100')).toBe('unknown');
  });

  it('is no when a comparable bound excludes the frame even if the other bound is unknown', () => {
    expect(frameInRange('DU-50', 'DU-100', 'EX-200')).toBe('no');
  });

  it('property: agrees with comparing against each bound', () => {
    const frame = fc.tuple(fc.constantFrom('DU', 'EX'), fc.integer({ min: 0, max: 500 })).map(([p, n]) => `${p}-${n}`);
    fc.assert(
      fc.property(frame, fc.option(frame, { nil: undefined }), fc.option(frame, { nil: undefined }), (f, from, to) => {
        const low = from === undefined ? 0 : compareFrameNumbers(f, from);
        const high = to === undefined ? 0 : compareFrameNumbers(f, to);
        const result = frameInRange(f, from, to);
        if (low === -1 || high === 1) expect(result).toBe('no');
        else if (low === 'unknown' || high === 'unknown') expect(result).toBe('unknown');
        else expect(result).toBe('yes');
      }),
    );
  });
});
