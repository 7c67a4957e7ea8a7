/**
 * A thread's compiled stacks by key (what was compiled: study, combination, wavelength, compile
 * options), at most `size` of them; beyond that the oldest is evicted first.
 */
export class StackCache<T> {
  private readonly entries = new Map<string, T>();

  constructor(private readonly size: number) {}

  /** The entry under key, built (and kept) on first use. */
  get(key: string, build: () => T): T {
    let hit = this.entries.get(key);
    if (hit === undefined) {
      hit = build();
      if (this.entries.size >= this.size) this.entries.delete(this.entries.keys().next().value as string);
      this.entries.set(key, hit);
    }
    return hit;
  }
}
