import { readFileSync } from "node:fs";
import path from "node:path";
// The JSON API in accounts mode, through proxy.ts and the route handlers, on SQLite
// (npm test, with HOLDLINE_AUTH=accounts) and on PostgreSQL (npm run test:pg, where a
// postgresql:// database turns accounts on by itself).
import { describe, it, expect, beforeAll, afterAll, vi } from "vitest";
import { tempDatabase } from "../helpers/tempdb";
import { api, nextHeadersMock } from "../helpers/api";
import type { Db } from "../../lib/db/client";
import { createAccount } from "../../lib/db/accounts";
import { DEMO_SCENARIO } from "../../lib/db/demo-scenario";

vi.mock("server-only", () => ({}));
vi.mock("next/headers", () => nextHeadersMock);
vi.mock("next/cache", () => ({ revalidatePath: () => {} }));

process.env.HOLDLINE_BCRYPT_COST = "4";
let db: Db;
let dispose: () => Promise<void>;
const saved = { DATABASE_URL: process.env.DATABASE_URL, HOLDLINE_AUTH: process.env.HOLDLINE_AUTH };
let editor = "";
let planner = "";

beforeAll(async () => {
  const t = await tempDatabase({ seed: true });
  db = t.db;
  dispose = t.dispose;
  process.env.DATABASE_URL = t.dbPath;
  process.env.HOLDLINE_AUTH = "accounts";
  for (const [u, n, role] of [["ed", "Edda Editor", "editor"], ["pat", "Pat Planner", "planner"]] as const) {
    const r = await createAccount(db, { username: u, displayName: n, password: `${u}-password-1`, role });
    if (!r.ok) throw new Error("setup");
  }
});
afterAll(async () => {
  process.env.DATABASE_URL = saved.DATABASE_URL;
  process.env.HOLDLINE_AUTH = saved.HOLDLINE_AUTH;
  if (saved.DATABASE_URL === undefined) delete process.env.DATABASE_URL;
  if (saved.HOLDLINE_AUTH === undefined) delete process.env.HOLDLINE_AUTH;
  await dispose();
});

describe("signing in", () => {
  it("answers 401 without a session, also to a forged actor header", async () => {
    expect((await api("GET", "/api/v1/products")).status).toBe(401);
    const forged = encodeURIComponent(JSON.stringify({ id: 1, name: "Mallory", role: "editor" }));
    expect((await api("POST", "/api/v1/products", { body: {}, headers: { "x-holdline-actor": forged } })).status).toBe(401);
    expect((await api("GET", "/api/v1/products", { token: "made-up-token" })).status).toBe(401);
  });

  it("refuses a wrong password and gives a token and an HttpOnly cookie for the right one", async () => {
    expect((await api("POST", "/api/v1/session", { body: { username: "ed", password: "nope-nope-nope" } })).status).toBe(401);
    expect((await api("POST", "/api/v1/session", { rawBody: "{not json" })).status).toBe(422);
    const e = await api("POST", "/api/v1/session", { body: { username: "ed", password: "ed-password-1" } });
    expect(e.status).toBe(200);
    editor = (e.body as { token: string }).token;
    expect(e.setCookies[0]).toMatch(/^holdline_account=/);
    const p = await api("POST", "/api/v1/session", { body: { username: "PAT", password: "pat-password-1" } });
    planner = (p.body as { token: string }).token;
    expect((p.body as { account: { role: string } }).account.role).toBe("planner");
    const me = await api("GET", "/api/v1/session", { cookie: `holdline_account=${encodeURIComponent(editor)}` });
    expect(me.body).toMatchObject({ mode: "accounts", actor: { name: "Edda Editor", role: "editor" } });
  });
});

describe("roles", () => {
  it("lets a planner read and save plans, not change templates, rule sets or settings", async () => {
    expect((await api("GET", "/api/v1/products", { token: planner })).status).toBe(200);
    const product = { ...structuredClone(DEMO_SCENARIO.products[0]), name: "Planner's product" };
    expect((await api("POST", "/api/v1/products", { token: planner, body: product })).status).toBe(403);
    const rules = (await api("GET", "/api/v1/rulesets", { token: planner })).body as { id: number; version: number }[];
    expect((await api("PUT", `/api/v1/rulesets/${rules[0].id}`, { token: planner, body: { ...rules[0], chilledMax_C: 9 } })).status).toBe(403);
    expect((await api("DELETE", `/api/v1/rulesets/${rules[0].id}`, { token: planner })).status).toBe(403);
    expect((await api("PUT", "/api/v1/settings", { token: planner, body: { temperatureUnit: "F", massUnit: "kg", lengthUnit: "mm" } })).status).toBe(403);
    const input = JSON.parse(readFileSync(path.join(process.cwd(), "public/examples/hold.json"), "utf8"));
    // A result sent by the client is never stored: the server computes its own.
    const plan = await api("POST", "/api/v1/plans", { token: planner, body: { kind: "hold", name: "Friday lunch", input, result: { holdTime_s: 1 } } });
    expect(plan.status).toBe(201);
    const saved = (await api("GET", `/api/v1/plans/${(plan.body as { id: number }).id}`, { token: planner })).body as { result: { holdTime_s: number | null; series: unknown[] }; input: { shipper: { name: string } } };
    expect(saved.result.series.length).toBeGreaterThan(10);
    expect(saved.result.holdTime_s).not.toBe(1);
    expect(saved.input.shipper.name).toBe(input.shipper);
    const bad = await api("POST", "/api/v1/plans", { token: planner, body: { kind: "hold", name: "Bad", input: { x: 1 } } });
    expect(bad.status).toBe(422);
    expect(Object.keys((bad.body as { fieldErrors: Record<string, string[]> }).fieldErrors).every((k) => k.startsWith("input"))).toBe(true);
    const list = (await api("GET", "/api/v1/plans", { token: editor })).body as { id: number; createdByName: string; createdAt: string }[];
    expect(list.find((p) => p.id === (plan.body as { id: number }).id)).toMatchObject({ createdByName: "Pat Planner" });
  });

  it("lets an editor change a rule set, with the version check, and the history names who and when", async () => {
    const rules = (await api("GET", "/api/v1/rulesets", { token: editor })).body as { id: number; version: number; name: string; chilledMax_C: number }[];
    const r = rules.find((x) => x.name === "Canada")!;
    const ok = await api("PUT", `/api/v1/rulesets/${r.id}`, { token: editor, body: { ...r, chilledMax_C: 3.5 } });
    expect(ok).toMatchObject({ status: 200, body: { version: r.version + 1 } });
    const stale = await api("PUT", `/api/v1/rulesets/${r.id}`, { token: editor, body: { ...r, chilledMax_C: 2 } });
    expect(stale.status).toBe(409);
    const h = await api("GET", `/api/v1/rulesets/${r.id}/history`, { token: planner });
    expect(h.status).toBe(200);
    const entries = h.body as { action: string; byName: string; version: number; at: string; snapshot: { chilledMax_C: number } }[];
    expect(entries[0]).toMatchObject({ action: "updated", byName: "Edda Editor", version: r.version + 1, snapshot: { chilledMax_C: 3.5 } });
    expect(Number.isNaN(Date.parse(entries[0].at))).toBe(false);
    expect(entries.at(-1)!.action).toBe("imported"); // the demo seed
    expect((await api("GET", `/api/v1/products/1/history`, { token: editor })).status).toBe(404);
    expect((await api("GET", `/api/v1/rulesets/abc/history`, { token: editor })).status).toBe(404);
    // Beyond the largest stored id (2^31 - 1): no id, not a database error on PostgreSQL.
    expect((await api("GET", `/api/v1/rulesets/9999999999/history`, { token: editor })).status).toBe(404);
  });

  it("keeps names unique and the version check under concurrent API calls", async () => {
    const product = { ...structuredClone(DEMO_SCENARIO.products[1]), name: "API race" };
    const creates = await Promise.all(Array.from({ length: 6 }, () => api("POST", "/api/v1/products", { token: editor, body: product })));
    expect(creates.map((c) => c.status).sort()).toEqual([201, 422, 422, 422, 422, 422]);
    const created = creates.find((c) => c.status === 201)!.body as { id: number; version: number };
    const puts = await Promise.all(
      Array.from({ length: 6 }, (_, i) => api("PUT", `/api/v1/products/${created.id}`, { token: editor, body: { ...product, version: created.version, mass_kg: 1 + i } })),
    );
    expect(puts.map((p) => p.status).sort()).toEqual([200, 409, 409, 409, 409, 409]);
  });
});

describe("one gate: main's host and cross-site checks, then the accounts gate", () => {
  it("refuses a foreign Host and a cross-site write even with a valid session; a set passphrase does not replace accounts", async () => {
    expect((await api("GET", "/api/v1/products", { token: editor, headers: { host: "rebound.example:3113" } })).status).toBe(403);
    const product = { ...structuredClone(DEMO_SCENARIO.products[1]), name: "Cross-site product" };
    expect((await api("POST", "/api/v1/products", { token: editor, body: product, headers: { origin: "http://evil.example" } })).status).toBe(403);
    const old = process.env.HOLDLINE_PASSPHRASE;
    process.env.HOLDLINE_PASSPHRASE = "a long shared phrase for this test";
    try {
      // Accounts on: the passphrase is not asked for (the session token is the bearer), nor accepted instead of a session.
      expect((await api("GET", "/api/v1/products", { token: planner })).status).toBe(200);
      expect((await api("GET", "/api/v1/products", { token: "a long shared phrase for this test" })).status).toBe(401);
    } finally {
      if (old === undefined) delete process.env.HOLDLINE_PASSPHRASE;
      else process.env.HOLDLINE_PASSPHRASE = old;
    }
    expect(await db.product.count({ where: { name: "Cross-site product" } })).toBe(0);
  });
});

describe("signing out", () => {
  it("ends the session at once", async () => {
    expect((await api("DELETE", "/api/v1/session", { token: planner })).status).toBe(204);
    expect((await api("GET", "/api/v1/products", { token: planner })).status).toBe(401);
    expect((await api("GET", "/api/v1/products", { token: editor })).status).toBe(200);
  });
});

describe("password guessing", () => {
  it("answers 429 with Retry-After after five wrong passwords for one username, even to the right one", async () => {
    for (let i = 0; i < 5; i++) expect((await api("POST", "/api/v1/session", { body: { username: "ed", password: `guess-${i}-xxxxx` } })).status).toBe(401);
    const locked = await api("POST", "/api/v1/session", { body: { username: "ed", password: "ed-password-1" } });
    expect(locked.status).toBe(429);
    expect((locked.body as { error: string }).error).toMatch(/try again in 30 s/);
    expect((await api("POST", "/api/v1/session", { body: { username: "pat", password: "pat-password-1" } })).status).toBe(200);
  });
});
