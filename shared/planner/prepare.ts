// Indexes a build's upgrades and their prerequisite graph once, for the planner and the validator.
import { buildIndexGraph, extractCycle, kahnOrder, type IndexGraph } from './graph';
import type { PlannerUpgrade } from './types';

export interface PreparedUpgrades {
  /** Upgrades with duplicate ids dropped (the first one wins), in input order. */
  ups: PlannerUpgrade[];
  index: Map<number, number>;
  graph: IndexGraph;
  /** A prerequisite order of every upgrade; meaningful only when cycle is null. */
  order: Int32Array;
  /** One prerequisite cycle as upgrade ids, each a prerequisite of the next and the last of the first. */
  cycle: number[] | null;
}

/**
 * Prerequisite ids that name no upgrade of the build (for example a deleted one) are ignored:
 * nothing can be scheduled for them, and refusing the whole plan for it would help nobody.
 */
export function prepareUpgrades(upgrades: readonly PlannerUpgrade[]): PreparedUpgrades {
  const ups: PlannerUpgrade[] = [];
  const index = new Map<number, number>();
  for (const u of upgrades) {
    if (index.has(u.id)) continue;
    index.set(u.id, ups.length);
    ups.push(u);
  }
  const preds: number[][] = new Array(ups.length);
  for (let i = 0; i < ups.length; i++) {
    const list: number[] = [];
    for (const pid of ups[i].prerequisiteIds ?? []) {
      const j = index.get(pid);
      if (j !== undefined && !list.includes(j)) list.push(j);
    }
    preds[i] = list;
  }
  const graph = buildIndexGraph(preds);
  const { order, count, remaining } = kahnOrder(graph);
  const cycle = count < ups.length ? extractCycle(graph, remaining).map((i) => ups[i].id) : null;
  return { ups, index, graph, order, cycle };
}

export function roundHours(h: number): number {
  // Sums of fractional hours carry float noise (0.1 + 0.2); six places is far below any real entry.
  return Math.round(h * 1e6) / 1e6;
}

export function validHours(h: unknown): h is number {
  return typeof h === 'number' && Number.isFinite(h) && h >= 0;
}
