// Unit tests for shared/tires.ts against published tire-size tables and an independent calculation.
import { describe, it, expect } from 'vitest';
import { parseTireSize, compareTires, DIAMETER_WARNING_PCT, type TireSize } from '../../shared/tires';

// Published check values. Each table below lists where its figures come from. These are
// nominal (calculated-from-marking) figures; a maker's measured diameter for a given tire model
// differs by a few tenths of an inch, so the published figures are compared at their own precision.
//
// P1: performanceplustire.com blog, "What Size is 275 55 R20 in Inches?" (2025-11-12):
//     275/55R20 → 31.9 in diameter, 10.8 in width, 5.9 in sidewall, 100.2 in circumference, 632 rev/mi.
// P2: performanceplustire.com blog, "What Size Tire is a 33 12.50 R20": 33x12.50R20 → 33.0 in,
//     12.5 in width, 6.5 in sidewall, 103.6 in circumference, 611 rev/mi.
// P3: carmath.fyi, "Tire Size Calculator: How to Read 265/70R17": 265/70R17 → 7.3 in sidewall, 31.6 in;
//     size table: 245/75R16 30.5 in, 285/70R17 32.7 in, 315/70R17 34.4 in, 35x12.50R17 35.0 in.
// P4: dodgeforum.com thread "formula for wheel and tire circumference": 265/70R17 → sidewall 7.303 in,
//     31.6 in diameter, 638.13 rev/mi.
// P5: tirefitlab.com "275/55 R20": 31.91 in diameter, 10.83 in width, 5.95 in sidewall,
//     100.25 in circumference, 632 rev/mi; 265/70 R17 is −1.0 %, 275/65 R18 +0.5 %, 31x10.50 R15 −2.9 %.
// P6: donsnotes.com "Tires": 235/75R15 → 28.9 in.   P7: barretire.com "Tire sizes": 245/55R18 → 726.7 mm.
// P8: Mopar owner's manual (Ram 2500/3500, 2022), "Tire sizing chart": in 31x10.5 R15 LT the 31 is the
//     overall diameter in inches and 10.5 the section width in inches.

function parsed(text: string): TireSize {
  const r = parseTireSize(text);
  if (!r.ok) throw new Error(`expected ${text} to parse: ${r.error}`);
  return r.size;
}

// Independent calculation: work in millimetres throughout and convert once at the end, so a
// mistake in the module's inch arithmetic would not be repeated here.
function independentDiameterIn(widthMm: number, aspect: number, rimIn: number): number {
  const totalMm = rimIn * 25.4 + 2 * widthMm * (aspect / 100);
  return totalMm / 25.4;
}

describe('parseTireSize: metric sizes against published tables', () => {
  it.each([
    // size, published diameter (in), decimals published, source
    ['265/70R17', 31.6, 1, 'P3, P4'],
    ['275/55R20', 31.9, 1, 'P1'],
    ['275/55R20', 31.91, 2, 'P5'],
    ['245/75R16', 30.5, 1, 'P3'],
    ['285/70R17', 32.7, 1, 'P3'],
    ['315/70R17', 34.4, 1, 'P3'],
    ['235/75R15', 28.9, 1, 'P6'],
  ])('%s is %s in across (%s)', (size, published, decimals) => {
    const s = parsed(size);
    expect(s.overallDiameterIn).toBeCloseTo(published, decimals);
  });

  it('gives the published millimetre diameter for 245/55R18 (P7)', () => {
    // P7 works in millimetres: (134.75 mm × 2) + 457.2 mm = 726.7 mm. Its inch figure (28.63) does not
    // follow from its own 726.7 mm (726.7 / 25.4 = 28.61), so we check the millimetre value it derives.
    expect(parsed('245/55R18').overallDiameterIn * 25.4).toBeCloseTo(726.7, 1);
  });

  it('gives the published sidewall, width, circumference and revolutions for 275/55R20', () => {
    const s = parsed('275/55R20');
    expect(s.sectionWidthIn).toBeCloseTo(10.83, 2); // P5: 10.83 in (P1: 10.8 in)
    expect(s.sidewallIn).toBeCloseTo(5.95, 2); // P5: 5.95 in (P1 truncates to 5.9 in)
    expect(s.circumferenceIn).toBeCloseTo(100.25, 2); // P5: 100.25 in (P1: 100.2 in)
    expect(Math.round(s.revsPerMile)).toBe(632); // P1, P5: 632 rev/mi
  });

  it('gives the published sidewall and revolutions for 265/70R17', () => {
    const s = parsed('265/70R17');
    expect(s.sidewallIn).toBeCloseTo(7.303, 3); // P4: 7.303 in
    expect(s.revsPerMile).toBeCloseTo(638.1, 0); // P4: 638.13 rev/mi (P4 rounds the diameter to 31.6 first)
  });

  it('agrees with an independent millimetre calculation on every field', () => {
    for (const [w, a, r] of [
      [265, 70, 17],
      [275, 55, 20],
      [275, 65, 20],
      [225, 45, 17],
      [315, 35, 21],
    ] as const) {
      const s = parsed(`${w}/${a}R${r}`);
      const d = independentDiameterIn(w, a, r);
      expect(s.overallDiameterIn).toBeCloseTo(d, 9);
      expect(s.sectionWidthIn).toBeCloseTo(w / 25.4, 9);
      expect(s.sidewallIn).toBeCloseTo((d - r) / 2, 9);
      expect(s.circumferenceIn).toBeCloseTo(d * 3.141592653589793, 9);
      expect(s.revsPerMile).toBeCloseTo((5280 * 12) / (d * 3.141592653589793), 6);
    }
  });

  it('accepts P and LT prefixes, spaces, ZR, lowercase and a trailing service description', () => {
    expect(parsed('P275/55R20').prefix).toBe('P');
    expect(parsed('P275/55R20').overallDiameterIn).toBeCloseTo(parsed('275/55R20').overallDiameterIn, 12);
    const lt = parsed('LT275/65R20');
    expect(lt.prefix).toBe('LT');
    expect(lt.overallDiameterIn).toBeCloseTo(independentDiameterIn(275, 65, 20), 9); // ≈ 34.07 in
    expect(parsed('265/70 R17').text).toBe('265/70R17');
    expect(parsed('265/70ZR17').overallDiameterIn).toBeCloseTo(31.6, 1); // P3: same size, speed-rated construction
    expect(parsed('lt275/65r20').text).toBe('LT275/65R20');
    expect(parsed('  275 / 55 R 20 ').text).toBe('275/55R20');
    expect(parsed('275/55R20 116T').text).toBe('275/55R20');
    expect(parsed('LT265/70R17 121/118S').prefix).toBe('LT');
    expect(parsed('265/70R17LT').prefix).toBe('LT');
  });

  it('rounds the display strings but keeps raw numbers', () => {
    const s = parsed('265/70R17');
    expect(s.overallDiameterIn).not.toBe(31.6); // raw, not rounded
    expect(s.display).toEqual({
      sectionWidth: '10.4 in',
      sidewall: '7.3 in', // P3: 7.3 in
      overallDiameter: '31.6 in', // P3, P4: 31.6 in
      circumference: '99.3 in',
      revsPerMile: '638', // P4: 638.13
    });
  });
});

describe('parseTireSize: flotation sizes', () => {
  it('reads 33x12.50R20 as published (P2)', () => {
    const s = parsed('33x12.50R20');
    expect(s.kind).toBe('flotation');
    expect(s.overallDiameterIn).toBe(33); // P2, P8: first number is the overall diameter
    expect(s.sectionWidthIn).toBe(12.5); // P2, P8: second number is the section width
    expect(s.sidewallIn).toBe(6.5); // P2: 6.5 in
    expect(s.rimIn).toBe(20);
    expect(s.circumferenceIn).toBeCloseTo(103.67, 2); // P2 prints 103.6 (truncated); π × 33 = 103.67
    expect(Math.round(s.revsPerMile)).toBe(611); // P2: 611 rev/mi
  });

  it('accepts the LT suffix, upper-case X and a one-decimal width', () => {
    const s = parsed('33X12.50R20LT');
    expect(s.text).toBe('33x12.50R20LT');
    expect(s.overallDiameterIn).toBe(33);
    expect(parsed('35x12.5R17').overallDiameterIn).toBeCloseTo(35.0, 1); // P3: 35x12.50R17 = 35.0 in
    expect(parsed('35x12.5R17').text).toBe('35x12.50R17');
  });
});

describe('parseTireSize: errors are messages, not exceptions', () => {
  it.each([
    ['', /enter a tire size/i],
    ['   ', /enter a tire size/i],
    ['hello', /not a tire size/i],
    ['265/7017', /construction letter/i],
    ['265/70R45', /rim diameter 45/i],
    ['999/70R17', /section width 999/i],
    ['265/15R17', /aspect ratio 15/i],
    ['20x12.50R20', /no room for a sidewall/i],
    ['33x40.00R20', /section width 40/i],
  ])('%j → error', (text, pattern) => {
    const r = parseTireSize(text);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error).toMatch(pattern);
  });

  it('does not throw on non-string input', () => {
    expect(() => parseTireSize(undefined as unknown as string)).not.toThrow();
    expect(parseTireSize(null as unknown as string).ok).toBe(false);
  });
});

describe('compareTires', () => {
  it('matches the published percent differences (P5) without a warning', () => {
    const smaller = compareTires('275/55R20', '265/70R17');
    expect(smaller.ok && smaller.display.diameterChange).toBe('-1.0 %'); // P5: 265/70 R17 −1.0 %
    const bigger = compareTires('275/55R20', '275/65R18');
    expect(bigger.ok && bigger.display.diameterChange).toBe('+0.5 %'); // P5: 275/65 R18 +0.5 %
    const close = compareTires('275/55R20', '31x10.50R15');
    expect(close.ok && close.display.diameterChange).toBe('-2.9 %'); // P5: 31x10.50 R15 −2.9 %
    expect(close.ok && close.warning).toBeNull(); // 2.9 % is inside the ±3 % rule of thumb
  });

  it('computes speedometer at true 60 mph two independent ways (diameter ratio and revolutions ratio)', () => {
    const r = compareTires('275/55R20', '33x12.50R20');
    if (!r.ok) throw new Error(r.error);
    // Independent: the speedometer counts revolutions, so it reads 60 × (new rev/mi ÷ old rev/mi).
    // Published rev/mi: 611 (P2) and 632 (P1) → 58.0 mph; exact nominal values give 58.02.
    expect(r.speedometerAtTrue60).toBeCloseTo((60 * 611) / 632, 1);
    expect(r.speedometerAtTrue60).toBeCloseTo((60 * r.to.revsPerMile) / r.from.revsPerMile, 9);
    expect(r.speedometerAtTrue60).toBeCloseTo((60 * 31.909448818897637) / 33, 9);
    expect(r.display.speedometerAtTrue60).toBe('58.0 mph');
    // Published diameters 31.9 (P1) and 33.0 (P2): (33 − 31.9) / 31.9 = +3.45 %; exact nominal +3.42 %.
    expect(r.diameterChangePct).toBeCloseTo(3.42, 2);
    expect(r.diameterChangePct).toBeCloseTo(((33 - 31.9) / 31.9) * 100, 0);
  });

  it('warns beyond ±3 % with the direction and the speedometer reading', () => {
    const up = compareTires('275/55R20', '33x12.50R20LT');
    if (!up.ok) throw new Error(up.error);
    expect(DIAMETER_WARNING_PCT).toBe(3); // common practice (rule of thumb), not a regulation
    expect(up.warning).toMatch(/taller/);
    expect(up.warning).toMatch(/58\.0 mph/);
    expect(up.warning).toMatch(/reading low/);
    expect(up.warning).toMatch(/common practice/);

    const down = compareTires('33x12.50R20', '275/55R20');
    if (!down.ok) throw new Error(down.error);
    expect(down.diameterChangePct).toBeLessThan(-3);
    expect(down.speedometerAtTrue60).toBeGreaterThan(60); // smaller tire: speedometer reads high
    expect(down.warning).toMatch(/shorter/);
    expect(down.warning).toMatch(/reading high/);
  });

  it('reports no change for the same size written two ways', () => {
    const r = compareTires('P275/55R20', '275/55 r20');
    if (!r.ok) throw new Error(r.error);
    expect(r.diameterChangePct).toBe(0);
    expect(r.speedometerAtTrue60).toBe(60);
    expect(r.display.diameterChange).toBe('0.0 %');
    expect(r.warning).toBeNull();
  });

  it('says which size could not be read', () => {
    const a = compareTires('nope', '275/55R20');
    expect(a.ok).toBe(false);
    if (!a.ok) expect(a.error).toMatch(/^Current size/);
    const b = compareTires('275/55R20', '275/55');
    expect(b.ok).toBe(false);
    if (!b.ok) expect(b.error).toMatch(/^New size/);
  });
});
