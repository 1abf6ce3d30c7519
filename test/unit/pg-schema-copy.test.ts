// Runs without a PostgreSQL server: the PostgreSQL copy of the schema is generated from
// prisma/schema.prisma (never hand-edited), and every SQLite migration has a PostgreSQL twin.
import { describe, it, expect } from "vitest";
import { readFileSync, readdirSync, existsSync } from "node:fs";
import path from "node:path";
// @ts-expect-error plain ES module script without types
import { postgresSchemaFrom } from "../../scripts/pg-schema.mjs";

const dirs = (p: string) =>
  readdirSync(p, { withFileTypes: true })
    .filter((d) => d.isDirectory() && existsSync(path.join(p, d.name, "migration.sql")))
    .map((d) => d.name)
    .sort();

describe("one source of truth for the models", () => {
  it("prisma/postgresql/schema.prisma is exactly what scripts/pg-schema.mjs makes from prisma/schema.prisma", () => {
    const want = postgresSchemaFrom(readFileSync("prisma/schema.prisma", "utf8")) as string;
    const have = readFileSync("prisma/postgresql/schema.prisma", "utf8");
    expect(have, "stale copy: run `node scripts/pg-schema.mjs`").toBe(want);
    expect(have).toMatch(/provider = "postgresql"/);
    expect(have.replace(/^\/\/ GENERATED.*\n.*\n/, "").replace('"postgresql"', '"sqlite"').replace("../../lib/db/generated-pg", "../lib/db/generated")).toBe(
      readFileSync("prisma/schema.prisma", "utf8"),
    );
  });

  it("every SQLite migration has a PostgreSQL migration of the same name, and no other", () => {
    const sqlite = dirs("prisma/migrations");
    const postgres = dirs("prisma/migrations-postgresql");
    const missing = sqlite.filter((m) => !postgres.includes(m));
    expect(missing, `write prisma/migrations-postgresql/<name>/migration.sql for: ${missing.join(", ")} (node scripts/pg-ddl.mjs helps)`).toEqual([]);
    expect(postgres.filter((m) => !sqlite.includes(m))).toEqual([]);
  });
});

describe("PostgreSQL twin of an additive SQLite migration", () => {
  it("maps the types and keeps the statements; refuses what it cannot translate", async () => {
    // @ts-expect-error plain ES module script without types
    const { twinOfSqliteMigration } = await import("../../scripts/pg-ddl.mjs");
    const twin = twinOfSqliteMigration(
      `-- why\nALTER TABLE "Product" ADD COLUMN "wall_m" REAL;\nALTER TABLE "Plan" ADD COLUMN "at" DATETIME;\nCREATE INDEX "Plan_at_idx" ON "Plan"("at");\n`,
      "20990101000000_x",
    ) as string;
    expect(twin).toContain(`ALTER TABLE "Product" ADD COLUMN "wall_m" DOUBLE PRECISION;`);
    expect(twin).toContain(`ALTER TABLE "Plan" ADD COLUMN "at" TIMESTAMP(3);`);
    expect(twin).toContain(`CREATE INDEX "Plan_at_idx" ON "Plan"("at");`);
    expect(twin).toContain("-- why");
    expect(() => twinOfSqliteMigration(`PRAGMA foreign_keys=OFF;\nCREATE TABLE "new_X" ("id" INTEGER);`)).toThrow(/by hand/);
  });
});
