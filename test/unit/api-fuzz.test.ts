/**
 * A bounded fuzz (fast-check, fixed seed) over every API route, through the proxy's guard and the route
 * handlers with a seeded temporary database and the real worker pool. For every request: no 5xx (a
 * non-finite number in a result is a 500 from the worker, so this covers "no NaN or Infinity in any
 * output"), no answer slower than a generous bound, and the database unchanged by every rejected request.
 * Bodies are arbitrary JSON and valid inputs with one to three fields replaced by hostile values or removed.
 */
import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, it, expect, beforeAll, afterAll, vi } from "vitest";
import fc from "fast-check";
import { startApi, JSON_HEADERS, ORIGIN, type ApiHarness } from "../helpers/api";
import { PLANNER_KINDS, type PlannerKind } from "../../lib/planners/registry";

vi.mock("server-only", () => ({}));

/** Fixed in CI; HOLDLINE_FUZZ_SEED explores other cases locally. */
const SEED = Number(process.env.HOLDLINE_FUZZ_SEED ?? 20261202);
/** Cases per route family: a few hundred for the quick routes, fewer for the calculations. */
const RUNS = { crud: 300, calc: 150 } as const;
/** The slowest answer seen per family, printed at the end (the calculation limit is set to 5 s below). */
const slowest: Partial<Record<keyof typeof RUNS, { ms: number; what: string }>> = {};

let api: ApiHarness;
const counts: Record<string, { cases: number; byStatus: Record<number, number> }> = {};

beforeAll(async () => {
  api = await startApi({ HOLDLINE_CALC_TIME_LIMIT_S: "5" });
}, 60_000);
afterAll(async () => {
  await api?.dispose();
  console.log("fuzz counts:", JSON.stringify(counts));
  console.log("fuzz slowest answers:", JSON.stringify(slowest));
});

const KINDS = ["materials", "products", "shippers", "packs", "routes", "rulesets"];

const hostile = fc.oneof(
  fc.jsonValue({ maxDepth: 3 }),
  fc.constantFrom(0, -0, -1, 1e308, -1e308, 5e-324, 2 ** 31, 2 ** 53, 1e21, 0.1 + 0.2, -273.16, 1e6, ""),
  fc.constantFrom(null, [], {}, "x".repeat(5000), "__proto__", "constructor", "1e309", true),
  fc.string({ maxLength: 30 }),
  fc.double(),
  fc.integer(),
);

/** Every path of a JSON value (objects and arrays), root excluded. */
function paths(x: unknown, prefix: (string | number)[] = [], out: (string | number)[][] = []): (string | number)[][] {
  if (Array.isArray(x)) {
    x.forEach((v, i) => {
      out.push([...prefix, i]);
      paths(v, [...prefix, i], out);
    });
  } else if (x && typeof x === "object") {
    for (const [k, v] of Object.entries(x)) {
      out.push([...prefix, k]);
      paths(v, [...prefix, k], out);
    }
  }
  return out;
}

type Edit = { at: number; op: "remove" | "set" | "scale"; value: unknown; factor: number };

/** Applies edits at paths picked by index: remove a key, set any value, or scale a number (a plausible but unusual input). */
function mutate(base: unknown, edits: Edit[]): unknown {
  const copy = structuredClone(base);
  for (const e of edits) {
    const ps = paths(copy);
    if (!ps.length) break;
    const numeric = ps.filter((p) => typeof get(copy, p) === "number");
    const p = e.op === "scale" && numeric.length ? numeric[e.at % numeric.length] : ps[e.at % ps.length];
    const parent = get(copy, p.slice(0, -1)) as Record<string | number, unknown>;
    const last = p[p.length - 1];
    if (e.op === "remove" && !Array.isArray(parent)) delete parent[last];
    else if (e.op === "scale" && typeof parent[last] === "number") parent[last] = (parent[last] as number) * e.factor;
    else parent[last] = e.value;
  }
  return copy;
}

function get(x: unknown, p: (string | number)[]): unknown {
  let cur = x as Record<string | number, unknown>;
  for (const k of p) cur = cur[k] as Record<string | number, unknown>;
  return cur;
}

const edits = fc.array(
  fc.record({
    at: fc.nat(),
    op: fc.constantFrom<Edit["op"]>("scale", "scale", "scale", "set", "set", "remove"),
    value: hostile,
    factor: fc.constantFrom(0, -1, 0.001, 0.1, 0.5, 0.9, 1.1, 2, 10, 100, 1e4),
  }),
  { minLength: 1, maxLength: 3 },
);

/** A body from the valid bases or anything at all; sometimes not JSON. */
function bodies(bases: unknown[]) {
  return fc.oneof(
    { weight: 6, arbitrary: fc.tuple(fc.nat(), edits).map(([i, e]) => JSON.stringify(mutate(bases[i % bases.length], e))) },
    { weight: 2, arbitrary: fc.jsonValue({ maxDepth: 4 }).map((v) => JSON.stringify(v)) },
    { weight: 1, arbitrary: fc.constantFrom("", "{", "null", "[]", "\uFEFF{}", '{"a":1e999}', "{\"__proto__\":{\"x\":1}}") },
    { weight: 1, arbitrary: fc.string({ maxLength: 200 }) },
  );
}

const ids = fc.oneof(
  fc.integer({ min: 1, max: 40 }).map(String),
  fc.constantFrom("0", "-1", "1.5", "0x1", " 1", "%201", "%00", "abc", "9".repeat(30), "2147483648", "1e3", "01", "NaN", "Infinity", "__proto__"),
  fc.string({ minLength: 1, maxLength: 12 }).map(encodeURIComponent),
);

const headerSets = fc.oneof(
  { weight: 8, arbitrary: fc.constant(JSON_HEADERS) },
  { weight: 1, arbitrary: fc.constantFrom<Record<string, string>>(
    { "content-type": "text/plain", origin: ORIGIN, host: "127.0.0.1:3104" },
    { "content-type": "application/json", origin: "http://evil.example", host: "127.0.0.1:3104" },
    { "content-type": "application/json", host: "evil.example" },
    { "content-type": "application/json", host: "127.0.0.1:3104" },
    { "content-type": "application/json; charset=utf-8", host: "localhost:3104", "sec-fetch-site": "same-origin" },
  ) },
);

async function check(family: keyof typeof RUNS, label: string, method: string, url: string, body: string | undefined, headers: Record<string, string>) {
  const before = method === "GET" ? null : await api.snapshot();
  const t0 = performance.now();
  const r = await api.call(method, url, body, headers);
  const text = await r.text();
  const ms = performance.now() - t0;
  const c = (counts[label] ??= { cases: 0, byStatus: {} });
  c.cases++;
  c.byStatus[r.status] = (c.byStatus[r.status] ?? 0) + 1;
  const what = `${method} ${url} ${String(body).slice(0, 300)} → ${r.status} ${text.slice(0, 300)}`;
  expect(r.status, what).toBeLessThan(500);
  // Speed is measured by the benches, never asserted here: the slowest answer of each family is printed.
  if (ms > (slowest[family]?.ms ?? 0)) slowest[family] = { ms: Math.round(ms), what: what.slice(0, 120) };
  if (r.headers.get("content-type")?.includes("json") && text) expect(() => JSON.parse(text), what).not.toThrow();
  if (before !== null && r.status >= 400) expect(await api.snapshot(), `database changed by a rejected request: ${what}`).toBe(before);
}

describe("API fuzz (fixed seed, bounded)", () => {
  const templates: Record<string, unknown[]> = {};
  beforeAll(async () => {
    for (const k of KINDS) templates[k] = JSON.parse(await (await api.call("GET", `/api/v1/${k}`, undefined, JSON_HEADERS)).text());
  });

  it("template lists and creates: GET|POST /api/v1/{kind}", async () => {
    const bases = KINDS.flatMap((k) => templates[k].map((t) => ({ ...(t as object), id: undefined, version: undefined, name: `${(t as { name: string }).name} fuzz` })));
    await fc.assert(
      fc.asyncProperty(fc.oneof(fc.constantFrom(...KINDS), fc.string({ maxLength: 12 }).map(encodeURIComponent)), fc.boolean(), bodies(bases), headerSets, async (kind, post, body, headers) => {
        await check("crud", "kind", post ? "POST" : "GET", `/api/v1/${kind || "x"}`, post ? body : undefined, headers);
      }),
      { seed: SEED, numRuns: RUNS.crud },
    );
  });

  it("one template: GET|PUT|DELETE /api/v1/{kind}/{id}", async () => {
    const bases = KINDS.flatMap((k) => templates[k]);
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(...KINDS), ids, fc.constantFrom("GET", "PUT", "PUT", "DELETE"), bodies(bases), headerSets, async (kind, id, method, body, headers) => {
        await check("crud", "kind/id", method, `/api/v1/${kind}/${id}`, method === "PUT" ? body : undefined, headers);
      }),
      { seed: SEED, numRuns: RUNS.crud },
    );
  });

  it("settings and schemas: GET|PUT /api/v1/settings, GET /api/v1/schema/{name}", async () => {
    const settings = [{ temperatureUnit: "C", massUnit: "kg", lengthUnit: "mm" }];
    await fc.assert(
      fc.asyncProperty(
        fc.oneof(fc.constantFrom("hold", "thaw", "size", "warmup", "product", "constructor", "__proto__", "toString", "valueOf", "library"), fc.string({ maxLength: 16 }).map(encodeURIComponent)),
        fc.boolean(),
        bodies(settings),
        headerSets,
        async (name, put, body, headers) => {
          if (put) await check("crud", "settings", "PUT", "/api/v1/settings", body, headers);
          else await check("crud", "schema", "GET", `/api/v1/schema/${name || "x"}`, undefined, headers);
        },
      ),
      { seed: SEED, numRuns: RUNS.crud },
    );
  });

  const calcBases: Partial<Record<PlannerKind, unknown[]>> & Record<"hold" | "thaw" | "warmup" | "size", unknown[]> = {
    hold: [
      { products: [{ product: "Cod fillets, frozen block", count: 1, start_C: -22 }], shipper: "Quillfield lined carton", packs: [{ pack: "Dry ice slab, 2.5 kg", count: 1 }], route: "Overnight courier, Millbrook depot" },
      { products: [{ product: "Roast chicken thighs, half tray", count: 2, start_C: 3 }], shipper: "Quillfield thin foam cooler", packs: [{ pack: "Gel pack, 600 g", count: 4, conditioning_C: -18, placement: "top" }], route: { name: "Short", segments: [{ duration_s: 7200, airTemp_C: 28, airSpeed_m_s: 2, sun_W_m2: 600, lidOpenings: 3, lidOpenDuration_s: 20 }] } },
    ],
    thaw: [
      { product: "Whole turkey, 6 kg", method: { kind: "running_water", water_C: 15, speed_m_s: 0.05 } },
      { product: "Cod fillets, frozen block", method: { kind: "still_water", water_C: 4, bath_m3: 0.05, changeEvery_s: 1800 }, horizon_s: 86400 },
      { product: "Cod fillets, frozen block", method: { kind: "tray", air_C: 4, speed_m_s: 0.2, tray: "Aluminium (pure)", trayThickness_m: 0.005, trayLength_m: 0.6, trayWidth_m: 0.4 } },
    ],
    warmup: [
      { product: "Steamed rice, full pan", start_C: 80, surroundings: { medium: "air", T_C: 22, speed_m_s: 0.3 }, limit: "hotHoldMin", horizon_s: 14400 },
      { product: "Vanilla ice cream, 4 L tub", start_C: -18, surroundings: { medium: "air", T_C: 25, speed_m_s: 1 }, limit: "frozenMax", horizon_s: 7200 },
    ],
    size: [
      { products: [{ product: "Roast chicken thighs, half tray", count: 1, start_C: 2 }], route: "Summer lunch run, Harbour Street", boxes: [{ shipper: "Quillfield thin foam cooler" }], packs: [{ pack: "Gel pack, 600 g", maxCount: 3, conditioning_C: [-18] }] },
    ],
    // A fit runs the hold model tens of times: one base, the README's example.
    calibrate: [JSON.parse(readFileSync(path.join(process.cwd(), "public/examples/calibrate.json"), "utf8"))],
    cool: [
      { product: "Steamed rice, full pan", start_C: 74, setup: { kind: "pan", size: "1/1", height_m: 0.065, depth_m: 0.05, material: "stainless", lid: false }, method: { kind: "walk_in", air_C: 3, speed_m_s: 0.5, relativeHumidity: 0.85, support: "rack" } },
      { product: "Steamed rice, full pan", start_C: 60, setup: { kind: "piece" }, method: { kind: "walk_in", air_C: 3, speed_m_s: 0.5, relativeHumidity: 0.85, support: "shelf" }, searchDepth: false },
    ],
  };

  /** Inputs with templates spelled out (no materials: the API fills them in from the names the box gives). */
  function spelledOut() {
    const strip = (t: unknown) => {
      const { id: _i, version: _v, ...rest } = t as Record<string, unknown>;
      return rest;
    };
    const box = strip(templates.shippers.find((t) => (t as { name: string }).name === "Quillfield lined carton"));
    const product = strip(templates.products.find((t) => (t as { name: string }).name === "Cod fillets, frozen block"));
    calcBases.hold.push({ products: [{ product, count: 1, start_C: -22 }], shipper: box, packs: [{ pack: "Dry ice slab, 2.5 kg", count: 1 }], route: "Overnight courier, Millbrook depot" });
    calcBases.size.push({ products: [{ product, count: 1, start_C: -22 }], route: "Summer lunch run, Harbour Street", boxes: [{ shipper: box }], packs: [{ pack: "Dry ice slab, 2.5 kg", maxCount: 2, conditioning_C: [-78.5] }] });
    calcBases.thaw.push({ product, method: { kind: "fridge_air", air_C: 4, speed_m_s: 0.3 } });
    calcBases.warmup.push({ product, start_C: -18, surroundings: { medium: "water", T_C: 10, speed_m_s: 0.1 }, limit: "chilledMax", horizon_s: 7200 });
  }
  let spelled = false;

  it("every planner in the registry has fuzz inputs", () => {
    expect(Object.keys(calcBases).sort()).toEqual([...PLANNER_KINDS].sort());
  });

  it("saved plans: POST /api/v1/plans, GET|PATCH|DELETE /api/v1/plans/{id}", async () => {
    if (!spelled) {
      spelledOut();
      spelled = true;
    }
    const kinds = fc.oneof(fc.constantFrom(...PLANNER_KINDS), fc.constantFrom("constructor", "__proto__", "", "x"));
    const ids = fc.oneof(fc.constantFrom("1", "2", "0", "-1", "1.5", "1e2", "abc", "%00", "99999999999999999999"), fc.nat({ max: 50 }).map(String));
    await fc.assert(
      fc.asyncProperty(
        fc.constantFrom("save", "get", "rename", "delete"),
        kinds,
        fc.oneof(fc.string({ maxLength: 40 }), hostile),
        ids,
        headerSets,
        async (op, kind, name, id, headers) => {
          const bases = calcBases[kind as keyof typeof calcBases] ?? calcBases.warmup;
          if (op === "save") await check("calc", "plans", "POST", "/api/v1/plans", JSON.stringify({ kind, name, input: bases[0] }), headers);
          else if (op === "get") await check("crud", "plan", "GET", `/api/v1/plans/${id}`, undefined, headers);
          else if (op === "rename") await check("crud", "plan", "PATCH", `/api/v1/plans/${id}`, JSON.stringify({ name }), headers);
          else await check("crud", "plan", "DELETE", `/api/v1/plans/${id}`, undefined, headers);
        },
      ),
      { seed: SEED, numRuns: RUNS.crud / 3 },
    );
  }, 600_000);

  for (const kind of PLANNER_KINDS) {
    it(`calculation: POST /api/v1/${kind}`, async () => {
      if (!spelled) {
        spelledOut();
        spelled = true;
      }
      await fc.assert(
        fc.asyncProperty(bodies(calcBases[kind] ?? []), headerSets, async (body, headers) => {
          await check("calc", kind, "POST", `/api/v1/${kind}`, body, headers);
        }),
        { seed: SEED, numRuns: kind === "size" ? RUNS.calc / 3 : kind === "calibrate" ? RUNS.calc / 6 : RUNS.calc },
      );
    }, 600_000);
  }
});
