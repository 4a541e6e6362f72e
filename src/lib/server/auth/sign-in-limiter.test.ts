import { describe, expect, it } from 'vitest';
import { SignInLimiter, signInLimiterKey } from './sign-in-limiter';

function limiterWithClock(maxFailures = 5, windowMinutes = 15) {
  const clock = { now: 1_000_000 };
  const limiter = new SignInLimiter(maxFailures, windowMinutes * 60_000, () => clock.now);
  return { limiter, clock };
}

describe('SignInLimiter', () => {
  it('lets a key fail four times and try a fifth time', () => {
    const { limiter } = limiterWithClock();
    for (let attempt = 0; attempt < 4; attempt++) limiter.recordFailure('k');
    expect(limiter.retryAfterSeconds('k')).toBe(0);
  });

  it('refuses a key after five failures until the oldest leaves the 15-minute window', () => {
    const { limiter, clock } = limiterWithClock();
    for (let attempt = 0; attempt < 5; attempt++) {
      limiter.recordFailure('k');
      clock.now += 60_000;
    }
    // The first failure was 5 minutes ago, so it leaves the window in 10 minutes.
    expect(limiter.retryAfterSeconds('k')).toBe(10 * 60);
    clock.now += 10 * 60_000;
    expect(limiter.retryAfterSeconds('k')).toBe(0);
  });

  it('counts keys separately', () => {
    const { limiter } = limiterWithClock(2);
    limiter.recordFailure('a');
    limiter.recordFailure('a');
    expect(limiter.retryAfterSeconds('a')).toBeGreaterThan(0);
    expect(limiter.retryAfterSeconds('b')).toBe(0);
  });

  it('forgets a key after a successful sign-in', () => {
    const { limiter } = limiterWithClock(1);
    limiter.recordFailure('k');
    expect(limiter.retryAfterSeconds('k')).toBeGreaterThan(0);
    limiter.reset('k');
    expect(limiter.retryAfterSeconds('k')).toBe(0);
  });

  it('keys by e-mail regardless of case and spaces, and by client address', () => {
    expect(signInLimiterKey(' Wren@Lanternfish.Example ', '10.0.0.1')).toBe(
      signInLimiterKey('wren@lanternfish.example', '10.0.0.1')
    );
    expect(signInLimiterKey('wren@lanternfish.example', '10.0.0.1')).not.toBe(
      signInLimiterKey('wren@lanternfish.example', '10.0.0.2')
    );
  });
});
