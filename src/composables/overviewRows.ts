// The rows of the overview's cost tables (per area, per episode, per upgrade), made one way for the
// overview screen and the printable report.
import type { RouteLocationRaw } from 'vue-router';
import type { BuildOverview } from '@/api/overview';
import { EPISODE_STATE_LABELS } from '@shared/domain';

/** Per area; `counts` adds "N upgrades" beside each area's name. */
export function areaRows(areas: BuildOverview['areas'], { counts = false } = {}) {
  return areas.map((a) => ({
    ...a,
    key: a.area,
    label: a.label,
    ...(counts ? { note: `${a.upgrades} upgrade${a.upgrades === 1 ? '' : 's'}` } : {}),
  }));
}

/** Per episode, numbered, with its state in words ("not in an episode" has neither). */
export function episodeRows(episodes: BuildOverview['episodes']) {
  return episodes.map((e) => ({
    ...e,
    key: e.episodeId ?? 'none',
    label: e.number === null ? e.title : `${e.number}. ${e.title}`,
    note: e.state ? EPISODE_STATE_LABELS[e.state] : undefined,
  }));
}

/** Per upgrade, in the order given; `link` makes each title a link (the screen's, not the paper's). */
export function upgradeRows(
  upgrades: BuildOverview['upgrades'],
  link?: (upgradeId: number) => RouteLocationRaw | null,
) {
  return upgrades.map((u) => ({
    ...u,
    key: u.upgradeId,
    label: u.title,
    ...(link ? { link: link(u.upgradeId) } : {}),
    note: u.done ? 'done' : undefined,
  }));
}
