// The hand-written PostgreSQL migrations and prisma/schema.prisma must describe the same tables.
// Needs a PostgreSQL server (HOLDLINE_TEST_PG_URL, see scripts/test-pg.sh). Skipped without one,
// except in CI (CI=true), where a missing server is a failure.
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { readFileSync } from "node:fs";
import pg from "pg";
import { tempPostgresDatabase } from "../helpers/tempdb";
import { migratePostgres } from "../../lib/db/migrate-pg";
// @ts-expect-error plain ES module script without types
import { parseModels, addColumnSql } from "../../scripts/pg-ddl.mjs";

type Field = { name: string; type: string; optional: boolean; unique: boolean };
type Model = { name: string; fields: Field[] };

const PG_DATA_TYPE: Record<string, string> = {
  Int: "integer",
  Float: "double precision",
  String: "text",
  Boolean: "boolean",
  DateTime: "timestamp without time zone",
};

const haveServer = !!process.env.HOLDLINE_TEST_PG_URL;
if (!haveServer && process.env.CI === "true") {
  describe("PostgreSQL migrations", () => {
    it("have a PostgreSQL server to run on in CI", () => {
      throw new Error("CI=true but HOLDLINE_TEST_PG_URL is not set: .ci/run must start the temporary cluster");
    });
  });
} else if (!haveServer) {
  console.warn("schema-drift.pg: skipped (no HOLDLINE_TEST_PG_URL; `npm run test:pg` starts a temporary PostgreSQL cluster)");
}

describe.runIf(haveServer)("PostgreSQL migrations match schema.prisma", () => {
  let url = "";
  let dispose: () => Promise<void> = async () => {};
  let client: pg.Client;
  const models = parseModels(readFileSync("prisma/schema.prisma", "utf8")) as Model[];

  beforeAll(async () => {
    const t = await tempPostgresDatabase();
    url = t.dbPath;
    dispose = t.dispose;
    await t.db.$disconnect();
    client = new pg.Client({ connectionString: url });
    await client.connect();
  });
  afterAll(async () => {
    await client?.end();
    await dispose();
  });

  it("records every migration once in _prisma_migrations and applies nothing twice", async () => {
    const again = await migratePostgres(url);
    expect(again.applied).toEqual([]);
    const rows = (await client.query(`SELECT migration_name, checksum, finished_at FROM "_prisma_migrations"`)).rows;
    expect(rows.length).toBe(again.alreadyApplied.length);
    expect(rows.length).toBeGreaterThanOrEqual(2);
    for (const r of rows) {
      expect(r.checksum).toMatch(/^[0-9a-f]{64}$/);
      expect(r.finished_at).toBeTruthy();
    }
  });

  it("has a table for every model and a column of the right type and nullability for every field", async () => {
    expect(models.length).toBeGreaterThanOrEqual(11);
    const missing: string[] = [];
    for (const model of models) {
      const cols = (
        await client.query<{ column_name: string; data_type: string; is_nullable: string; datetime_precision: number | null }>(
          `SELECT column_name, data_type, is_nullable, datetime_precision FROM information_schema.columns WHERE table_schema = current_schema() AND table_name = $1`,
          [model.name],
        )
      ).rows;
      expect(cols.length, `table ${model.name}: write its CREATE TABLE (node scripts/pg-ddl.mjs ${model.name})`).toBeGreaterThan(0);
      for (const f of model.fields) {
        const col = cols.find((c) => c.column_name === f.name);
        if (!col) {
          missing.push(addColumnSql(model, f.name));
          continue;
        }
        expect(col.data_type, `${model.name}.${f.name} type`).toBe(PG_DATA_TYPE[f.type]);
        if (f.type === "DateTime") expect(col.datetime_precision, `${model.name}.${f.name} precision`).toBe(3);
        expect(col.is_nullable === "YES", `${model.name}.${f.name} nullability`).toBe(f.optional);
      }
      expect(missing, `columns missing from prisma/migrations-postgresql; add a migration with:\n${missing.join("\n")}\n`).toEqual([]);
      expect(cols.map((c) => c.column_name).sort(), `${model.name} has no columns beyond the schema`).toEqual(model.fields.map((f) => f.name).sort());
    }
  });

  it("has a unique index for every @unique field", async () => {
    for (const model of models) {
      for (const f of model.fields.filter((x) => x.unique)) {
        const r = await client.query(`SELECT indexdef FROM pg_indexes WHERE schemaname = current_schema() AND tablename = $1 AND indexname = $2`, [
          model.name,
          `${model.name}_${f.name}_key`,
        ]);
        expect(r.rows[0]?.indexdef ?? "", `${model.name}.${f.name} unique index`).toMatch(/CREATE UNIQUE INDEX/);
      }
    }
  });
});
