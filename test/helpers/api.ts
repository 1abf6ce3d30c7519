/**
 * Calls the app's API the way `next start` does, without a server: the request goes through proxy.ts first
 * (the guard: host, origin, content type, passphrase; then the accounts gate), and, if it passes, to the
 * route handler of its path with the params Next would give it and the headers the proxy forwards.
 * next/headers is served from the same request (tests that sign in mock it with `nextHeadersMock`).
 *
 * Two ways in, one path through:
 *  - `api(method, path, opts)`: a request against the database in DATABASE_URL (the test sets it, e.g. from
 *    test/helpers/tempdb.ts, so it runs on both providers); answers status, parsed body and cookies set.
 *  - `startApi(env)`: a fresh seeded temporary SQLite file, calculations in the real worker pool on a worker
 *    freshly bundled from the current sources (so a stale dist/ never hides a change); answers Responses.
 * Test files that use it must `vi.mock("server-only", () => ({}))`.
 */
import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { execFileSync } from "node:child_process";
import { NextRequest } from "next/server";
import { createPrismaClient, type Db } from "../../lib/db/client";
import { prepareDatabase } from "../../lib/db/prepare";

export const ORIGIN = "http://127.0.0.1:3104";
export const JSON_HEADERS = { "content-type": "application/json", origin: ORIGIN, host: "127.0.0.1:3104" };

type Ctx = { params: Promise<Record<string, string>> };
type Handler = (req: Request, ctx: Ctx) => Promise<Response>;
type RouteModule = Partial<Record<string, Handler>>;

const current: { headers: Headers; setCookies: string[] } = { headers: new Headers(), setCookies: [] };

/** What tests pass to vi.mock("next/headers", …). */
export const nextHeadersMock = {
  headers: async () => current.headers,
  cookies: async () => {
    const jar = new Map<string, string>();
    for (const part of (current.headers.get("cookie") ?? "").split(";")) {
      const i = part.indexOf("=");
      if (i > 0) jar.set(part.slice(0, i).trim(), decodeURIComponent(part.slice(i + 1).trim()));
    }
    return {
      get: (name: string) => (jar.has(name) ? { name, value: jar.get(name)! } : undefined),
      set: (name: string, value: string) => {
        jar.set(name, value);
        current.setCookies.push(`${name}=${value}`);
      },
      delete: (name: string) => {
        jar.delete(name);
        current.setCookies.push(`${name}=`);
      },
    };
  },
};

const decode = (s: string) => {
  try {
    return decodeURIComponent(s);
  } catch {
    return s;
  }
};

/** The route module and params for an /api/v1/… path, as Next's router would pick them; null for none. */
async function route(pathname: string): Promise<{ mod: RouteModule; params: Record<string, string> } | null> {
  const parts = pathname.split("/").filter(Boolean);
  if (parts[0] !== "api" || parts[1] !== "v1" || parts.length < 3) return null;
  const p = parts.slice(2).map(decode);
  const m = (x: unknown) => x as RouteModule;
  if (p.length === 1) {
    if (p[0] === "session") return { mod: m(await import("../../app/api/v1/session/route")), params: {} };
    if (p[0] === "plans") return { mod: m(await import("../../app/api/v1/plans/route")), params: {} };
    if (p[0] === "settings") return { mod: m(await import("../../app/api/v1/settings/route")), params: {} };
    return { mod: m(await import("../../app/api/v1/[kind]/route")), params: { kind: p[0] } };
  }
  if (p.length === 2 && p[0] === "plans") return { mod: m(await import("../../app/api/v1/plans/[id]/route")), params: { id: p[1] } };
  if (p.length === 2 && p[0] === "calibrate" && p[1] === "save") return { mod: m(await import("../../app/api/v1/calibrate/save/route")), params: {} };
  if (p.length === 2 && p[0] === "schema") return { mod: m(await import("../../app/api/v1/schema/[name]/route")), params: { name: p[1] } };
  if (p.length === 2) return { mod: m(await import("../../app/api/v1/[kind]/[id]/route")), params: { kind: p[0], id: p[1] } };
  if (p.length === 3 && p[2] === "history") return { mod: m(await import("../../app/api/v1/[kind]/[id]/history/route")), params: { kind: p[0], id: p[1] } };
  return null;
}

/** One request through proxy.ts and the route handler. */
async function dispatch(url: string, method: string, headers: Headers, body?: BodyInit): Promise<Response> {
  const { proxy } = await import("../../proxy");
  // The proxy never reads an API body, so it gets the headers only; the handler gets the body untouched.
  const gate = await proxy(new NextRequest(url, { method, headers }));
  if (gate.headers.get("x-middleware-next") !== "1") return gate;
  // The headers the proxy forwards: NextResponse.next({ request: { headers } }) lists them.
  const forwarded = new Headers();
  for (const name of (gate.headers.get("x-middleware-override-headers") ?? "").split(",").filter(Boolean)) {
    const v = gate.headers.get(`x-middleware-request-${name}`);
    if (v !== null) forwarded.set(name, v);
  }
  current.headers = forwarded;
  current.setCookies = [];
  const r = await route(new URL(url).pathname);
  if (!r) return new Response("not found", { status: 404 });
  const handler = r.mod[method];
  if (!handler) return new Response("method not allowed", { status: 405 });
  const init: RequestInit & { duplex?: string } = { method, headers: forwarded, body };
  if (body instanceof ReadableStream) init.duplex = "half";
  return handler.call(r.mod, new Request(url, init), { params: Promise.resolve(r.params) });
}

export interface ApiAnswer {
  status: number;
  body: unknown;
  setCookies: string[];
}

export async function api(method: string, pathname: string, opts: { body?: unknown; rawBody?: string; token?: string; cookie?: string; headers?: Record<string, string> } = {}): Promise<ApiAnswer> {
  // What a browser on this origin sends, so host and origin checks in the proxy pass as for the app's own pages.
  const headers = new Headers({ host: "127.0.0.1:3113", origin: "http://127.0.0.1:3113", ...(opts.headers ?? {}) });
  if (opts.token) headers.set("authorization", `Bearer ${opts.token}`);
  if (opts.cookie) headers.set("cookie", opts.cookie);
  const body = opts.rawBody ?? (opts.body === undefined ? undefined : JSON.stringify(opts.body));
  if (body !== undefined) headers.set("content-type", "application/json");
  current.setCookies = [];
  const res = await dispatch(`http://127.0.0.1:3113${pathname}`, method, headers, body);
  const text = await res.text();
  return { status: res.status, body: text ? JSON.parse(text) : null, setCookies: current.setCookies };
}

export interface ApiHarness {
  db: Db;
  dbPath: string;
  call: (method: string, url: string, body?: unknown, headers?: Record<string, string>) => Promise<Response>;
  /** Every table's rows, to compare before and after a request. */
  snapshot: () => Promise<string>;
  dispose: () => Promise<void>;
}

export async function startApi(env: Record<string, string> = {}): Promise<ApiHarness> {
  const dir = mkdtempSync(path.join(os.tmpdir(), "holdline-api-"));
  const dbPath = path.join(dir, "api.db");
  await prepareDatabase(dbPath, { seed: true, quiet: true });
  process.env.DATABASE_URL = dbPath;
  const worker = path.join(dir, "calc-worker.mjs");
  execFileSync(process.execPath, ["scripts/bundle.mjs", "--out-dir", dir], { cwd: path.resolve(__dirname, "../.."), stdio: "pipe" });
  process.env.HOLDLINE_WORKER_FILE = worker;
  for (const [k, v] of Object.entries(env)) process.env[k] = v;
  const db = createPrismaClient(dbPath);

  async function call(method: string, url: string, body?: unknown, headers: Record<string, string> = JSON_HEADERS): Promise<Response> {
    const full = new URL(url, ORIGIN);
    const raw =
      body === undefined ? undefined : typeof body === "string" || body instanceof Uint8Array || body instanceof ReadableStream ? (body as BodyInit) : JSON.stringify(body);
    return dispatch(full.toString(), method, new Headers(headers), raw);
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
