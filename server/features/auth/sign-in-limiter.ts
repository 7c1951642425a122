import { rateLimit } from 'express-rate-limit';

export interface SignInLimits {
  /** Failed attempts per client address in the window. */
  perAddress: number;
  /** Failed attempts per account in the window, from any address. */
  perAccount: number;
  windowMs: number;
}

export const DEFAULT_SIGN_IN_LIMITS: SignInLimits = { perAddress: 20, perAccount: 5, windowMs: 15 * 60 * 1000 };

/** Per-address limit on failed sign-ins (successful ones do not count). */
export function signInAddressLimiter(limits: SignInLimits) {
  return rateLimit({
    windowMs: limits.windowMs,
    limit: limits.perAddress,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    handler: (_req, res) =>
      res
        .status(429)
        .json({ error: { code: 'rate_limited', message: 'Too many failed sign-ins from here. Wait a few minutes and try again.' } }),
  });
}

/**
 * Failed sign-ins counted per account *and* client address: after `perAccount` failures in the window,
 * that pair waits before its next attempt, and the wait doubles with each further failure (capped at the
 * window). Failures from one address never lock the account for anyone else, and no request sleeps:
 * a refusal is a 429 with Retry-After.
 */
export class SignInBackoff {
  private failures = new Map<string, number[]>();
  constructor(
    private limits: SignInLimits,
    private now: () => number = Date.now,
  ) {}

  /** Milliseconds this account must wait from this address; 0 when it may try. */
  waitMs(email: string, address: string): number {
    const recent = this.recent(email, address);
    const over = recent.length - this.limits.perAccount;
    if (over < 0) return 0;
    const wait = Math.min(this.limits.windowMs, 30_000 * 2 ** over);
    return Math.max(0, recent.at(-1)! + wait - this.now());
  }
  recordFailure(email: string, address: string): void {
    this.failures.set(key(email, address), [...this.recent(email, address), this.now()]);
  }
  clear(email: string, address: string): void {
    this.failures.delete(key(email, address));
  }
  private recent(email: string, address: string): number[] {
    const since = this.now() - this.limits.windowMs;
    return (this.failures.get(key(email, address)) ?? []).filter((t) => t > since);
  }
}

const key = (email: string, address: string) => `${email.toLowerCase()}\u0000${address}`;

/** A sliding-window count per key (reset requests per address and per account). */
export class WindowCounter {
  private hits = new Map<string, number[]>();
  constructor(
    private limit: number,
    private windowMs: number,
    private now: () => number = Date.now,
  ) {}

  /** Counts one request; returns the milliseconds to wait when the key is over its limit (the request is not counted then). */
  take(k: string): number {
    const since = this.now() - this.windowMs;
    const recent = (this.hits.get(k) ?? []).filter((t) => t > since);
    if (recent.length >= this.limit) return recent[0]! + this.windowMs - this.now();
    recent.push(this.now());
    this.hits.set(k, recent);
    return 0;
  }
}
