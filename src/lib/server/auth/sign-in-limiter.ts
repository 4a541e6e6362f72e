import { getConfig } from '../config';

/**
 * Counts failed sign-ins per key (e-mail and client address) in a sliding window and says
 * when to refuse more, to slow down password guessing. In memory: a restart forgets, and
 * several servers count separately; both are acceptable for a brake, not a lock.
 */
export class SignInLimiter {
  private readonly failures = new Map<string, number[]>();

  constructor(
    private readonly maxFailures: number,
    private readonly windowMs: number,
    private readonly now: () => number = Date.now
  ) {}

  /** Seconds until `key` may try again; 0 when it may try now. */
  retryAfterSeconds(key: string): number {
    const recent = this.recent(key);
    if (recent.length < this.maxFailures) return 0;
    const oldest = recent[recent.length - this.maxFailures];
    return Math.max(1, Math.ceil((oldest + this.windowMs - this.now()) / 1000));
  }

  /** Records one failed attempt. */
  recordFailure(key: string): void {
    const recent = this.recent(key);
    recent.push(this.now());
    this.failures.set(key, recent);
    if (this.failures.size > 10_000) this.sweep();
  }

  /** Forgets the failures of `key` (after a successful sign-in). */
  reset(key: string): void {
    this.failures.delete(key);
  }

  private recent(key: string): number[] {
    const since = this.now() - this.windowMs;
    return (this.failures.get(key) ?? []).filter((time) => time > since);
  }

  private sweep(): void {
    for (const key of [...this.failures.keys()]) {
      const recent = this.recent(key);
      if (recent.length === 0) this.failures.delete(key);
      else this.failures.set(key, recent);
    }
  }
}

/** The limiter key for an e-mail (case-insensitive) from a client address. */
export function signInLimiterKey(email: string, clientAddress: string): string {
  return `${email.trim().toLowerCase()}\u0000${clientAddress}`;
}

let shared: SignInLimiter | undefined;

/** The process-wide limiter, sized from SIGNIN_MAX_FAILURES and SIGNIN_WINDOW_MINUTES. */
export function getSignInLimiter(): SignInLimiter {
  const { signInMaxFailures, signInWindowMinutes } = getConfig().limits;
  shared ??= new SignInLimiter(signInMaxFailures, signInWindowMinutes * 60_000);
  return shared;
}
