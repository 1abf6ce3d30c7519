// The cooling planner on the user's paths, from the demo library: the registry entry (what the page's
// worker and the server's pool run), the command line (`holdline cool`, `holdline schema cool`) and
// POST /api/v1/cool through the proxy and the route handler, on SQLite (npm test) and PostgreSQL
// (npm run test:pg). The physics is checked in test/reference/cooling.ref.test.ts and
// test/unit/cooling.test.ts; here, that every path gives the same answer with the issue's names.
import { describe, it, expect, beforeAll, afterAll, vi } from "vitest";
import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { DEMO_SCENARIO as D } from "../../lib/db/demo-scenario";
import { plannerOf, PLANNER_KINDS } from "../../lib/planners/registry";
import { runPlanner } from "../../lib/planners/run";
import { coolingRecord, type CoolResult } from "../../lib/physics/cooling";
import type { CoolParsed } from "../../lib/schemas/cool";
import { jsonSchemaOf } from "../../lib/schemas/json-schema";
import { ROOT, sh, STACK_TRACE } from "../helpers/cli-run";
import { tempDatabase } from "../helpers/tempdb";
import { createAccount } from "../../lib/db/accounts";
import { api, nextHeadersMock } from "../helpers/api";
import type { Db } from "../../lib/db/client";

vi.mock("server-only", () => ({}));
vi.mock("next/headers", () => nextHeadersMock);
vi.mock("next/cache", () => ({ revalidatePath: () => {} }));

const rice = D.products.find((p) => p.name === "Steamed rice, full pan")!;
const defaultRules = D.rulesets.find((r) => r.isDefault)!;
/** What the page sends by default: the demo rice in a 1/1 pan, 65 mm deep, at its library depth, in a walk-in. */
const pageDefault = { product: rice, start_C: 74, setup: { kind: "pan", size: "1/1", height_m: 0.065, depth_m: rice.dimA_m }, method: { kind: "walk_in" }, ruleSet: defaultRules };
/** The same by name, as a script would send it (public/examples/cool.json). */
const byName = { product: "Steamed rice, full pan", start_C: 74, setup: { kind: "pan", size: "1/1", height_m: 0.065, depth_m: 0.05, material: "stainless", lid: false }, method: { kind: "walk_in", air_C: 3, speed_m_s: 0.5, relativeHumidity: 0.85, support: "rack" } };

const ISSUE_NAMES = ["stages", "maxDepth_m", "warnings", "assumptions", "series"];
const STAGE_NAMES = ["from_C", "to_C", "limit_s", "reached_s", "meets"];

function expectIssueShape(r: CoolResult) {
  for (const k of ISSUE_NAMES) expect(r).toHaveProperty(k);
  expect(r.stages.map((s) => s.stage)).toEqual([1, 2]);
  for (const s of r.stages) for (const k of STAGE_NAMES) expect(s).toHaveProperty(k);
  expect(JSON.stringify(r)).not.toMatch(/NaN|Infinity/);
}

let full: { parsed: CoolParsed; result: CoolResult };

describe("the cooling planner's registry entry, from the demo library", () => {
  const entry = plannerOf("cool");
  it("is registered after the warm-up check, with a JSON Schema of its own", () => {
    expect(PLANNER_KINDS.indexOf("cool")).toBe(PLANNER_KINDS.indexOf("warmup") + 1);
    expect(JSON.stringify(jsonSchemaOf("cool"))).toContain("ice_bath");
  });

  it("the quick answer is the one plan (no search, no comparison); the full one adds the deepest layer and the methods", { timeout: 120_000 }, async () => {
    const q = await runPlanner(entry, pageDefault, "quick");
    const f = await runPlanner(entry, pageDefault, "full");
    if (!q.ok || !f.ok) throw new Error("the demo rice must plan");
    const qr = q.result.result as CoolResult;
    const fr = f.result.result as CoolResult;
    expect(q.result.pending).toMatch(/deepest layer/);
    expect(qr.maxDepth.limitedBy).toBe("not searched");
    expect(qr.comparison).toBeNull();
    expect(f.result.pending).toBeNull();
    expectIssueShape(fr);
    // The same plan: the quick stages are the full ones.
    expect(qr.stages).toEqual(fr.stages);
    expect(fr.maxDepth_m).not.toBeNull();
    expect(fr.comparison!.map((c) => c.kind)).toEqual(["walk_in", "blast_chiller", "ice_bath", "cold_plate"]);
    full = { parsed: f.result.parsed as CoolParsed, result: fr };
  });

  it("the view judges both stages, names the deepest layer, lays out the record with blanks; in °F and inches too", () => {
    const { parsed, result } = full;
    for (const units of [{ temperatureUnit: "C", massUnit: "kg", lengthUnit: "mm" }, { temperatureUnit: "F", massUnit: "lb", lengthUnit: "in" }] as const) {
      const v = entry.view(parsed, result, units);
      const fact = (id: string) => v.facts.find((f) => f.testId === id)!.value;
      expect(fact("cool-stage-1")).toMatch(/— (meets|misses)$/);
      expect(fact("cool-stage-2")).toMatch(/— (meets|misses)$/);
      expect(fact("cool-max-depth")).toMatch(units.lengthUnit === "mm" ? /^\d+(\.\d+)? mm/ : /^\d+(\.\d+)? in/);
      const record = v.tables.find((t) => t.testId === "cool-record")!;
      expect(record.columns).toEqual(expect.arrayContaining([`Probe reading (${units.temperatureUnit === "C" ? "°C" : "°F"})`, "Initials"]));
      const rec = coolingRecord(parsed, result);
      expect(record.rows.length).toBe(rec.rows.length);
      expect(record.rows.every((r) => r.filter((c) => c === "__________").length === rec.blanks.length)).toBe(true);
      const deadlines = v.charts[0].markers!.filter((m) => /due/.test(m.label));
      expect(deadlines.length).toBe(2);
      const text = JSON.stringify(v);
      if (units.temperatureUnit === "F") {
        expect(text).not.toMatch(/\d °C/);
        expect(text).toMatch(/134\.6 °F|135 °F/); // 57 °C, FDA's stage-1 start
      }
      const csv = entry.csv(parsed, result, units);
      expect(Object.keys(csv[0])).toEqual(["t_s", `slowest_${units.temperatureUnit}`, `top_${units.temperatureUnit}`, `base_${units.temperatureUnit}`]);
    }
  });

  it("bad input: a field message and nothing computed; the ice paddle says why it is not modelled", async () => {
    const r = await runPlanner(entry, { ...pageDefault, method: { kind: "ice_paddle" } });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.fieldErrors["method.kind"][0]).toMatch(/no published heat-transfer correlation/);
    const deep = await runPlanner(entry, { ...pageDefault, setup: { ...pageDefault.setup, depth_m: 0.1 } });
    expect(deep.ok).toBe(false);
    if (!deep.ok) expect(deep.fieldErrors["setup.depth_m"][0]).toMatch(/does not fit/);
  });
});

describe("holdline cool and holdline schema cool", () => {
  const dir = mkdtempSync(path.join(os.tmpdir(), "holdline-cool-cli-"));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));
  it("plans the example file against the seeded library and prints the issue's JSON names", { timeout: 120_000 }, () => {
    const db = path.join(dir, "lib.db");
    const r = sh(`node bin/holdline.mjs cool public/examples/cool.json --db ${db}`, { cwd: ROOT });
    expect(r.stderr).not.toMatch(STACK_TRACE);
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout) as CoolResult;
    expectIssueShape(out);
    // The CLI names the product; the page sends it whole: the same answer.
    expect(out.stages).toEqual(full.result.stages);
    expect(out.maxDepth_m).toBe(full.result.maxDepth_m);
    const s = sh(`node bin/holdline.mjs schema cool`, { cwd: ROOT });
    expect(s.status).toBe(0);
    expect(JSON.parse(s.stdout).properties.method).toBeDefined();
    const bad = sh(`echo '{"product":"No such food","start_C":74,"setup":{"kind":"pan","depth_m":0.05},"method":{"kind":"walk_in"}}' | node bin/holdline.mjs cool - --db ${db}`, { cwd: ROOT });
    expect(bad.status).toBe(1);
    expect(bad.stderr).toMatch(/product/);
    expect(bad.stderr).not.toMatch(STACK_TRACE);
  });
});

// In accounts mode, as a shared library runs (PostgreSQL turns accounts on by itself): a planner signs in.
describe("POST /api/v1/cool", () => {
  let db: Db;
  let dispose: () => Promise<void>;
  let token = "";
  const saved = { DATABASE_URL: process.env.DATABASE_URL, HOLDLINE_AUTH: process.env.HOLDLINE_AUTH, HOLDLINE_BCRYPT_COST: process.env.HOLDLINE_BCRYPT_COST };
  beforeAll(async () => {
    const t = await tempDatabase({ seed: true });
    db = t.db;
    dispose = t.dispose;
    process.env.DATABASE_URL = t.dbPath;
    process.env.HOLDLINE_AUTH = "accounts";
    process.env.HOLDLINE_BCRYPT_COST = "4";
    const made = await createAccount(db, { username: "cook", displayName: "Chris Cook", password: "cook-password-1", role: "planner" });
    if (!made.ok) throw new Error("account setup");
    const s = await api("POST", "/api/v1/session", { body: { username: "cook", password: "cook-password-1" } });
    token = (s.body as { token: string }).token;
  }, 60_000);
  afterAll(async () => {
    for (const [k, v] of Object.entries(saved)) {
      if (v === undefined) delete process.env[k];
      else process.env[k] = v;
    }
    await db.$disconnect();
    await dispose();
  });

  it("answers the named demo rice with the issue's names, and a 422 naming the field for bad input", { timeout: 120_000 }, async () => {
    const ok = await api("POST", "/api/v1/cool", { token, body: { ...byName, compare: false } });
    expect(ok.status).toBe(200);
    const r = ok.body as CoolResult;
    expectIssueShape(r);
    expect(r.stages).toEqual(full.result.stages);
    expect(r.maxDepth_m).toBe(full.result.maxDepth_m);
    const bad = await api("POST", "/api/v1/cool", { token, body: { ...byName, method: { kind: "ice_bath", level_m: 0.2 } } });
    expect(bad.status).toBe(422);
    expect(JSON.stringify(bad.body)).toMatch(/level_m.*rim/);
    const junk = await api("POST", "/api/v1/cool", { token, rawBody: "{not json" });
    expect(junk.status).toBe(422);
  });

  it("saves a plan the server computes, and stores the stages", async () => {
    const p = await api("POST", "/api/v1/plans", { token, body: { kind: "cool", name: "Rice for tomorrow", input: { ...byName, compare: false, searchDepth: false } } });
    expect(p.status).toBe(201);
    const id = (p.body as { id: number }).id;
    const got = await api("GET", `/api/v1/plans/${id}`, { token });
    expect(got.status).toBe(200);
    expect(JSON.stringify(got.body)).toMatch(/"stages":\[\{"stage":1/);
  });
});
