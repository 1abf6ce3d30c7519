import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { tempDatabase } from "../helpers/tempdb";
import type { Db } from "../../lib/db/client";
import { listTemplates, saveTemplate, getTemplate, deleteTemplate, duplicateTemplate, getTemplateByName, defaultRuleSet } from "../../lib/db/templates";
import { exportLibrary, importLibrary } from "../../lib/db/library";
import { savePlan, getPlan } from "../../lib/db/plans";
import { seedIfFresh } from "../../lib/db/seed";
import { DEMO_SCENARIO } from "../../lib/db/demo-scenario";
import { getSettings, saveSettings } from "../../lib/db/settings";

let db: Db;
let dispose: () => Promise<void>;
beforeAll(async () => {
  ({ db, dispose } = await tempDatabase({ seed: true }));
});
afterAll(async () => dispose());

describe("seeded demo scenario", () => {
  it("holds the demo products, boxes, packs, routes and rule sets, with one default rule set", async () => {
    expect((await listTemplates(db, "products")).length).toBe(DEMO_SCENARIO.products.length);
    expect((await listTemplates(db, "shippers")).length).toBe(3);
    expect((await listTemplates(db, "packs")).map((p) => p.data.kind).sort()).toEqual(["dry_ice", "gel", "pcm", "water_ice"]);
    expect((await listTemplates(db, "routes")).length).toBe(2);
    const rules = await listTemplates(db, "rulesets");
    expect(rules.length).toBe(4);
    expect(rules.filter((r) => r.data.isDefault).length).toBe(1);
    expect((await defaultRuleSet(db))?.data.chilledMax_C).toBe(5);
  });

  it("never seeds again, even after the user deleted everything", async () => {
    const p = await getTemplateByName(db, "products", "Whole turkey, 6 kg");
    expect(await seedIfFresh(db)).toBe("skipped");
    expect((await listTemplates(db, "products")).length).toBe(DEMO_SCENARIO.products.length);
    expect(p).not.toBeNull();
  });
});

describe("saving templates", () => {
  const base = structuredClone(DEMO_SCENARIO.products[0]);

  it("rejects a composition that does not sum to 1 with an error on the composition field, and changes nothing", async () => {
    const before = (await listTemplates(db, "products")).length;
    const r = await saveTemplate(db, "products", null, null, { ...base, name: "Bad mix", composition: { ...base.composition, water: 0.2 } });
    expect(r.ok).toBe(false);
    if (!r.ok && r.reason === "invalid") expect(r.fieldErrors["composition"][0]).toMatch(/add up to/);
    expect((await listTemplates(db, "products")).length).toBe(before);
  });

  it("rejects a negative dimension on that field", async () => {
    const r = await saveTemplate(db, "products", null, null, { ...base, name: "Neg", dimA_m: -0.01 });
    expect(r.ok).toBe(false);
    if (!r.ok && r.reason === "invalid") expect(Object.keys(r.fieldErrors)).toEqual(["dimA_m"]);
  });

  it("rejects a duplicate name", async () => {
    const r = await saveTemplate(db, "products", null, null, base);
    expect(r.ok).toBe(false);
    if (!r.ok && r.reason === "invalid") expect(r.fieldErrors.name[0]).toMatch(/already called/);
  });

  it("detects a conflicting edit: the second save with a stale version is refused and the first stays", async () => {
    const created = await saveTemplate(db, "products", null, null, { ...base, name: "Conflict test" });
    expect(created.ok).toBe(true);
    if (!created.ok) return;
    const first = await saveTemplate(db, "products", created.id, created.version, { ...base, name: "Conflict test", mass_kg: 3 });
    expect(first).toMatchObject({ ok: true, version: created.version + 1 });
    const second = await saveTemplate(db, "products", created.id, created.version, { ...base, name: "Conflict test", mass_kg: 9 });
    expect(second).toMatchObject({ ok: false, reason: "conflict", currentVersion: created.version + 1 });
    if (!second.ok && second.reason === "conflict") expect(second.message).toMatch(/changed since you opened it/);
    expect((await getTemplate(db, "products", created.id))?.data.mass_kg).toBe(3);
  });

  it("duplicates under a free name and deletes", async () => {
    const src = await getTemplateByName(db, "routes", "Summer lunch run, Harbour Street");
    const d1 = await duplicateTemplate(db, "routes", src!.id);
    const d2 = await duplicateTemplate(db, "routes", src!.id);
    expect(d1.ok && d2.ok).toBe(true);
    if (!d1.ok || !d2.ok) return;
    expect((await getTemplate(db, "routes", d1.id))?.data.name).toBe("Summer lunch run, Harbour Street (copy)");
    expect((await getTemplate(db, "routes", d2.id))?.data.name).toBe("Summer lunch run, Harbour Street (copy 2)");
    expect((await getTemplate(db, "routes", d1.id))?.data.segments).toEqual(src!.data.segments);
    expect(await deleteTemplate(db, "routes", d2.id)).toEqual({ ok: true });
    expect(await getTemplate(db, "routes", d2.id)).toBeNull();
  });

  it("keeps only one default rule set", async () => {
    const r = await getTemplateByName(db, "rulesets", "Canada");
    const s = await saveTemplate(db, "rulesets", r!.id, r!.version, { ...r!.data, isDefault: true });
    expect(s.ok).toBe(true);
    const defaults = (await listTemplates(db, "rulesets")).filter((x) => x.data.isDefault);
    expect(defaults.map((d) => d.data.name)).toEqual(["Canada"]);
  });

  it("refuses a box whose layer names an unknown material", async () => {
    const b = structuredClone(DEMO_SCENARIO.shippers[0]);
    const r = await saveTemplate(db, "shippers", null, null, { ...b, name: "Ghost", wallLayers: [{ material: "Unobtainium", thickness_m: 0.02 }] });
    expect(r.ok).toBe(false);
    if (!r.ok && r.reason === "invalid") expect(r.fieldErrors["wallLayers.0.material"][0]).toMatch(/No material/);
  });

  it("refuses to delete a material a box uses", async () => {
    const m = await getTemplateByName(db, "materials", "EPS foam, 16 kg/m³");
    const r = await deleteTemplate(db, "materials", m!.id);
    expect(r.ok).toBe(false);
  });
});

describe("saved plans keep their snapshot", () => {
  it("survives deleting the template it was made from", async () => {
    const p = await getTemplateByName(db, "products", "Mixed salad leaves, tub");
    const planId = await savePlan(db, { kind: "warmup", name: "Salad on the pass", input: { product: p!.data }, result: { note: "x" } });
    await deleteTemplate(db, "products", p!.id);
    const plan = await getPlan(db, planId);
    expect((plan!.input as { product: { name: string } }).product.name).toBe("Mixed salad leaves, tub");
  });
});

describe("settings", () => {
  it("stores units once and validates them", async () => {
    expect((await saveSettings(db, { temperatureUnit: "F", massUnit: "lb", lengthUnit: "in" })).ok).toBe(true);
    expect(await getSettings(db)).toEqual({ temperatureUnit: "F", massUnit: "lb", lengthUnit: "in" });
    const bad = await saveSettings(db, { temperatureUnit: "K", massUnit: "lb", lengthUnit: "in" });
    expect(bad.ok).toBe(false);
    expect(await getSettings(db)).toEqual({ temperatureUnit: "F", massUnit: "lb", lengthUnit: "in" });
  });
});

describe("export and import", () => {
  it("round-trips into an empty database with an identical export", async () => {
    const exported = await exportLibrary(db);
    const other = await tempDatabase({ seed: false });
    try {
      const r = await importLibrary(other.db, JSON.parse(JSON.stringify(exported)));
      expect(r.ok).toBe(true);
      expect(await exportLibrary(other.db)).toEqual(exported);
    } finally {
      await other.dispose();
    }
  });

  it("changes nothing when one entry is malformed, and names the entry and field", async () => {
    const before = await exportLibrary(db);
    const file = JSON.parse(JSON.stringify(before));
    file.products[1].mass_kg = -2;
    file.products[0].notes = "changed by the import";
    const r = await importLibrary(db, file);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors.join("\n")).toMatch(/products\[1\] \(".*"\)\.mass_kg: Mass must be greater than zero/);
    expect(await exportLibrary(db)).toEqual(before);
  });

  it("rejects a file that is not a library file", async () => {
    expect((await importLibrary(db, [])).ok).toBe(false);
    expect((await importLibrary(db, { format: "other", formatVersion: 1 })).ok).toBe(false);
  });
});
