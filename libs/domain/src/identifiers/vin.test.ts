import fc from 'fast-check';
import { validate as independentVinValidate } from 'vin-validator';
import { describe, expect, it } from 'vitest';
import { isSeventeenCharacterVin, validateVin, vinCheckDigit, vinWeightedSum } from './vin';

/** Characters a VIN may hold (49 CFR 565): digits and letters other than I, O, Q. */
const VIN_ALPHABET = [...'0123456789ABCDEFGHJKLMNPRSTUVWXYZ'];
const vinCharacter = fc.constantFrom(...VIN_ALPHABET);

/** 16 free characters with the computed check digit put in position 9. */
const checkedVin = fc.array(vinCharacter, { minLength: 16, maxLength: 16 }).map((chars) => {
  const draft = [...chars.slice(0, 8), '0', ...chars.slice(8)].join('');
  const check = vinCheckDigit(draft);
  if (check === null) throw new Error('the generator only uses permitted characters');
  return draft.slice(0, 8) + check + draft.slice(9);
});

describe('vinCheckDigit', () => {
  it('reproduces the worked example of 49 CFR 565: 1G4AH59H45G118341, sum 411, remainder 4', () => {
    // Source: US 49 CFR 565 check-digit calculation example (sum 411; 411 = 37 × 11 + 4).
    expect(vinWeightedSum('1G4AH59H45G118341')).toBe(411);
    expect(vinCheckDigit('1G4AH59H45G118341')).toBe('4');
    expect(validateVin('1G4AH59H45G118341')).toEqual({ ok: true });
  });

  it('writes remainder 10 as X: 1M8GDM9AXKP042788', () => {
    // Source: a published valid VIN with check digit X (listed in /work/shared/check-values.md
    // with 49 CFR 565); the independent library agrees.
    expect(vinCheckDigit('1M8GDM9AXKP042788')).toBe('X');
    expect(validateVin('1m8gdm9axkp042788')).toEqual({ ok: true }); // lower case reads the same
    expect(independentVinValidate('1M8GDM9AXKP042788')).toBe(true);
  });

  it('gives no digit for anything that is not 17 permitted characters', () => {
    expect(vinCheckDigit('1G4AH59H45G11834')).toBeNull();
    expect(vinCheckDigit('1G4AH59H45G11834I')).toBeNull();
    expect(vinCheckDigit('1G4AH59H45G11834-')).toBeNull();
  });
});

describe('validateVin', () => {
  it('names what is wrong, and the expected check digit', () => {
    expect(validateVin('1G4AH59H45G11834')).toEqual({ ok: false, reason: 'length' });
    expect(validateVin('1G4AH59H45G1183412')).toEqual({ ok: false, reason: 'length' });
    // I, O and Q are excluded from VINs by 49 CFR 565 (they read as 1 and 0).
    expect(validateVin('1G4AH59H45G11834I')).toEqual({ ok: false, reason: 'illegal_letter' });
    expect(validateVin('1G4AH59H4OG118341')).toEqual({ ok: false, reason: 'illegal_letter' });
    expect(validateVin('1G4AH59H45G11834q')).toEqual({ ok: false, reason: 'illegal_letter' });
    expect(validateVin('1G4AH59H45G11834 ')).toEqual({ ok: false, reason: 'bad_character' });
    expect(validateVin('1G4AH59H45G-18341')).toEqual({ ok: false, reason: 'bad_character' });
    expect(validateVin('1G4AH59H55G118341')).toEqual({ ok: false, reason: 'check_digit', expected: '4' });
  });

  it('only 17-character identifiers are VINs to check; older frame numbers are not', () => {
    expect(isSeventeenCharacterVin('1G4AH59H45G118341')).toBe(true);
    expect(isSeventeenCharacterVin('1g4ah59h45g118341')).toBe(true);
    // Invented pre-1981 frame numbers: free-form, never checked.
    expect(isSeventeenCharacterVin('HW 41207')).toBe(false);
    expect(isSeventeenCharacterVin('BF7-00931-T')).toBe(false);
    expect(isSeventeenCharacterVin('')).toBe(false);
    expect(isSeventeenCharacterVin('1G4AH59H45G11834 ')).toBe(false);
  });

  it('accepts every VIN it computes a check digit for, as does vin-validator', () => {
    // Independent library: vin-validator (validate(vin) → boolean).
    fc.assert(
      fc.property(checkedVin, (vin) => {
        expect(validateVin(vin)).toEqual({ ok: true });
        expect(independentVinValidate(vin)).toBe(true);
      }),
      { numRuns: 500 },
    );
  });

  it('agrees with vin-validator on every single-character corruption', () => {
    // A substitution at a position of weight w changes the sum by w·Δvalue, which mod 11 is caught
    // unless Δvalue = 0 (letters sharing a value, such as A and J) or the position weighs 0 (position
    // 9 is then compared directly). Both implementations must reach the same verdict either way.
    fc.assert(
      fc.property(checkedVin, fc.integer({ min: 0, max: 16 }), vinCharacter, (vin, position, replacement) => {
        const corrupted = vin.slice(0, position) + replacement + vin.slice(position + 1);
        expect(validateVin(corrupted).ok).toBe(independentVinValidate(corrupted));
        const changedSum = vinWeightedSum(corrupted) !== vinWeightedSum(vin);
        const changedCheckDigit = position === 8 && corrupted !== vin;
        if (changedSum || changedCheckDigit) expect(validateVin(corrupted).ok).toBe(false);
      }),
      { numRuns: 2000 },
    );
  });
});
