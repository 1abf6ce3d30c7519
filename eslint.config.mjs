// ESLint flat config: Next.js's recommended rules with Core Web Vitals and its TypeScript rules
// (eslint-config-next), run by `npm test` through `npm run lint`.
import { defineConfig, globalIgnores } from "eslint/config";
import nextVitals from "eslint-config-next/core-web-vitals";
import nextTs from "eslint-config-next/typescript";

export default defineConfig([
  ...nextVitals,
  ...nextTs,
  {
    rules: {
      // An underscore marks a deliberately unused binding (a destructured field left out, an unused parameter).
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_", destructuredArrayIgnorePattern: "^_", caughtErrors: "none" }],
    },
  },
  globalIgnores([".next/**", "dist/**", "node_modules/**", "lib/db/generated/**", "next-env.d.ts", "test-results/**", ".e2e-tmp/**"]),
]);
