// validatePlan finds every kind of violation in a hand-made order; minimumShopDays uses the critical path.
import { describe, expect, it } from 'vitest';
import { minimumShopDays, validatePlan } from '../../shared/planner/plan';
import type { PlannerInput, PlannerUpgrade, PlanViolation } from '../../shared/planner/types';
import type { Area } from '../../shared/domain';

const up = (
  id: number,
  title: string,
  area: Area,
  estimatedHours: number,
  o: Partial<PlannerUpgrade> = {},
): PlannerUpgrade => ({
  id,
  title,
  area,
  estimatedHours,
  priority: 3,
  votes: 0,
  installState: 'queued',
  partsDueDate: null,
  prerequisiteIds: [],
  fixedEpisode: null,
  ...o,
});
const base = { startDate: '2025-01-06', shootHoursPerEpisode: 10, releaseCadenceDays: 14, shopHoursPerWeek: 20 };

const input: PlannerInput = {
  ...base,
  upgrades: [
    up(1, 'Head unit', 'cabin', 4),
    up(2, 'Surround-view camera', 'electrical', 5, { prerequisiteIds: [1], partsDueDate: '2025-02-01' }),
    up(3, 'Trailer wiring', 'rear', 2),
    up(4, 'Brake controller', 'cabin', 1.5, { prerequisiteIds: [3] }),
    up(5, '20-inch wheels', 'wheels_chassis', 12),
    up(6, 'Hitch', 'rear', 3, { installState: 'installed' }),
    up(7, 'Hitch cover', 'rear', 0.5, { prerequisiteIds: [6] }),
    up(8, 'Crossbars', 'sides', 1, { prerequisiteIds: [9] }),
    up(9, 'Roof rails', 'sides', 2),
    up(10, 'Heated steering wheel', 'cabin', 2, { prerequisiteIds: [11] }),
    up(11, 'Clockspring', 'cabin', 1),
  ],
};

describe('validatePlan', () => {
  const violations = validatePlan(input, {
    episodes: [
      { number: 1, shootDate: '2025-01-20', upgradeIds: [2, 1, 4, 3] },
      { number: 2, shootDate: '2025-02-03', upgradeIds: [5] },
      { number: 3, shootDate: '2025-02-17', upgradeIds: [7, 77, 1, 8, 7] },
      { number: 4, shootDate: '2025-03-03', upgradeIds: [10] },
      { number: 5, shootDate: '2025-03-17', upgradeIds: [11] },
    ],
  });
  const of = (kind: PlanViolation['kind']) =>
    violations.filter((v) => v.kind === kind).map(({ kind: _k, ...rest }) => rest);

  it('finds upgrades that are not in the build and upgrades listed twice', () => {
    expect(of('unknown_upgrade')).toEqual([
      {
        message: 'Episode 3 lists upgrade #77, which is not an upgrade of this build.',
        upgradeIds: [77],
        episodeNumbers: [3],
      },
    ]);
    expect(of('duplicate_upgrade')).toEqual([
      {
        message: '"Head unit" is in episode 1 and again in episode 3; an upgrade belongs to one episode.',
        upgradeIds: [1],
        episodeNumbers: [1, 3],
      },
      {
        message: '"Hitch cover" is twice in episode 3; an upgrade belongs to one episode.',
        upgradeIds: [7],
        episodeNumbers: [3],
      },
    ]);
  });

  it('finds prerequisites later in the episode, in a later episode, or in none (an installed one is fine)', () => {
    expect(of('prerequisite_order')).toEqual([
      {
        message: 'In episode 1, "Surround-view camera" runs before its prerequisite "Head unit".',
        upgradeIds: [2, 1],
        episodeNumbers: [1],
      },
      {
        message: 'In episode 1, "Brake controller" runs before its prerequisite "Trailer wiring".',
        upgradeIds: [4, 3],
        episodeNumbers: [1],
      },
      {
        message: '"Crossbars" (episode 3) needs "Roof rails", which is in no episode and not installed.',
        upgradeIds: [8, 9],
        episodeNumbers: [3],
      },
      {
        message: '"Heated steering wheel" (episode 4) comes before its prerequisite "Clockspring" (episode 5).',
        upgradeIds: [10, 11],
        episodeNumbers: [4, 5],
      },
    ]);
  });

  it('finds parts due after the shoot date and episodes over capacity (one oversize upgrade alone is allowed)', () => {
    expect(of('parts_late')).toEqual([
      {
        message: '"Surround-view camera" is in episode 1, shot 2025-01-20, but its parts are due 2025-02-01.',
        upgradeIds: [2],
        episodeNumbers: [1],
      },
    ]);
    expect(of('over_capacity')).toEqual([
      {
        message:
          'Episode 1 holds 12.5 h, over its capacity of 10 h: "Surround-view camera", "Head unit", "Brake controller", "Trailer wiring".',
        upgradeIds: [2, 1, 4, 3],
        episodeNumbers: [1],
      },
    ]);
  });

  it('reports a prerequisite cycle by title, in order', () => {
    const cyclic: PlannerInput = {
      ...base,
      upgrades: [up(1, 'A', 'cabin', 1, { prerequisiteIds: [2] }), up(2, 'B', 'cabin', 1, { prerequisiteIds: [1] })],
    };
    const v = validatePlan(cyclic, { episodes: [{ number: 1, shootDate: '2025-01-20', upgradeIds: [1, 2] }] });
    expect(v[0]).toEqual({
      kind: 'cycle',
      message:
        'Prerequisites form a cycle, so no order can satisfy them (each must come before the next): "A" → "B" → "A".',
      upgradeIds: [1, 2],
      episodeNumbers: [],
    });
  });

  it('does not hold a locked episode to capacity or parts dates: it was shot as it was', () => {
    const v = validatePlan(
      {
        ...base,
        upgrades: [up(1, 'X', 'cabin', 8, { partsDueDate: '2025-03-01' }), up(2, 'Y', 'cabin', 8, { fixedEpisode: 1 })],
      },
      { episodes: [{ number: 1, shootDate: '2025-01-20', upgradeIds: [1, 2] }] },
    );
    expect(v).toEqual([]);
  });
});

describe('minimumShopDays', () => {
  it('is the critical path over remaining hours, in whole shop days', () => {
    const r = minimumShopDays(
      [
        up(1, 'Head unit', 'cabin', 4),
        up(2, 'Camera', 'electrical', 5, { prerequisiteIds: [1] }),
        up(3, 'Wheels', 'wheels_chassis', 10, { installState: 'installed' }), // done: no hours left
        up(4, 'Re-torque', 'wheels_chassis', 3, { prerequisiteIds: [3, 404] }), // 404 is not in the build
      ],
      8,
    );
    expect(r).toEqual({ ok: true, hours: 9, days: 2, critical: [1, 2] });
  });

  it('reports a cycle instead of a duration', () => {
    expect(
      minimumShopDays(
        [up(1, 'A', 'cabin', 1, { prerequisiteIds: [2] }), up(2, 'B', 'cabin', 1, { prerequisiteIds: [1] })],
        8,
      ),
    ).toEqual({
      ok: false,
      cycle: [1, 2],
    });
  });
});
