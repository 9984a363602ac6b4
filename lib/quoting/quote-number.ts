/** Quote numbers per shop and year: Q-2026-0001 (DESIGN.md §5). Pure: no database. */
export const QUOTE_NUMBER_PATTERN = /^Q-(\d{4})-(\d{4,})$/;

/** Q-{year}-{sequence padded to four digits}; sequences past 9999 simply grow wider. */
export function formatQuoteNumber(year: number, sequence: number): string {
  if (!Number.isInteger(year) || year < 1000 || year > 9999) throw new RangeError(`year out of range: ${year}`);
  if (!Number.isInteger(sequence) || sequence < 1) throw new RangeError(`sequence must be a positive integer: ${sequence}`);
  return `Q-${year}-${String(sequence).padStart(4, "0")}`;
}

export function isQuoteNumber(value: string): boolean {
  return QUOTE_NUMBER_PATTERN.test(value);
}

/** The year a number is counted in: the calendar year in UTC, so every server agrees. */
export function numberingYear(now: Date): number {
  return now.getUTCFullYear();
}
