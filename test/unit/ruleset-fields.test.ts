// Rule-set fields (time as a control for cold food, ready-to-eat thawing, two-stage cooling) and the
// product's ready-to-eat flag: schema messages and cross-field checks, storage round trip, and that
// every field changes a planner's answer.
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { ruleSetSchema, productSchema, type RuleSet } from "../../lib/schemas/templates";
import { fieldErrorsOf } from "../../lib/schemas/errors";
import { DEMO_SCENARIO as D } from "../../lib/db/demo-scenario";
import { coolingStageLines, excursion, outOfBandLines, thawTimeAboveLine, warmupCompliance, holdCompliance } from "../../lib/physics/compliance";
import { tempDatabase } from "../helpers/tempdb";
import type { Db } from "../../lib/db/client";
import { getTemplateByName, saveTemplate, getTemplate } from "../../lib/db/templates";
import { exportLibrary, importLibrary } from "../../lib/db/library";

const US = ruleSetSchema.parse(D.rulesets.find((r) => r.name.startsWith("US"))!);
const UK = ruleSetSchema.parse(D.rulesets.find((r) => r.name.startsWith("England"))!);
const AU = ruleSetSchema.parse(D.rulesets.find((r) => r.name.startsWith("Australia"))!);

const errorsOf = (x: unknown) => {
  const r = ruleSetSchema.safeParse(x);
  return r.success ? {} : fieldErrorsOf(r.error);
};

describe("rule-set schema: new fields and cross-field checks", () => {
  it("every demo rule set and product parses, and the new fields default when absent", () => {
    for (const r of D.rulesets) expect(ruleSetSchema.safeParse(r).success, r.name).toBe(true);
    for (const p of D.products) expect(productSchema.safeParse(p).success, p.name).toBe(true);
    const { outsideControlColdMax_s: _a, outsideControlColdCeiling_C: _b, thawReadyToEatAboveMax_s: _c, coolFrom_C: _d, coolStage1To_C: _e, coolStage1Max_s: _f, coolStage2To_C: _g, coolStage2Max_s: _h, coolStage2Counted: _i, ...old } = US;
    const parsed = ruleSetSchema.parse(old);
    expect(parsed.coolStage2Counted).toBe("in_all");
    expect(parsed.coolFrom_C).toBeNull();
    expect(productSchema.parse({ ...D.products[0], readyToEat: undefined }).readyToEat).toBe(false);
  });

  it("cold-food time as a control needs both its time and its ceiling, above the chill limit, longer than the general allowance", () => {
    expect(errorsOf({ ...US, outsideControlColdCeiling_C: null })["outsideControlColdCeiling_C"]?.[0]).toMatch(/give both/);
    expect(errorsOf({ ...US, outsideControlColdMax_s: null })["outsideControlColdMax_s"]?.[0]).toMatch(/give both/);
    expect(errorsOf({ ...US, outsideControlColdCeiling_C: 4 })["outsideControlColdCeiling_C"]?.[0]).toMatch(/above the chilled upper limit/);
    expect(errorsOf({ ...US, outsideControlColdMax_s: 3 * 3600 })["outsideControlColdMax_s"]?.[0]).toMatch(/longer than the general/);
    expect(errorsOf({ ...US, outsideControlColdMax_s: "six" })["outsideControlColdMax_s"]?.[0]).toMatch(/enter a number/);
  });

  it("two-stage cooling: all five values or none, falling temperatures, stage 2 longer when counted in all", () => {
    const partial = errorsOf({ ...UK, coolFrom_C: 60 });
    expect(Object.keys(partial).sort()).toEqual(["coolStage1Max_s", "coolStage1To_C", "coolStage2Max_s", "coolStage2To_C"]);
    expect(partial["coolStage1To_C"][0]).toMatch(/required when any cooling limit is given/);
    expect(errorsOf({ ...US, coolStage1To_C: 60 })["coolStage1To_C"]?.[0]).toMatch(/below the starting temperature/);
    expect(errorsOf({ ...US, coolStage2To_C: 25 })["coolStage2To_C"]?.[0]).toMatch(/below the stage-1 end/);
    expect(errorsOf({ ...US, coolStage2Max_s: 3600 })["coolStage2Max_s"]?.[0]).toMatch(/longer than stage 1/);
    // Counted after stage 1, a shorter second stage is fine (FSANZ: 2 h, then a further 4 h is not the only form).
    expect(errorsOf({ ...AU, coolStage2Max_s: 3600 })).toEqual({});
    expect(errorsOf({ ...US, coolStage2Counted: "sometime" })["coolStage2Counted"]?.[0]).toMatch(/in_all or after_stage1/);
  });

  it("thawing: ready-to-eat food cannot be allowed longer than raw food, and its limit can be zero but not negative", () => {
    expect(errorsOf({ ...US, thawReadyToEatAboveMax_s: 5 * 3600 })["thawReadyToEatAboveMax_s"]?.[0]).toMatch(/cannot be allowed longer/);
    expect(errorsOf({ ...US, thawReadyToEatAboveMax_s: -1 })["thawReadyToEatAboveMax_s"]?.[0]).toMatch(/cannot be negative/);
    expect(errorsOf({ ...US, thawReadyToEatAboveMax_s: 0 })).toEqual({});
    const bad = productSchema.safeParse({ ...D.products[0], readyToEat: "yes" });
    expect(bad.success).toBe(false);
    expect(fieldErrorsOf(bad.error!)["readyToEat"][0]).toMatch(/Ready to eat: yes or no/);
  });
});

describe("rule-set and product fields are stored, exported and imported", () => {
  let db: Db;
  let dispose: () => Promise<void>;
  beforeAll(async () => {
    ({ db, dispose } = await tempDatabase({ seed: true }));
  });
  afterAll(async () => dispose());

  it("the seeded demo keeps every new value; a save, an export and an import keep them", async () => {
    const us = await getTemplateByName(db, "rulesets", US.name);
    expect(us!.data).toEqual(US);
    const au = await getTemplateByName(db, "rulesets", AU.name);
    expect(au!.data.coolStage2Counted).toBe("after_stage1");
    const chicken = await getTemplateByName(db, "products", "Roast chicken thighs, half tray");
    expect(chicken!.data.readyToEat).toBe(true);
    const edited = { ...us!.data, outsideControlColdMax_s: 5 * 3600, coolStage2Counted: "after_stage1", coolStage2Max_s: 4 * 3600, thawReadyToEatAboveMax_s: 600 };
    const s = await saveTemplate(db, "rulesets", us!.id, us!.version, edited);
    expect(s.ok).toBe(true);
    expect((await getTemplate(db, "rulesets", us!.id))!.data).toEqual(edited);
    const file = await exportLibrary(db);
    const ex = file.rulesets.find((r) => r.name === US.name)!;
    expect(ex.outsideControlColdMax_s).toBe(5 * 3600);
    const uncooked = { ...file.products.find((p) => p.name === chicken!.data.name)!, readyToEat: false };
    const imp = await importLibrary(db, { ...file, products: [uncooked], rulesets: [{ ...ex, coolFrom_C: 63 }] });
    expect(imp.ok).toBe(true);
    expect((await getTemplateByName(db, "rulesets", US.name))!.data.coolFrom_C).toBe(63);
    expect((await getTemplateByName(db, "products", chicken!.data.name))!.data.readyToEat).toBe(false);
    const rejected = await importLibrary(db, { ...file, rulesets: [{ ...ex, coolStage1Max_s: null }] });
    expect(rejected.ok).toBe(false);
    if (!rejected.ok) expect(rejected.errors.join("\n")).toMatch(/rulesets\[0\].*coolStage1Max_s: Cooling stage 1: time allowed: required/);
  });
});

// A cooling curve T(t) = 3 + 72·exp(−t/τ), sampled every minute (a lumped body from 75 °C in 3 °C air).
const coolCurve = (tau_s: number, horizon_s = 12 * 3600) => {
  const t_s: number[] = [];
  const T_C: number[] = [];
  for (let t = 0; t <= horizon_s; t += 60) {
    t_s.push(t);
    T_C.push(3 + 72 * Math.exp(-t / tau_s));
  }
  return { t_s, T_C };
};
const cross = (tau_s: number, T: number) => tau_s * Math.log(72 / (T - 3));

describe("compliance: the judgements themselves", () => {
  it("excursion counts separate periods, the longest and the total, linear between samples", () => {
    const c = { t_s: [0, 1, 2, 3, 4, 5, 6], T_C: [4, 6, 6, 4, 4, 7, 4] };
    const e = excursion(c, 5, "above", 6);
    expect(e.periods).toBe(2);
    expect(e.first_s).toBeCloseTo(0.5, 9);
    expect(e.total_s).toBeCloseTo(2 + 2 * (2 / 3), 9); // 0.5→2.5 and 4.333→5.667
    expect(e.longest_s).toBeCloseTo(2, 9);
    expect(e.extreme_C).toBe(7);
    expect(excursion(c, 5, "above", 3).periods).toBe(1);
  });

  it("the stage-2 time counted in all (FDA) or after stage 1 (FSANZ) changes the verdict", () => {
    // τ = 1.45 h: stage 1 (57 → 21 °C) takes τ·ln(54/18) = 1.59 h; 57 → 5 °C takes τ·ln(54/2) = 4.78 h in all.
    const tau = 1.45 * 3600;
    const c = coolCurve(tau);
    const inAll = coolingStageLines(US, c, 12 * 3600);
    expect(inAll.map((l) => l.status)).toEqual(["meets", "meets"]);
    // The same limits but stage 2 counted after stage 1, with 2 h only: 21 → 5 °C takes τ·ln(18/2) = 3.19 h > 2 h.
    const after = coolingStageLines({ ...US, coolStage2Counted: "after_stage1", coolStage2Max_s: 2 * 3600 }, c, 12 * 3600);
    expect(after.map((l) => l.status)).toEqual(["meets", "exceeds"]);
    expect(after[1].detail).toContain(`${((cross(tau, 5) - cross(tau, 21)) / 3600).toFixed(1)} h after stage 1`);
    // Too slow for stage 1: τ = 2 h gives 2.2 h.
    expect(coolingStageLines(US, coolCurve(2 * 3600), 12 * 3600)[0].status).toBe("exceeds");
    // A curve that stops before the deadline cannot say "exceeds".
    expect(coolingStageLines(US, coolCurve(tau, 3 * 3600), 3 * 3600).map((l) => l.status)).toEqual(["meets", "check locally"]);
    // No stages in the rule set: no lines.
    expect(coolingStageLines(UK, c, 12 * 3600)).toEqual([]);
  });

  it("ready-to-eat and raw food are judged against their own thawing limits", () => {
    expect(thawTimeAboveLine(US, true, 0, 5).status).toBe("meets");
    expect(thawTimeAboveLine(US, true, 600, 5).status).toBe("exceeds");
    expect(thawTimeAboveLine(US, false, 600, 5).status).toBe("meets");
    expect(thawTimeAboveLine(US, false, 5 * 3600, 5).status).toBe("exceeds");
    expect(thawTimeAboveLine({ ...US, thawReadyToEatAboveMax_s: 3600 }, true, 600, 5).status).toBe("meets");
    // The UK chill tolerance is for service or display, not a thawing time.
    expect(thawTimeAboveLine(UK, false, 600, 8).status).toBe("check locally");
  });

  it("time as a control and tolerance periods: each field changes the lines", () => {
    const warming = { t_s: [0, 3600, 7200, 10800, 14400, 18000], T_C: [3, 6, 12, 18, 22, 24] }; // passes 5 °C at 0.67 h
    const us = outOfBandLines(US, "Tray", "chilled", 3, warming, 4 * 3600);
    expect(us.map((l) => l.status)).toEqual(["meets", "exceeds"]); // 3.3 h < 4 h; but it passes 21 °C
    expect(outOfBandLines({ ...US, outsideControlColdCeiling_C: 25 }, "Tray", "chilled", 3, warming, 4 * 3600)[1].status).toBe("meets");
    expect(outOfBandLines({ ...US, outsideControlMax_s: 3 * 3600, outsideControlColdMax_s: null, outsideControlColdCeiling_C: null }, "Tray", "chilled", 3, warming, 4 * 3600).map((l) => l.status)).toEqual(["exceeds"]);
    // UK: one period only.
    const twice = { t_s: [0, 1, 2, 3, 4], T_C: [6, 9, 6, 9, 6] };
    expect(outOfBandLines(UK, "Tray", "chilled", 6, twice, 4).map((l) => l.status)).toEqual(["exceeds"]);
    expect(outOfBandLines(UK, "Tray", "chilled", 6, { t_s: [0, 1, 2], T_C: [6, 9, 6] }, 2)[0].status).toBe("meets");
    // Hot food below 63 °C: the 2 h hot tolerance.
    const coolingHot = { t_s: [0, 3600, 7200, 10800], T_C: [70, 64, 61, 58] };
    const hot = outOfBandLines(UK, "Rice", "hot", 70, coolingHot, 10800);
    expect(hot[0].rule).toMatch(/at most 2.0 h below 63 °C/);
    expect(hot[0].status).toBe("meets");
    expect(outOfBandLines({ ...UK, hotExcursionMax_s: 3600 }, "Rice", "hot", 70, coolingHot, 10800)[0].status).toBe("exceeds");
    // The uncertainty band's earlier failure is named beside the central estimate.
    expect(outOfBandLines(US, "Tray", "chilled", 3, warming, 4 * 3600, 600)[0].detail).toMatch(/low end of the uncertainty band the load leaves its band at 0.2 h/);
    expect(outOfBandLines(US, "Tray", "chilled", 3, warming, 4 * 3600, null)[0].detail).not.toMatch(/uncertainty/);
    // Inside the band: nothing to say.
    expect(outOfBandLines(US, "Tray", "chilled", 3, { t_s: [0, 1], T_C: [3, 4] }, 1)).toEqual([]);
  });

  it("the hold and warm-up hooks pass the right curve: warmest point for chilled food, frozen food skipped", () => {
    const series = [0, 1, 2].map((i) => ({ t_s: i * 3600, products: [{ center_C: 3 + i, surface_C: 3 + 3 * i }, { center_C: -20, surface_C: -19 }] }));
    const lines = holdCompliance(US, [{ name: "A", start_C: 3, mode: "chilled" }, { name: "B", start_C: -20, mode: "frozen" }], series, 7200);
    expect(lines.length).toBe(2);
    expect(lines.every((l) => l.rule.startsWith("A:"))).toBe(true);
    const w = warmupCompliance(US, "warming", 5, 3, [0, 3600, 7 * 3600].map((t, i) => ({ t_s: t, center_C: 3 + i, surface_C: 3 + 2 * i })), 7 * 3600);
    expect(w[0].status).toBe("meets");
    const r = { ...US } as RuleSet;
    expect(warmupCompliance({ ...r, outsideControlColdCeiling_C: 6, outsideControlColdMax_s: 6 * 3600 }, "warming", 5, 3, [0, 3600, 7 * 3600].map((t, i) => ({ t_s: t, center_C: 3 + i, surface_C: 3 + 2 * i })), 7 * 3600)[0].status).toBe("exceeds");
  });
});

describe("compliance: a cool-down is judged whichever limit the user picked", () => {
  it("hot food cooling towards the chill limit still gets the cooling stages", () => {
    const c = coolCurve(1.45 * 3600);
    const series = c.t_s.map((t, i) => ({ t_s: t, center_C: c.T_C[i], surface_C: c.T_C[i] - 1 }));
    expect(warmupCompliance(US, "warming", 5, 75, series, 12 * 3600).map((l) => l.rule)).toEqual([
      "Cooling stage 1: 57 °C → 21 °C within 2.0 h",
      "Cooling stage 2: to 5 °C within 6.0 h of the start, in all",
    ]);
  });
});

describe("migration 20261202090000_ruleset_fields on a database that already holds data", () => {
  it("keeps existing rule sets and products, with the new columns empty or at their defaults", async () => {
    const { mkdtempSync, mkdirSync, cpSync } = await import("node:fs");
    const os = await import("node:os");
    const path = await import("node:path");
    const Database = (await import("better-sqlite3")).default;
    const { migrateDatabase } = await import("../../lib/db/migrate");
    const dir = mkdtempSync(path.join(os.tmpdir(), "holdline-rsf-"));
    const firstOnly = path.join(dir, "migrations");
    mkdirSync(firstOnly);
    cpSync("prisma/migrations/20261201220000_initial", path.join(firstOnly, "20261201220000_initial"), { recursive: true });
    const file = path.join(dir, "old.db");
    migrateDatabase(file, firstOnly);
    const db = new Database(file);
    db.prepare(`INSERT INTO "RuleSet" (name, jurisdiction, chilledMax_C, frozenMax_C, hotHoldMin_C, source, reminder, updatedAt) VALUES ('Old', 'Here', 5, -18, 60, 's', 'r', CURRENT_TIMESTAMP)`).run();
    db.close();
    const res = migrateDatabase(file);
    expect(res.applied).toContain("20261202090000_ruleset_fields");
    const after = new Database(file, { readonly: true });
    const row = after.prepare(`SELECT * FROM "RuleSet" WHERE name = 'Old'`).get() as Record<string, unknown>;
    after.close();
    expect(row.chilledMax_C).toBe(5);
    expect(row.coolFrom_C).toBeNull();
    expect(row.outsideControlColdMax_s).toBeNull();
    expect(row.coolStage2Counted).toBe("in_all");
  });
});
