import { defineConfig } from "vitest/config";

export default defineConfig({
  resolve: { tsconfigPaths: true },
  test: {
    include: ["tests/unit/**/*.test.ts", "tests/integration/**/*.test.ts"],
    server: { deps: { inline: ["kysely"] } },
    testTimeout: 20000,
    // Route handlers read the environment; tests that do not set a secret get a fixed one of their own.
    env: { SESSION_SECRET: process.env.SESSION_SECRET ?? "vitest-session-secret-not-for-any-server" },
    hookTimeout: 60000,
  },
});
