import path from "node:path";
import { isPostgresUrl } from "./provider";

/**
 * The one place that turns DATABASE_URL (or the default embedded file) into an
 * absolute SQLite file path. The CLI, the app, the migration runner and the
 * Prisma config all call this, so they never disagree about which file is meant.
 * A postgresql:// connection string is returned unchanged (see provider.ts).
 */
export function resolveDatabasePath(env: NodeJS.ProcessEnv = process.env, cwd: string = process.cwd()): string {
  const raw = env.DATABASE_URL?.trim();
  if (!raw) return path.resolve(/*turbopackIgnore: true*/ cwd, "data", "holdline.db");
  if (isPostgresUrl(raw)) return raw;
  const withoutScheme = raw.startsWith("file:") ? raw.slice("file:".length) : raw;
  const withoutQuery = withoutScheme.split("?")[0];
  return path.isAbsolute(withoutQuery) ? withoutQuery : path.resolve(/*turbopackIgnore: true*/ cwd, withoutQuery);
}
