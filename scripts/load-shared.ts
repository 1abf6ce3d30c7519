/**
 * Load check for a shared install: two app instances (`next start`, built first with
 * `npm run build`) on ONE database, hammered at once through the JSON API by editors and
 * planners signed in on both. Then it checks that no write was lost:
 *  - a counter template that workers update with the version check (re-read and retry on 409):
 *    its version must equal 1 + the number of 200s, and its notes must hold every mark;
 *  - creates with colliding names: rows made == 201s, every refusal a 422 on `name`;
 *  - saved plans: rows == 201s, each with who saved it;
 *  - rule-set edits: history rows == successful edits;
 *  - no 5xx anywhere.
 *   npm run load:shared -- --pg postgresql://postgres@127.0.0.1:55432/postgres [--ops 400] [--workers 8] [--ports 3113,3114]
 *   npm run load:shared -- --sqlite          # the same against one SQLite file (HOLDLINE_AUTH=accounts)
 * With --pg it creates and afterwards drops a database of its own on that server.
 */
import { spawn, type ChildProcess } from "node:child_process";
import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { parseArgs } from "node:util";
import { randomBytes } from "node:crypto";
import pg from "pg";
import { prepareDatabase } from "../lib/db/prepare";
import { createPrismaClient } from "../lib/db/client";
import { createAccount } from "../lib/db/accounts";
import { DEMO_SCENARIO } from "../lib/db/demo-scenario";

const { values } = parseArgs({
  options: {
    pg: { type: "string" },
    sqlite: { type: "boolean", default: false },
    ops: { type: "string", default: "400" },
    workers: { type: "string", default: "8" },
    ports: { type: "string", default: "3113,3114" },
  },
});
if (!values.pg && !values.sqlite) {
  console.error("usage: npm run load:shared -- --pg postgresql://… | --sqlite");
  process.exit(2);
}
const OPS = Number(values.ops);
const WORKERS = Number(values.workers);
const PORTS = values.ports!.split(",").map(Number);

// ---- the database ----
let location: string;
let cleanup: () => Promise<void>;
if (values.pg) {
  const name = `holdline_load_${randomBytes(4).toString("hex")}`;
  const admin = new pg.Client({ connectionString: values.pg });
  await admin.connect();
  await admin.query(`CREATE DATABASE "${name}"`);
  await admin.end();
  const u = new URL(values.pg);
  u.pathname = "/" + name;
  location = u.toString();
  cleanup = async () => {
    const c = new pg.Client({ connectionString: values.pg });
    await c.connect();
    await c.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
    await c.end();
  };
} else {
  const dir = mkdtempSync(path.join(os.tmpdir(), "holdline-load-"));
  location = path.join(dir, "load.db");
  cleanup = async () => rmSync(dir, { recursive: true, force: true });
}
await prepareDatabase(location, { quiet: true });
const db = createPrismaClient(location);
for (const [u, role] of [["load-editor", "editor"], ["load-planner", "planner"]] as const) {
  const r = await createAccount(db, { username: u, displayName: u, password: `${u}-pw-123`, role });
  if (!r.ok) throw new Error(JSON.stringify(r.fieldErrors));
}

// ---- two app instances ----
const servers: ChildProcess[] = [];
const stopAll = () => {
  for (const s of servers) {
    try {
      process.kill(-s.pid!, "SIGTERM");
    } catch {}
  }
};
process.on("exit", stopAll);
for (const port of PORTS) {
  const s = spawn(path.resolve("node_modules/.bin/next"), ["start", "-H", "127.0.0.1", "-p", String(port)], {
    env: { ...process.env, DATABASE_URL: location, HOLDLINE_AUTH: "accounts", NEXT_TELEMETRY_DISABLED: "1" },
    stdio: ["ignore", "ignore", "inherit"],
    detached: true,
  });
  servers.push(s);
}
const bases = PORTS.map((p) => `http://127.0.0.1:${p}`);
for (const b of bases) {
  for (let i = 0; ; i++) {
    try {
      const r = await fetch(b + "/api/v1/session");
      if (r.ok) break;
    } catch {}
    if (i > 200) throw new Error(`${b} did not start`);
    await new Promise((r) => setTimeout(r, 300));
  }
}

// ---- client side ----
const statuses = new Map<string, number>();
const latencies: Record<string, number[]> = {};
// The answers are whatever the API sends; each use below reads the fields it expects.
// eslint-disable-next-line @typescript-eslint/no-explicit-any
async function call(op: string, base: string, method: string, p: string, token: string, body?: unknown): Promise<{ status: number; json: any }> {
  const t0 = performance.now();
  const r = await fetch(base + p, {
    method,
    headers: { authorization: `Bearer ${token}`, "content-type": "application/json", origin: base },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const text = await r.text();
  (latencies[op] ??= []).push(performance.now() - t0);
  statuses.set(`${op} ${r.status}`, (statuses.get(`${op} ${r.status}`) ?? 0) + 1);
  return { status: r.status, json: text ? JSON.parse(text) : null };
}
async function signIn(base: string, username: string): Promise<string> {
  const r = await fetch(base + "/api/v1/session", {
    method: "POST",
    headers: { "content-type": "application/json", origin: base },
    body: JSON.stringify({ username, password: `${username}-pw-123` }),
  });
  if (!r.ok) throw new Error(`sign-in ${username} on ${base}: ${r.status}`);
  return ((await r.json()) as { token: string }).token;
}
const tokens = await Promise.all(bases.map(async (b) => ({ base: b, editor: await signIn(b, "load-editor"), planner: await signIn(b, "load-planner") })));

const product = structuredClone(DEMO_SCENARIO.products[0]);
const seed = await call("setup", bases[0], "POST", "/api/v1/products", tokens[0].editor, { ...product, name: "Load counter", notes: "" });
const counterId = seed.json.id as number;
const rules = (await call("setup", bases[0], "GET", "/api/v1/rulesets", tokens[0].editor)).json as { id: number; name: string }[];
const ruleId = rules.find((r) => r.name === "Canada")!.id;
const historyBefore = ((await call("setup", bases[0], "GET", `/api/v1/rulesets/${ruleId}/history`, tokens[0].editor)).json as unknown[]).length;

const done = { counter: 0, counterConflicts: 0, creates: 0, createRefusals: 0, plans: 0, ruleEdits: 0, ruleConflicts: 0, reads: 0 };
const marks: string[] = [];
let next = 0;
async function worker(w: number) {
  while (next < OPS) {
    const i = next++;
    const t = tokens[i % tokens.length];
    switch (i % 5) {
      case 0: {
        // counter: read, update with the version, retry on conflict
        for (;;) {
          const cur = await call("read", t.base, "GET", `/api/v1/products/${counterId}`, t.editor);
          const { id: _id, version, ...data } = cur.json;
          const mark = `${w}.${i}`;
          const r = await call("update", t.base, "PUT", `/api/v1/products/${counterId}`, t.editor, { ...data, version, notes: `${data.notes}${mark};` });
          if (r.status === 200) {
            done.counter++;
            marks.push(mark);
            break;
          }
          if (r.status !== 409) throw new Error(`counter update: ${r.status} ${JSON.stringify(r.json)}`);
          done.counterConflicts++;
        }
        break;
      }
      case 1: {
        const r = await call("create", t.base, "POST", "/api/v1/products", t.editor, { ...product, name: `Load item ${i % 17}` });
        if (r.status === 201) done.creates++;
        else if (r.status === 422 && /already called/.test(r.json.fieldErrors?.name?.[0] ?? "")) done.createRefusals++;
        else throw new Error(`create: ${r.status} ${JSON.stringify(r.json)}`);
        break;
      }
      case 2: {
        const r = await call("plan", t.base, "POST", "/api/v1/plans", t.planner, { kind: "hold", name: `Load plan ${i}`, input: { i }, result: { ok: true } });
        if (r.status !== 201) throw new Error(`plan: ${r.status}`);
        done.plans++;
        break;
      }
      case 3: {
        const cur = await call("read", t.base, "GET", `/api/v1/rulesets/${ruleId}`, t.editor);
        const { id: _id, version, ...data } = cur.json;
        const r = await call("ruleset", t.base, "PUT", `/api/v1/rulesets/${ruleId}`, t.editor, { ...data, version, chilledMax_C: 3 + (i % 20) / 10 });
        if (r.status === 200) done.ruleEdits++;
        else if (r.status === 409) done.ruleConflicts++;
        else throw new Error(`ruleset: ${r.status}`);
        break;
      }
      default: {
        await call("list", t.base, "GET", "/api/v1/products", t.planner);
        done.reads++;
      }
    }
  }
}
const t0 = performance.now();
let failure: unknown = null;
try {
  await Promise.all(Array.from({ length: WORKERS }, (_, w) => worker(w)));
} catch (e) {
  failure = e;
}
const elapsed_s = (performance.now() - t0) / 1000;

// ---- checks, straight from the database ----
const counter = await db.product.findUnique({ where: { id: counterId } });
const items = await db.product.count({ where: { name: { startsWith: "Load item " } } });
const plans = await db.plan.findMany({ where: { name: { startsWith: "Load plan " } } });
const history = await db.ruleSetChange.count({ where: { ruleSetId: ruleId } });
const five = [...statuses].filter(([k]) => /\s5\d\d$/.test(k));
const notes = (counter?.notes ?? "").split(";").filter(Boolean);
const checks = {
  "counter version = 1 + successful updates": counter!.version === 1 + done.counter,
  "counter notes hold every mark": notes.length === done.counter && marks.every((m) => notes.includes(m)),
  "created rows = 201s": items === done.creates,
  "distinct names created = 17 or fewer": items <= 17,
  "plans saved = 201s, each with who": plans.length === done.plans && plans.every((p) => p.createdByName === "load-planner"),
  "rule-set history rows = edits": history === historyBefore + done.ruleEdits,
  "no 5xx": five.length === 0,
};
const pct = (xs: number[], q: number) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length ? Math.round(s[Math.min(s.length - 1, Math.floor(q * s.length))]) : 0;
};
const requests = Object.values(latencies).reduce((n, xs) => n + xs.length, 0);
console.log(
  JSON.stringify(
    {
      provider: values.pg ? "postgresql" : "sqlite",
      instances: bases.length,
      workers: WORKERS,
      operations: OPS,
      requests,
      elapsed_s: Math.round(elapsed_s * 10) / 10,
      requests_per_s: Math.round(requests / elapsed_s),
      done,
      latency_ms: Object.fromEntries(Object.entries(latencies).map(([k, xs]) => [k, { n: xs.length, p50: pct(xs, 0.5), p95: pct(xs, 0.95) }])),
      statuses: Object.fromEntries(statuses),
      checks,
      failure: failure ? String(failure) : null,
    },
    null,
    2,
  ),
);
await db.$disconnect();
stopAll();
await new Promise((r) => setTimeout(r, 1000));
await cleanup();
process.exit(failure || Object.values(checks).some((v) => !v) ? 1 : 0);
