// Critical path method (DESIGN §4.3): forward and backward pass, total float, in linear time.
import { buildIndexGraph, extractCycle, kahnOrder } from './graph';

export interface CpmTask {
  id: string;
  duration: number;
  /**
   * The tasks that must finish before this one starts: an id (finish-to-start, zero lag) or
   * `{ id, lag }` (finish-to-start with a wait of `lag` after the predecessor finishes).
   */
  after: (string | CpmLink)[];
  /** Earliest start allowed (a release time, "start no earlier than"); 0 when absent. */
  release?: number;
}

export interface CpmLink {
  id: string;
  lag: number;
}

export interface CpmTimes {
  es: number;
  ef: number;
  ls: number;
  lf: number;
  totalFloat: number;
}

export type CriticalPathResult =
  | {
      ok: true;
      /** Project duration: the largest early finish (0 for an empty network). */
      duration: number;
      /** Zero-float ids, by early start then schedule order. */
      critical: string[];
      /** Every id in a valid schedule (topological) order. */
      order: string[];
      tasks: Record<string, CpmTimes>;
    }
  | { ok: false; cycle: string[] }
  | { ok: false; unknown: string[] }
  | { ok: false; duplicate: string[] };

// Durations may be fractional hours; sums like 0.1 + 0.2 leave float noise that must not turn a
// critical task into one with 5e-17 of float.
const EPS = 1e-9;
const snap = (x: number) => (Math.abs(x) < EPS ? 0 : x);

/**
 * Forward pass: ES = max(release, EF + lag of each predecessor) (0 without any), EF = ES + duration.
 * Backward pass: LF = min(LS − lag) over successors (project duration without any), LS = LF − duration.
 * A release time only bounds the early dates, as a "start no earlier than" constraint does in the
 * precedence diagramming method; with no releases and no lags this is the classic pure network.
 * Total float = LS − ES. A task may not list itself or an unknown id; both are reported, not thrown.
 * Negative or non-finite durations are a programming error and throw.
 */
export function criticalPath(tasks: readonly CpmTask[]): CriticalPathResult {
  const n = tasks.length;
  const index = new Map<string, number>();
  const duplicate: string[] = [];
  for (let i = 0; i < n; i++) {
    const t = tasks[i];
    if (!(Number.isFinite(t.duration) && t.duration >= 0)) {
      throw new RangeError(`criticalPath: task ${t.id} has duration ${t.duration}; durations must be finite and ≥ 0`);
    }
    if (t.release !== undefined && !(Number.isFinite(t.release) && t.release >= 0)) {
      throw new RangeError(`criticalPath: task ${t.id} has release ${t.release}; releases must be finite and ≥ 0`);
    }
    if (index.has(t.id)) {
      if (!duplicate.includes(t.id)) duplicate.push(t.id);
    } else index.set(t.id, i);
  }
  if (duplicate.length) return { ok: false, duplicate };

  const unknown: string[] = [];
  const seenUnknown = new Set<string>();
  const preds: number[][] = new Array(n);
  const lags: number[][] = new Array(n);
  let anyLag = false;
  for (let i = 0; i < n; i++) {
    const list: number[] = [];
    const lagList: number[] = [];
    const dedupe = new Map<number, number>();
    for (const link of tasks[i].after) {
      const a = typeof link === 'string' ? link : link.id;
      const lag = typeof link === 'string' ? 0 : link.lag;
      if (!Number.isFinite(lag))
        throw new RangeError(`criticalPath: task ${tasks[i].id} has lag ${lag} after ${a}; lags must be finite`);
      if (lag !== 0) anyLag = true;
      const j = index.get(a);
      if (j === undefined) {
        if (!seenUnknown.has(a)) {
          seenUnknown.add(a);
          unknown.push(a);
        }
      } else if (!dedupe.has(j)) {
        // A repeated predecessor is harmless but would double-count in Kahn's in-degrees;
        // the longest of its lags is the one that binds.
        dedupe.set(j, list.length);
        list.push(j);
        lagList.push(lag);
      } else {
        const k = dedupe.get(j)!;
        lagList[k] = Math.max(lagList[k], lag);
      }
    }
    preds[i] = list;
    lags[i] = lagList;
  }
  if (unknown.length) return { ok: false, unknown };

  const g = buildIndexGraph(preds);
  const { order, count, remaining } = kahnOrder(g);
  if (count < n) return { ok: false, cycle: extractCycle(g, remaining).map((i) => tasks[i].id) };

  // Lags laid out like g.predIdx (buildIndexGraph keeps each list's order).
  const lagOf = new Float64Array(g.predIdx.length);
  if (anyLag) for (let i = 0, k = 0; i < n; i++) for (const lag of lags[i]) lagOf[k++] = lag;

  const es = new Float64Array(n);
  const ef = new Float64Array(n);
  let duration = 0;
  for (let k = 0; k < n; k++) {
    const u = order[k];
    let start = tasks[u].release ?? 0;
    for (let e = g.predStart[u]; e < g.predStart[u + 1]; e++) start = Math.max(start, ef[g.predIdx[e]] + lagOf[e]);
    es[u] = start;
    ef[u] = start + tasks[u].duration;
    duration = Math.max(duration, ef[u]);
  }
  // Backward pass in reverse schedule order: a task's LF is final once every successor has been
  // seen, and it then bounds the LF of each predecessor by LS − lag.
  const lf = new Float64Array(n).fill(duration);
  const ls = new Float64Array(n);
  for (let k = n - 1; k >= 0; k--) {
    const u = order[k];
    ls[u] = lf[u] - tasks[u].duration;
    for (let e = g.predStart[u]; e < g.predStart[u + 1]; e++) {
      const p = g.predIdx[e];
      lf[p] = Math.min(lf[p], ls[u] - lagOf[e]);
    }
  }

  const out: Record<string, CpmTimes> = {};
  const orderIds: string[] = new Array(n);
  const position = new Int32Array(n);
  const criticalIdx: number[] = [];
  for (let k = 0; k < n; k++) {
    const u = order[k];
    position[u] = k;
    orderIds[k] = tasks[u].id;
    const totalFloat = snap(ls[u] - es[u]);
    out[tasks[u].id] = { es: es[u], ef: ef[u], ls: ls[u], lf: lf[u], totalFloat };
    if (totalFloat === 0) criticalIdx.push(u);
  }
  // Kahn's FIFO order is topological but can interleave parallel branches; reading the critical
  // chain by early start (ties in schedule order, which keeps zero-duration tasks valid) is what a
  // planner expects to see. Only the critical subset is sorted.
  criticalIdx.sort((a, b) => es[a] - es[b] || position[a] - position[b]);
  return { ok: true, duration, critical: criticalIdx.map((i) => tasks[i].id), order: orderIds, tasks: out };
}

/**
 * Finds one dependency cycle in a graph given as ids and edges `[before, after]` (before must come
 * first). Returns the members in dependency order — each must come before the next and the last
 * before the first — or null when the graph is acyclic. Ids that appear only in edges are included.
 * The server calls this with the existing prerequisites plus a proposed one to refuse a cycle.
 */
export function findCycle<T extends string | number>(
  ids: readonly T[],
  edges: readonly (readonly [T, T])[],
): T[] | null {
  const index = new Map<T, number>();
  const nodes: T[] = [];
  const add = (id: T) => {
    let i = index.get(id);
    if (i === undefined) {
      i = nodes.length;
      index.set(id, i);
      nodes.push(id);
    }
    return i;
  };
  for (const id of ids) add(id);
  const preds: number[][] = [];
  for (const [before, after] of edges) {
    const b = add(before);
    const a = add(after);
    while (preds.length < nodes.length) preds.push([]);
    preds[a].push(b);
  }
  while (preds.length < nodes.length) preds.push([]);
  const g = buildIndexGraph(preds);
  const { count, remaining } = kahnOrder(g);
  if (count === g.n) return null;
  return extractCycle(g, remaining).map((i) => nodes[i]);
}
