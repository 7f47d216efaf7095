/**
 * A least-recently-used map bounded by the total size of its values (e.g. bytes of text), so a few
 * 100,000-point payloads cannot crowd out memory. Values larger than the budget are not kept.
 */
export class SizedLru<V> {
  private readonly map = new Map<string, { value: V; size: number }>();
  private total = 0;

  constructor(
    readonly maxSize: number,
    private readonly sizeOf: (v: V) => number,
  ) {
    if (!(maxSize > 0)) throw new RangeError("maxSize must be positive");
  }

  get(key: string): V | undefined {
    const hit = this.map.get(key);
    if (!hit) return undefined;
    this.map.delete(key);
    this.map.set(key, hit);
    return hit.value;
  }

  set(key: string, value: V): void {
    const size = this.sizeOf(value);
    const old = this.map.get(key);
    if (old) {
      this.total -= old.size;
      this.map.delete(key);
    }
    if (size > this.maxSize) return;
    this.map.set(key, { value, size });
    this.total += size;
    while (this.total > this.maxSize) {
      const oldest = this.map.keys().next().value as string;
      this.total -= this.map.get(oldest)!.size;
      this.map.delete(oldest);
    }
  }

  get size(): number {
    return this.map.size;
  }

  get usedSize(): number {
    return this.total;
  }
}
