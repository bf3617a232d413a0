/**
 * One computed value per production, kept in this process while the production's data version (and
 * whatever else the key holds, such as today's date) is unchanged. Every app server checks the
 * version in PostgreSQL before answering from its own copy, so several servers always agree; each
 * recomputes once after a change. Concurrent first reads share one computation.
 */
export class VersionedCache<T> {
  private readonly entries = new Map<string, { key: string; value: Promise<T> }>();

  /** @param maxProductions how many productions' values to keep (least recently read go first). */
  constructor(private readonly maxProductions: number) {}

  get(productionId: string, key: string, compute: () => Promise<T>): Promise<T> {
    const hit = this.entries.get(productionId);
    if (hit && hit.key === key) {
      // Most recently read last, for eviction.
      this.entries.delete(productionId);
      this.entries.set(productionId, hit);
      return hit.value;
    }
    const value = compute();
    const entry = { key, value };
    this.entries.delete(productionId);
    this.entries.set(productionId, entry);
    // A failed computation is not kept.
    value.catch(() => {
      if (this.entries.get(productionId) === entry) this.entries.delete(productionId);
    });
    while (this.entries.size > this.maxProductions) this.entries.delete(this.entries.keys().next().value!);
    return value;
  }

  /** Number of productions held (tests). */
  get size(): number {
    return this.entries.size;
  }
}
