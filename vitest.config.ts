import { defineConfig } from "vitest/config";

export default defineConfig({
  resolve: { tsconfigPaths: true },
  test: {
    include: ["tests/unit/**/*.test.ts", "tests/integration/**/*.test.ts"],
    server: { deps: { inline: ["kysely"] } },
    testTimeout: 20000,
    hookTimeout: 60000,
  },
});
