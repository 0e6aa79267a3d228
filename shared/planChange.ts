// What a plan change does, in the producer's terms, before it is applied: which upgrades move,
// which episodes' contents change (their titles may no longer fit), and which dates change.
// Pure: the server lists it with a proposal and in each revision; the planner shows it.

export interface PlanSideEpisode {
  id: number | null;
  number: number;
  title: string;
  state: string | null;
  shootDate: string | null;
  releaseDate: string | null;
  upgradeIds: number[];
}

export interface PlanChangeSummary {
  moved: { upgradeId: number; title: string; from: number | null; to: number | null }[];
  episodesChanged: {
    id: number | null;
    number: number;
    title: string;
    added: string[];
    removed: string[];
    isNew: boolean;
  }[];
  dateChanges: {
    id: number;
    number: number;
    title: string;
    state: string | null;
    shootDate: [string | null, string | null] | null;
    releaseDate: [string | null, string | null] | null;
  }[];
}

export function summarizePlanChange(
  before: readonly PlanSideEpisode[],
  after: readonly PlanSideEpisode[],
  titleOf: (id: number) => string,
): PlanChangeSummary {
  const keyOf = (e: PlanSideEpisode) => (e.id !== null ? `id${e.id}` : `new${e.number}`);
  const wasIn = new Map<number, PlanSideEpisode>();
  for (const e of before) for (const u of e.upgradeIds) wasIn.set(u, e);
  const willBe = new Map<number, PlanSideEpisode>();
  for (const e of after) for (const u of e.upgradeIds) willBe.set(u, e);

  const moved: PlanChangeSummary['moved'] = [];
  for (const id of new Set([...wasIn.keys(), ...willBe.keys()])) {
    const a = wasIn.get(id);
    const b = willBe.get(id);
    if (a && b && keyOf(a) === keyOf(b)) continue;
    moved.push({ upgradeId: id, title: titleOf(id), from: a?.number ?? null, to: b?.number ?? null });
  }
  moved.sort((x, y) => (x.to ?? 1e9) - (y.to ?? 1e9) || x.title.localeCompare(y.title));

  const beforeById = new Map(before.filter((e) => e.id !== null).map((e) => [e.id!, e]));
  const episodesChanged: PlanChangeSummary['episodesChanged'] = [];
  const dateChanges: PlanChangeSummary['dateChanges'] = [];
  for (const e of after) {
    const old = e.id !== null ? beforeById.get(e.id) : undefined;
    const had = new Set(old?.upgradeIds ?? []);
    const has = new Set(e.upgradeIds);
    const added = e.upgradeIds.filter((u) => !had.has(u)).map(titleOf);
    const removed = (old?.upgradeIds ?? []).filter((u) => !has.has(u)).map(titleOf);
    if (added.length || removed.length || (!old && e.upgradeIds.length)) {
      episodesChanged.push({ id: e.id, number: e.number, title: e.title, added, removed, isNew: !old });
    }
    if (old) {
      const shoot: [string | null, string | null] | null =
        old.shootDate !== e.shootDate ? [old.shootDate, e.shootDate] : null;
      const release: [string | null, string | null] | null =
        old.releaseDate !== e.releaseDate ? [old.releaseDate, e.releaseDate] : null;
      if (shoot || release)
        dateChanges.push({
          id: old.id!,
          number: e.number,
          title: old.title,
          state: old.state,
          shootDate: shoot,
          releaseDate: release,
        });
    }
  }
  return { moved, episodesChanged, dateChanges };
}

/** One line for the history: "12 upgrades moved, 3 episodes changed contents, 2 episodes' dates changed". */
export function planChangeLine(s: PlanChangeSummary): string {
  const n = (k: number, one: string, many: string) => `${k} ${k === 1 ? one : many}`;
  return `${n(s.moved.length, 'upgrade moved', 'upgrades moved')}, ${n(s.episodesChanged.length, 'episode changed contents', 'episodes changed contents')}, ${n(s.dateChanges.length, "episode's dates changed", "episodes' dates changed")}`;
}
