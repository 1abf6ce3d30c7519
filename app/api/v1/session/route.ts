import { NextResponse } from "next/server";
import { readJson, unprocessable } from "../_lib";
import { signIn, signOut } from "@/app/_server/session";
import { currentActor } from "@/app/_server/auth";
import { authMode } from "@/lib/db/auth-mode";

/** Who is signed in, and whether this install uses accounts. */
export async function GET() {
  return NextResponse.json({ mode: authMode(), actor: await currentActor() });
}

/** Sign in: `{ "username", "password" }` → `{ token, expiresAt, account }` and the session cookie. Send the token as `Authorization: Bearer …`. */
export async function POST(req: Request) {
  if (authMode() === "none") return NextResponse.json({ error: "This install has no accounts: nothing to sign in to" }, { status: 404 });
  const body = await readJson(req);
  if (!body.ok) return body.response;
  const b = body.body as { username?: unknown; password?: unknown } | null;
  if (!b || typeof b !== "object") return unprocessable("Send { \"username\": …, \"password\": … }", { username: ["Required"], password: ["Required"] });
  const s = await signIn(b.username, b.password, new URL(req.url).protocol === "https:");
  if (!s) return NextResponse.json({ error: "Unknown username or wrong password" }, { status: 401 });
  if ("wait_s" in s) {
    return NextResponse.json({ error: `Too many wrong passwords for this username: try again in ${s.wait_s} s` }, { status: 429, headers: { "retry-after": String(s.wait_s) } });
  }
  return NextResponse.json({ token: s.token, expiresAt: s.expiresAt, account: { username: s.account.username, displayName: s.account.displayName, role: s.account.role } });
}

/** Sign out (the cookie's session, or the bearer token's). */
export async function DELETE(req: Request) {
  const bearer = /^Bearer\s+(\S+)$/i.exec(req.headers.get("authorization") ?? "")?.[1] ?? null;
  await signOut(bearer);
  return new NextResponse(null, { status: 204 });
}
