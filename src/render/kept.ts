/**
 * A memory of recent results for a build that asks for them ahead and uses them later: when full, it forgets the
 * oldest entry that has already been used, and keeps every entry not yet used, however many. The chart thread draws
 * a pack's charts ahead of the pages; a plain "forget the oldest" memory of 512 would drop the first charts of a
 * longer pack before their pages used them, so that they were drawn again, and the pack drawn from their SVG rather
 * than their scene, depending on how far ahead the thread had got.
 */
export class KeptUntilUsed<V> {
  private readonly entries = new Map<string, { value: V; used: boolean }>();
  private notUsed = 0;

  constructor(private readonly limit: number) {}

  /** The value kept for `key`; `use` marks it used (so that it may be forgotten when room is needed). */
  get(key: string, use = true): V | undefined {
    const entry = this.entries.get(key);
    if (entry !== undefined && use && !entry.used) {
      entry.used = true;
      this.notUsed--;
    }
    return entry?.value;
  }

  has(key: string): boolean {
    return this.entries.has(key);
  }

  /** Keep `value` for `key`, used or not yet used. */
  set(key: string, value: V, used: boolean): void {
    if (!this.entries.has(key) && this.entries.size >= this.limit) {
      for (const [k, entry] of this.entries) {
        if (entry.used) {
          this.entries.delete(k);
          break;
        }
      }
    }
    this.delete(key);
    this.entries.set(key, { value, used });
    if (!used) this.notUsed++;
  }

  delete(key: string): void {
    const entry = this.entries.get(key);
    if (entry !== undefined && !entry.used) this.notUsed--;
    this.entries.delete(key);
  }

  /** How many entries are kept and not yet used. */
  get unused(): number {
    return this.notUsed;
  }

  get size(): number {
    return this.entries.size;
  }
}
