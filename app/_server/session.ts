import "server-only";
import { cookies } from "next/headers";
import { getDb } from "./db";
import { SESSION_COOKIE } from "@/lib/db/auth-mode";
import { createSession, endSession, verifyCredentials, type AccountView } from "@/lib/db/accounts";
import { forgetSession } from "@/lib/db/session-gate";
import { SignInThrottle } from "@/lib/db/sign-in-throttle";

const g = globalThis as unknown as { __holdlineThrottle?: SignInThrottle };
const throttle = (g.__holdlineThrottle ??= new SignInThrottle());

/**
 * Checks a username and password; on success starts a session and sets the session cookie.
 * `{ wait_s }` when that username is locked for a while after repeated wrong passwords.
 */
export async function signIn(
  username: unknown,
  password: unknown,
  secure: boolean,
): Promise<{ token: string; expiresAt: Date; account: AccountView } | { wait_s: number } | null> {
  const db = await getDb();
  const key = typeof username === "string" ? username.trim().toLowerCase().slice(0, 100) : "";
  const wait = throttle.waitFor(key, Date.now());
  if (wait > 0) return { wait_s: Math.ceil(wait / 1000) };
  const account = await verifyCredentials(db, username, password);
  if (!account) {
    throttle.failed(key, Date.now());
    return null;
  }
  throttle.succeeded(key);
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
