/**
 * The CLI's door to the template library. Imported lazily (only when a command names a template or
 * works on the library), so a calculation on a file that spells everything out never loads Prisma,
 * better-sqlite3 or the demo scenario.
 */
import { closeSync, openSync, readSync, statSync } from "node:fs";
import path from "node:path";
import Database from "better-sqlite3";
import { migrateDatabase } from "../lib/db/migrate";
import { migratePostgres } from "../lib/db/migrate-pg";
import { isPostgresUrl, redactLocation } from "../lib/db/provider";
import { createPrismaClient, type Db } from "../lib/db/client";
import { seedIfFresh } from "../lib/db/seed";
import { migrationsDir, pgMigrationsDir } from "./paths";
import { CliError } from "./errors";

/** A database path the CLI refuses, with the reason in one line. */
class DatabaseFileError extends CliError {
  constructor(reason: string) {
    super(`holdline: cannot use the database: ${reason}`);
  }
}

const SQLITE_HEADER = "SQLite format 3\0";

/**
 * Refuses, before anything is opened or written, a path that is a folder, a device or other special
 * file, a file that is not SQLite (a text file, a system file), or a SQLite database of another program.
 */
export function checkDatabaseFile(dbPath: string): void {
  let st;
  try {
    st = statSync(dbPath);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    if (code === "ENOENT") {
      const parent = path.dirname(dbPath);
      let pst;
      try {
        pst = statSync(parent);
      } catch {
        return; // the folder is created with the file
      }
      if (!pst.isDirectory()) throw new DatabaseFileError(`${parent} is not a folder, so ${dbPath} cannot be created`);
      return;
    }
    if (code === "ENOTDIR") throw new DatabaseFileError(`${dbPath}: a part of the path is a file, not a folder`);
    throw new DatabaseFileError(`${dbPath}: ${(e as Error).message}`);
  }
  if (st.isDirectory()) throw new DatabaseFileError(`${dbPath} is a folder; give the path of a database file inside it`);
  if (!st.isFile()) throw new DatabaseFileError(`${dbPath} is not a regular file`);
  if (st.size === 0) return;
  const head = Buffer.alloc(16);
  let fd;
  try {
    fd = openSync(dbPath, "r");
    readSync(fd, head, 0, 16, 0);
  } catch (e) {
    throw new DatabaseFileError(`${dbPath} cannot be read: ${(e as Error).message}`);
  } finally {
    if (fd !== undefined) closeSync(fd);
  }
  if (head.toString("latin1") !== SQLITE_HEADER) throw new DatabaseFileError(`${dbPath} is not a database file (it does not start with the SQLite header); nothing was changed`);
  const probe = new Database(dbPath, { readonly: true, fileMustExist: true });
  try {
    const tables = (probe.prepare("SELECT name FROM sqlite_master WHERE type = 'table'").all() as { name: string }[]).map((t) => t.name);
    if (tables.length > 0 && !tables.includes("_prisma_migrations")) {
      throw new DatabaseFileError(`${dbPath} is a SQLite database of another program (it has tables but no Holdline migrations); nothing was changed`);
    }
  } catch (e) {
    if (e instanceof DatabaseFileError) throw e;
    throw new DatabaseFileError(`${dbPath} cannot be opened as a database: ${(e as Error).message}`);
  } finally {
    probe.close();
  }
}

/** Checks, migrates (with the package's own migrations) and, when brand new, seeds the database; returns a client. */
export async function openLibrary(dbPath: string, opts: { seed: boolean }): Promise<Db> {
  if (isPostgresUrl(dbPath)) return openPostgresLibrary(dbPath, opts);
  checkDatabaseFile(dbPath);
  try {
    migrateDatabase(dbPath, migrationsDir());
  } catch (e) {
    throw new DatabaseFileError(`${dbPath} cannot be prepared: ${(e as Error).message}`);
  }
  const db = createPrismaClient(dbPath);
  if (opts.seed) {
    try {
      await seedIfFresh(db);
    } catch (e) {
      await db.$disconnect();
      throw e;
    }
  }
  return db;
}

/**
 * A shared PostgreSQL library: migrated with the package's PostgreSQL twins under the migration lock, and
 * seeded under that lock only when brand new (lib/db/migrate-pg.ts), as the app does when it starts.
 */
async function openPostgresLibrary(url: string, opts: { seed: boolean }): Promise<Db> {
  const seed = async () => {
    const db = createPrismaClient(url);
    try {
      await seedIfFresh(db);
    } finally {
      await db.$disconnect();
    }
  };
  try {
    await migratePostgres(url, { migrationsDir: pgMigrationsDir(), whileLocked: opts.seed ? seed : undefined });
  } catch (e) {
    throw new DatabaseFileError(`${redactLocation(url)} cannot be prepared: ${(e as Error).message}`);
  }
  return createPrismaClient(url);
}

export { exportLibrary, importLibrary } from "../lib/db/library";
export { listPlans, getPlan } from "../lib/db/plans";
