import "server-only";
import { env } from "@/lib/env";
import { createDb, type Db } from "./client";

const globalForDb = globalThis as unknown as { faradsmithDb?: Db };

/** The app's one database client (kept across hot reloads in development). */
export const db: Db = globalForDb.faradsmithDb ?? createDb(env.DATABASE_URL).db;
if (env.NODE_ENV !== "production") globalForDb.faradsmithDb = db;
