/**
 * Slows password guessing: after FREE_FAILURES wrong passwords for one username, that
 * username is refused for a while, doubling with each further failure (up to MAX_LOCK_MS),
 * whatever the password. A right password after the lock ends clears the count. Kept in
 * memory per app instance (so with N instances a guesser gets N times as many tries); the
 * bcrypt cost already makes each try slow. Pure: the clock is passed in.
 */
export const FREE_FAILURES = 5;
const FIRST_LOCK_MS = 30_000;
const MAX_LOCK_MS = 15 * 60_000;

export class SignInThrottle {
  private entries = new Map<string, { failures: number; lockedUntil: number }>();

  /** Milliseconds this username must still wait (0: may try now). */
  waitFor(username: string, now: number): number {
    const e = this.entries.get(username);
    return e && e.lockedUntil > now ? e.lockedUntil - now : 0;
  }

  failed(username: string, now: number): void {
    if (this.entries.size > 10_000) this.entries.clear();
    const e = this.entries.get(username) ?? { failures: 0, lockedUntil: 0 };
    e.failures++;
    if (e.failures >= FREE_FAILURES) e.lockedUntil = now + Math.min(MAX_LOCK_MS, FIRST_LOCK_MS * 2 ** (e.failures - FREE_FAILURES));
    this.entries.set(username, e);
  }

  succeeded(username: string): void {
    this.entries.delete(username);
  }
}
