// Planner benchmark: median proposePlan / validatePlan time on 500, 1,000 and 2,000 upgrades with 3 prerequisites each.
// Run: node --import tsx scripts/bench/planner.ts  (DESIGN §8: 2,000 upgrades, 6,000 prerequisites, under 100 ms)
import { AREAS } from '../../shared/domain';
import { proposePlan, validatePlan } from '../../shared/planner/plan';
import type { PlannerInput, PlannerUpgrade } from '../../shared/planner/types';

const RUNS = Number(process.env.BENCH_RUNS ?? 41);

// Seeded, so every run measures the same builds.
function rng(seed: number) {
  return () => {
    seed = (seed + 0x6d2b79f5) | 0;
    let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** n upgrades in a hidden order; each takes up to 3 distinct prerequisites from earlier ones (acyclic). */
function generateBuild(n: number, seed = 1): PlannerInput {
  const rand = rng(seed);
  const ids = Array.from({ length: n }, (_, i) => 1000 + i);
  for (let i = n - 1; i > 0; i--) {
    const j = Math.floor(rand() * (i + 1));
    [ids[i], ids[j]] = [ids[j], ids[i]];
  }
  const upgrades: PlannerUpgrade[] = ids.map((id, k) => {
    const prereqs = new Set<number>();
    while (prereqs.size < Math.min(3, k)) prereqs.add(ids[Math.floor(rand() * k)]);
    const late = rand() < 0.3;
    return {
      id,
      title: `Upgrade ${id}`,
      area: AREAS[Math.floor(rand() * AREAS.length)],
      estimatedHours: Math.round((0.5 + rand() * 7.5) * 4) / 4,
      priority: 1 + Math.floor(rand() * 5),
      votes: Math.floor(rand() * 200),
      installState: 'queued',
      partsDueDate: late ? new Date(Date.UTC(2025, 0, 6 + Math.floor(rand() * 400))).toISOString().slice(0, 10) : null,
      prerequisiteIds: [...prereqs],
      fixedEpisode: null,
    };
  });
  return { startDate: '2025-01-06', shootHoursPerEpisode: 10, releaseCadenceDays: 7, shopHoursPerWeek: 40, upgrades };
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

function time(fn: () => unknown): number[] {
  for (let i = 0; i < 10; i++) fn(); // warm the JIT before measuring
  const out: number[] = [];
  for (let i = 0; i < RUNS; i++) {
    const t0 = performance.now();
    fn();
    out.push(performance.now() - t0);
  }
  return out;
}

const SIZES = [500, 1000, 2000];
// One untimed pass over every size first, so the smallest size is not measured on cold code.
for (const n of SIZES) proposePlan(generateBuild(n, 99));

const rows: string[] = [];
for (const n of SIZES) {
  const input = generateBuild(n);
  const edges = input.upgrades.reduce((s, u) => s + u.prerequisiteIds.length, 0);
  const plan = proposePlan(input);
  if (!plan.ok) throw new Error('generated build has a cycle');
  const violations = validatePlan(input, plan);
  if (violations.length) throw new Error(`proposed plan is invalid: ${violations[0].message}`);
  const propose = median(time(() => proposePlan(input)));
  const validate = median(time(() => validatePlan(input, plan)));
  const perUnit = (ms: number) => ((ms * 1000) / (n + edges)).toFixed(3);
  rows.push(
    [
      String(n).padStart(5),
      String(edges).padStart(6),
      String(plan.episodes.length).padStart(8),
      propose.toFixed(2).padStart(11),
      perUnit(propose).padStart(12),
      validate.toFixed(2).padStart(12),
      perUnit(validate).padStart(12),
    ].join('  '),
  );
}
console.log(`planner benchmark, median of ${RUNS} runs (µs/unit = µs per upgrade + prerequisite edge)`);
console.log('    n   edges  episodes  propose ms  propose µs/u  validate ms  validate µs/u');
for (const r of rows) console.log(r);
