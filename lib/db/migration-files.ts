/**
 * The committed migrations as both runners (SQLite: migrate.ts, PostgreSQL: migrate-pg.ts) see them:
 * every folder under the migrations directory holding a migration.sql, in name order, with the sha256
 * checksum Prisma's journal stores; and the one rule for a migration already in the journal.
 */
import { createHash } from "node:crypto";
import { existsSync, readdirSync, readFileSync } from "node:fs";
import path from "node:path";

export interface MigrationResult {
  applied: string[];
  alreadyApplied: string[];
}

export interface MigrationFile {
  name: string;
  sql: string;
  checksum: string;
}

export function migrationFiles(migrationsDir: string): MigrationFile[] {
  if (!existsSync(/*turbopackIgnore: true*/ migrationsDir)) return [];
  return readdirSync(/*turbopackIgnore: true*/ migrationsDir, { withFileTypes: true })
    .filter((d) => d.isDirectory() && existsSync(/*turbopackIgnore: true*/ path.join(migrationsDir, d.name, "migration.sql")))
    .map((d) => d.name)
    .sort()
    .map((name) => {
      const sql = readFileSync(/*turbopackIgnore: true*/ path.join(migrationsDir, name, "migration.sql"), "utf8");
      return { name, sql, checksum: createHash("sha256").update(sql).digest("hex") };
    });
}

/** True when the journal already holds this migration; throws when it was applied with other contents. */
export function alreadyApplied(done: Map<string, string>, m: MigrationFile): boolean {
  const prior = done.get(m.name);
  if (prior === undefined) return false;
  if (prior !== m.checksum) throw new Error(`Migration ${m.name} was edited after it was applied (checksum differs). Add a new migration instead.`);
  return true;
}
