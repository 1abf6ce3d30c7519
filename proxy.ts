/**
 * Runs in front of every request (Next 16 proxy, Node.js runtime).
 * Accounts mode (a shared database, lib/auth/mode.ts): every page and API call needs a valid
 * session, from the session cookie or `Authorization: Bearer <token>`. The proxy checks it
 * against the database and passes the verified actor to pages, server actions and route
 * handlers in a request header (any such header the client sent is dropped first); they
 * check the role. Without a session, pages redirect to /signin and the API answers 401.
 * In a single-user install (mode "none") requests pass untouched.
 */
import { NextResponse, type NextRequest } from "next/server";
import { ACTOR_HEADER, SESSION_COOKIE, authMode, encodeActor, isPublicPath } from "./lib/auth/mode";
import { sessionActorFor } from "./lib/auth/gate";

export async function proxy(req: NextRequest) {
  const headers = new Headers(req.headers);
  headers.delete(ACTOR_HEADER);
  // ---- accounts mode (issue 16) ----
  if (authMode() === "accounts") {
    const bearer = /^Bearer\s+(\S+)$/i.exec(req.headers.get("authorization") ?? "")?.[1];
    const token = bearer ?? req.cookies.get(SESSION_COOKIE)?.value;
    const actor = token ? await sessionActorFor(token) : null;
    if (actor) headers.set(ACTOR_HEADER, encodeActor(actor));
    else if (!isPublicPath(req.nextUrl.pathname)) {
      if (req.nextUrl.pathname.startsWith("/api/")) {
        return NextResponse.json({ error: "Sign in first: POST /api/v1/session with your username and password" }, { status: 401 });
      }
      const to = new URL("/signin", req.url);
      to.searchParams.set("next", req.nextUrl.pathname + req.nextUrl.search);
      return NextResponse.redirect(to);
    }
  }
  // ---- end accounts mode ----
  return NextResponse.next({ request: { headers } });
}

export const config = {
  matcher: ["/((?!_next/static|_next/image).*)"],
};
