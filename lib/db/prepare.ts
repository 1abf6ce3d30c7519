import { createPrismaClient } from "./client";
import { migrateDatabase } from "./migrate";
import { migratePostgres } from "./migrate-pg";
import { isPostgresUrl, redactLocation } from "./provider";
import { seedIfFresh } from "./seed";

/**
 * Creates (if needed), migrates and — only when fresh — seeds the database at `location`:
 * a SQLite file path, or a postgresql:// connection string (see provider.ts).
 */
export async function prepareDatabase(location: string, opts: { seed?: boolean; quiet?: boolean } = {}): Promise<void> {
  const log = opts.quiet ? () => {} : (s: string) => console.error(s);
  const seed = async () => {
    const db = createPrismaClient(location);
    try {
      const s = await seedIfFresh(db);
      if (s === "seeded") log("holdline: seeded the demo scenario");
    } finally {
      await db.$disconnect();
    }
  };
  if (isPostgresUrl(location)) {
    const m = await migratePostgres(location, { whileLocked: opts.seed === false ? undefined : seed });
    if (m.applied.length) log(`holdline: applied migrations ${m.applied.join(", ")} to ${redactLocation(location)}`);
    return;
  }
  const m = migrateDatabase(location);
  if (m.applied.length) log(`holdline: applied migrations ${m.applied.join(", ")} to ${location}`);
  if (opts.seed === false) return;
  await seed();
}
