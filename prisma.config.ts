import { defineConfig } from "prisma/config";
import { resolveDatabasePath } from "./lib/db/path";

// Prisma 7 does not read .env by itself; the database path is resolved in one place.
export default defineConfig({
  schema: "prisma/schema.prisma",
  migrations: {
    path: "prisma/migrations",
    seed: "tsx scripts/prepare-db.ts",
  },
  datasource: {
    url: "file:" + resolveDatabasePath(),
  },
});
