// Plan quality benchmark: how close proposePlan's finish is to the earliest possible, on seeded
// random builds (6–40 upgrades with prerequisites, late parts, areas and priorities). Each build is
// also solved exactly as a mixed-integer program by HiGHS (the `highs` package, a WebAssembly build
// of the HiGHS solver), with a time limit per build.
// Run: npm run bench:plan-quality   (BENCH_BUILDS=n per size class, BENCH_TIME_LIMIT seconds per solve)
import loadHighs from 'highs';
import { AREAS } from '../../shared/domain';
import { proposePlan, validatePlan } from '../../shared/planner/plan';
import { episodeCapacity } from '../../shared/planner/episodes';
import { toDay, addDays } from '../../shared/planner/dates';
import type { PlannerInput, PlannerUpgrade } from '../../shared/planner/types';

const BUILDS = Number(process.env.BENCH_BUILDS ?? 100);
const TIME_LIMIT = Number(process.env.BENCH_TIME_LIMIT ?? 10);

function rng(seed: number) {
  return () => {
    seed = (seed + 0x6d2b79f5) | 0;
    let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A fresh build of n upgrades: hours 1–6 in halves, up to two earlier prerequisites, a quarter late. */
export function generate(n: number, seed: number): PlannerInput {
  const rand = rng(seed);
  const startDate = '2027-01-04';
  const cadence = 7;
  const upgrades: PlannerUpgrade[] = [];
  for (let k = 0; k < n; k++) {
    const pre = new Set<number>();
    if (k > 0 && rand() < 0.45) pre.add(1 + Math.floor(rand() * k));
    if (k > 1 && rand() < 0.2) pre.add(1 + Math.floor(rand() * k));
    const late = rand() < 0.25;
    upgrades.push({
      id: k + 1,
      title: `U${k + 1}`,
      area: AREAS[Math.floor(rand() * AREAS.length)],
      estimatedHours: 1 + Math.floor(rand() * 11) / 2,
      priority: 1 + Math.floor(rand() * 5),
      votes: Math.floor(rand() * 30),
      installState: 'queued',
      partsDueDate: late
        ? addDays(startDate, Math.floor(rand() * Math.max(2, n / 2)) * cadence + 1 + Math.floor(rand() * 6))
        : null,
      prerequisiteIds: [...pre],
      fixedEpisode: null,
    });
  }
  return { startDate, shootHoursPerEpisode: 8, releaseCadenceDays: cadence, shopHoursPerWeek: 20, upgrades };
}

/** Slot of an episode: its shoot day is startDate + slot × cadence. */
export const slotOf = (input: PlannerInput, shootDate: string) =>
  (toDay(shootDate) - toDay(input.startDate)) / input.releaseCadenceDays;

/**
 * The exact earliest last slot: x[i,k] = upgrade i in the episode of slot k (1..K), each upgrade in
 * one slot, hours per slot within capacity, no upgrade before its parts' day, a prerequisite in the
 * same or an earlier slot; minimise T ≥ slot of every upgrade. K is the proposal's own last slot.
 */
export function exactModel(input: PlannerInput, K: number): string {
  const { capacity } = episodeCapacity(input);
  const start = toDay(input.startDate);
  const ups = input.upgrades;
  const x = (i: number, k: number) => `x_${i}_${k}`;
  const slotsOf = (u: PlannerUpgrade) => {
    const list: number[] = [];
    for (let k = 1; k <= K; k++)
      if (!u.partsDueDate || toDay(u.partsDueDate) <= start + k * input.releaseCadenceDays) list.push(k);
    return list;
  };
  const allowed = ups.map(slotsOf);
  const rows: string[] = [];
  ups.forEach((u, i) => {
    rows.push(` one_${i}: ${allowed[i].map((k) => x(i, k)).join(' + ')} = 1`);
    rows.push(` last_${i}: T ${allowed[i].map((k) => `- ${k} ${x(i, k)}`).join(' ')} >= 0`);
  });
  for (let k = 1; k <= K; k++) {
    const terms = ups.map((u, i) => (allowed[i].includes(k) ? `${u.estimatedHours} ${x(i, k)}` : '')).filter(Boolean);
    if (terms.length) rows.push(` cap_${k}: ${terms.join(' + ')} <= ${capacity}`);
  }
  const index = new Map(ups.map((u, i) => [u.id, i]));
  ups.forEach((u, s) => {
    for (const pid of u.prerequisiteIds) {
      const p = index.get(pid)!;
      rows.push(
        ` pre_${p}_${s}: ${allowed[s].map((k) => `${k} ${x(s, k)}`).join(' + ')} ${allowed[p].map((k) => `- ${k} ${x(p, k)}`).join(' ')} >= 0`,
      );
    }
  });
  const bins = ups.flatMap((_, i) => allowed[i].map((k) => x(i, k)));
  return `Minimize\n obj: T\nSubject To\n${rows.join('\n')}\nBounds\n 0 <= T <= ${K}\nBinary\n ${bins.join(' ')}\nEnd\n`;
}

async function main() {
  const highs = await loadHighs();
  const classes = [
    { name: '6–10 upgrades', min: 6, max: 10, target: 0.95 },
    { name: '20–40 upgrades', min: 20, max: 40, target: 0.8 },
  ];
  console.log(
    `plan quality: ${BUILDS} seeded builds per class, exact optimum by HiGHS (time limit ${TIME_LIMIT} s per build)`,
  );
  let failed = false;
  for (const c of classes) {
    let optimal = 0,
      solved = 0,
      gapSum = 0,
      gapMax = 0,
      broken = 0,
      timeouts = 0;
    for (let b = 0; b < BUILDS; b++) {
      const seed = 1000 * c.min + b;
      const n = c.min + Math.floor(rng(seed)() * (c.max - c.min + 1));
      const input = generate(n, seed);
      const plan = proposePlan(input);
      if (!plan.ok) throw new Error(`seed ${seed}: cycle`);
      if (validatePlan(input, plan).length || plan.unplaced.length) broken++;
      const K = Math.max(...plan.episodes.map((e) => slotOf(input, e.shootDate)));
      const r = highs.solve(exactModel(input, K), { output_flag: false, time_limit: TIME_LIMIT, mip_rel_gap: 0 });
      if (r.Status !== 'Optimal') {
        timeouts++;
        continue;
      }
      solved++;
      const best = Math.round(r.ObjectiveValue);
      const gap = K - best;
      if (gap <= 0) optimal++;
      gapSum += gap;
      gapMax = Math.max(gapMax, gap);
    }
    const share = solved ? optimal / solved : 0;
    console.log(
      `${c.name}: optimal finish on ${optimal}/${solved} solved builds (${(share * 100).toFixed(1)} %, target ${c.target * 100} %), ` +
        `mean gap ${(solved ? gapSum / solved : 0).toFixed(2)} episodes, worst ${gapMax}; rules broken ${broken}; not solved in time ${timeouts}`,
    );
    if (share < c.target || broken) failed = true;
  }
  if (failed) process.exitCode = 1;
}

if (process.argv[1]?.endsWith('planQuality.ts')) await main();
