import { describe, it, expect } from "vitest";
import { runThawParsed } from "../../lib/physics/thaw";
import { thawInputSchema } from "../../lib/schemas/thaw";
import { DEMO_SCENARIO as D } from "../../lib/db/demo-scenario";

/**
 * Hand check: start by = ready by − thaw time. A 6 kg turkey in the refrigerator takes days, so with
 * service one hour from "now" the start-by time is days before now: it has passed and must be flagged.
 * With service a month away it has not.
 */
describe("a start-by time already in the past is flagged", () => {
  const now = Date.UTC(2026, 11, 2, 2, 0, 0);
  const input = (readyBy_ms: number) =>
    thawInputSchema.parse({
      product: D.products.find((p) => p.name.startsWith("Whole turkey"))!,
      start_C: -18,
      ruleSet: D.rulesets[0],
      method: { kind: "fridge_air", air_C: 4, speed_m_s: 0.3 },
      readyBy: new Date(readyBy_ms).toISOString(),
    });
  it("service in one hour: start by has passed", () => {
    const r = runThawParsed(input(now + 3600_000), { now_ms: now });
    expect(r.thawTime_s!).toBeGreaterThan(3600);
    expect(new Date(r.startBy!).getTime()).toBeCloseTo(now + 3600_000 - r.thawTime_s! * 1000, -3);
    expect(r.startByPassed).toBe(true);
    expect(r.warnings.join(" ")).toMatch(/has already passed/);
  });
  it("service in a month: start by is still ahead", () => {
    const r = runThawParsed(input(now + 30 * 86400_000), { now_ms: now });
    expect(r.startByPassed).toBe(false);
    expect(r.warnings.join(" ")).not.toMatch(/has already passed/);
  });
});
