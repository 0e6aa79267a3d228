// The planner's three fixed weaknesses (issue 11, deliverable 6), on small builds whose best finish
// is known: by hand (total hours over episode capacity) or from HiGHS, a general-purpose
// mixed-integer solver from the registry (`highs`), solving the model in scripts/bench/planQuality.ts.
import { describe, expect, it } from 'vitest';
import loadHighs from 'highs';
import { proposePlan, validatePlan } from '../../shared/planner/plan';
import type { Plan, PlannerInput, PlannerUpgrade } from '../../shared/planner/types';
import type { Area } from '../../shared/domain';
import { exactModel, slotOf } from '../../scripts/bench/planQuality';

type Row = [id: number, area: Area, hours: number, priority: number, votes: number, after: number[], partsDue?: string];
// 8 shoot hours an episode, 20 shop hours a week, weekly: capacity min(8, 20) = 8 h.
const build = (rows: Row[]): PlannerInput => ({
  startDate: '2027-01-04',
  shootHoursPerEpisode: 8,
  releaseCadenceDays: 7,
  shopHoursPerWeek: 20,
  upgrades: rows.map(([id, area, estimatedHours, priority, votes, prerequisiteIds, partsDueDate]): PlannerUpgrade => ({
    id,
    title: `U${id}`,
    area,
    estimatedHours,
    priority,
    votes,
    installState: 'queued',
    partsDueDate: partsDueDate ?? null,
    prerequisiteIds,
    fixedEpisode: null,
  })),
});
const ok = (p: Plan) => {
  if (!p.ok) throw new Error('cycle');
  return p;
};

describe('fills episodes instead of stranding room', () => {
  it("takes the larger same-level upgrade that fills the episode over a small one of the lead's area", () => {
    // 3 + 1.5 + 5 + 5.5 + 5.5 + 1.5 = 22 h at 8 h an episode: at least ceil(22 / 8) = 3 episodes (by hand).
    // The rule before this fix led with 1 (rear, priority 1) and took 2 (rear, 1.5 h) first, for its
    // area and votes, leaving 3.5 h empty: [1,2] [3,6] [4] [5], four episodes.
    const input = build([
      [1, 'rear', 3, 1, 12, []],
      [2, 'rear', 1.5, 2, 29, []],
      [3, 'sides', 5, 2, 27, []],
      [4, 'rear', 5.5, 3, 23, [2]],
      [5, 'sides', 5.5, 4, 8, []],
      [6, 'sides', 1.5, 4, 27, [3]],
    ]);
    const plan = ok(proposePlan(input));
    expect(plan.episodes.map((e) => e.upgradeIds)).toEqual([
      [1, 3],
      [2, 4],
      [6, 5],
    ]);
    expect(validatePlan(input, plan)).toEqual([]);
    expect(plan.method).toBe('priority');
  });

  it('best fit within a priority level: 23 h in the 3 episodes it needs', () => {
    // ceil(23 / 8) = 3 (by hand). First fit in priority order gave [4,5] [6,2] [1] [3].
    const input = build([
      [1, 'cabin', 5.5, 2, 6, []],
      [2, 'wheels_chassis', 2.5, 4, 11, []],
      [3, 'front', 4.5, 3, 4, []],
      [4, 'sides', 3, 2, 1, []],
      [5, 'electrical', 3, 1, 19, [4]],
      [6, 'cabin', 4.5, 1, 2, []],
    ]);
    const plan = ok(proposePlan(input));
    expect(plan.episodes).toHaveLength(3);
    expect(validatePlan(input, plan)).toEqual([]);
  });
});

describe('urgency inherited only when the dependant can be shot soon', () => {
  it('a prerequisite of an upgrade whose parts are weeks away does not take the slot of a shootable one', () => {
    // 2 (priority 1) needs 1 (priority 5) and waits for parts until 2027-02-03, the day after the
    // 2027-02-01 shoot (slot 4), so it can be shot on 2027-02-08 at the earliest. The shootable 3
    // (priority 3) goes first; 1 goes in time to come before 2.
    const input = build([
      [1, 'front', 8, 5, 0, []],
      [2, 'front', 2, 1, 50, [1], '2027-02-03'],
      [3, 'cabin', 8, 3, 0, []],
    ]);
    const plan = ok(proposePlan(input));
    expect(plan.episodes.map((e) => [e.shootDate, e.upgradeIds])).toEqual([
      ['2027-01-11', [3]],
      ['2027-01-18', [1]],
      ['2027-02-08', [2]],
    ]);
  });

  it('with late parts, reaches the exact optimum HiGHS finds (seeded build 20 of the benchmark)', async () => {
    // The rule before this fix finished one episode later (2027-02-08 against 2027-02-01).
    const input = build([
      [1, 'rear', 4, 2, 12, []],
      [2, 'rear', 6, 2, 4, [1]],
      [3, 'wheels_chassis', 2.5, 1, 9, [2], '2027-01-06'],
      [4, 'wheels_chassis', 2.5, 1, 13, [3]],
      [5, 'sides', 1.5, 5, 13, [1], '2027-01-30'],
      [6, 'electrical', 2, 1, 11, []],
      [7, 'front', 3.5, 3, 21, [], '2027-01-31'],
      [8, 'sides', 4.5, 1, 1, []],
    ]);
    const plan = ok(proposePlan(input));
    expect(validatePlan(input, plan)).toEqual([]);
    const last = Math.max(...plan.episodes.map((e) => slotOf(input, e.shootDate)));
    const highs = await loadHighs();
    const exact = highs.solve(exactModel(input, last + 1), { output_flag: false, time_limit: 10 });
    expect(exact.Status).toBe('Optimal');
    expect(last).toBe(Math.round(exact.ObjectiveValue));
    expect(last).toBe(4);
  });
});
