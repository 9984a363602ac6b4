import { vi } from "vitest";

// Server actions and server components read the request through next/headers; in tests the
// "request" is whatever headers the test installs with `actAs` (tests/integration/helpers.ts).
const state = globalThis as unknown as { __requestHeaders?: Headers };

vi.mock("next/headers", () => ({
  headers: async () => state.__requestHeaders ?? new Headers(),
  cookies: async () => ({ get: () => undefined, getAll: () => [], set: () => undefined, delete: () => undefined, has: () => false }),
}));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined, revalidateTag: () => undefined }));
