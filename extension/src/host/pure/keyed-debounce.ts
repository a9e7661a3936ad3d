// Runs a callback once per key after `delayMs` of quiet, so a burst of saves of one file
// (format-on-save, save-all) starts one review, not several.

export class KeyedDebounce<K> {
  private readonly timers = new Map<K, ReturnType<typeof setTimeout>>();

  constructor(private readonly delayMs: number) {}

  schedule(key: K, run: () => void): void {
    const existing = this.timers.get(key);
    if (existing !== undefined) clearTimeout(existing);
    this.timers.set(key, setTimeout(() => {
      this.timers.delete(key);
      run();
    }, this.delayMs));
  }

  cancel(key: K): void {
    const existing = this.timers.get(key);
    if (existing !== undefined) clearTimeout(existing);
    this.timers.delete(key);
  }

  dispose(): void {
    for (const t of this.timers.values()) clearTimeout(t);
    this.timers.clear();
  }
}
