/**
 * A fixed-window counter in memory: enough for one server process. Keys are e.g. `ip|email`.
 * Counts failures only; a success clears the key.
 */
export class AttemptLimiter {
  private readonly windows = new Map<string, { count: number; resetAt: number }>();

  constructor(
    private readonly maxAttempts: number,
    private readonly windowMs: number,
    private readonly now: () => number = Date.now,
  ) {}

  /** Seconds until the key may try again, or 0 when it may try now. */
  retryAfterSeconds(key: string): number {
    const entry = this.windows.get(key);
    if (!entry) return 0;
    if (entry.resetAt <= this.now()) {
      this.windows.delete(key);
      return 0;
    }
    return entry.count >= this.maxAttempts ? Math.ceil((entry.resetAt - this.now()) / 1000) : 0;
  }

  recordFailure(key: string): void {
    const entry = this.windows.get(key);
    if (!entry || entry.resetAt <= this.now()) this.windows.set(key, { count: 1, resetAt: this.now() + this.windowMs });
    else entry.count += 1;
    // Keep memory bounded under a spray of random keys.
    if (this.windows.size > 50_000) this.prune();
  }

  clear(key: string): void {
    this.windows.delete(key);
  }

  private prune() {
    const now = this.now();
    for (const [key, entry] of this.windows) if (entry.resetAt <= now) this.windows.delete(key);
  }
}
