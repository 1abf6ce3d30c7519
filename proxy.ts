/**
 * Runs in front of every request but Next's static files (Next 16 proxy, Node.js runtime).
 * Accounts mode (a shared database): app/_server/accounts-gate.ts checks the session and passes
 * the verified person on to pages, actions and route handlers.
 */
import type { NextRequest } from "next/server";
import { accountsGate } from "./app/_server/accounts-gate";

export async function proxy(req: NextRequest) {
  return accountsGate(req);
}

export const config = {
  matcher: ["/((?!_next/static|_next/image).*)"],
};
