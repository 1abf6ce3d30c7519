import { describe, it, expect } from "vitest";
import { runHoldParsed } from "../../lib/physics/hold";
import { placementSplit } from "../../lib/physics/placement";
import { holdInputSchema, type HoldInput } from "../../lib/schemas/hold";
import { DEMO_SCENARIO as D } from "../../lib/db/demo-scenario";

/**
 * Placement is physics. Sources of the argument:
 * - Cold air sinks. A horizontal air layer colder above than below is unstable and mixes by natural
 *   convection once Ra > 1708 (Globe & Dropkin 1959, Nu = 0.069 Ra^(1/3) Pr^0.074, as Incropera & DeWitt
 *   6th ed. §9.8 Eq. 9.49, from memory); one colder below than above is stable and passes heat by conduction
 *   only, Nu = 1 (same section). So packs on top cool the whole box and packs underneath leave a warm top.
 * - Common practice in catering and cold-chain guidance: coolant on top of a chilled load.
 * The expected ordering for a chilled load with an upper limit: on top holds longer than underneath,
 * and the lower half of the air is the colder one only when the packs are underneath.
 * Every input is the demo library's own templates through runHoldParsed, as a user runs it.
 */
const P = (n: string) => D.products.find((p) => p.name.startsWith(n))!;
const K = (n: string) => D.packs.find((p) => p.name.startsWith(n))!;
const S = (n: string) => D.shippers.find((p) => p.name.startsWith(n))!;
const hot12 = { name: "12 h at 30 °C", notes: "", segments: [{ label: "van", duration_s: 12 * 3600, airTemp_C: 30, airSpeed_m_s: 1, sun_W_m2: 0, lidOpenings: 0, lidOpenDuration_s: 0 }] };
const noBand = { outerH_frac: 0, insulationK_frac: 0, conditioning_K: 0 };
const plan = (placement: "top" | "bottom" | "side" | "around", over: Partial<HoldInput> = {}): HoldInput => ({
  products: [{ product: P("Roast chicken"), count: 1, start_C: 3 }],
  shipper: S("Quillfield thick"),
  materials: D.materials,
  packs: [{ pack: K("Gel"), count: 4, conditioning_C: -18, placement }],
  route: hot12,
  ruleSet: D.rulesets[1],
  uncertainty: noBand,
  extendFraction: 3,
  ...over,
});
const run = (x: HoldInput) => runHoldParsed(holdInputSchema.parse(x));
const holdOf = (r: ReturnType<typeof run>) => r.holdTime_s ?? r.routeLength_s + r.margin_s!;

describe("placement changes the answer in the physical order", () => {
  it("chilled chicken, 4 gel packs, 12 h at 30 °C: on top > underneath; the air stratifies the right way", () => {
    const res = Object.fromEntries((["top", "bottom", "side", "around"] as const).map((p) => [p, run(plan(p))]));
    const h = Object.fromEntries(Object.entries(res).map(([k, r]) => [k, holdOf(r) / 3600]));
    console.log(`placement, hold (h): top ${h.top.toFixed(2)}, bottom ${h.bottom.toFixed(2)}, side ${h.side.toFixed(2)}, around ${h.around.toFixed(2)}`);
    // Four placements, four different answers.
    const vals = Object.values(h).sort((a, b) => a - b);
    for (let i = 1; i < vals.length; i++) expect(vals[i] - vals[i - 1]).toBeGreaterThan(0.05);
    expect(h.top).toBeGreaterThan(h.bottom * 1.02);
    // Half-way through the route: packs underneath leave the upper half warmer (stable); packs on top make the upper half the colder one, and it sinks.
    const mid = (r: ReturnType<typeof run>) => r.series.find((p) => p.t_s >= 6 * 3600)!;
    expect(mid(res.bottom).airUpper_C).toBeGreaterThan(mid(res.bottom).airLower_C);
    expect(mid(res.top).airUpper_C).toBeLessThan(mid(res.top).airLower_C);
    // The default couples the packs to the load: its surface is cooled below where it was packed.
    const minSurface = Math.min(...res.around.series.map((p) => p.products[0].surface_C));
    expect(minSurface).toBeLessThan(3);
    for (const r of Object.values(res)) expect(r.energyBalanceError!).toBeLessThan(1e-9);
  });

  it("packs on top intercept the lid's heat, packs underneath the base's", () => {
    const top = run(plan("top"));
    const bottom = run(plan("bottom"));
    // A face against packs has a colder inner surface, so more heat crosses it.
    expect(top.heatGain_J.lid).toBeGreaterThan(bottom.heatGain_J.lid);
    expect(bottom.heatGain_J.base).toBeGreaterThan(top.heatGain_J.base);
  });

  it("a freeze-sensitive salad touching gel packs from the freezer fails on its lower limit next to the packs", () => {
    // Before placement was modelled the packs touched nothing and this plan held the whole route.
    const r = run(plan("around", { products: [{ product: P("Mixed salad"), count: 1, start_C: 3 }], route: D.routes[0] }));
    expect(r.failsFirst).toMatchObject({ limit: "lower", point: "next to a pack" });
    expect(r.holdTime_s).not.toBeNull();
    // Kept apart from the load, the same packs do not freeze it.
    const apart = run(plan("around", { products: [{ product: P("Mixed salad"), count: 1, start_C: 3 }], route: D.routes[0], packs: [{ pack: K("Gel"), count: 4, conditioning_C: -18, placement: "around", contactWith: "none" }] }));
    expect(apart.failsFirst?.point).not.toBe("next to a pack");
  });

  it("'around' shares the packs out as the diagram shows them", () => {
    expect(placementSplit("around", 1)).toEqual({ bottom: 0, top: 1, side: 0 });
    expect(placementSplit("around", 3)).toEqual({ bottom: 1, top: 1, side: 1 });
    expect(placementSplit("around", 4)).toEqual({ bottom: 1, top: 2, side: 1 });
    expect(placementSplit("side", 4)).toEqual({ bottom: 0, top: 0, side: 4 });
  });
});
