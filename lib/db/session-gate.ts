/**
 * The proxy's view of the database: one Prisma client per server process, used only to
 * verify session tokens (lib/db/accounts.ts sessionActor). A short cache keeps a page and
 * its prefetches from asking the database for the same token again and again; disabling
 * an account or signing out takes effect within SESSION_CACHE_MS.
 */
import { createPrismaClient, type Db } from "./client";
import { resolveDatabasePath } from "./path";
import { sessionActor } from "./accounts";
import type { Actor } from "./audit";

const SESSION_CACHE_MS = 5_000;
const g = globalThis as unknown as { __holdlineGateDb?: Db; __holdlineGateCache?: Map<string, { actor: Actor; until: number }> };

export async function sessionActorFor(token: string): Promise<Actor> {
  const cache = (g.__holdlineGateCache ??= new Map());
  const now = Date.now();
  const hit = cache.get(token);
  if (hit && hit.until > now) return hit.actor;
  g.__holdlineGateDb ??= createPrismaClient(resolveDatabasePath());
  const actor = await sessionActor(g.__holdlineGateDb, token);
  if (cache.size > 5000) cache.clear();
  cache.set(token, { actor, until: now + SESSION_CACHE_MS });
  return actor;
}

/** Forget a token at once (sign-out in this process). */
export function forgetSession(token: string): void {
  g.__holdlineGateCache?.delete(token);
}
