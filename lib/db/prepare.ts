import { createPrismaClient } from "./client";
import { migrateDatabase } from "./migrate";
import { seedIfFresh } from "./seed";

/** Creates (if needed), migrates and — only when fresh — seeds the database at dbPath. */
export async function prepareDatabase(dbPath: string, opts: { seed?: boolean; quiet?: boolean } = {}): Promise<void> {
  const m = migrateDatabase(dbPath);
  const log = opts.quiet ? () => {} : (s: string) => console.error(s);
  if (m.applied.length) log(`holdline: applied migrations ${m.applied.join(", ")} to ${dbPath}`);
  if (opts.seed === false) return;
  const db = createPrismaClient(dbPath);
  try {
    const s = await seedIfFresh(db);
    if (s === "seeded") log("holdline: seeded the demo scenario");
  } finally {
    await db.$disconnect();
  }
}
