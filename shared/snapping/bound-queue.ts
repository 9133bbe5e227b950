/**
 * A max-priority queue of search items keyed by a number (the snapper's bound), kept in growable
 * typed arrays so a best-first search allocates per growth, not per item. Each item carries five
 * integers (`kind`, `a`, `b`, `c`, `tier`) whose meaning the caller decides.
 */
export class BoundQueue {
  private keys = new Float64Array(64);
  private ints = new Int32Array(64 * 5);
  private bounds = new Float64Array(64);
  private heap = new Int32Array(64);
  private free: number[] = [];
  private slots = 0;
  /** Items queued. */
  size = 0;

  /** Queues an item with priority `key` and the bound it was queued with. */
  push(key: number, bound: number, kind: number, a: number, b: number, c: number, tier: number): void {
    let slot = this.free.pop();
    if (slot === undefined) {
      slot = this.slots++;
      if (slot >= this.keys.length) this.grow();
    }
    this.keys[slot] = key;
    this.bounds[slot] = bound;
    const o = slot * 5;
    this.ints[o] = kind;
    this.ints[o + 1] = a;
    this.ints[o + 2] = b;
    this.ints[o + 3] = c;
    this.ints[o + 4] = tier;
    let at = this.size++;
    const heap = this.heap;
    while (at > 0) {
      const parent = (at - 1) >> 1;
      if (this.keys[heap[parent]] >= key) break;
      heap[at] = heap[parent];
      at = parent;
    }
    heap[at] = slot;
  }

  /** Slot of the item with the largest key (valid until the next pop). */
  peek(): number {
    return this.heap[0];
  }

  /** Removes the largest item and returns its slot (read it before the next push). */
  pop(): number {
    const heap = this.heap;
    const top = heap[0];
    const last = heap[--this.size];
    let at = 0;
    const key = this.keys[last];
    for (;;) {
      let child = 2 * at + 1;
      if (child >= this.size) break;
      if (child + 1 < this.size && this.keys[heap[child + 1]] > this.keys[heap[child]]) child++;
      if (this.keys[heap[child]] <= key) break;
      heap[at] = heap[child];
      at = child;
    }
    if (this.size > 0) heap[at] = last;
    this.free.push(top);
    return top;
  }

  /** Priority key of the item in `slot`. */
  key(slot: number): number {
    return this.keys[slot];
  }
  /** Bound the item in `slot` was queued with. */
  bound(slot: number): number {
    return this.bounds[slot];
  }
  kind(slot: number): number {
    return this.ints[slot * 5];
  }
  a(slot: number): number {
    return this.ints[slot * 5 + 1];
  }
  b(slot: number): number {
    return this.ints[slot * 5 + 2];
  }
  c(slot: number): number {
    return this.ints[slot * 5 + 3];
  }
  tier(slot: number): number {
    return this.ints[slot * 5 + 4];
  }

  private grow(): void {
    const n = this.keys.length * 2;
    const keys = new Float64Array(n);
    keys.set(this.keys);
    this.keys = keys;
    const bounds = new Float64Array(n);
    bounds.set(this.bounds);
    this.bounds = bounds;
    const ints = new Int32Array(n * 5);
    ints.set(this.ints);
    this.ints = ints;
    const heap = new Int32Array(n);
    heap.set(this.heap);
    this.heap = heap;
  }
}
