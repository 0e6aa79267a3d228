// summarizePlanChange (shared/planChange.ts): what a plan change does, worked out by hand below.
import { describe, it, expect } from 'vitest';
import { planChangeLine, summarizePlanChange, type PlanSideEpisode } from '../../shared/planChange';

const ep = (
  id: number | null,
  number: number,
  title: string,
  state: string | null,
  shootDate: string | null,
  upgradeIds: number[],
): PlanSideEpisode => ({ id, number, title, state, shootDate, releaseDate: null, upgradeIds });
const titles: Record<number, string> = { 1: 'Wheels', 2: 'Mirrors', 3: 'Grille', 4: 'Hitch' };

describe('summarizePlanChange', () => {
  it('lists moved upgrades, episodes whose contents change and date changes', () => {
    const before = [
      ep(10, 1, 'Ready to tow', 'scheduled', '2026-12-10', [4, 1]),
      ep(11, 2, 'Stance', 'draft', null, [2]),
    ];
    const after = [
      ep(10, 1, 'Ready to tow', 'scheduled', '2026-12-14', [1, 2, 3]),
      ep(11, 2, 'Stance', 'draft', null, []),
      ep(null, 3, 'New', null, null, [4]),
    ];
    const s = summarizePlanChange(before, after, (id) => titles[id]!);
    // By hand: Wheels stays in episode 1; Mirrors 2 → 1; Grille unplanned → 1; Hitch 1 → new episode 3.
    expect(s.moved).toEqual([
      { upgradeId: 3, title: 'Grille', from: null, to: 1 },
      { upgradeId: 2, title: 'Mirrors', from: 2, to: 1 },
      { upgradeId: 4, title: 'Hitch', from: 1, to: 3 },
    ]);
    expect(s.episodesChanged).toEqual([
      { id: 10, number: 1, title: 'Ready to tow', added: ['Mirrors', 'Grille'], removed: ['Hitch'], isNew: false },
      { id: 11, number: 2, title: 'Stance', added: [], removed: ['Mirrors'], isNew: false },
      { id: null, number: 3, title: 'New', added: ['Hitch'], removed: [], isNew: true },
    ]);
    expect(s.dateChanges).toEqual([
      {
        id: 10,
        number: 1,
        title: 'Ready to tow',
        state: 'scheduled',
        shootDate: ['2026-12-10', '2026-12-14'],
        releaseDate: null,
      },
    ]);
    expect(planChangeLine(s)).toBe("3 upgrades moved, 3 episodes changed contents, 1 episode's dates changed");
  });

  it('an unchanged plan changes nothing', () => {
    const plan = [ep(10, 1, 'A', 'draft', null, [1, 2])];
    expect(summarizePlanChange(plan, plan, (id) => titles[id]!)).toEqual({
      moved: [],
      episodesChanged: [],
      dateChanges: [],
    });
  });
});
