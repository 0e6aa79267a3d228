// Unit tests for shared/safety.ts: every flag has a short, paraphrased caution that defers to the authorities.
import { describe, it, expect } from 'vitest';
import { SAFETY_FLAGS } from '../../shared/domain';
import { SAFETY_CAUTIONS, SAFETY_DEFERRAL, cautionsFor } from '../../shared/safety';

// Counts sentence ends (., ! or ? followed by a space or the end). The deferral's semicolon joins
// two clauses of one sentence, so it is not counted.
function sentenceCount(text: string): number {
  return (text.match(/[.!?](\s|$)/g) ?? []).length;
}

describe('SAFETY_CAUTIONS', () => {
  it('covers exactly the safety flags of the domain', () => {
    expect(Object.keys(SAFETY_CAUTIONS).sort()).toEqual([...SAFETY_FLAGS].sort());
  });

  it.each([...SAFETY_FLAGS])('%s has a short label and a 2–3 sentence caution', (flag) => {
    const { label, caution } = SAFETY_CAUTIONS[flag];
    expect(label.trim().length).toBeGreaterThan(3);
    expect(label.length).toBeLessThanOrEqual(30); // fits a badge on the shop-floor checklist
    expect(sentenceCount(caution)).toBeGreaterThanOrEqual(2);
    expect(sentenceCount(caution)).toBeLessThanOrEqual(3);
    expect(caution.length).toBeLessThan(450);
  });

  it.each([...SAFETY_FLAGS])(
    "%s defers to the maker's service information, local codes and licensed practice",
    (flag) => {
      const { caution } = SAFETY_CAUTIONS[flag];
      expect(caution).toContain("vehicle maker's service information");
      expect(caution).toContain('local codes');
      expect(caution).toContain('licensed practice');
      expect(caution.endsWith(SAFETY_DEFERRAL)).toBe(true);
    },
  );

  it('gives each flag its own wording (not one caution repeated)', () => {
    const specific = SAFETY_FLAGS.map((f) => SAFETY_CAUTIONS[f].caution.replace(SAFETY_DEFERRAL, '').trim());
    expect(new Set(specific).size).toBe(SAFETY_FLAGS.length);
    const labels = SAFETY_FLAGS.map((f) => SAFETY_CAUTIONS[f].label);
    expect(new Set(labels).size).toBe(SAFETY_FLAGS.length);
  });

  it('names the subject of each flag in its caution', () => {
    expect(SAFETY_CAUTIONS.srs_airbag.caution).toMatch(/airbag/i);
    expect(SAFETY_CAUTIONS.brakes.caution).toMatch(/trailer/i);
    expect(SAFETY_CAUTIONS.lighting.caution).toMatch(/federal lamp rules/i);
    expect(SAFETY_CAUTIONS.rear_camera.caution).toMatch(/reverse/i);
    expect(SAFETY_CAUTIONS.wheels_tires.caution).toMatch(/torque/i);
    expect(SAFETY_CAUTIONS.wheels_tires.caution).toMatch(/load/i);
    expect(SAFETY_CAUTIONS.high_current.caution).toMatch(/fuse/i);
    expect(SAFETY_CAUTIONS.lifting.caution).toMatch(/lift points/i);
  });
});

describe('cautionsFor', () => {
  it('returns each flag once in the fixed domain order', () => {
    const list = cautionsFor(['wheels_tires', 'srs_airbag', 'wheels_tires', 'lifting']);
    expect(list.map((c) => c.flag)).toEqual(['srs_airbag', 'wheels_tires', 'lifting']);
    expect(list[0]).toEqual({ flag: 'srs_airbag', ...SAFETY_CAUTIONS.srs_airbag });
  });

  it('skips unknown flags and tolerates missing input', () => {
    expect(cautionsFor(['not_a_flag', 'brakes'])).toHaveLength(1);
    expect(cautionsFor([])).toEqual([]);
    expect(cautionsFor(null)).toEqual([]);
    expect(cautionsFor(undefined)).toEqual([]);
  });
});
