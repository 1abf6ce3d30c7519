import { describe, it, expect } from "vitest";
import { runThaw } from "../../lib/physics/thaw";
import { DEMO_SCENARIO as D } from "../../lib/db/demo-scenario";

const turkey = D.products.find((p) => p.name === "Whole turkey, 6 kg")!;
const rules = D.rulesets[0];

describe("still water changed on a schedule: chunk boundaries", () => {
  // Issue 10, reproduction 1: 3 × 100.1 s falls about 6e-14 s short of 300.3 s in floating point; the
  // remainder took no solver step and the loop never ended (the request never answered).
  it("a horizon that is a whole number of changes ends (100.1 s changes, 300.3 s horizon)", () => {
    const r = runThaw({
      product: turkey,
      ruleSet: rules,
      method: { kind: "still_water", water_C: 4, bath_m3: 0.5, changeEvery_s: 100.1 },
      horizon_s: 300.3,
    });
    const t = r.series.map((p) => p.t_s);
    expect(t[t.length - 1]).toBeCloseTo(300.3, 6);
    for (let i = 1; i < t.length; i++) expect(t[i]).toBeGreaterThan(t[i - 1]);
    expect(r.thawTime_s).toBeNull(); // a 6 kg turkey does not thaw in five minutes
  });

  it("the same with other awkward decimal intervals", () => {
    for (const [every, n] of [[0.1 * 3 * 1000, 7], [333.3, 3], [120.7, 10]] as const) {
      const r = runThaw({ product: turkey, ruleSet: rules, method: { kind: "still_water", water_C: 4, bath_m3: 0.5, changeEvery_s: every }, horizon_s: every * n });
      expect(r.series[r.series.length - 1].t_s).toBeCloseTo(every * n, 6);
    }
  });
});
