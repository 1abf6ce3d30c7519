/**
 * Runs in front of every request but Next's static files (Next 16 proxy, Node.js runtime).
 * First the host, cross-site and content-type checks (app/_server/guard.ts), with its passphrase only
 * when accounts are off; then, in accounts mode (a shared database), app/_server/accounts-gate.ts checks
 * the session and passes the verified person on to pages, actions and route handlers.
 */
import type { NextRequest } from "next/server";
import { guard } from "@/app/_server/guard";
import { accountsGate } from "@/app/_server/accounts-gate";
import { authMode } from "@/lib/db/auth-mode";

export async function proxy(req: NextRequest) {
  const env = process.env;
  const stop = await guard(req, {
    HOLDLINE_HOST: env["HOLDLINE_HOST"],
    HOLDLINE_ALLOWED_HOSTS: env["HOLDLINE_ALLOWED_HOSTS"],
    HOLDLINE_PASSPHRASE: authMode() === "accounts" ? undefined : env["HOLDLINE_PASSPHRASE"],
  });
  return stop ?? accountsGate(req);
}

export const config = {
  matcher: ["/((?!_next/static|_next/image).*)"],
};
