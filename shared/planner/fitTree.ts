// A min segment tree over rank positions: "best-ranked available upgrade that still fits" in O(log n).

/**
 * Leaf i holds the hours of the upgrade at rank position i while it is available, +∞ otherwise.
 * `firstFitting(room)` descends towards the leftmost leaf whose hours fit, which is the most urgent
 * available upgrade that fits the hours left in an episode. Scanning a sorted list instead would make
 * the planner quadratic on large builds.
 */
export class FitTree {
  private readonly size: number;
  private readonly min: Float64Array;

  constructor(n: number) {
    let size = 1;
    while (size < Math.max(1, n)) size *= 2;
    this.size = size;
    this.min = new Float64Array(2 * size).fill(Infinity);
  }

  set(pos: number, hours: number): void {
    let i = pos + this.size;
    this.min[i] = hours;
    for (i >>= 1; i >= 1; i >>= 1) {
      const v = Math.min(this.min[2 * i], this.min[2 * i + 1]);
      if (this.min[i] === v) break; // ancestors already agree
      this.min[i] = v;
    }
  }

  remove(pos: number): void {
    this.set(pos, Infinity);
  }

  isEmpty(): boolean {
    return this.min[1] === Infinity;
  }

  /** Leftmost position whose hours are ≤ room (with a hair of slack for fractional hours), or −1. */
  firstFitting(room: number): number {
    const limit = room + 1e-9;
    if (!(this.min[1] <= limit)) return -1;
    let i = 1;
    while (i < this.size) i = this.min[2 * i] <= limit ? 2 * i : 2 * i + 1;
    return i - this.size;
  }

  /** Leftmost position at or after `from` whose hours are ≤ room, or −1 (climb, then descend). */
  nextFitting(room: number, from: number): number {
    if (from <= 0) return this.firstFitting(room);
    if (from >= this.size) return -1;
    const limit = room + 1e-9;
    let i = from + this.size;
    if (this.min[i] <= limit) return from;
    for (;;) {
      if (i === 1) return -1;
      if ((i & 1) === 0 && this.min[i + 1] <= limit) {
        i++;
        break;
      }
      i >>= 1;
    }
    while (i < this.size) i = this.min[2 * i] <= limit ? 2 * i : 2 * i + 1;
    return i - this.size;
  }

  /** Leftmost available position regardless of hours, or −1. */
  first(): number {
    // Hours are finite, so the largest finite number fits anything while +∞ (empty) still does not.
    return this.firstFitting(Number.MAX_VALUE);
  }
}
