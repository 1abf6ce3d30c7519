import { defineConfig } from "prisma/config";
import { resolveDatabasePath } from "./lib/db/path";
import { isPostgresUrl } from "./lib/db/provider";

// Prisma 7 does not read .env by itself; the database location is resolved in one place.
// A postgresql:// DATABASE_URL selects the PostgreSQL copy of the schema and its migrations.
const location = resolveDatabasePath();
const pg = isPostgresUrl(location);
export default defineConfig({
  schema: pg ? "prisma/postgresql/schema.prisma" : "prisma/schema.prisma",
  migrations: {
    path: pg ? "prisma/migrations-postgresql" : "prisma/migrations",
    seed: "tsx scripts/prepare-db.ts",
  },
  datasource: {
    url: pg ? location : "file:" + location,
  },
});
