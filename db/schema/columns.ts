import { sql } from "drizzle-orm";
import { text, timestamp } from "drizzle-orm/pg-core";
import { shops } from "./auth";

/** The tenant key a shop-owned table carries: its shop, whose deletion takes the row with it. */
export const shopColumn = () =>
  text()
    .notNull()
    .references(() => shops.id, { onDelete: "cascade" });

/** When the row was made. */
export const createdAtColumn = () => timestamp({ withTimezone: true }).notNull().defaultNow();

/** When the row last changed: set on insert and by every update made through Drizzle. */
export const updatedAtColumn = () =>
  timestamp({ withTimezone: true })
    .notNull()
    .defaultNow()
    .$onUpdate(() => sql`now()`);
