// A least-recently-used cache with a size budget, kept on globalThis under a name because the bundler may load a
// module once per route bundle and every route must share one cache per process.

export class Lru<V> {
  private readonly entries = new Map<string, { value: V; size: number }>();
  private total = 0;

  constructor(
    private readonly budget: number,
    private readonly sizeOf: (value: V) => number = () => 1,
  ) {}

  get(key: string): V | undefined {
    const entry = this.entries.get(key);
    if (!entry) return undefined;
    this.entries.delete(key);
    this.entries.set(key, entry);
    return entry.value;
  }

  set(key: string, value: V): void {
    this.delete(key);
    const size = this.sizeOf(value);
    this.entries.set(key, { value, size });
    this.total += size;
    for (const [oldest, entry] of this.entries) {
      if (this.total <= this.budget || oldest === key) break;
      this.entries.delete(oldest);
      this.total -= entry.size;
    }
  }

  delete(key: string): void {
    const entry = this.entries.get(key);
    if (!entry) return;
    this.entries.delete(key);
    this.total -= entry.size;
  }

  get size(): number {
    return this.total;
  }
}

/** One instance per process of the value `make` builds, under `name`. */
export function processWide<T>(name: string, make: () => T): T {
  const key = Symbol.for(`splitfield.${name}`);
  const holder = globalThis as typeof globalThis & Record<symbol, T | undefined>;
  holder[key] ??= make();
  return holder[key]!;
}
