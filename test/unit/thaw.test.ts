import { describe, it, expect } from "vitest";
import { runThaw, runThawParsed } from "../../lib/physics/thaw";
import { thawInputSchema, type ThawInput } from "../../lib/schemas/thaw";
import { runValidated } from "../../lib/schemas/run";
import { DEMO_SCENARIO as D } from "../../lib/db/demo-scenario";

const cod = D.products.find((p) => p.name.startsWith("Cod"))!;
const us = D.rulesets.find((r) => r.name.startsWith("US"))!;
const al = D.materials.find((m) => m.name === "Aluminium (pure)")!;
const water = (T: number): ThawInput["method"] => ({ kind: "running_water", water_C: T, speed_m_s: 0.05, packaging: null });
const base: ThawInput = { product: cod, start_C: -18, ruleSet: us, method: water(15) };
const time = (x: ThawInput) => {
  const r = runThaw(x);
  expect(r.energyBalanceError).toBeLessThan(1e-9);
  return r.thawTime_s!;
};

describe("thaw planner: direction checks", () => {
  it("thicker → slower", () => {
    expect(time({ ...base, product: { ...cod, dimA_m: 0.07, mass_kg: 7 } })).toBeGreaterThan(time(base));
  });
  it("warmer water → faster", () => {
    expect(time({ ...base, method: water(20) })).toBeLessThan(time({ ...base, method: water(10) }));
  });
  it("higher contact conductance on a tray → faster", () => {
    const tray = (c: number): ThawInput["method"] => ({ kind: "tray", air_C: 4, speed_m_s: 0.1, tray: al, trayThickness_m: 0.006, trayLength_m: 0.6, trayWidth_m: 0.4, undersideExposed: true, contact_W_m2K: c });
    expect(time({ ...base, method: tray(500) })).toBeLessThan(time({ ...base, method: tray(20) }));
  });
  it("packaging with an air gap slows running-water thawing", () => {
    const gap: ThawInput["method"] = { kind: "running_water", water_C: 15, speed_m_s: 0.05, packaging: { thickness_m: 0.002, k_W_mK: 0.026 } };
    expect(time({ ...base, method: gap })).toBeGreaterThan(time(base));
  });
});

describe("thaw planner: results", () => {
  it("compares every method, plans backwards from a ready-by time, and reports compliance", () => {
    const r = runThaw({ ...base, method: { kind: "fridge_air", air_C: 4, speed_m_s: 0.3 }, compare: true, readyBy: "2026-12-05T11:00:00Z" });
    expect(r.comparison!.map((m) => m.kind).sort()).toEqual(["fridge_air", "room_air", "running_water", "still_water", "tray"]);
    for (const m of r.comparison!) {
      expect(m.thawTime_s).not.toBeNull();
      expect(new Date(m.startBy!).getTime() + m.thawTime_s! * 1000).toBeCloseTo(new Date("2026-12-05T11:00:00Z").getTime(), -3);
      expect(m.compliance.length).toBeGreaterThan(0);
    }
    const room = r.comparison!.find((m) => m.kind === "room_air")!;
    expect(room.compliance[0].status).toBe("not approved");
    const fridge = r.comparison!.find((m) => m.kind === "fridge_air")!;
    expect(fridge.fridgeSpaceTime_m3h).toBeGreaterThan(0);
    expect(fridge.surfaceAboveLimit_s).toBe(0);
    expect(r.advice.join(" ")).toMatch(/refreez/);
    expect(r.assumptions.join(" ")).toMatch(/Microwave/);
  });

  it("running water above the rule set's maximum is computed, then flagged", () => {
    const r = runThaw({ ...base, method: water(25) });
    expect(r.thawTime_s).toBeGreaterThan(0);
    expect(r.compliance[0].status).toBe("exceeds");
    expect(r.warnings.join(" ")).toMatch(/above the rule set's maximum/);
  });

  it("the surface of a whole bird in room air sits above the chill limit for part of the thaw", () => {
    const turkey = D.products.find((p) => p.name.startsWith("Whole turkey"))!;
    const r = runThaw({ ...base, product: turkey, method: { kind: "room_air", air_C: 21, speed_m_s: 0.1 } });
    expect(r.maxSurface_C).toBeGreaterThan(us.chilledMax_C);
    expect(r.surfaceAboveLimit_s).toBeGreaterThan(0);
    expect(r.surfaceAboveLimit_s).toBeLessThan(r.thawTime_s!);
  });
});

describe("thaw planner: bad input", () => {
  const run = (x: unknown) => runValidated(thawInputSchema, x, (i) => runThawParsed(i));
  it("an item larger than the tray", () => {
    const r = run({ ...base, method: { kind: "tray", air_C: 4, speed_m_s: 0, tray: al, trayThickness_m: 0.003, trayLength_m: 0.3, trayWidth_m: 0.2 } });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(Object.values(r.fieldErrors).flat().join(" ")).toMatch(/larger than the tray/);
  });
  it("a start temperature above the freezing point: nothing to thaw", () => {
    const r = run({ ...base, start_C: 2 });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.fieldErrors.start_C[0]).toMatch(/nothing to thaw/);
  });
  it("an unknown method is a field error", () => {
    const r = run({ ...base, method: { kind: "microwave" } });
    expect(r.ok).toBe(false);
  });
});
