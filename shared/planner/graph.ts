// Index-based graph helpers (Kahn's order, cycle extraction) shared by the critical path and the planner.

/**
 * A directed graph over nodes 0..n-1 in compressed form: the predecessors of node i are
 * `predIdx[predStart[i] .. predStart[i+1])`. Typed arrays keep 2,000 × 6,000 graphs cheap to build.
 */
export interface IndexGraph {
  n: number;
  predStart: Int32Array;
  predIdx: Int32Array;
  succStart: Int32Array;
  succIdx: Int32Array;
}

/** Builds both adjacency directions from predecessor lists (each entry a node index). */
export function buildIndexGraph(preds: readonly (readonly number[])[]): IndexGraph {
  const n = preds.length;
  const predStart = new Int32Array(n + 1);
  let m = 0;
  for (let i = 0; i < n; i++) {
    predStart[i] = m;
    m += preds[i].length;
  }
  predStart[n] = m;
  const predIdx = new Int32Array(m);
  const outDeg = new Int32Array(n);
  let k = 0;
  for (let i = 0; i < n; i++) {
    for (const p of preds[i]) {
      predIdx[k++] = p;
      outDeg[p]++;
    }
  }
  const succStart = new Int32Array(n + 1);
  for (let i = 0; i < n; i++) succStart[i + 1] = succStart[i] + outDeg[i];
  const fill = succStart.slice(0, n);
  const succIdx = new Int32Array(m);
  // Successors are filled in node order so successor lists are deterministic.
  for (let i = 0; i < n; i++) {
    for (let e = predStart[i]; e < predStart[i + 1]; e++) succIdx[fill[predIdx[e]]++] = i;
  }
  return { n, predStart, predIdx, succStart, succIdx };
}

/**
 * Kahn's algorithm with a FIFO queue seeded in node order, so the result is stable for a stable
 * input order. Returns the order and how many nodes it reached; fewer than n means a cycle.
 */
export function kahnOrder(g: IndexGraph): { order: Int32Array; count: number; remaining: Int32Array } {
  const remaining = new Int32Array(g.n);
  for (let i = 0; i < g.n; i++) remaining[i] = g.predStart[i + 1] - g.predStart[i];
  const order = new Int32Array(g.n);
  let tail = 0;
  for (let i = 0; i < g.n; i++) if (remaining[i] === 0) order[tail++] = i;
  for (let head = 0; head < tail; head++) {
    const u = order[head];
    for (let e = g.succStart[u]; e < g.succStart[u + 1]; e++) {
      const v = g.succIdx[e];
      if (--remaining[v] === 0) order[tail++] = v;
    }
  }
  return { order, count: tail, remaining };
}

/**
 * After Kahn stalls, every unreached node still has an unreached predecessor, so walking
 * predecessors from the first unreached node must revisit a node: that loop is a cycle.
 * Returned in dependency order (each member is a predecessor of the next, the last of the first),
 * rotated to start at its lowest index so the answer does not depend on where the walk began.
 */
export function extractCycle(g: IndexGraph, remaining: Int32Array): number[] {
  let start = -1;
  for (let i = 0; i < g.n; i++) {
    if (remaining[i] > 0) {
      start = i;
      break;
    }
  }
  if (start < 0) return [];
  const seenAt = new Map<number, number>();
  const walk: number[] = [];
  let u = start;
  while (!seenAt.has(u)) {
    seenAt.set(u, walk.length);
    walk.push(u);
    let next = -1;
    for (let e = g.predStart[u]; e < g.predStart[u + 1]; e++) {
      if (remaining[g.predIdx[e]] > 0) {
        next = g.predIdx[e];
        break;
      }
    }
    u = next; // always found: an unreached node keeps at least one unreached predecessor
  }
  // The walk goes backwards along edges; reverse it to read in dependency order.
  const cycle = walk.slice(seenAt.get(u)!).reverse();
  let low = 0;
  for (let i = 1; i < cycle.length; i++) if (cycle[i] < cycle[low]) low = i;
  return [...cycle.slice(low), ...cycle.slice(0, low)];
}
