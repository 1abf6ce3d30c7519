// The repository and API tests again, on PostgreSQL: `npm run test:pg` (scripts/test-pg.sh)
// starts a temporary cluster and sets HOLDLINE_TEST_PG_URL; with HOLDLINE_TEST_DB=postgresql
// test/helpers/tempdb.ts gives every test file a new PostgreSQL database instead of a SQLite file.
import { defineConfig } from "vitest/config";
import base from "./vitest.config";

export const DATABASE_TESTS = [
  "test/unit/library-repo.test.ts",
  "test/unit/accounts.test.ts",
  "test/unit/concurrency.test.ts",
  "test/unit/api.test.ts",
  "test/unit/ruleset-fields.test.ts",
  "test/unit/cli-library-db.test.ts",
  "test/unit/schema-drift.pg.test.ts",
  "test/unit/cool-paths.test.ts",
];

if (!process.env.HOLDLINE_TEST_PG_URL) throw new Error("vitest.pg.config.ts needs HOLDLINE_TEST_PG_URL: run `npm run test:pg`");

export default defineConfig({ ...base, test: { ...base.test, include: DATABASE_TESTS, env: { HOLDLINE_TEST_DB: "postgresql" } } });
