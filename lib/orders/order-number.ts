/** Order numbers per shop and year: O-2026-0001 (DESIGN.md §5), counted like quote numbers. Pure: no database. */
import { formatQuoteNumber } from "@/lib/quoting/quote-number";

export const ORDER_NUMBER_PATTERN = /^O-(\d{4})-(\d{4,})$/;

/** O-{year}-{sequence padded to four digits}: the quote number's rules with the order's letter. */
export function formatOrderNumber(year: number, sequence: number): string {
  return `O${formatQuoteNumber(year, sequence).slice(1)}`;
}

export function isOrderNumber(value: string): boolean {
  return ORDER_NUMBER_PATTERN.test(value);
}
