/**
 * Calibration over the JSON API, through the proxy and the route handlers with a seeded temporary database
 * and the real worker pool: POST /api/v1/calibrate with the example input (templates by name), a malformed
 * log refused with row and column, and POST /api/v1/calibrate/save: a new box with its provenance, and a
 * hold plan with it that says where its factors came from.
 */
import { describe, it, expect, beforeAll, afterAll, vi } from "vitest";
import { readFileSync } from "node:fs";
import path from "node:path";
import { startApi, type ApiHarness } from "../helpers/api";
import { ROOT } from "../helpers/cli-run";
import { getPlan } from "../../lib/db/plans";

vi.mock("server-only", () => ({}));
vi.mock("next/cache", () => ({ revalidatePath: () => {} }));

let api: ApiHarness;
beforeAll(async () => {
  api = await startApi();
}, 60_000);
afterAll(async () => {
  await api?.dispose();
});

const example = JSON.parse(readFileSync(path.join(ROOT, "public", "examples", "calibrate.json"), "utf8"));
const bodyOf = async (r: Response) => JSON.parse(await r.text());

describe("POST /api/v1/calibrate", () => {
  it("fits the example: factors with value, low and high, rms_K, maxResidual_K, warnings", async () => {
    const r = await api.call("POST", "/api/v1/calibrate", example);
    expect(r.status).toBe(200);
    const b = await bodyOf(r);
    expect(b.factors).toHaveLength(3);
    for (const f of b.factors) {
      expect(f.low).toBeLessThanOrEqual(f.value);
      expect(f.high).toBeGreaterThanOrEqual(f.value);
    }
    expect(b.rms_K).toBeGreaterThan(0);
    expect(b.maxResidual_K).toBeGreaterThan(b.rms_K);
    expect(Array.isArray(b.warnings)).toBe(true);
  }, 60_000);

  it("a log with time going backwards is a 422 naming its row and column; an unknown template in the plan names its field", async () => {
    const lines = example.log.text.split("\n");
    [lines[5], lines[6]] = [lines[6], lines[5]];
    const r = await api.call("POST", "/api/v1/calibrate", { ...example, log: { name: "x.csv", text: lines.join("\n") } });
    expect(r.status).toBe(422);
    expect((await bodyOf(r)).fieldErrors["log.text"].join(" ")).toMatch(/row 7, "elapsed_min"/);
    const u = await api.call("POST", "/api/v1/calibrate", { ...example, plan: { ...example.plan, shipper: "No such box" } });
    expect(u.status).toBe(422);
    expect(Object.keys((await bodyOf(u)).fieldErrors)).toContain("plan.shipper");
  });
});

describe("POST /api/v1/calibrate/save", () => {
  it("saves the box as a new template with where its factors came from, and a hold plan with it", async () => {
    const r = await api.call("POST", "/api/v1/calibrate/save", { input: example });
    expect(r.status).toBe(201);
    const b = await bodyOf(r);
    expect(b.name).toMatch(/^Quillfield thin foam cooler — calibrated logger-trip\.csv \d{4}-\d{2}-\d{2}$/);
    const list = await bodyOf(await api.call("GET", "/api/v1/shippers"));
    const box = list.find((s: { name: string }) => s.name === b.name);
    expect(box.calibration.source).toMatch(/^logger-trip\.csv, fitted /);
    expect(Object.keys(box.calibration.factors)).toEqual(["wallConductance", "innerH", "contact"]);
    const original = list.find((s: { name: string }) => s.name === "Quillfield thin foam cooler");
    expect(original.calibration ?? null).toBeNull();
    // Planning with it, by name: its factors and "calibrated from" in the assumptions.
    const hold = await bodyOf(await api.call("POST", "/api/v1/hold", { ...example.plan, shipper: b.name }));
    expect(hold.assumptions.join(" ")).toMatch(/Calibrated from logger-trip\.csv/);
    expect(hold.assumptions.join(" ")).toMatch(/fitted 95 % intervals/);
    const plan = await getPlan(api.db, b.planId);
    expect(plan?.kind).toBe("hold");
    expect((plan?.input as { shipper: { name: string } }).shipper.name).toBe(b.name);
  }, 120_000);

  it("a thaw calibration, a name taken and a body without input are refused with a field message", async () => {
    const thaw = await api.call("POST", "/api/v1/calibrate/save", { input: { ...example, planner: "thaw" } });
    expect(thaw.status).toBe(422);
    const taken = await api.call("POST", "/api/v1/calibrate/save", { input: example, name: "Quillfield thin foam cooler" });
    expect(taken.status).toBe(422);
    expect((await bodyOf(taken)).fieldErrors.name[0]).toMatch(/already called/);
    expect((await api.call("POST", "/api/v1/calibrate/save", {})).status).toBe(422);
    expect((await api.call("POST", "/api/v1/calibrate/save", "not json at all")).status).toBe(422);
  }, 120_000);
});
