/** A quote's last valid day: today (UTC) plus the shop's validity days, as YYYY-MM-DD. Pure. */
export function validUntilFrom(now: Date, validityDays: number): string {
  if (!Number.isInteger(validityDays) || validityDays < 0) throw new RangeError(`validity days must be a non-negative integer: ${validityDays}`);
  const day = Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate());
  return new Date(day + validityDays * 86_400_000).toISOString().slice(0, 10);
}

/** Whether a quote valid until `validUntil` (YYYY-MM-DD, inclusive) has lapsed at `now`. */
export function isExpired(validUntil: string, now: Date): boolean {
  return now.toISOString().slice(0, 10) > validUntil;
}
