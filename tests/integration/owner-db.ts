/**
 * The tables' owner, for tests that look at or arrange rows behind the app's back (counting every
 * shop's rows, ageing a row, reading what an action wrote). It bypasses row-level security, so the
 * app's own code never uses it: app code and the queries under test use `db` from "@/db", the
 * app's role. This file's database is the test file's copy (tests/integration/setup.ts).
 */
import { createDb } from "@/db/client";

const owner = createDb(process.env.MIGRATION_DATABASE_URL ?? "", 4);

export const ownerDb = owner.db;
export const ownerPool = owner.pool;
