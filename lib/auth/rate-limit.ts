/**
 * A fixed-window request budget per key (an API token): `limit` requests per `windowMs`. Kept in
 * the memory of the web process, so with several processes each one counts on its own.
 */
export type RateDecision =
  { ok: true; remaining: number } | { ok: false; retryAfterSeconds: number };

export class RateLimiter {
  private readonly windows = new Map<string, { start: number; count: number }>();

  constructor(
    readonly limit: number,
    readonly windowMs: number,
    private readonly now: () => number = Date.now,
  ) {}

  take(key: string): RateDecision {
    const now = this.now();
    let window = this.windows.get(key);
    if (!window || now - window.start >= this.windowMs) {
      window = { start: now, count: 0 };
      this.windows.set(key, window);
      if (this.windows.size > 10_000) this.forgetOld(now);
    }
    if (window.count >= this.limit) {
      return {
        ok: false,
        retryAfterSeconds: Math.max(1, Math.ceil((window.start + this.windowMs - now) / 1000)),
      };
    }
    window.count += 1;
    return { ok: true, remaining: this.limit - window.count };
  }

  private forgetOld(now: number) {
    for (const [key, window] of this.windows) {
      if (now - window.start >= this.windowMs) this.windows.delete(key);
    }
  }
}
