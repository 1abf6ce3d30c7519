/**
 * Which database engine a database location means. The location is what
 * resolveDatabasePath() returns: an absolute SQLite file path (a `file:` URL, a plain
 * path or no DATABASE_URL at all: the embedded default) or, unchanged, a
 * `postgresql://` / `postgres://` connection string for a database shared by a group.
 */
export type Provider = "sqlite" | "postgresql";

export function isPostgresUrl(location: string): boolean {
  return /^postgres(ql)?:\/\//i.test(location.trim());
}

export function providerOf(location: string): Provider {
  return isPostgresUrl(location) ? "postgresql" : "sqlite";
}

/** The connection string with any password replaced, for logs and messages. */
export function redactLocation(location: string): string {
  if (!isPostgresUrl(location)) return location;
  try {
    const u = new URL(location);
    if (u.password) u.password = "***";
    return u.toString();
  } catch {
    return "postgresql://(unparseable connection string)";
  }
}
