/**
 * The PostgreSQL twin of migrate.ts: applies the committed SQL under
 * prisma/migrations-postgresql in order, each in its own transaction, and records them
 * in `_prisma_migrations` with Prisma's columns and the sha256 of the file (so
 * `prisma migrate deploy` on a machine with Prisma's schema engine sees them as applied).
 *
 * Several app instances may start at once against one database: migrating and the
 * first-run seed happen under a session advisory lock (the key Prisma's own migrate
 * uses), so exactly one instance migrates and seeds and the others wait, then find
 * everything done.
 */
import pg from "pg";
import { randomUUID } from "node:crypto";
import path from "node:path";
import { alreadyApplied, migrationFiles, type MigrationResult } from "./migration-files";

const JOURNAL_DDL = `CREATE TABLE IF NOT EXISTS "_prisma_migrations" (
  "id" VARCHAR(36) PRIMARY KEY NOT NULL,
  "checksum" VARCHAR(64) NOT NULL,
  "finished_at" TIMESTAMPTZ,
  "migration_name" VARCHAR(255) NOT NULL,
  "logs" TEXT,
  "rolled_back_at" TIMESTAMPTZ,
  "started_at" TIMESTAMPTZ NOT NULL DEFAULT now(),
  "applied_steps_count" INTEGER NOT NULL DEFAULT 0
)`;

/** Prisma migrate's advisory lock key, so our runner and `prisma migrate deploy` never overlap. */
const MIGRATE_LOCK = 72707369;

export function defaultPgMigrationsDir(cwd = process.cwd()): string {
  return path.resolve(/*turbopackIgnore: true*/ cwd, "prisma", "migrations-postgresql");
}

async function applyMigrations(client: pg.Client, migrationsDir: string): Promise<MigrationResult> {
  await client.query(JOURNAL_DDL);
  const done = new Map<string, string>(
    (
      await client.query<{ migration_name: string; checksum: string }>(
        `SELECT migration_name, checksum FROM "_prisma_migrations" WHERE finished_at IS NOT NULL AND rolled_back_at IS NULL`,
      )
    ).rows.map((r) => [r.migration_name, r.checksum]),
  );
  const result: MigrationResult = { applied: [], alreadyApplied: [] };
  for (const { name, sql, checksum } of migrationFiles(migrationsDir)) {
    if (alreadyApplied(done, { name, sql, checksum })) {
      result.alreadyApplied.push(name);
      continue;
    }
    const id = randomUUID();
    await client.query("BEGIN");
    try {
      await client.query(`INSERT INTO "_prisma_migrations" (id, checksum, migration_name, started_at) VALUES ($1, $2, $3, now())`, [id, checksum, name]);
      await client.query(sql);
      await client.query(`UPDATE "_prisma_migrations" SET finished_at = now(), applied_steps_count = 1 WHERE id = $1`, [id]);
      await client.query("COMMIT");
    } catch (e) {
      await client.query("ROLLBACK");
      throw new Error(`Migration ${name} failed: ${(e as Error).message}`);
    }
    result.applied.push(name);
  }
  return result;
}

/**
 * Migrates the database, then runs `whileLocked` (the first-run seed) before releasing
 * the lock. Returns what was applied.
 */
export async function migratePostgres(
  url: string,
  opts: { migrationsDir?: string; whileLocked?: () => Promise<void> } = {},
): Promise<MigrationResult> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    await client.query("SELECT pg_advisory_lock($1)", [MIGRATE_LOCK]);
    try {
      const result = await applyMigrations(client, opts.migrationsDir ?? defaultPgMigrationsDir());
      if (opts.whileLocked) await opts.whileLocked();
      return result;
    } finally {
      await client.query("SELECT pg_advisory_unlock($1)", [MIGRATE_LOCK]);
    }
  } finally {
    await client.end();
  }
}
