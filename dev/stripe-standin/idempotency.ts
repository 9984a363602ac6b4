/**
 * Stripe's idempotent requests: a POST's result is kept under its `Idempotency-Key`; the same key
 * with the same endpoint and parameters gets that result again (header `Idempotent-Replayed:
 * true`, no new object or event), the same key with anything else a 400 `idempotency_error`.
 * Keys are kept for a bounded time (Stripe: 24 hours) and the store holds a bounded number of
 * them, forgetting the oldest first.
 */

export interface StoredResult {
  endpoint: string;
  fingerprint: string;
  status: number;
  body: string;
  requestId: string;
  storedAtMs: number;
}

export const MAX_KEY_LENGTH = 255;

export class IdempotencyStore {
  private readonly entries = new Map<string, StoredResult>();

  constructor(
    private readonly ttlMs: number,
    private readonly maxEntries: number,
    private readonly nowMs: () => number = Date.now,
  ) {}

  get size(): number {
    return this.entries.size;
  }

  get(scope: string, key: string): StoredResult | undefined {
    const id = `${scope}\u0000${key}`;
    const found = this.entries.get(id);
    if (found && this.nowMs() - found.storedAtMs >= this.ttlMs) {
      this.entries.delete(id);
      return undefined;
    }
    return found;
  }

  set(scope: string, key: string, result: Omit<StoredResult, "storedAtMs">): void {
    const id = `${scope}\u0000${key}`;
    this.entries.delete(id);
    this.entries.set(id, { ...result, storedAtMs: this.nowMs() });
    this.prune();
  }

  clear(): void {
    this.entries.clear();
  }

  /** Drops expired keys (oldest first, they are in insertion order) and any beyond the bound. */
  private prune(): void {
    const now = this.nowMs();
    for (const [id, entry] of this.entries) {
      if (now - entry.storedAtMs < this.ttlMs && this.entries.size <= this.maxEntries) break;
      this.entries.delete(id);
    }
  }
}
