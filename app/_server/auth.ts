import "server-only";
import { headers } from "next/headers";
import { NextResponse } from "next/server";
import { ACTOR_HEADER, DENIED, authMode, can, decodeActor, type Permission } from "@/lib/db/auth-mode";
import type { Actor } from "@/lib/db/audit";

/**
 * The person behind this request: the actor the proxy verified (accounts mode), or null in a
 * single-user install. Works in server components, server actions and route handlers.
 */
export async function currentActor(): Promise<Actor> {
  if (authMode() === "none") return null;
  return decodeActor((await headers()).get(ACTOR_HEADER));
}

/** For server actions: the actor if allowed, else the message to show. */
export async function authorize(permission: Permission): Promise<{ ok: true; actor: Actor } | { ok: false; message: string }> {
  const actor = await currentActor();
  return can(authMode(), actor, permission) ? { ok: true, actor } : { ok: false, message: DENIED[permission] };
}

/** For route handlers: the actor if allowed, else a 401 (no session) or 403 (wrong role) response. */
export async function authorizeApi(permission: Permission): Promise<{ ok: true; actor: Actor } | { ok: false; response: NextResponse }> {
  const a = await authorize(permission);
  if (a.ok) return a;
  const status = (await currentActor()) ? 403 : 401;
  return { ok: false, response: NextResponse.json({ error: a.message }, { status }) };
}
