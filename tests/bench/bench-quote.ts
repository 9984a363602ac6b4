/**
 * A quote for the page-speed bench to load: the demo customer of Kestrel Bank Works chooses the
 * cheapest priced option for a 48 V, 20 kJ bank, through the real quoting path (search again,
 * price, number, freeze). Prints `<customer e-mail> <quote number>` on its last line.
 *   DATABASE_URL=… npx tsx --conditions=react-server tests/bench/bench-quote.ts
 * (the `react-server` condition lets the server modules' `server-only` import load outside Next.js).
 */
import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import { db } from "@/db";
import { users } from "@/db/schema";
import { getShopBySlug } from "@/db/queries/shops";
import { loadShopCatalog } from "@/db/queries/catalog";
import { demoPeople } from "@/db/seed/people";
import { createQuoteFromChoice } from "@/lib/quoting/create-quote";
import { searchPricedOptions } from "@/lib/quoting/priced-search";
import { chooseArrangementSchema } from "@/lib/validation/quote";

const SLUG = "kestrel-bank-works";
const requirement = { maxVoltage: 48, minVoltage: 24, energy: 20_000, quantity: 1 };

async function main() {
  const shop = await getShopBySlug(SLUG);
  if (!shop) throw new Error(`no demo shop ${SLUG}: run the demo set-up first`);
  const person = demoPeople[SLUG].customers[0];
  const [user] = await db.select({ id: users.id, name: users.name, email: users.email }).from(users).where(eq(users.email, person.email));
  if (!user) throw new Error(`no demo customer ${person.email}`);
  const found = await searchPricedOptions(await loadShopCatalog(shop.id), requirement);
  const option = found.options.find((o) => o.price !== null);
  if (!option) throw new Error(`no priced option: ${found.reasons.join("; ")}`);
  const input = chooseArrangementSchema.parse({
    idempotencyKey: randomUUID(),
    requirement,
    option: { cellSku: option.cell.sku, topology: option.topology, seriesCount: option.seriesCount, parallelCount: option.parallelCount },
  });
  const r = await createQuoteFromChoice({ user, shop, role: "customer" }, input);
  if (!r.ok || r.data.kind !== "quote") throw new Error(`expected a quote, got ${JSON.stringify(r)}`);
  console.log(`${user.email} ${r.data.quoteNumber}`);
}

main().then(
  () => process.exit(0),
  (error: unknown) => {
    console.error(error);
    process.exit(1);
  },
);
