// Lint: Next's recommended rules (core web vitals, TypeScript) and the React hooks rules (the
// recommended set of eslint-plugin-react-hooks, which Next's config carries). `npm test` runs it.
import { defineConfig, globalIgnores } from "eslint/config";
import nextVitals from "eslint-config-next/core-web-vitals";
import nextTs from "eslint-config-next/typescript";
import reactHooks from "eslint-plugin-react-hooks";

export default defineConfig([
  ...nextVitals,
  ...nextTs,
  { rules: reactHooks.configs.recommended.rules },
  {
    rules: {
      // A leading underscore names what a destructuring leaves out on purpose.
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_", ignoreRestSiblings: true }],
      // server/main.ts declares what shutdown stops before the start assigns it.
      "prefer-const": ["error", { ignoreReadBeforeAssign: true }],
      // A switch case that runs into the next one is a slip (a merge once made a promotion also drop the live socket).
      "no-fallthrough": "error",
    },
  },
  {
    // Migrations (and the grants run after them) take Kysely<any>: they must not depend on the app's
    // Database type, which describes the schema after the last migration only.
    files: ["migrations/**/*.ts", "db/grants.ts"],
    rules: { "@typescript-eslint/no-explicit-any": "off" },
  },
  globalIgnores([".next/**", ".next-*/**", ".data/**", "coverage/**", "test-results/**", "playwright-report/**", "bench-results/**", "next-env.d.ts"]),
]);
