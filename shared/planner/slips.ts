// Slips (DESIGN §11): when each episode can really be shot given the parts still to come, against
// its current plan and its baseline. Pure: the server loads the facts, the planner shows the answer.
import { addDays, toDay } from './dates';

export interface SlipUpgrade {
  id: number;
  title: string;
  installed: boolean;
  episodeId: number | null;
  prerequisiteIds: number[];
}

export interface SlipPart {
  id: number;
  upgradeId: number;
  partNumber: string;
  description: string;
  /** Expected arrival; parts already received, fitted or returned are not passed in. */
  expectedArrival: string | null;
}

export interface SlipEpisode {
  id: number;
  number: number;
  title: string;
  state: string;
  shootDate: string | null;
  releaseDate: string | null;
  baselineShootDate: string | null;
  baselineReleaseDate: string | null;
}

export interface LatePart {
  partId: number;
  partNumber: string;
  description: string;
  upgradeId: number;
  upgradeTitle: string;
  expectedArrival: string;
  overdue: boolean;
}

export interface EpisodeSlip {
  episodeId: number;
  number: number;
  title: string;
  state: string;
  baseline: { shootDate: string | null; releaseDate: string | null };
  planned: { shootDate: string | null; releaseDate: string | null };
  /** The planned dates pushed back by parts that will not be in by the shoot. */
  projected: { shootDate: string | null; releaseDate: string | null };
  /** Projected minus planned, in days (0 when the parts are in time). */
  partsDelayDays: number;
  /** Projected minus baseline, in days, for shoot and release; null without a baseline. */
  slipDays: { shoot: number | null; release: number | null };
  /** The projected release is later than the planned release. */
  releaseAtRisk: boolean;
  /** The part that holds the shoot back longest (its own or a prerequisite's), if any. */
  cause: LatePart | null;
}

/** Episodes still to be filmed: parts can move their shoot. Later states keep what happened. */
const OPEN_STATES = new Set(['draft', 'scheduled']);

/**
 * An upgrade can be installed once its parts and its prerequisites' parts are in: its ready day is
 * the latest expected arrival among its own parts still to come and those of its prerequisites not
 * yet installed (transitively). A part past its expected arrival is overdue: it can come today at
 * the earliest. An episode's projected shoot is its planned shoot or the latest ready day of its
 * upgrades, whichever is later, and its release moves by the same number of days.
 */
export function computeSlips(input: {
  today: string;
  episodes: SlipEpisode[];
  upgrades: SlipUpgrade[];
  parts: SlipPart[];
}): EpisodeSlip[] {
  const { today } = input;
  const byId = new Map(input.upgrades.map((u) => [u.id, u]));
  const ownLate = new Map<number, LatePart>();
  for (const p of input.parts) {
    if (!p.expectedArrival) continue;
    const u = byId.get(p.upgradeId);
    if (!u || u.installed) continue;
    const overdue = p.expectedArrival < today;
    const late: LatePart = {
      partId: p.id,
      partNumber: p.partNumber,
      description: p.description,
      upgradeId: u.id,
      upgradeTitle: u.title,
      expectedArrival: p.expectedArrival,
      overdue,
    };
    const prev = ownLate.get(u.id);
    if (
      !prev ||
      readyOf(late, today) > readyOf(prev, today) ||
      (readyOf(late, today) === readyOf(prev, today) && late.partId < prev.partId)
    )
      ownLate.set(u.id, late);
  }
  const memo = new Map<number, LatePart | null>();
  const visiting = new Set<number>();
  const readyPart = (id: number): LatePart | null => {
    if (memo.has(id)) return memo.get(id)!;
    const u = byId.get(id);
    if (!u || u.installed || visiting.has(id)) return null; // a cycle is reported by the planner, not here
    visiting.add(id);
    let best = ownLate.get(id) ?? null;
    for (const p of u.prerequisiteIds) {
      const c = readyPart(p);
      if (c && (!best || readyOf(c, today) > readyOf(best, today))) best = c;
    }
    visiting.delete(id);
    memo.set(id, best);
    return best;
  };

  const members = new Map<number, number[]>();
  for (const u of input.upgrades)
    if (u.episodeId !== null) (members.get(u.episodeId) ?? members.set(u.episodeId, []).get(u.episodeId)!).push(u.id);

  return input.episodes.map((e) => {
    let cause: LatePart | null = null;
    if (OPEN_STATES.has(e.state)) {
      for (const id of members.get(e.id) ?? []) {
        const c = readyPart(id);
        if (c && (!cause || readyOf(c, today) > readyOf(cause, today))) cause = c;
      }
    }
    const ready = cause ? readyOf(cause, today) : null;
    const delay = e.shootDate && ready && ready > e.shootDate ? toDay(ready) - toDay(e.shootDate) : 0;
    const projected = {
      shootDate: e.shootDate ? addDays(e.shootDate, delay) : null,
      releaseDate: e.releaseDate ? addDays(e.releaseDate, delay) : null,
    };
    const slip = (base: string | null, now: string | null) => (base && now ? toDay(now) - toDay(base) : null);
    return {
      episodeId: e.id,
      number: e.number,
      title: e.title,
      state: e.state,
      baseline: { shootDate: e.baselineShootDate, releaseDate: e.baselineReleaseDate },
      planned: { shootDate: e.shootDate, releaseDate: e.releaseDate },
      projected,
      partsDelayDays: delay,
      slipDays: {
        shoot: slip(e.baselineShootDate, projected.shootDate),
        release: slip(e.baselineReleaseDate, projected.releaseDate),
      },
      releaseAtRisk: delay > 0 && e.releaseDate !== null,
      cause: delay > 0 ? cause : null,
    };
  });
}

/** The day a part can be counted on: its expected arrival, or today once it is overdue. */
function readyOf(p: LatePart, today: string): string {
  return p.overdue ? today : p.expectedArrival;
}
