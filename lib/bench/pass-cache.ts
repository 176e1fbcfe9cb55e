/**
 * Values computed in one pass over a list (one render's candidates), kept for the next pass only:
 * `get` reuses what the previous pass computed for the key, `endPass` forgets what this pass did not ask for.
 */
export class PassCache<T> {
  private last = new Map<string, T>();
  private next = new Map<string, T>();

  get(key: string, compute: () => T): T {
    const value = this.last.get(key) ?? compute();
    this.next.set(key, value);
    return value;
  }

  endPass(): void {
    this.last = this.next;
    this.next = new Map();
  }
}
