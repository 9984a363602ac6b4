/**
 * Data each integration test makes for itself: a shop of its own (its own people, and the catalog
 * and rules of one of the demo shops) and quotes through the real quoting path. No test reads what
 * another test or file left behind.
 */
import { randomUUID } from "node:crypto";
import { hashPassword } from "better-auth/crypto";
import { ownerDb as db } from "./owner-db";
import { DEMO_PASSWORD, demoCatalogs, demoPricingRules, seedShop } from "@/db/seed";
import type { ShopContext } from "@/lib/auth/context";
import type { Role } from "@/lib/auth/permissions";
import type { Requirement } from "@/lib/bank";
import { loadShopCatalog } from "@/db/queries/catalog";
import { searchPricedOptions } from "@/lib/quoting/priced-search";
import { createQuoteFromChoice } from "@/lib/quoting/create-quote";
import { chooseArrangementSchema } from "@/lib/validation/quote";

export interface TestPerson {
  id: string;
  name: string;
  email: string;
}

export interface TestShop {
  id: string;
  slug: string;
  name: string;
  currency: string;
  manager: TestPerson;
  estimator: TestPerson;
  customers: [TestPerson, TestPerson];
}

/** A 48 V bank with 20 kJ usable down to 24 V: Kestrel's catalog prices several options for it. */
export const KESTREL_REQUIREMENT = { maxVoltage: 48, minVoltage: 24, energy: 20_000, quantity: 1 };
/** A small film bank Marlow's catalog builds: 800 V, 10 µF. */
export const MARLOW_REQUIREMENT = { maxVoltage: 800, capacitance: 10e-6, quantity: 1 };

let passwordHash: Promise<string> | null = null;

/**
 * A new shop for one test, with a manager, an estimator and two customers who all sign in with the
 * demo password. `like` picks whose catalog, currency and pricing rules it copies; `depositPercent`
 * overrides the rules' deposit.
 */
export async function createShop(like: "kestrel" | "marlow" = "kestrel", options: { depositPercent?: number } = {}): Promise<TestShop> {
  passwordHash ??= hashPassword(DEMO_PASSWORD);
  const tag = randomUUID().slice(0, 8);
  const slug = `${like}-${tag}`;
  const name = `${like === "kestrel" ? "Kestrel" : "Marlow"} test shop ${tag}`;
  const currency = like === "kestrel" ? "EUR" : "GBP";
  const person = (who: string) => ({ name: `${who[0]?.toUpperCase()}${who.slice(1)} ${tag}`, email: `${who}.${tag}@${slug}.example` });
  const people = {
    manager: person("manager"),
    estimator: person("estimator"),
    customers: [person("customer"), person("other")] as [ReturnType<typeof person>, ReturnType<typeof person>],
  };
  const demo = like === "kestrel" ? "kestrel-bank-works" : "marlow-pulse";
  // the demo shop's own rules, or with another deposit when a test needs one (Kestrel asks 30 %, Marlow 40 %)
  const pricingRules = options.depositPercent === undefined ? demoPricingRules[demo] : { ...demoPricingRules[demo], depositPercent: options.depositPercent };
  const { shopId, userIds } = await seedShop(db, { slug, name, currency, people, catalog: demoCatalogs[demo], pricingRules }, await passwordHash);
  const withId = (p: { name: string; email: string }): TestPerson => ({ ...p, id: userIds.get(p.email) ?? "" });
  return {
    id: shopId,
    slug,
    name,
    currency,
    manager: withId(people.manager),
    estimator: withId(people.estimator),
    customers: [withId(people.customers[0]), withId(people.customers[1])],
  };
}

/** The context a member of `shop` has, as the guards would build it. */
export function contextOf(shop: TestShop, person: TestPerson, role: Role): ShopContext {
  return { user: { id: person.id, name: person.name, email: person.email }, shop: { id: shop.id, slug: shop.slug, name: shop.name }, role };
}

/** The priced options the shop's catalog offers now (the storefront's search). */
export async function searchOptions(shopId: string, requirement: Requirement) {
  return searchPricedOptions(await loadShopCatalog(shopId), requirement);
}

/** The cheapest priced option the shop's catalog offers for the requirement. */
export async function cheapestOption(shopId: string, requirement: Requirement) {
  const found = await searchOptions(shopId, requirement);
  const option = found.options.find((o) => o.price !== null);
  if (!option) throw new Error(`no priced option: ${found.reasons.join("; ")}`);
  return option;
}

/** A customer's choice of an option, as the storefront sends it. */
export function choiceOf(
  requirement: Requirement,
  option: { cell: { sku: string }; topology: "series-of-parallel-groups" | "parallel-of-series-strings"; seriesCount: number; parallelCount: number },
  key = randomUUID(),
) {
  return chooseArrangementSchema.parse({
    idempotencyKey: key,
    requirement,
    option: { cellSku: option.cell.sku, topology: option.topology, seriesCount: option.seriesCount, parallelCount: option.parallelCount },
  });
}

/** A quote for the customer through the quoting path (search again, price, number, freeze, outbox). */
export async function createQuote(shop: TestShop, customer: TestPerson, requirement: Requirement = KESTREL_REQUIREMENT, now?: Date): Promise<string> {
  const option = await cheapestOption(shop.id, requirement);
  const r = await createQuoteFromChoice(contextOf(shop, customer, "customer"), choiceOf(requirement, option), now);
  if (!r.ok || r.data.kind !== "quote") throw new Error(`expected a quote, got ${JSON.stringify(r)}`);
  return r.data.quoteNumber;
}
