import { gtin } from 'cdigit';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { gs1CheckDigit, validateGs1 } from './gs1';

const payload = (length: number) => fc.string({ unit: fc.constantFrom(...'0123456789'), minLength: length, maxLength: length });
const anyPayload = fc.constantFrom(7, 11, 12, 13, 17).chain(payload);

describe('gs1CheckDigit', () => {
  it('reproduces the GTIN-13 worked example 629104150021 → 3', () => {
    // Source: GS1 General Specifications §7.9.1 method; GS1 Hong Kong's worked example 6291041500213.
    expect(gs1CheckDigit('629104150021')).toBe('3');
    expect(validateGs1('6291041500213')).toEqual({ ok: true, kind: 'GTIN-13' });
  });

  it('reproduces the UPC-A (GTIN-12) example 03600024145 → 7', () => {
    // Source: GS1 General Specifications §7.9.1; UPC-A 036000241457 (check-values.md).
    expect(gs1CheckDigit('03600024145')).toBe('7');
    expect(validateGs1('036000241457')).toEqual({ ok: true, kind: 'GTIN-12' });
  });

  it('gives 0 when the weighted sum is already a multiple of ten', () => {
    // 1234567 → 3·7 + 6 + 3·5 + 4 + 3·3 + 2 + 3·1 = 60 → (10 − 0) mod 10 = 0 (hand calculation, §7.9.1).
    expect(gs1CheckDigit('1234567')).toBe('0');
    expect(validateGs1('12345670')).toEqual({ ok: true, kind: 'GTIN-8' });
  });

  it('refuses payloads of other lengths or with other characters', () => {
    expect(gs1CheckDigit('123456')).toBeNull();
    expect(gs1CheckDigit('12345678')).toBeNull();
    expect(gs1CheckDigit('12345a7')).toBeNull();
    expect(gs1CheckDigit('')).toBeNull();
  });

  it('agrees with cdigit on generated GTIN-8/12/13/14 and SSCC-18 payloads', () => {
    // Independent library: cdigit (gtin.compute, gtin.validate).
    fc.assert(
      fc.property(anyPayload, (digits) => {
        const check = gs1CheckDigit(digits);
        expect(check).toBe(gtin.compute(digits));
        expect(gtin.validate(digits + check)).toBe(true);
      }),
      { numRuns: 1000 },
    );
  });
});

describe('validateGs1', () => {
  it('names the kind by length', () => {
    // Each built with cdigit's check digit so the expectation does not come from the code under test.
    for (const [length, kind] of [
      [8, 'GTIN-8'],
      [12, 'GTIN-12'],
      [13, 'GTIN-13'],
      [14, 'GTIN-14'],
      [18, 'SSCC-18'],
    ] as const) {
      const body = '9'.repeat(length - 1);
      expect(validateGs1(body + gtin.compute(body))).toEqual({ ok: true, kind });
    }
  });

  it('names what is wrong and the expected check digit', () => {
    expect(validateGs1('6291041500214')).toEqual({ ok: false, reason: 'check_digit', expected: '3' });
    // Dropping the check digit leaves 12 digits, a GTIN-12 length: it is judged as one, like cdigit does.
    expect(validateGs1('629104150021').ok).toBe(gtin.validate('629104150021'));
  });

  it('refuses other lengths and characters', () => {
    expect(validateGs1('1234567')).toEqual({ ok: false, reason: 'length' });
    expect(validateGs1('123456789012345')).toEqual({ ok: false, reason: 'length' });
    expect(validateGs1('')).toEqual({ ok: false, reason: 'length' });
    expect(validateGs1('629104150021X')).toEqual({ ok: false, reason: 'bad_character' });
    expect(validateGs1(' 6291041500213')).toEqual({ ok: false, reason: 'bad_character' });
  });

  it('agrees with cdigit on every single-digit corruption', () => {
    // A single changed digit always changes the weighted sum mod 10 (weights 1 and 3 are units mod 10).
    fc.assert(
      fc.property(anyPayload, fc.nat(), fc.constantFrom(...'0123456789'), (digits, at, digit) => {
        const code = digits + gs1CheckDigit(digits);
        const position = at % code.length;
        const corrupted = code.slice(0, position) + digit + code.slice(position + 1);
        expect(validateGs1(corrupted).ok).toBe(gtin.validate(corrupted));
        expect(validateGs1(corrupted).ok).toBe(corrupted === code);
      }),
      { numRuns: 1000 },
    );
  });
});
