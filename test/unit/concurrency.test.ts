// Concurrent writers on one database, as several app instances make them. On PostgreSQL
// (npm run test:pg) two Prisma clients, that is two connection pools, as two instances have.
// On SQLite (npm test) one client: better-sqlite3 waits for another connection's write lock
// synchronously, so two clients in one process would block each other's event loop (two
// processes on one file are measured by scripts/load-shared.ts). The version check, unique names,
// the single default rule set and all-or-nothing import must hold exactly as for one writer.
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { onPostgres, tempDatabase } from "../helpers/tempdb";
import { createPrismaClient, type Db } from "../../lib/db/client";
import { getTemplate, getTemplateByName, listTemplates, saveTemplate } from "../../lib/db/templates";
import { exportLibrary, importLibrary } from "../../lib/db/library";
import { DEMO_SCENARIO } from "../../lib/db/demo-scenario";

let a: Db;
let b: Db;
let dispose: () => Promise<void>;
beforeAll(async () => {
  const t = await tempDatabase({ seed: true });
  a = t.db;
  b = onPostgres() ? createPrismaClient(t.dbPath) : a;
  dispose = async () => {
    if (b !== a) await b.$disconnect();
    await t.dispose();
  };
});
afterAll(async () => dispose());

const clients = () => [a, b];
const product = structuredClone(DEMO_SCENARIO.products[0]);

describe("concurrent writers", () => {
  it("version check: of many saves from the same version, exactly one wins and the rest are conflicts", async () => {
    const c = await saveTemplate(a, "products", null, null, { ...product, name: "Race: version" });
    if (!c.ok) throw new Error("setup");
    const results = await Promise.all(
      Array.from({ length: 12 }, (_, i) => saveTemplate(clients()[i % 2], "products", c.id, c.version, { ...product, name: "Race: version", mass_kg: 1 + i })),
    );
    const wins = results.filter((r) => r.ok);
    expect(wins.length).toBe(1);
    expect(results.filter((r) => !r.ok && r.reason === "conflict").length).toBe(11);
    const winner = results.findIndex((r) => r.ok);
    const now = await getTemplate(b, "products", c.id);
    expect(now!.version).toBe(c.version + 1);
    expect(now!.data.mass_kg).toBe(1 + winner);
  });

  it("no lost write: workers that re-read and retry on conflict all land, and the version counts them", async () => {
    const c = await saveTemplate(a, "routes", null, null, { ...structuredClone(DEMO_SCENARIO.routes[0]), name: "Race: counter", notes: "" });
    if (!c.ok) throw new Error("setup");
    const perWorker = 5;
    const worker = async (db: Db, w: number) => {
      for (let k = 0; k < perWorker; k++) {
        for (;;) {
          const cur = (await getTemplate(db, "routes", c.id))!;
          const r = await saveTemplate(db, "routes", c.id, cur.version, { ...cur.data, notes: `${cur.data.notes}${w}.${k};` });
          if (r.ok) break;
          expect(r.reason).toBe("conflict");
        }
      }
    };
    await Promise.all([0, 1, 2, 3].map((w) => worker(clients()[w % 2], w)));
    const end = (await getTemplate(a, "routes", c.id))!;
    expect(end.version).toBe(c.version + 4 * perWorker);
    const marks = end.data.notes.split(";").filter(Boolean);
    expect(marks.length).toBe(4 * perWorker);
    expect(new Set(marks).size).toBe(4 * perWorker);
  });

  it("unique names: of many creates with one name, exactly one is made and the rest get a name error", async () => {
    const results = await Promise.all(
      Array.from({ length: 10 }, (_, i) => saveTemplate(clients()[i % 2], "products", null, null, { ...product, name: "Race: same name" })),
    );
    expect(results.filter((r) => r.ok).length).toBe(1);
    for (const r of results.filter((x) => !x.ok)) {
      expect(r).toMatchObject({ ok: false, reason: "invalid" });
      if (!r.ok && r.reason === "invalid") expect(r.fieldErrors.name[0]).toMatch(/already called/);
    }
    expect((await listTemplates(a, "products")).filter((p) => p.data.name === "Race: same name").length).toBe(1);
  });

  it("one default rule set, however many are made the default at once", async () => {
    const rules = await listTemplates(a, "rulesets");
    await Promise.all(rules.map((r, i) => saveTemplate(clients()[i % 2], "rulesets", r.id, r.version, { ...r.data, isDefault: true })));
    expect((await listTemplates(b, "rulesets")).filter((r) => r.data.isDefault).length).toBe(1);
  });

  it("all-or-nothing import: concurrent imports of overlapping new entries both apply in full, a bad one changes nothing", async () => {
    const mk = (from: number, to: number) => ({
      format: "holdline-library",
      formatVersion: 1,
      products: Array.from({ length: to - from }, (_, i) => ({ ...product, name: `Race: import ${from + i}` })),
    });
    const bad = mk(100, 110);
    (bad.products[9] as { mass_kg: number }).mass_kg = -1;
    const before = await exportLibrary(a);
    const [r1, r2, r3] = await Promise.all([importLibrary(a, mk(0, 15)), importLibrary(b, mk(5, 20)), importLibrary(b, bad)]);
    expect(r1.ok && r2.ok).toBe(true);
    expect(r3.ok).toBe(false);
    if (r1.ok && r2.ok) {
      expect(r1.created + r2.created).toBe(20);
      expect(r1.updated + r2.updated).toBe(10);
    }
    const names = (await listTemplates(a, "products")).map((p) => p.data.name).filter((n) => n.startsWith("Race: import"));
    expect(names.length).toBe(20);
    const overlap = await getTemplateByName(a, "products", "Race: import 7");
    expect(overlap!.version).toBe(2);
    expect(before.products.length + 20).toBe((await exportLibrary(b)).products.length);
  });
});
