// Release times (start no earlier than) and finish-to-start lags in criticalPath, and the one-bay
// forecast built on them (shared/planner/forecast.ts).
import { describe, expect, it } from 'vitest';
import { criticalPath } from '../../shared/planner/criticalPath';
import { bayForecast } from '../../shared/planner/forecast';

describe('finish-to-start lags: published worked example', () => {
  it('IBM PM10G curriculum, "Lag Time": Mix Concrete (6) –lag 5→ Pour Concrete (4)', () => {
    // Source: IBM project management curriculum PM10G (2007), "Calculating Start and Finish Dates",
    // lag-time graphic. Forward pass, day-1 numbering: 1(ES1) + 6 = 7(EF1) + 5 (lag) = 12(ES2) + 4 = 16(EF2).
    // Backward pass from the source's LF2 = 18: 18 − 4 = 14(LS2) − 5 (lag) = 9(LF1) − 6 = 3(LS1).
    // Here time starts at 0 (ES1 = 0 instead of day 1) and the backward pass starts from the project's
    // own finish 15 (16 in day-1 numbering) instead of 18, i.e. 3 units earlier, so the source's
    // late dates less 3 give LS2 = 11, LF1 = 6, LS1 = 0: the same subtractions.
    const r = criticalPath([
      { id: 'mix', duration: 6, after: [] },
      { id: 'pour', duration: 4, after: [{ id: 'mix', lag: 5 }] },
    ]);
    if (!r.ok) throw new Error('no schedule');
    expect(r.tasks.mix).toEqual({ es: 0, ef: 6, ls: 0, lf: 6, totalFloat: 0 });
    expect(r.tasks.pour).toEqual({ es: 11, ef: 15, ls: 11, lf: 15, totalFloat: 0 });
    expect(r.duration).toBe(15);
    expect(r.critical).toEqual(['mix', 'pour']);
  });
});

describe('release times (start no earlier than)', () => {
  // Worked by hand (from the forward/backward pass rules; a release bounds only the early dates):
  //   A 3, no predecessors          ES 0  EF 3   LS 4  LF 7   float 4
  //   B 2, release 5                ES 5  EF 7   LS 5  LF 7   float 0   (the release binds)
  //   C 4, after A and B            ES 7  EF 11  LS 7  LF 11  float 0
  //   D 1, after A, release 2       ES 3  EF 4   LS 10 LF 11  float 7   (A's finish binds, not 2)
  // Duration 11; critical B → C. Without B's release the chain would be A → C, 7 long.
  const tasks = [
    { id: 'A', duration: 3, after: [] },
    { id: 'B', duration: 2, after: [], release: 5 },
    { id: 'C', duration: 4, after: ['A', 'B'] },
    { id: 'D', duration: 1, after: ['A'], release: 2 },
  ];
  it('the early dates wait for the release, and the late dates come from the project finish', () => {
    const r = criticalPath(tasks);
    if (!r.ok) throw new Error('no schedule');
    expect(r.duration).toBe(11);
    expect(r.tasks).toEqual({
      A: { es: 0, ef: 3, ls: 4, lf: 7, totalFloat: 4 },
      B: { es: 5, ef: 7, ls: 5, lf: 7, totalFloat: 0 },
      C: { es: 7, ef: 11, ls: 7, lf: 11, totalFloat: 0 },
      D: { es: 3, ef: 4, ls: 10, lf: 11, totalFloat: 7 },
    });
    expect(r.critical).toEqual(['B', 'C']);
  });

  it('a release equals a finish-to-start lag from a zero-length start milestone', () => {
    const viaLag = criticalPath([
      { id: 'start', duration: 0, after: [] },
      ...tasks.map((t) => ({
        id: t.id,
        duration: t.duration,
        after: [...t.after, { id: 'start', lag: t.release ?? 0 }],
      })),
    ]);
    const viaRelease = criticalPath(tasks);
    if (!viaLag.ok || !viaRelease.ok) throw new Error('no schedule');
    for (const id of ['A', 'B', 'C', 'D']) expect(viaLag.tasks[id]).toEqual(viaRelease.tasks[id]);
  });

  it('a negative or non-finite release is a programming error', () => {
    expect(() => criticalPath([{ id: 'x', duration: 1, after: [], release: -1 }])).toThrow(RangeError);
    expect(() => criticalPath([{ id: 'x', duration: 1, after: [], release: Number.NaN }])).toThrow(RangeError);
  });

  it('a repeated predecessor keeps its longest lag', () => {
    const r = criticalPath([
      { id: 'a', duration: 1, after: [] },
      { id: 'b', duration: 1, after: ['a', { id: 'a', lag: 2 }] },
    ]);
    expect(r.ok && r.tasks.b.es).toBe(3);
  });
});

describe('the one-bay forecast', () => {
  // 7 shop hours a week makes one hour one calendar day, so the arithmetic below is by hand.
  it('a late part opens the last stretch of work and is named with its chain', () => {
    // 1 (2 h) → 2 (3 h, parts due day 10); 3 (4 h) free. Bay: 1 on days 0–2, 3 on 2–6, idle, 2 on 10–13.
    const r = bayForecast(
      [
        { id: 1, hours: 2, release: 0, prerequisiteIds: [] },
        { id: 2, hours: 3, release: 10, prerequisiteIds: [1] },
        { id: 3, hours: 4, release: 0, prerequisiteIds: [] },
      ],
      7,
    );
    if (!r.ok) throw new Error('cycle');
    expect(r.days).toBe(13);
    expect(r.chainDays).toBe(13);
    expect(r.drivenByRelease).toBe(2);
    expect(r.critical).toEqual([2]);
    expect(r.order).toEqual([1, 3, 2]);
  });

  it('with every part in, the hours decide: one bay works them one after another', () => {
    // 5 + 4 + 6 = 15 h at 7 h a week = 15 days, though the longest chain is only 1 → 2 = 9.
    const r = bayForecast(
      [
        { id: 1, hours: 5, release: 0, prerequisiteIds: [] },
        { id: 2, hours: 4, release: 0, prerequisiteIds: [1] },
        { id: 3, hours: 6, release: 0, prerequisiteIds: [] },
      ],
      7,
    );
    if (!r.ok) throw new Error('cycle');
    expect(r.days).toBe(15);
    expect(r.chainDays).toBe(9);
    expect(r.drivenByRelease).toBeNull();
    expect(r.order.indexOf(1)).toBeLessThan(r.order.indexOf(2));
  });

  it('a prerequisite chain after a late part: the chain is named from the late part on', () => {
    // 1 (1 h, due day 4) → 2 (2 h) → 3 (1 h); 4 (1 h) free. Bay: 4 on 0–1, idle, 1 on 4–5, 2 on 5–7, 3 on 7–8.
    const r = bayForecast(
      [
        { id: 1, hours: 1, release: 4, prerequisiteIds: [] },
        { id: 2, hours: 2, release: 0, prerequisiteIds: [1] },
        { id: 3, hours: 1, release: 0, prerequisiteIds: [2] },
        { id: 4, hours: 1, release: 0, prerequisiteIds: [] },
      ],
      7,
    );
    if (!r.ok) throw new Error('cycle');
    expect(r.days).toBe(8);
    expect(r.drivenByRelease).toBe(1);
    expect(r.critical).toEqual([1, 2, 3]);
  });

  it('reports a cycle', () => {
    const r = bayForecast(
      [
        { id: 1, hours: 1, release: 0, prerequisiteIds: [2] },
        { id: 2, hours: 1, release: 0, prerequisiteIds: [1] },
      ],
      7,
    );
    expect(r.ok).toBe(false);
  });
});
