import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { randomBytes } from "node:crypto";
import pg from "pg";
import { createPrismaClient, type Db } from "../../lib/db/client";
import { prepareDatabase } from "../../lib/db/prepare";

type TempDb = { db: Db; dbPath: string; dispose: () => Promise<void> };

/**
 * A fresh, migrated database of its own (one per test file, so workers never share).
 * SQLite in a temporary folder by default; a new PostgreSQL database when the run is on
 * PostgreSQL (HOLDLINE_TEST_DB=postgresql, set by vitest.pg.config.ts). `dbPath` is the
 * location createPrismaClient takes.
 */
export async function tempDatabase(opts: { seed?: boolean } = {}): Promise<TempDb> {
  return onPostgres() ? tempPostgresDatabase(opts) : tempSqliteDatabase(opts);
}

/**
 * A new PostgreSQL database on the server in HOLDLINE_TEST_PG_URL (a server the tests may
 * create databases on, see scripts/test-pg.sh), dropped again by dispose().
 */
export async function tempPostgresDatabase(opts: { seed?: boolean } = {}): Promise<TempDb> {
  const server = process.env.HOLDLINE_TEST_PG_URL;
  if (!server) throw new Error("HOLDLINE_TEST_PG_URL is not set: run `npm run test:pg`");
  const name = `holdline_t_${randomBytes(6).toString("hex")}`;
  const admin = new pg.Client({ connectionString: server });
  await admin.connect();
  await admin.query(`CREATE DATABASE "${name}"`);
  await admin.end();
  const u = new URL(server);
  u.pathname = "/" + name;
  const url = u.toString();
  await prepareDatabase(url, { seed: opts.seed ?? false, quiet: true });
  const db = createPrismaClient(url);
  return {
    db,
    dbPath: url,
    dispose: async () => {
      await db.$disconnect();
      const c = new pg.Client({ connectionString: server });
      await c.connect();
      await c.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
      await c.end();
    },
  };
}

export async function tempSqliteDatabase(opts: { seed?: boolean } = {}): Promise<TempDb> {
  const dir = mkdtempSync(path.join(os.tmpdir(), "holdline-test-"));
  const dbPath = path.join(dir, "test.db");
  await prepareDatabase(dbPath, { seed: opts.seed ?? false, quiet: true });
  const db = createPrismaClient(dbPath);
  return {
    db,
    dbPath,
    dispose: async () => {
      await db.$disconnect();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}

/** Whether the database tests run against PostgreSQL in this run. */
export const onPostgres = (): boolean => process.env.HOLDLINE_TEST_DB === "postgresql";
