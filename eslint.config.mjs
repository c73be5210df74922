// Lint for the whole project: Next.js's rules (core web vitals, React, React Hooks, accessibility) and its
// TypeScript rules, run by `npm test` as one counted check and by `npm run lint`. No warnings are allowed.
import { defineConfig, globalIgnores } from "eslint/config";
import nextVitals from "eslint-config-next/core-web-vitals";
import nextTs from "eslint-config-next/typescript";

export default defineConfig([
  ...nextVitals,
  ...nextTs,
  {
    rules: {
      // An unused name is a leftover; a leading underscore marks one kept on purpose (a destructured field left out).
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_", destructuredArrayIgnorePattern: "^_", ignoreRestSiblings: true }],
    },
  },
  globalIgnores([".next/**", "node_modules/**", "test-results/**", "playwright-report/**", ".data/**", "next-env.d.ts", "migrations/**"]),
]);
