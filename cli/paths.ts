/**
 * Where the holdline package lives, whether the CLI runs from source (cli/*.ts under tsx or vitest)
 * or from the bundle (dist/cli/*.mjs), so it finds its migrations and sizer threads from any folder.
 */
import { existsSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";

/** The package root: the nearest folder above this module that holds prisma/migrations. */
export function packageRoot(from: string = path.dirname(fileURLToPath(import.meta.url))): string {
  for (let dir = from; ; dir = path.dirname(dir)) {
    if (existsSync(path.join(dir, "prisma", "migrations"))) return dir;
    if (path.dirname(dir) === dir) return path.resolve(from, "..");
  }
}

export const migrationsDir = () => path.join(packageRoot(), "prisma", "migrations");
/** Their PostgreSQL twins (same folder names), for a `postgresql://` database. */
export const pgMigrationsDir = () => path.join(packageRoot(), "prisma", "migrations-postgresql");
/** The prebuilt sizer thread (scripts/bundle.mjs builds it; Node runs it without a TypeScript loader). */
export const sizeWorkerFile = () => path.join(packageRoot(), "dist", "cli", "size-worker.mjs");
