/**
 * The one place that decides how the app authenticates. (Pure: reads only the
 * environment it is given.)
 *  - "none": a single-user install on the embedded SQLite file. No sign-in.
 *  - "accounts": the database is shared (DATABASE_URL=postgresql://…), or HOLDLINE_AUTH=accounts
 *    is set: people sign in with their own account and role (lib/db/accounts.ts).
 * A passphrase mode for a single-user install listening beyond loopback slots in here too:
 * accounts, when on, take precedence over it.
 */
import { resolveDatabasePath } from "./path";
import { providerOf } from "./provider";
import type { Actor, Role } from "./audit";

export type AuthMode = "none" | "accounts";

export function authMode(env: Record<string, string | undefined> = process.env): AuthMode {
  const forced = env.HOLDLINE_AUTH?.trim().toLowerCase();
  if (forced === "accounts") return "accounts";
  return providerOf(resolveDatabasePath(env as NodeJS.ProcessEnv)) === "postgresql" ? "accounts" : "none";
}

/** What each role may do: editors change the library (templates, rule sets, settings) and make plans; planners make plans. */
export type Permission = "edit" | "plan";
const GRANTS: Record<Role, readonly Permission[]> = { editor: ["edit", "plan"], planner: ["plan"] };

export function can(mode: AuthMode, actor: Actor, permission: Permission): boolean {
  if (mode === "none") return true;
  return !!actor && GRANTS[actor.role].includes(permission);
}

export const DENIED: Record<Permission, string> = {
  edit: "Only an editor can change templates, rule sets and settings. Ask an editor, or sign in as one.",
  plan: "Sign in to save a plan.",
};

/** The cookie that holds the session token, and the request header the proxy passes the verified actor in. */
export const SESSION_COOKIE = "holdline_account";
export const ACTOR_HEADER = "x-holdline-actor";

export function encodeActor(actor: NonNullable<Actor>): string {
  return encodeURIComponent(JSON.stringify({ id: actor.id, name: actor.name, role: actor.role }));
}

export function decodeActor(value: string | null | undefined): Actor {
  if (!value) return null;
  try {
    const a = JSON.parse(decodeURIComponent(value)) as { id?: unknown; name?: unknown; role?: unknown };
    if (typeof a.id === "number" && typeof a.name === "string" && (a.role === "editor" || a.role === "planner")) {
      return { id: a.id, name: a.name, role: a.role };
    }
  } catch {}
  return null;
}

/** Paths open without a session in accounts mode: the sign-in page and the session API, and static files. */
export function isPublicPath(pathname: string): boolean {
  return (
    pathname === "/signin" ||
    pathname === "/api/v1/session" ||
    pathname.startsWith("/_next/") ||
    pathname === "/icon.svg" ||
    pathname === "/favicon.ico"
  );
}
