import "server-only";
import { cookies } from "next/headers";
import { getDb } from "./db";
import { SESSION_COOKIE } from "@/lib/db/auth-mode";
import { createSession, endSession, verifyCredentials, type AccountView } from "@/lib/db/accounts";
import { forgetSession } from "@/lib/db/session-gate";

/** Checks a username and password; on success starts a session and sets the session cookie. */
export async function signIn(username: unknown, password: unknown, secure: boolean): Promise<{ token: string; expiresAt: Date; account: AccountView } | null> {
  const db = await getDb();
  const account = await verifyCredentials(db, username, password);
  if (!account) return null;
  const s = await createSession(db, account.id);
  (await cookies()).set(SESSION_COOKIE, s.token, { httpOnly: true, sameSite: "lax", path: "/", secure, expires: s.expiresAt });
  return { ...s, account };
}

/** Ends the session of this cookie or bearer token and clears the cookie. */
export async function signOut(bearer?: string | null): Promise<void> {
  const jar = await cookies();
  const token = bearer ?? jar.get(SESSION_COOKIE)?.value;
  if (token) {
    await endSession(await getDb(), token);
    forgetSession(token);
  }
  jar.delete(SESSION_COOKIE);
}

/** A redirect target from a `next` parameter: only a path on this site. */
export function safeNext(next: unknown): string {
  return typeof next === "string" && next.startsWith("/") && !next.startsWith("//") && !next.startsWith("/\\") ? next : "/";
}
