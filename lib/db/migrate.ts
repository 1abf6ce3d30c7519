/**
 * Applies the committed SQL migrations under prisma/migrations in order, each in its
 * own transaction, and records them in `_prisma_migrations` with Prisma's columns and
 * the sha256 checksum of the file, so `prisma migrate deploy` on a machine that has
 * Prisma's schema engine sees them as applied. (Prisma's own migrate commands need a
 * native engine these machines cannot download; see DEVELOPERS.md.)
 */
import Database from "better-sqlite3";
import { randomUUID } from "node:crypto";
import { mkdirSync } from "node:fs";
import { alreadyApplied, migrationFiles, type MigrationResult } from "./migration-files";
import path from "node:path";

export type { MigrationResult };

const JOURNAL_DDL = `CREATE TABLE IF NOT EXISTS "_prisma_migrations" (
  "id" TEXT PRIMARY KEY NOT NULL,
  "checksum" TEXT NOT NULL,
  "finished_at" DATETIME,
  "migration_name" TEXT NOT NULL,
  "logs" TEXT,
  "rolled_back_at" DATETIME,
  "started_at" DATETIME NOT NULL DEFAULT current_timestamp,
  "applied_steps_count" INTEGER UNSIGNED NOT NULL DEFAULT 0
)`;

export function defaultMigrationsDir(cwd = process.cwd()): string {
  return path.resolve(/*turbopackIgnore: true*/ cwd, "prisma", "migrations");
}

export function migrateDatabase(dbPath: string, migrationsDir = defaultMigrationsDir()): MigrationResult {
  mkdirSync(/*turbopackIgnore: true*/ path.dirname(dbPath), { recursive: true });
  const db = new Database(dbPath);
  try {
    db.pragma("journal_mode = WAL");
    db.pragma("foreign_keys = ON");
    db.exec(JOURNAL_DDL);
    const done = new Map<string, string>(
      (
        db
          .prepare(`SELECT migration_name, checksum FROM "_prisma_migrations" WHERE finished_at IS NOT NULL AND rolled_back_at IS NULL`)
          .all() as { migration_name: string; checksum: string }[]
      ).map((r) => [r.migration_name, r.checksum]),
    );
    const result: MigrationResult = { applied: [], alreadyApplied: [] };
    for (const { name, sql, checksum } of migrationFiles(migrationsDir)) {
      if (alreadyApplied(done, { name, sql, checksum })) {
        result.alreadyApplied.push(name);
        continue;
      }
      const apply = db.transaction(() => {
        const id = randomUUID();
        db.prepare(`INSERT INTO "_prisma_migrations" (id, checksum, migration_name, started_at) VALUES (?, ?, ?, ?)`).run(
          id,
          checksum,
          name,
          new Date().toISOString(),
        );
        db.exec(sql);
        db.prepare(`UPDATE "_prisma_migrations" SET finished_at = ?, applied_steps_count = 1 WHERE id = ?`).run(
          new Date().toISOString(),
          id,
        );
      });
      apply();
      result.applied.push(name);
    }
    return result;
  } finally {
    db.close();
  }
}
