/**
 * Results that depend only on their inputs, kept across document versions: an edit elsewhere in
 * the spec (a coordinate of another atom, a comment) leaves a fragment's point group and plan
 * estimate as they were, so the next version finds them here instead of computing them again.
 * Keys are the inputs written out in full; the least recently used entries go first.
 */
export class InputMemo<V> {
  private readonly entries = new Map<string, V>();

  constructor(private readonly limit: number) {}

  get(key: string, compute: () => V): V {
    if (this.entries.has(key)) {
      const value = this.entries.get(key) as V;
      // Refresh its place in the order of use.
      this.entries.delete(key);
      this.entries.set(key, value);
      return value;
    }
    const value = compute();
    this.entries.set(key, value);
    if (this.entries.size > this.limit) this.entries.delete(this.entries.keys().next().value!);
    return value;
  }

  get size(): number {
    return this.entries.size;
  }

  clear(): void {
    this.entries.clear();
  }
}
