/**
 * Demo data: two invented shops with their people, catalogs and settings. Loaded by the start
 * command into an empty database and by tests that need it. Every name here is invented.
 */
import { randomUUID } from "node:crypto";
import { hashPassword } from "better-auth/crypto";
import { count, sql } from "drizzle-orm";
import { DEFAULT_DESIGN_FACTORS } from "@/lib/bank/types";
import { DEFAULT_PRICING_RULES, type PricingRules } from "@/lib/pricing";
import type { Db } from "../client";
import { accounts, catalogCells, catalogComponents, members, shopSettings, shops, users, type NewCatalogCell, type NewCatalogComponent } from "../schema";
import { kestrelCells, kestrelComponents } from "./catalog-kestrel";
import { marlowCells, marlowComponents } from "./catalog-marlow";
import { DEMO_PASSWORD, demoPeople, demoShops, type DemoPerson, type DemoShopPeople } from "./people";
import { demoPricingRules } from "./pricing-rules";

export { DEMO_PASSWORD, demoPeople, demoPricingRules, demoShops };

/** Each demo shop's catalog (tests copy them into shops of their own). */
export const demoCatalogs = {
  "kestrel-bank-works": { cells: kestrelCells, components: kestrelComponents },
  "marlow-pulse": { cells: marlowCells, components: marlowComponents },
} as const;

export async function isDatabaseEmpty(db: Db): Promise<boolean> {
  const [row] = await db.select({ n: count() }).from(shops);
  return (row?.n ?? 0) === 0;
}

/** A transaction on the client the seed was given. */
type SeedTx = Parameters<Parameters<Db["transaction"]>[0]>[0];

async function createUser(db: SeedTx, person: { name: string; email: string }, passwordHash: string) {
  const id = randomUUID();
  await db.insert(users).values({ id, name: person.name, email: person.email, emailVerified: true });
  await db.insert(accounts).values({ id: randomUUID(), accountId: id, providerId: "credential", userId: id, password: passwordHash });
  return id;
}

/** One shop to load: its storefront facts, its people and the catalog it builds from. */
export interface ShopSeed {
  slug: string;
  name: string;
  currency: string;
  tagline?: string;
  description?: string;
  people: DemoShopPeople;
  /** the shop's pricing rules (default: the defaults in its currency) */
  pricingRules?: PricingRules;
  catalog: { cells: Omit<NewCatalogCell, "shopId">[]; components: Omit<NewCatalogComponent, "shopId">[] };
}

/**
 * Loads one shop with the default design factors and its pricing rules; answers its id and its people's
 * user ids. One transaction scoped to the new shop (as withShop scopes one), so it works under
 * row-level security whichever role runs it.
 */
export async function seedShop(db: Db, shop: ShopSeed, passwordHash: string): Promise<{ shopId: string; userIds: Map<string, string> }> {
  const shopId = randomUUID();
  return db.transaction(async (tx) => {
    await tx.execute(sql`select set_config('app.shop_id', ${shopId}, true)`);
    await tx.insert(shops).values({ id: shopId, name: shop.name, slug: shop.slug });
    await tx.insert(shopSettings).values({
      shopId,
      currency: shop.currency,
      tagline: shop.tagline,
      description: shop.description,
      designFactors: DEFAULT_DESIGN_FACTORS,
      pricingRules: shop.pricingRules ?? { ...DEFAULT_PRICING_RULES, currency: shop.currency },
    });
    const { people } = shop;
    const staff: [DemoPerson, "manager" | "estimator" | "customer"][] = [
      [people.manager, "manager"],
      [people.estimator, "estimator"],
      ...people.customers.map((c) => [c, "customer"] as [DemoPerson, "customer"]),
    ];
    const userIds = new Map<string, string>();
    for (const [person, role] of staff) {
      const userId = await createUser(tx, person, passwordHash);
      userIds.set(person.email, userId);
      // the wall clock, not the transaction's start: they join one after another
      await tx.insert(members).values({ id: randomUUID(), shopId, userId, role, createdAt: sql`clock_timestamp()` });
    }
    await tx.insert(catalogCells).values(shop.catalog.cells.map((c) => ({ ...c, shopId })));
    await tx.insert(catalogComponents).values(shop.catalog.components.map((c) => ({ ...c, shopId })));
    return { shopId, userIds };
  });
}

/** Loads both demo shops. Call only on an empty database (the start command checks). */
export async function seedDemo(db: Db): Promise<void> {
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  for (const shop of demoShops) {
    await seedShop(db, { ...shop, people: demoPeople[shop.slug], pricingRules: demoPricingRules[shop.slug], catalog: demoCatalogs[shop.slug] }, passwordHash);
  }
}
