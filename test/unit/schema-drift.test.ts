// The hand-written SQL migrations and prisma/schema.prisma must describe the same tables.
import { describe, it, expect } from "vitest";
import Database from "better-sqlite3";
import { readFileSync, mkdtempSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { migrateDatabase } from "../../lib/db/migrate";

function modelsOf(schema: string): Map<string, { field: string; optional: boolean; type: string }[]> {
  const models = new Map<string, { field: string; optional: boolean; type: string }[]>();
  const re = /model\s+(\w+)\s*\{([^}]*)\}/g;
  const withoutComments = schema.replace(/\/\/.*$/gm, "");
  for (const m of withoutComments.matchAll(re)) {
    const fields = m[2]
      .split("\n")
      .map((l) => l.replace(/\/\/.*$/, "").trim())
      .filter((l) => l && !l.startsWith("@@"))
      .map((l) => {
        const [field, type] = l.split(/\s+/);
        return { field, type: type.replace("?", ""), optional: type.endsWith("?") };
      });
    models.set(m[1], fields);
  }
  return models;
}

const SQL_TYPE: Record<string, string> = { Int: "INTEGER", Float: "REAL", String: "TEXT", Boolean: "BOOLEAN", DateTime: "DATETIME" };

describe("migrations match schema.prisma", () => {
  const dir = mkdtempSync(path.join(os.tmpdir(), "holdline-drift-"));
  const dbPath = path.join(dir, "drift.db");
  const result = migrateDatabase(dbPath);
  const db = new Database(dbPath, { readonly: true });
  const models = modelsOf(readFileSync("prisma/schema.prisma", "utf8"));

  it("applies every migration once and records it in _prisma_migrations", () => {
    expect(result.applied.length).toBeGreaterThan(0);
    const again = migrateDatabase(dbPath);
    expect(again.applied).toEqual([]);
    const rows = db.prepare(`SELECT migration_name, checksum, finished_at FROM _prisma_migrations`).all() as { checksum: string; finished_at: string }[];
    expect(rows.length).toBe(result.applied.length);
    for (const r of rows) {
      expect(r.checksum).toMatch(/^[0-9a-f]{64}$/);
      expect(r.finished_at).toBeTruthy();
    }
  });

  it("has a table for every model and a column of the right type and nullability for every field", () => {
    expect(models.size).toBeGreaterThanOrEqual(8);
    for (const [model, fields] of models) {
      const cols = db.prepare(`PRAGMA table_info("${model}")`).all() as { name: string; type: string; notnull: number }[];
      expect(cols.length, `table ${model}`).toBeGreaterThan(0);
      for (const f of fields) {
        const col = cols.find((c) => c.name === f.field);
        expect(col, `${model}.${f.field}`).toBeDefined();
        expect(col!.type, `${model}.${f.field} type`).toBe(SQL_TYPE[f.type]);
        expect(col!.notnull === 0, `${model}.${f.field} nullability`).toBe(f.optional);
      }
      expect(cols.length, `${model} has no columns beyond the schema`).toBe(fields.length);
    }
  });
});
