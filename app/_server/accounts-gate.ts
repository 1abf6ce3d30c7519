/**
 * The accounts part of the request gate (proxy.ts). In accounts mode (a shared database,
 * lib/db/auth-mode.ts) every page and API call needs a valid session, from the session cookie
 * or `Authorization: Bearer <token>`; the gate checks it against the database and passes the
 * verified actor on in a request header (any such header the client sent is dropped first).
 * Pages, server actions and route handlers check the role (app/_server/auth.ts). Without a
 * session, pages redirect to /signin and the API answers 401. In the other modes requests
 * pass untouched (apart from dropping the actor header).
 */
import { NextResponse, type NextRequest } from "next/server";
import { ACTOR_HEADER, SESSION_COOKIE, authMode, encodeActor, isPublicPath } from "@/lib/db/auth-mode";
import { sessionActorFor } from "@/lib/db/session-gate";

export async function accountsGate(req: NextRequest): Promise<NextResponse> {
  const headers = new Headers(req.headers);
  headers.delete(ACTOR_HEADER);
  if (authMode() === "accounts") {
    const bearer = /^Bearer\s+(\S+)$/i.exec(req.headers.get("authorization") ?? "")?.[1];
    const token = bearer ?? req.cookies.get(SESSION_COOKIE)?.value;
    const actor = token ? await sessionActorFor(token) : null;
    if (actor) headers.set(ACTOR_HEADER, encodeActor(actor));
    else if (!isPublicPath(req.nextUrl.pathname)) {
      if (req.nextUrl.pathname.startsWith("/api/")) {
        return NextResponse.json(
          { error: "Sign in first: POST /api/v1/session with your username and password, then send Authorization: Bearer <token>" },
          { status: 401, headers: { "www-authenticate": 'Bearer realm="holdline"' } },
        );
      }
      const to = new URL("/signin", req.url);
      to.searchParams.set("next", req.nextUrl.pathname + req.nextUrl.search);
      return NextResponse.redirect(to, 303);
    }
  }
  return NextResponse.next({ request: { headers } });
}
