import { NextResponse, type NextRequest } from "next/server";
import { guard } from "@/app/_server/guard";

/** Every request but Next's static files passes the host, cross-site and sign-in checks (app/_server/guard.ts). */
export async function proxy(request: NextRequest) {
  const env = process.env;
  const stop = await guard(request, {
    HOLDLINE_HOST: env["HOLDLINE_HOST"],
    HOLDLINE_ALLOWED_HOSTS: env["HOLDLINE_ALLOWED_HOSTS"],
    HOLDLINE_PASSPHRASE: env["HOLDLINE_PASSPHRASE"],
  });
  return stop ?? NextResponse.next();
}

export const config = {
  matcher: ["/((?!_next/static|_next/image).*)"],
};
