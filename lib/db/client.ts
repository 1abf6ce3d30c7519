/**
 * Builds a Prisma client on the better-sqlite3 driver adapter for one SQLite file.
 * The app reaches it only through app/_server/db.ts (server-only, cached); the CLI
 * and the tests call it directly with the path they want.
 */
import { PrismaBetterSqlite3 } from "@prisma/adapter-better-sqlite3";
import { PrismaClient } from "./generated/client";

export type Db = PrismaClient;

export function createPrismaClient(dbPath: string): PrismaClient {
  return new PrismaClient({ adapter: new PrismaBetterSqlite3({ url: "file:" + dbPath }) });
}
