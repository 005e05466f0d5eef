/**
 * A value that panels and the map watch: the event view and the comparison keep their own state
 * here rather than in the page's main store, so opening an event never disturbs the scenario,
 * its run or its wind limits.
 */
export class Cell<T> {
  private readonly listeners = new Set<(value: T, previous: T) => void>();

  constructor(private value: T) {}

  get(): T {
    return this.value;
  }

  update(patch: Partial<T>): void {
    const previous = this.value;
    this.value = { ...previous, ...patch };
    for (const listener of this.listeners) listener(this.value, previous);
  }

  subscribe(listener: (value: T, previous: T) => void): () => void {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  }
}
