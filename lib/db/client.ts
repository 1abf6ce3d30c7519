/**
 * Builds a Prisma client for one database location (see provider.ts): a SQLite file
 * through the better-sqlite3 driver adapter, or a PostgreSQL database through the pg
 * driver adapter. The app reaches it only through app/_server/db.ts (server-only,
 * cached); the CLI and the tests call it directly with the location they want.
 */
import { PrismaBetterSqlite3 } from "@prisma/adapter-better-sqlite3";
import { PrismaPg } from "@prisma/adapter-pg";
import { PrismaClient } from "./generated/client";
import { PrismaClient as PgPrismaClient } from "./generated-pg/client";
import { isPostgresUrl, type Provider } from "./provider";

export type Db = PrismaClient;

const providers = new WeakMap<object, Provider>();

/** The engine behind a client made by createPrismaClient (SQLite for any other client). */
export function providerOfClient(db: object): Provider {
  return providers.get(db) ?? "sqlite";
}

export function createPrismaClient(location: string): PrismaClient {
  if (isPostgresUrl(location)) {
    // Both clients come from the same models (prisma/postgresql/schema.prisma is generated from
    // prisma/schema.prisma), so their query API is the same; the SQLite client's type stands for both.
    const pool = Number(process.env.HOLDLINE_PG_POOL) || 10;
    const client = new PgPrismaClient({ adapter: new PrismaPg({ connectionString: location, max: pool }) }) as unknown as PrismaClient;
    providers.set(client, "postgresql");
    return client;
  }
  // Another process (a second app instance, the CLI) may hold the file's write lock: wait for it up to 10 s.
  return new PrismaClient({ adapter: new PrismaBetterSqlite3({ url: "file:" + location, timeout: 10_000 }) });
}
