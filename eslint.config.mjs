import js from "@eslint/js";
import tseslint from "typescript-eslint";
import prettier from "eslint-config-prettier";

const pureModules = ["lib/bank/**", "lib/pricing/**", "lib/quantities/**"];

export default tseslint.config(
  { ignores: [".next/**", "node_modules/**", ".data/**", "drizzle/**", "next-env.d.ts", "test-results/**", "playwright-report/**", ".next-slot-*/**"] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: {
      globals: {
        process: "readonly",
        console: "readonly",
        URL: "readonly",
        fetch: "readonly",
        setTimeout: "readonly",
        clearTimeout: "readonly",
        Buffer: "readonly",
        Response: "readonly",
        Request: "readonly",
        Headers: "readonly",
        window: "readonly",
        document: "readonly",
        performance: "readonly",
      },
    },
    rules: {
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_" }],
      "@typescript-eslint/no-explicit-any": "error",
    },
  },
  {
    // lib/ reads and writes through db/queries and opens transactions with db/tx.ts inTransaction;
    // it never queries the client or the schema itself (types are fine). The auth plugin's database
    // adapter (lib/auth/server.ts) is the one exception.
    files: ["lib/**"],
    ignores: ["lib/auth/server.ts"],
    rules: {
      "no-restricted-imports": [
        "error",
        {
          paths: ["@/db", "@/db/index", "@/db/client", "@/db/schema"].map((name) => ({
            name,
            allowTypeImports: true,
            message: "Query through db/queries/* and open transactions with inTransaction from @/db/tx.",
          })),
          patterns: [
            { group: ["@/db/schema/*"], allowTypeImports: true, message: "Query through db/queries/* and open transactions with inTransaction from @/db/tx." },
          ],
        },
      ],
    },
  },
  {
    // The engine, the money and the quantities stay pure (STYLE.md §6).
    files: pureModules,
    rules: {
      "no-restricted-imports": [
        "error",
        {
          patterns: [
            {
              group: ["next", "next/*", "react", "react-dom", "drizzle-orm", "drizzle-orm/*", "@/db", "@/db/*", "@/lib/env", "**/db/**", "**/lib/env"],
              message: "lib/bank, lib/pricing and lib/quantities are pure: no framework, database or environment imports.",
            },
          ],
        },
      ],
    },
  },
  {
    // Forms take zodResolver from lib/validation/zod-resolver.ts, which sets zod up for the page's
    // Content-Security-Policy in the browser; nothing else loads zod on a page that has no form.
    files: ["app/**", "components/**", "lib/**"],
    ignores: ["lib/validation/zod-resolver.ts"],
    rules: {
      "@typescript-eslint/no-restricted-imports": [
        "error",
        { paths: [{ name: "@hookform/resolvers/zod", message: "Import zodResolver from @/lib/validation/zod-resolver (it sets zod up for the CSP)." }] },
      ],
    },
  },
  // formatting is Prettier's (npm run format); lint leaves it alone
  prettier,
);
