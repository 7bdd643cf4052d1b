// VIN check digit: 49 CFR 565.15 (transliteration, weights 8 7 6 5 4 3 2 10 0 9 8 7 6 5 4 3 2, modulo 11, X for 10),
// with the worked example from Wikipedia, "Vehicle identification number" (1M8GDM9AXKP042788 → X).
import { describe, expect, it } from 'vitest';
import { vinCheckDigit, vinProblem } from '@/domain/vin';

describe('VIN check digit (49 CFR 565; ISO 3779 character set)', () => {
  it('the published example 1M8GDM9AXKP042788 carries X', () => {
    expect(vinCheckDigit('1M8GDM9AXKP042788')).toBe('X');
    expect(vinProblem('1M8GDM9AXKP042788')).toBeNull();
  });

  it('17 ones check to 1 (every weight sums to 89; 89 mod 11 = 1)', () => {
    expect(vinCheckDigit('11111111111111111')).toBe('1');
    expect(vinProblem('11111111111111111')).toBeNull();
  });

  it('a mistyped character is caught and the right digit named', () => {
    expect(vinProblem('1M8GDM9A1KP042788')).toMatch(/should be X, not 1/);
  });

  it('I, O and Q never appear', () => {
    expect(vinProblem('1M8GDM9AXKP04278O')).toMatch(/never contains the letters I, O or Q/);
  });

  it('the wrong length is named', () => {
    expect(vinProblem('1M8GDM9AXKP04278')).toMatch(/17 characters; this one has 16/);
  });

  it('the North American check-digit rule is not applied to other regions', () => {
    expect(vinProblem('WVWZZZ1JZXW000001')).toBeNull();
  });
});
