import "server-only";
import { createPrismaClient, type Db } from "@/lib/db/client";
import { resolveDatabasePath } from "@/lib/db/path";
import { prepareDatabase } from "@/lib/db/prepare";

/**
 * The app's one Prisma client, built once per process and cached on globalThis (so
 * dev-mode reloads reuse it). The first call also makes sure the database file is
 * migrated and, if brand new, seeded with the demo scenario.
 */
const g = globalThis as unknown as { __holdlineDb?: Promise<Db> };

export function getDb(): Promise<Db> {
  if (!g.__holdlineDb) {
    const dbPath = resolveDatabasePath();
    g.__holdlineDb = prepareDatabase(dbPath, { quiet: true }).then(() => createPrismaClient(dbPath));
    g.__holdlineDb.catch(() => {
      g.__holdlineDb = undefined;
    });
  }
  return g.__holdlineDb;
}
