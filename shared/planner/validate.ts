// Checks a proposed or hand-made episode order against the planner's hard rules; lists every violation.
import { episodeCapacity } from './episodes';
import { prepareUpgrades, roundHours, validHours } from './prepare';
import type { PlannerInput, PlanToValidate, PlanViolation } from './types';

const fmtHours = (h: number) => `${Number(roundHours(h).toFixed(1))} h`;

/**
 * Violations, in this order: a prerequisite cycle; then per episode (by number) unknown and duplicate
 * upgrades; then prerequisite order, late parts and over-capacity episodes. Episodes are compared by
 * number, and inside one episode by running order.
 *
 * Not violations: a prerequisite that is installed but in no episode (it is done); a single upgrade
 * bigger than an episode (the planner gives it an episode of its own); late parts or over-capacity in
 * a locked episode (a fixed episode, or one an upgrade is locked into) — it was shot as it was.
 */
export function validatePlan(input: PlannerInput, plan: PlanToValidate): PlanViolation[] {
  const { capacity } = episodeCapacity(input);
  const { ups, index, graph: g, cycle } = prepareUpgrades(input.upgrades);
  const n = ups.length;
  const name = (i: number) => `"${ups[i].title}"`;
  const out: PlanViolation[] = [];

  if (cycle) {
    const titles = cycle.map((id) => name(index.get(id)!));
    out.push({
      kind: 'cycle',
      message: `Prerequisites form a cycle, so no order can satisfy them (each must come before the next): ${[...titles, titles[0]].join(' → ')}.`,
      upgradeIds: cycle,
      episodeNumbers: [],
    });
  }

  const locked = new Set<number>((input.fixedEpisodes ?? []).map((e) => e.number));
  for (const u of ups) if (u.fixedEpisode != null) locked.add(u.fixedEpisode);

  const episodes = [...plan.episodes].sort((a, b) => a.number - b.number);
  const epOf = new Float64Array(n).fill(NaN);
  const posOf = new Int32Array(n);
  const members: number[][] = episodes.map(() => []);
  episodes.forEach((ep, e) => {
    ep.upgradeIds.forEach((id, p) => {
      const i = index.get(id);
      if (i === undefined) {
        out.push({
          kind: 'unknown_upgrade',
          message: `Episode ${ep.number} lists upgrade #${id}, which is not an upgrade of this build.`,
          upgradeIds: [id],
          episodeNumbers: [ep.number],
        });
      } else if (!Number.isNaN(epOf[i])) {
        const where =
          epOf[i] === ep.number
            ? `twice in episode ${ep.number}`
            : `in episode ${epOf[i]} and again in episode ${ep.number}`;
        out.push({
          kind: 'duplicate_upgrade',
          message: `${name(i)} is ${where}; an upgrade belongs to one episode.`,
          upgradeIds: [id],
          episodeNumbers: epOf[i] === ep.number ? [ep.number] : [epOf[i], ep.number],
        });
      } else {
        epOf[i] = ep.number;
        posOf[i] = p;
        members[e].push(i);
      }
    });
  });

  // Prerequisite order, per upgrade in plan order so the list reads like the plan.
  for (const list of members) {
    for (const i of list) {
      for (let k = g.predStart[i]; k < g.predStart[i + 1]; k++) {
        const j = g.predIdx[k];
        const ids = [ups[i].id, ups[j].id];
        if (Number.isNaN(epOf[j])) {
          if (ups[j].installState === 'installed') continue;
          out.push({
            kind: 'prerequisite_order',
            message: `${name(i)} (episode ${epOf[i]}) needs ${name(j)}, which is in no episode and not installed.`,
            upgradeIds: ids,
            episodeNumbers: [epOf[i]],
          });
        } else if (epOf[j] > epOf[i]) {
          out.push({
            kind: 'prerequisite_order',
            message: `${name(i)} (episode ${epOf[i]}) comes before its prerequisite ${name(j)} (episode ${epOf[j]}).`,
            upgradeIds: ids,
            episodeNumbers: [epOf[i], epOf[j]],
          });
        } else if (epOf[j] === epOf[i] && posOf[j] > posOf[i]) {
          out.push({
            kind: 'prerequisite_order',
            message: `In episode ${epOf[i]}, ${name(i)} runs before its prerequisite ${name(j)}.`,
            upgradeIds: ids,
            episodeNumbers: [epOf[i]],
          });
        }
      }
    }
  }

  episodes.forEach((ep, e) => {
    if (locked.has(ep.number)) return;
    const shoot = ep.shootDate ?? null;
    let hours = 0;
    for (const i of members[e]) {
      if (validHours(ups[i].estimatedHours)) hours += ups[i].estimatedHours;
      const due = ups[i].partsDueDate;
      // ISO dates compare correctly as strings.
      if (shoot && due && due > shoot) {
        out.push({
          kind: 'parts_late',
          message: `${name(i)} is in episode ${ep.number}, shot ${shoot}, but its parts are due ${due}.`,
          upgradeIds: [ups[i].id],
          episodeNumbers: [ep.number],
        });
      }
    }
    if (members[e].length > 1 && hours > capacity + 1e-9) {
      out.push({
        kind: 'over_capacity',
        message: `Episode ${ep.number} holds ${fmtHours(hours)}, over its capacity of ${fmtHours(capacity)}: ${members[e].map(name).join(', ')}.`,
        upgradeIds: members[e].map((i) => ups[i].id),
        episodeNumbers: [ep.number],
      });
    }
  });
  return out;
}
