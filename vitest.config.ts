import { defineConfig } from "vitest/config";
import path from "node:path";

const root = import.meta.dirname;

// Two projects: "unit" is pure lib code; "integration" talks to the real PostgreSQL
// that scripts/test.ts provisions (DATABASE_URL points at it).
export default defineConfig({
  resolve: {
    alias: {
      "@": root,
      // 'server-only' throws outside React Server Components; tests import server code directly.
      "server-only": path.join(root, "tests/support/empty-module.ts"),
    },
  },
  test: {
    projects: [
      {
        extends: true,
        test: { name: "unit", include: ["tests/unit/**/*.test.ts"], environment: "node", setupFiles: ["tests/support/fast-check-seed.ts"] },
      },
      {
        extends: true,
        test: {
          name: "integration",
          include: ["tests/integration/**/*.test.ts"],
          environment: "node",
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
    ],
  },
});
