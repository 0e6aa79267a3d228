// A binary min-heap of (day, position) pairs: upgrades waiting for parts, soonest arrival first.

export class DayHeap {
  private readonly day: number[] = [];
  private readonly pos: number[] = [];

  get size(): number {
    return this.day.length;
  }

  private less(a: number, b: number): boolean {
    // Ties on day go to the better rank position so the heap's order is deterministic.
    return this.day[a] < this.day[b] || (this.day[a] === this.day[b] && this.pos[a] < this.pos[b]);
  }

  private swap(a: number, b: number): void {
    [this.day[a], this.day[b]] = [this.day[b], this.day[a]];
    [this.pos[a], this.pos[b]] = [this.pos[b], this.pos[a]];
  }

  push(day: number, pos: number): void {
    this.day.push(day);
    this.pos.push(pos);
    let i = this.day.length - 1;
    while (i > 0) {
      const p = (i - 1) >> 1;
      if (!this.less(i, p)) break;
      this.swap(i, p);
      i = p;
    }
  }

  peekDay(): number {
    return this.day.length ? this.day[0] : Infinity;
  }

  /** Removes the soonest entry and returns its position. Call only when size > 0. */
  pop(): number {
    const top = this.pos[0];
    const lastDay = this.day.pop()!;
    const lastPos = this.pos.pop()!;
    if (this.day.length) {
      this.day[0] = lastDay;
      this.pos[0] = lastPos;
      let i = 0;
      for (;;) {
        const l = 2 * i + 1;
        const r = l + 1;
        let m = i;
        if (l < this.day.length && this.less(l, m)) m = l;
        if (r < this.day.length && this.less(r, m)) m = r;
        if (m === i) break;
        this.swap(i, m);
        i = m;
      }
    }
    return top;
  }
}
