import type { AuthContext } from './middleware';

/**
 * Who a session cookie belongs to, remembered for a few seconds so that a burst of API reads
 * (a pin card, a walk, a readings page) does not check the same session in MariaDB on every
 * request.
 *
 * The trade-off, and its bound: on THIS app instance, sign-out, a removed member, a role or
 * name change and a password change or reset forget the entries at once (the routes call
 * `forgetSession` / `forgetUser` after their transaction commits). On ANOTHER instance behind
 * the same load balancer the old answer can live on for at most `ttlMs` (SESSION_CACHE_MS,
 * 5 s by default; 0 turns the cache off): a revoked session may still read there for those
 * seconds, never longer, and never across shops (the entry carries the session's own shop).
 */
export class SessionCache {
  private readonly entries = new Map<string, { auth: AuthContext; until: number }>();
  /** Bumped by every forget: a lookup that began before one must not store what it read. */
  private generation = 0;

  constructor(
    readonly ttlMs = 5000,
    readonly capacity = 10_000,
    private readonly now: () => number = Date.now,
  ) {}

  get enabled(): boolean {
    return this.ttlMs > 0;
  }

  /** Take this before reading the session from the database; hand it back to `set`. */
  mark(): number {
    return this.generation;
  }

  get(sessionId: string): AuthContext | undefined {
    const e = this.entries.get(sessionId);
    if (!e) return undefined;
    if (e.until <= this.now()) {
      this.entries.delete(sessionId);
      return undefined;
    }
    return e.auth;
  }

  /** Remembers a session read at `mark` (skipped when anything was forgotten since). */
  set(auth: AuthContext, sessionExpiresAt: Date, mark: number): void {
    if (!this.enabled || mark !== this.generation) return;
    const until = Math.min(this.now() + this.ttlMs, sessionExpiresAt.getTime());
    this.entries.delete(auth.sessionId);
    this.entries.set(auth.sessionId, { auth, until });
    // Oldest first: Map keeps insertion order.
    while (this.entries.size > this.capacity) {
      const oldest = this.entries.keys().next();
      if (oldest.done) break;
      this.entries.delete(oldest.value);
    }
  }

  forgetSession(sessionId: string): void {
    this.generation++;
    this.entries.delete(sessionId);
  }

  /** Every session of this person (signed out elsewhere, removed, role or password changed). */
  forgetUser(userId: string): void {
    this.generation++;
    for (const [id, e] of this.entries) if (e.auth.userId === userId) this.entries.delete(id);
  }

  get size(): number {
    return this.entries.size;
  }
}
