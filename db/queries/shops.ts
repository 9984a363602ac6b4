import "server-only";
import { eq, sql } from "drizzle-orm";
import { db } from "@/db";
import { shopSettings, shops, users } from "@/db/schema";
import { withShop } from "@/db/tx";
import { DEFAULT_DESIGN_FACTORS } from "@/lib/bank/types";
import { DEFAULT_PRICING_RULES } from "@/lib/pricing";

/** A slug as shops are given them (lib/validation/auth.ts): anything else cannot name a shop, and is never looked up. */
const SLUG_SHAPE = /^[a-z0-9-]{1,64}$/;

/**
 * The shop a URL's slug names, or null: the first step of every shop context. `shops` is the
 * directory of tenants (name and slug, public on every storefront), not a tenant table.
 */
export async function getShopBySlug(slug: string): Promise<{ id: string; slug: string; name: string; catalogVersion: number } | null> {
  if (!SLUG_SHAPE.test(slug)) return null;
  const [shop] = await db
    .select({ id: shops.id, slug: shops.slug, name: shops.name, catalogVersion: shops.catalogVersion })
    .from(shops)
    .where(eq(shops.slug, slug))
    .limit(1);
  return shop ?? null;
}

export async function isSlugTaken(slug: string): Promise<boolean> {
  return (await getShopBySlug(slug)) !== null;
}

/**
 * Shops shown on the landing page: public storefront facts only, read across shops by the
 * database function `public_shop_list` (drizzle/0009_row-level-security.sql).
 */
export async function listPublicShops(): Promise<{ slug: string; name: string; tagline: string; currency: string }[]> {
  const rows = await db.execute<{ slug: string; name: string; tagline: string; currency: string }>(sql`select * from public_shop_list(50)`);
  return rows.rows;
}

export async function getShopSettings(shopId: string) {
  const [row] = await withShop(shopId, (tx) => tx.select().from(shopSettings).where(eq(shopSettings.shopId, shopId)).limit(1));
  return row ?? null;
}

/** A new shop starts with the default design factors and pricing rules in its own currency. */
export async function createShopSettings(shopId: string, currency: string) {
  await withShop(shopId, (tx) =>
    tx
      .insert(shopSettings)
      .values({ shopId, currency, designFactors: DEFAULT_DESIGN_FACTORS, pricingRules: { ...DEFAULT_PRICING_RULES, currency } })
      .onConflictDoNothing(),
  );
}

export async function isEmailTaken(email: string): Promise<boolean> {
  const [row] = await db.select({ id: users.id }).from(users).where(eq(users.email, email.toLowerCase())).limit(1);
  return Boolean(row);
}

/** Removes an account created moments ago when the rest of a sign-up could not complete. */
export async function deleteUserAccount(userId: string) {
  await db.delete(users).where(eq(users.id, userId));
}

/** A shop's name and slug, for messages about it. */
export async function getShopIdentity(shopId: string) {
  const [row] = await db.select({ name: shops.name, slug: shops.slug }).from(shops).where(eq(shops.id, shopId)).limit(1);
  return row ?? null;
}

/** The opener's currency for a shop opened moments ago: its settings row starts in euros (lib/auth/plugin-rules.ts). */
export async function setOpeningCurrency(shopId: string, currency: string) {
  await withShop(shopId, (tx) =>
    tx
      .update(shopSettings)
      .set({ currency, pricingRules: sql`jsonb_set(${shopSettings.pricingRules}, '{currency}', to_jsonb(${currency}::text))`, updatedAt: new Date() })
      .where(eq(shopSettings.shopId, shopId)),
  );
}
