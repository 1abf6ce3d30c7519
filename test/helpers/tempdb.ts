import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { createPrismaClient, type Db } from "../../lib/db/client";
import { prepareDatabase } from "../../lib/db/prepare";

/** A fresh, migrated SQLite database in its own temporary folder (one per test file, so workers never share). */
export async function tempDatabase(opts: { seed?: boolean } = {}): Promise<{ db: Db; dbPath: string; dispose: () => Promise<void> }> {
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
