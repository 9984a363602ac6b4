import { z } from "zod";
import { QUOTE_NUMBER_PATTERN } from "@/lib/quoting/quote-number";
import { MAX_MESSAGE_LENGTH } from "./limits";
import { text } from "./text";

/** The moves a customer and the shop's staff make on a quote page, checked at the field. */

const number = z.string().regex(QUOTE_NUMBER_PATTERN, "Not a quote number");
const revision = z.number().int().min(1).max(100_000);
const reason = (what: string) =>
  text()
    .trim()
    .min(3, `Say ${what} in a few words`)
    .max(MAX_MESSAGE_LENGTH, `At most ${MAX_MESSAGE_LENGTH.toLocaleString("en-GB")} characters`);

export const quoteRefSchema = z.strictObject({ number });
export const acceptQuoteSchema = z.strictObject({ number, revision });
export const declineQuoteSchema = z.strictObject({ number, revision, reason: reason("why you decline") });
export const withdrawQuoteSchema = z.strictObject({ number, reason: reason("why the shop withdraws it") });
export const quoteMessageSchema = z.strictObject({
  number,
  body: text()
    .trim()
    .min(1, "Write a message")
    .max(MAX_MESSAGE_LENGTH, `At most ${MAX_MESSAGE_LENGTH.toLocaleString("en-GB")} characters`),
  kind: z.enum(["message", "change-request"]).default("message"),
});

/** The revisions the quote page compares (`?from=1&to=2`), read forgivingly from the URL. */
export function compareParams(search: Record<string, string | string[] | undefined>, latest: number): { view: number; from: number; to: number } {
  const read = (key: string) => {
    const raw = search[key];
    const v = Number(Array.isArray(raw) ? raw[0] : raw);
    return Number.isInteger(v) && v >= 1 && v <= latest ? v : null;
  };
  const view = read("revision") ?? latest;
  const to = read("to") ?? latest;
  const from = read("from") ?? Math.max(1, to - 1);
  return { view, from, to };
}
