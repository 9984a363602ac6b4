import path from "node:path";
import { Client } from "pg";
import { vi } from "vitest";
import { apiRouteFiles, withDriftCheck } from "../support/route-drift";

// Each test file works in a database of its own, copied from the migrated and seeded test database
// (tests/integration/global-setup.ts): no file sees rows, queued jobs or counters another file left.
// DATABASE_URL (the app's role) and MIGRATION_DATABASE_URL (the tables' owner) both move to the copy.
const url = new URL(process.env.DATABASE_URL ?? "");
const ownerUrl = new URL(process.env.MIGRATION_DATABASE_URL ?? "");
const template = url.pathname.slice(1);
const copy = `${template}_file_${process.pid}_${Date.now().toString(36)}`;
const admin = new URL(ownerUrl);
admin.pathname = "/postgres";
const client = new Client({ connectionString: admin.toString() });
await client.connect();
try {
  await client.query(`CREATE DATABASE "${copy}" TEMPLATE "${template}"`);
} finally {
  await client.end();
}
url.pathname = `/${copy}`;
ownerUrl.pathname = `/${copy}`;
process.env.DATABASE_URL = url.toString();
process.env.MIGRATION_DATABASE_URL = ownerUrl.toString();

// Server actions and server components read the request through next/headers; in tests the
// "request" is whatever headers the test installs with `actAs` (tests/integration/helpers.ts).
const state = globalThis as unknown as { __requestHeaders?: Headers };

vi.mock("next/headers", () => ({
  headers: async () => state.__requestHeaders ?? new Headers(),
  cookies: async () => ({ get: () => undefined, getAll: () => [], set: () => undefined, delete: () => undefined, has: () => false }),
}));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined, revalidateTag: () => undefined }));

// `forbidden()` works once next.config's experimental.authInterrupts is on; the build sets this.
process.env.__NEXT_EXPERIMENTAL_AUTH_INTERRUPTS = "true";

// Drift is impossible: every route handler under app/api/v1 that a test calls has its request and
// its answer checked against the OpenAPI description (tests/support/route-drift.ts).
for (const file of apiRouteFiles()) {
  vi.doMock(path.resolve(file), async (importOriginal) => withDriftCheck(await importOriginal<Record<string, unknown>>(), file));
}
