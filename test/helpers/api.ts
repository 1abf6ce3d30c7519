/**
 * Calls the API's route handlers in-process, as `next start` would after proxy.ts: the request first goes
 * through the guard (host, origin, content type, passphrase), then to the handler of its path, with the
 * params Next would give it. The database is a fresh seeded temporary file; calculations run in the real
 * worker pool, on a worker freshly bundled from the current sources (so a stale dist/ never hides a change).
 * Test files that use it must `vi.mock("server-only", () => ({}))`.
 */
import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { execFileSync } from "node:child_process";
import { createPrismaClient, type Db } from "../../lib/db/client";
import { prepareDatabase } from "../../lib/db/prepare";

export const ORIGIN = "http://127.0.0.1:3104";
export const JSON_HEADERS = { "content-type": "application/json", origin: ORIGIN, host: "127.0.0.1:3104" };

export interface ApiHarness {
  db: Db;
  dbPath: string;
  call: (method: string, url: string, body?: unknown, headers?: Record<string, string>) => Promise<Response>;
  /** Every table's rows, to compare before and after a request. */
  snapshot: () => Promise<string>;
  dispose: () => Promise<void>;
}

type Handler = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;

export async function startApi(env: Record<string, string> = {}): Promise<ApiHarness> {
  const dir = mkdtempSync(path.join(os.tmpdir(), "holdline-api-"));
  const dbPath = path.join(dir, "api.db");
  await prepareDatabase(dbPath, { seed: true, quiet: true });
  process.env.DATABASE_URL = dbPath;
  const worker = path.join(dir, "calc-worker.mjs");
  execFileSync(process.execPath, ["scripts/bundle.mjs", "--out-dir", dir], { cwd: path.resolve(__dirname, "../.."), stdio: "pipe" });
  process.env.HOLDLINE_WORKER_FILE = worker;
  for (const [k, v] of Object.entries(env)) process.env[k] = v;

  const { guard } = await import("../../app/_server/guard");
  const kindRoute = await import("../../app/api/v1/[kind]/route");
  const idRoute = await import("../../app/api/v1/[kind]/[id]/route");
  const schemaRoute = await import("../../app/api/v1/schema/[name]/route");
  const settingsRoute = await import("../../app/api/v1/settings/route");
  const calc: Record<string, { POST: Handler }> = {
    hold: await import("../../app/api/v1/hold/route"),
    size: await import("../../app/api/v1/size/route"),
    thaw: await import("../../app/api/v1/thaw/route"),
    warmup: await import("../../app/api/v1/warmup/route"),
  };
  const db = createPrismaClient(dbPath);

  const decode = (s: string) => {
    try {
      return decodeURIComponent(s);
    } catch {
      return s;
    }
  };

  async function call(method: string, url: string, body?: unknown, headers: Record<string, string> = JSON_HEADERS): Promise<Response> {
    const full = new URL(url, ORIGIN);
    const init: RequestInit & { duplex?: string } = { method, headers };
    if (body !== undefined) init.body = typeof body === "string" || body instanceof Uint8Array || body instanceof ReadableStream ? (body as BodyInit) : JSON.stringify(body);
    if (init.body instanceof ReadableStream) init.duplex = "half";
    const req = new Request(full, init);
    const stop = await guard(req, { HOLDLINE_HOST: process.env.HOLDLINE_HOST, HOLDLINE_ALLOWED_HOSTS: process.env.HOLDLINE_ALLOWED_HOSTS, HOLDLINE_PASSPHRASE: process.env.HOLDLINE_PASSPHRASE });
    if (stop) return stop;
    const parts = full.pathname.split("/").filter(Boolean); // api v1 ...
    if (parts[0] !== "api" || parts[1] !== "v1" || parts.length < 3) return new Response("not found", { status: 404 });
    const rest = parts.slice(2).map(decode);
    const route = ((): Record<string, Handler> | null => {
      if (rest.length === 1 && rest[0] === "settings") return settingsRoute as unknown as Record<string, Handler>;
      if (rest.length === 1 && Object.hasOwn(calc, rest[0])) return calc[rest[0]] as unknown as Record<string, Handler>;
      if (rest.length === 2 && rest[0] === "schema") return schemaRoute as unknown as Record<string, Handler>;
      if (rest.length === 1) return kindRoute as unknown as Record<string, Handler>;
      if (rest.length === 2) return idRoute as unknown as Record<string, Handler>;
      return null;
    })();
    const handler = route?.[method];
    if (!handler) return new Response("method not allowed", { status: route ? 405 : 404 });
    const params: Record<string, string> = rest.length === 1 ? { kind: rest[0] } : rest[0] === "schema" ? { name: rest[1] } : { kind: rest[0], id: rest[1] };
    return handler(req, { params: Promise.resolve(params) });
  }

  async function snapshot(): Promise<string> {
    const [materials, products, shippers, packs, routes, ruleSets, plans, settings] = await Promise.all([
      db.material.findMany({ orderBy: { id: "asc" } }),
      db.product.findMany({ orderBy: { id: "asc" } }),
      db.shipper.findMany({ orderBy: { id: "asc" } }),
      db.coolantPack.findMany({ orderBy: { id: "asc" } }),
      db.route.findMany({ orderBy: { id: "asc" } }),
      db.ruleSet.findMany({ orderBy: { id: "asc" } }),
      db.plan.findMany({ orderBy: { id: "asc" } }),
      db.setting.findMany(),
    ]);
    return JSON.stringify({ materials, products, shippers, packs, routes, ruleSets, plans, settings });
  }

  return {
    db,
    dbPath,
    call,
    snapshot,
    dispose: async () => {
      const { closeCalculationPool } = await import("../../app/_server/calc-pool");
      await closeCalculationPool();
      await db.$disconnect();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
