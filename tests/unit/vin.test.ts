// Unit tests for shared/vin.ts against published VIN check-digit examples and the model-year table.
import { describe, it, expect } from 'vitest';
import { checkVin, computeCheckDigit, modelYearsForCode, vinCharValue, VIN_WEIGHTS } from '../../shared/vin';

// Source W: Wikipedia, "Vehicle identification number", sections "Check-digit calculation",
// "Worked example" and "Model year encoding" (the same worked example is reproduced on
// autocalculator.org/VIN/VIN-Checkdigit.aspx and in Wikibooks "Vehicle Identification Numbers (VIN codes)/Check digit").
// Source S: scientificgems.wordpress.com, "Mathematics in action: Vehicle Identification Numbers" (2018-04-27).

describe('checkVin: published valid VINs', () => {
  it('accepts the worked example 1M8GDM9AXKP042788 with check digit X', () => {
    const r = checkVin('1M8GDM9AXKP042788'); // Source W, worked example: sum 351, 351 mod 11 = 10 → 'X'
    expect(r.valid).toBe(true);
    expect(r.checkDigit).toBe('X');
    expect(r.modelYears).toEqual([1989, 2019]); // Source W model-year table: K = 1989 and K = 2019
    expect(r.reason).toBeUndefined();
    expect(r.normalized).toBe('1M8GDM9AXKP042788');
  });

  it('reproduces the worked example row by row (values × weights = products, sum 351)', () => {
    const vin = '1M8GDM9A_KP042788'; // Source W, worked example (underscore = check digit)
    const publishedValues = [1, 4, 8, 7, 4, 4, 9, 1, 0, 2, 7, 0, 4, 2, 7, 8, 8]; // Source W "Value" row
    const publishedWeights = [8, 7, 6, 5, 4, 3, 2, 10, 0, 9, 8, 7, 6, 5, 4, 3, 2]; // Source W "Weight" row
    const publishedProducts = [8, 28, 48, 35, 16, 12, 18, 10, 0, 18, 56, 0, 24, 10, 28, 24, 16]; // Source W "Products" row
    expect([...VIN_WEIGHTS]).toEqual(publishedWeights);
    const values = [...vin].map((ch, i) => (i === 8 ? 0 : vinCharValue(ch)));
    expect(values).toEqual(publishedValues);
    const products = values.map((v, i) => (v ?? NaN) * VIN_WEIGHTS[i]!);
    expect(products).toEqual(publishedProducts);
    expect(products.reduce((a, b) => a + b, 0)).toBe(351); // Source W: "sum, 351"
    expect(computeCheckDigit(vin)).toBe('X');
  });

  it('accepts seventeen ones (check digit 1)', () => {
    // Source W: "straight-ones" VIN passes because the weights sum to 89 and 89 mod 11 = 1.
    const r = checkVin('11111111111111111');
    expect(r.valid).toBe(true);
    expect(r.checkDigit).toBe('1');
    expect(r.modelYears).toEqual([2001, 2031]); // Source W model-year table: 1 = 2001 and 1 = 2031
  });

  it('accepts 5GZCZ43D13S812715 (check digit 1)', () => {
    // Source W, "Check-digit calculation": cited as a valid VIN with leading five.
    // Hand sum: 40+49+54+15+36+12+6+40+0+27+16+56+6+10+28+3+10 = 408; 408 mod 11 = 1.
    const r = checkVin('5GZCZ43D13S812715');
    expect(r.valid).toBe(true);
    expect(r.checkDigit).toBe('1');
    expect(r.modelYears).toEqual([2003, 2033]); // Source W table: 3 = 2003 / 2033
  });

  it('accepts LJCPCBLCX11000237 (check digit X)', () => {
    const r = checkVin('LJCPCBLCX11000237'); // Source S: products sum to 186, 186 mod 11 = 10 → 'X'
    expect(r.valid).toBe(true);
    expect(r.checkDigit).toBe('X');
  });

  it('accepts 1HGCM82633A004352 (check digit 3)', () => {
    const r = checkVin('1HGCM82633A004352'); // from memory: a widely used sample VIN; not from a cited page
    expect(r.valid).toBe(true);
    expect(r.checkDigit).toBe('3');
  });

  it('trims whitespace and upper-cases before checking', () => {
    const r = checkVin('  1m8gdm9axkp042788\n');
    expect(r.normalized).toBe('1M8GDM9AXKP042788');
    expect(r.valid).toBe(true);
  });
});

describe('checkVin: wrong check digit', () => {
  it('reports expected vs found when position 9 does not match', () => {
    const r = checkVin('1M8GDM9A1KP042788'); // worked example with its X changed to 1
    expect(r.valid).toBe(false);
    expect(r.checkDigit).toBe('X');
    expect(r.reason).toContain("'1'");
    expect(r.reason).toContain("'X'");
    expect(r.reason).toMatch(/position 9/i);
    expect(r.modelYears).toEqual([1989, 2019]); // still decoded, the UI may let the user override
  });

  it('catches a one-character typo in position 1 (5GZ… typed as SGZ…)', () => {
    // Source W mentions SGZCZ43D13S812715 as the mistyped form of 5GZCZ43D13S812715. By the
    // regulation's table S = 2, not 5, so position 1 contributes 16 instead of 40: 384 mod 11 = 10 → 'X'.
    // (The copy of the article we read calls both "valid"; the arithmetic above says the typo is caught.)
    const r = checkVin('SGZCZ43D13S812715');
    expect(r.valid).toBe(false);
    expect(r.checkDigit).toBe('X');
  });

  it('flags VINs built for outside North America without throwing', () => {
    // Source W: WP0ZZZ99ZTS392124 (Porsche) and KLATF08Y1VB363636 (GM-T body) do not pass the
    // North American check-digit verification. The computed digits below are our own arithmetic.
    const porsche = checkVin('WP0ZZZ99ZTS392124');
    expect(porsche.valid).toBe(false);
    expect(porsche.checkDigit).toBe('8');
    expect(porsche.reason).toContain("'Z'");
    const gm = checkVin('KLATF08Y1VB363636');
    expect(gm.valid).toBe(false);
    expect(gm.checkDigit).toBe('4');
  });
});

describe('checkVin: malformed input never throws', () => {
  it('rejects the letters I, O and Q naming the position', () => {
    const o = checkVin('1M8GDM9AXKO042788'); // O at position 11
    expect(o.valid).toBe(false);
    expect(o.reason).toMatch(/position 11/i);
    expect(o.reason).toMatch(/\bO\b/);
    expect(o.checkDigit).toBe('');
    const i = checkVin('IM8GDM9AXKP042788');
    expect(i.reason).toMatch(/position 1:/i);
    const q = checkVin('1M8GDM9AXKP04278Q');
    expect(q.reason).toMatch(/position 17/i);
  });

  it('rejects the wrong length, saying how many characters were given', () => {
    const short = checkVin('1M8GDM9AXKP04278');
    expect(short.valid).toBe(false);
    expect(short.reason).toMatch(/17/);
    expect(short.reason).toMatch(/16/);
    expect(short.checkDigit).toBe('');
    const long = checkVin('1M8GDM9AXKP0427888');
    expect(long.reason).toMatch(/18/);
  });

  it('rejects punctuation and inner spaces by position', () => {
    const dash = checkVin('1M8GDM9-XKP042788');
    expect(dash.valid).toBe(false);
    expect(dash.reason).toMatch(/position 8/i);
    const space = checkVin('1M8GDM9A KP042788');
    expect(space.reason).toMatch(/position 9.*space/i);
  });

  it('handles empty and non-string input', () => {
    expect(checkVin('').valid).toBe(false);
    expect(checkVin('   ').reason).toMatch(/enter a vin/i);
    expect(() => checkVin(undefined as unknown as string)).not.toThrow();
    expect(checkVin(null as unknown as string).valid).toBe(false);
  });

  it('keeps a long paste readable by listing only the first few character problems', () => {
    const r = checkVin('this is not a vin at all!!');
    expect(r.valid).toBe(false);
    expect(r.reason).toMatch(/more character problem/);
  });

  it('warns when position 10 is not a model-year code but the check digit passes', () => {
    // Position 10 = '0' (not a year code per Source W: 0, U and Z are unused). Check digit
    // computed by hand for this made-up VIN: 1M8GDM9A?0P042788 → sum 333, 333 mod 11 = 3.
    const r = checkVin('1M8GDM9A30P042788');
    expect(r.checkDigit).toBe('3');
    expect(r.valid).toBe(true);
    expect(r.modelYears).toEqual([]);
    expect(r.warning).toMatch(/position 10/i);
  });
});

describe('modelYearsForCode', () => {
  // Source W, "Model year encoding" table (also reproduced on montanaowners.com forum post #8, 2011).
  it.each([
    ['A', [1980, 2010]],
    ['H', [1987, 2017]],
    ['J', [1988, 2018]],
    ['L', [1990, 2020]],
    ['P', [1993, 2023]],
    ['R', [1994, 2024]],
    ['V', [1997, 2027]],
    ['Y', [2000, 2030]],
    ['1', [2001, 2031]],
    ['9', [2009, 2039]],
  ])('%s → %j', (code, years) => {
    expect(modelYearsForCode(code)).toEqual(years);
  });

  it('returns no years for codes that are never used for the model year', () => {
    // Source W: I, O, Q, U, Z and 0 are not used for the model year.
    for (const c of ['I', 'O', 'Q', 'U', 'Z', '0', '', 'AB']) expect(modelYearsForCode(c)).toEqual([]);
  });
});
