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
      res.status(429).json({ error: { code: 'rate_limited', message: 'Too many failed sign-ins from here. Wait a few minutes and try again.' } }),
  });
}

/** Per-account counter of failed sign-ins, so spreading guesses over addresses does not help. */
export class AccountLockout {
  private failures = new Map<string, number[]>();
  constructor(private limits: SignInLimits, private now: () => number = Date.now) {}

  isLocked(email: string): boolean {
    return this.recent(email).length >= this.limits.perAccount;
  }
  recordFailure(email: string): void {
    this.failures.set(email, [...this.recent(email), this.now()]);
  }
  clear(email: string): void {
    this.failures.delete(email);
  }
  private recent(email: string): number[] {
    const since = this.now() - this.limits.windowMs;
    return (this.failures.get(email) ?? []).filter((t) => t > since);
  }
}
