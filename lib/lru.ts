/**
 * A least-recently-used map bounded by entry count and by total weight (the caller's estimate
 * of bytes; 1 per entry when it has no better one). Map order is recency: a hit moves its key
 * to the end, eviction takes from the front. Pure, per process; used by the per-process caches
 * (lib/services/results-cache.ts, lib/auth/session-cache.ts).
 */
export class BoundedLru<V extends { weight: number }> {
  private readonly entries = new Map<string, V>();
  private total = 0;

  constructor(
    readonly maxEntries: number,
    readonly maxWeight: number = Number.POSITIVE_INFINITY,
  ) {}

  get size(): number {
    return this.entries.size;
  }

  /** Sum of the entries' weights. */
  get weight(): number {
    return this.total;
  }

  /** The entry without touching its recency. */
  peek(key: string): V | undefined {
    return this.entries.get(key);
  }

  get(key: string): V | undefined {
    const value = this.entries.get(key);
    if (value === undefined) return undefined;
    this.entries.delete(key);
    this.entries.set(key, value);
    return value;
  }

  /** Store (or replace) `key` as the most recent; an entry heavier than the whole budget is not kept. */
  set(key: string, value: V): void {
    this.delete(key);
    if (value.weight > this.maxWeight) return;
    this.entries.set(key, value);
    this.total += value.weight;
    this.evict();
  }

  /** `key`'s entry grew (or shrank) by `delta`; others are evicted if the budget is now exceeded. */
  grew(key: string, delta: number): void {
    const value = this.entries.get(key);
    if (value === undefined) return;
    value.weight += delta;
    this.total += delta;
    if (value.weight > this.maxWeight) this.delete(key);
    else this.evict(key);
  }

  delete(key: string): void {
    const value = this.entries.get(key);
    if (value === undefined) return;
    this.entries.delete(key);
    this.total -= value.weight;
  }

  clear(): void {
    this.entries.clear();
    this.total = 0;
  }

  private evict(keep?: string): void {
    for (const [key, value] of this.entries) {
      if (this.entries.size <= this.maxEntries && this.total <= this.maxWeight) return;
      if (key === keep) continue;
      this.entries.delete(key);
      this.total -= value.weight;
    }
  }
}
