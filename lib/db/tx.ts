/**
 * One way to write to the template library: a transaction that first takes the library's
 * write lock: on PostgreSQL a transaction-scoped advisory lock, on SQLite the file's own
 * write lock (one writer at a time). Library writes are so serialized in both, so the
 * version check, unique names, the single default rule set and all-or-nothing import
 * behave the same under concurrent requests from several app instances (PostgreSQL's
 * default READ COMMITTED isolation alone would let two "set as default" saves both win).
 * Library writes are rare and short; plans, sessions and reads never take the lock.
 */
import type { Db } from "./client";
import { providerOfClient } from "./client";

/** Arbitrary constant key for the library write lock (pg_advisory_xact_lock takes a bigint). */
const LIBRARY_WRITE_LOCK = 4_801_770_116;

export async function libraryTransaction<T>(db: Db, fn: (tx: Db) => Promise<T>): Promise<T> {
  const pg = providerOfClient(db) === "postgresql";
  return db.$transaction(
    async (tx) => {
      if (pg) await tx.$queryRawUnsafe(`SELECT 1 AS locked FROM pg_advisory_xact_lock(${LIBRARY_WRITE_LOCK})`);
      // SQLite: the driver adapter opens a deferred transaction; a write before any read takes the
      // file's write lock now (waiting out another process's writer), as BEGIN IMMEDIATE would. A
      // read first would pin a snapshot, and a later write would fail at once if another process wrote.
      else await tx.$executeRawUnsafe(`UPDATE "Setting" SET "id" = "id" WHERE 1 = 0`);
      return fn(tx as unknown as Db);
    },
    // Waiting behind other writers counts against the timeout, so give it room under load.
    { maxWait: 20_000, timeout: 60_000 },
  );
}

/** A unique-constraint violation (Prisma P2002) from either driver adapter. */
export function isUniqueViolation(e: unknown): boolean {
  return typeof e === "object" && e !== null && (e as { code?: unknown }).code === "P2002";
}
