import { fileURLToPath } from "node:url";
import { defineConfig } from "vitest/config";

const root = fileURLToPath(new URL(".", import.meta.url));

export default defineConfig({
  resolve: {
    alias: [
      { find: /^@\//, replacement: `${root}` },
      // `server-only` throws outside the React server bundle; tests import server modules directly.
      { find: /^server-only$/, replacement: `${root}tests/support/server-only-stub.ts` },
    ],
  },
  test: {
    include: ["tests/unit/**/*.test.ts", "tests/integration/**/*.test.ts"],
    environment: "node",
    pool: "forks",
    setupFiles: ["tests/support/setup.ts"],
  },
});
