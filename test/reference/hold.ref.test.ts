import { describe, it, expect } from "vitest";
import { runHoldParsed, steadyUA } from "../../lib/physics/hold";
import { holdInputSchema, type HoldInput } from "../../lib/schemas/hold";
import { DEMO_SCENARIO as D } from "../../lib/db/demo-scenario";

const P = (n: string) => D.products.find((p) => p.name.startsWith(n))!;
const K = (n: string) => D.packs.find((p) => p.name.startsWith(n))!;
const S = (n: string) => D.shippers.find((p) => p.name.startsWith(n))!;
const M = (n: string) => D.materials.find((m) => m.name === n)!;
const constantRoute = (T: number, hours: number, sun = 0) => ({
  name: "constant",
  notes: "",
  segments: [{ label: "constant", duration_s: hours * 3600, airTemp_C: T, airSpeed_m_s: 0, sun_W_m2: sun, lidOpenings: 0, lidOpenDuration_s: 0 }],
});
const run = (x: HoldInput, opts = {}) => runHoldParsed(holdInputSchema.parse(x), opts);
const noBand = { outerH_frac: 0, insulationK_frac: 0, conditioning_K: 0 };

describe("ice only, constant ambient: melt time = (latent + sensible heat) ÷ (UA·ΔT)", () => {
  // The textbook series-resistance UA (Incropera & DeWitt, 6th ed., §3.1, Eq. 3.19: R_tot = 1/(h_o A) + Σ L/(kA) + 1/(h_i A)),
  // with the edge/corner shape factors of Table 4.1 (from memory), in series with the film between inside
  // air and the packs. Sensible heat: the ice from its conditioning temperature to 0 °C, and the wall from
  // the ambient temperature it starts at to its steady mean (about halfway).
  it("agrees within 5 % for a thin foam cooler with four 1 kg ice bricks at 30 °C", () => {
    const hO = 10;
    const hI = 5;
    const box = S("Quillfield thin");
    const ice = K("Water ice");
    const r = run({
      products: [],
      shipper: box,
      materials: D.materials,
      packs: [{ pack: ice, count: 4, conditioning_C: -18 }],
      route: constantRoute(30, 72),
      ruleSet: D.rulesets[0],
      overrides: { outerH_W_m2K: hO, innerH_W_m2K: hI, wallUA_W_K: null, sunShareSides: 0.25, lidOpenAirChangesPerMinute: 6 },
      uncertainty: noBand,
      extendFraction: 0,
    });
    const eps = M("EPS foam, 16 kg/m³");
    const layers = box.wallLayers.map((l) => ({ thickness_m: l.thickness_m, k_W_mK: eps.conductivity_W_mK, rho_kg_m3: eps.density_kg_m3, c_J_kgK: eps.specificHeat_J_kgK, insulation: true }));
    const inner = { L: box.innerLength_m, W: box.innerWidth_m, H: box.innerHeight_m };
    const t = box.wallLayers[0].thickness_m;
    const edgeG = eps.conductivity_W_mK * (0.54 * 4 * (inner.L + inner.W + inner.H) + 8 * 0.15 * t);
    const ua = steadyUA(layers, layers, inner, hO, hI, 1, edgeG).total_W_K;
    const packArea = 4 * 2 * (ice.length_m * ice.width_m + ice.length_m * ice.thickness_m + ice.width_m * ice.thickness_m);
    const UA = 1 / (1 / ua + 1 / (hI * packArea));
    const wallVolume = (2 * (inner.L + inner.W) * inner.H + 2 * inner.L * inner.W) * t;
    const heat = 4 * (ice.latentHeat_J_kg + ice.cpSolid_J_kgK * 18) + eps.density_kg_m3 * eps.specificHeat_J_kgK * wallVolume * 15;
    const expected = heat / (UA * 30);
    const melted = r.series.find((p) => p.packs[0].latentLeft <= 0);
    expect(melted).toBeDefined();
    console.log(`ice-only melt: model ${(melted!.t_s / 3600).toFixed(2)} h, formula ${(expected / 3600).toFixed(2)} h (${((melted!.t_s / expected - 1) * 100).toFixed(2)} %)`);
    expect(Math.abs(melted!.t_s / expected - 1)).toBeLessThan(0.05);
    expect(r.energyBalanceError).toBeLessThan(1e-9);
  });
});

describe("open cold-box protocol: WHO PQS cold life at a constant +43 °C", () => {
  // WHO PQS E004 cold-box test: constant +43 °C ambient, frozen water packs; cold life ends when the
  // coldest-box compartment first exceeds +10 °C (the +10 °C end point is from memory; the 43 °C ambient
  // is CONFIRMED in published-values.md §7). Here: the demo catering box, six 1 kg ice bricks at −20 °C,
  // end point judged on the inside node after it has first cooled below +10 °C.
  it("states the cold life of the thick catering box (hours) and closes its energy balance", () => {
    const r = run({
      products: [],
      shipper: S("Quillfield thick"),
      materials: D.materials,
      packs: [{ pack: K("Water ice"), count: 6, conditioning_C: -20 }],
      route: constantRoute(43, 240),
      ruleSet: D.rulesets[0],
      uncertainty: noBand,
      extendFraction: 0,
    });
    const firstCold = r.series.findIndex((p) => p.air_C < 10);
    expect(firstCold).toBeGreaterThan(0);
    const end = r.series.findIndex((p, i) => i > firstCold && p.air_C > 10);
    expect(end).toBeGreaterThan(firstCold);
    const coldLife_h = r.series[end].t_s / 3600;
    // 6 kg of ice, ~2 MJ of latent heat, against ~0.55 W/K × ~40 K ≈ 22 W: about a day; the test pins it to 10–60 h.
    expect(coldLife_h).toBeGreaterThan(10);
    expect(coldLife_h).toBeLessThan(60);
    expect(r.energyBalanceError).toBeLessThan(1e-9);
    console.log(`WHO PQS-style cold life (+43 °C, +10 °C end point), demo thick box with 6 kg ice: ${coldLife_h.toFixed(1)} h`);
  });
});

describe("mesh and time-step refinement change the hold time by < 1 %", () => {
  it("chilled load with gel packs on the summer lunch route, and a frozen load overnight", () => {
    const cases: HoldInput[] = [
      {
        products: [{ product: P("Roast chicken"), count: 1, start_C: 1 }, { product: P("Steamed rice"), count: 1, start_C: 2 }],
        shipper: S("Quillfield thick"),
        materials: D.materials,
        packs: [{ pack: K("Gel pack"), count: 4, conditioning_C: -18 }],
        route: { ...D.routes[0], segments: D.routes[0].segments.map((s) => ({ ...s, duration_s: s.duration_s * 4 })) },
        ruleSet: D.rulesets[1],
        boxStart_C: 5,
        uncertainty: noBand,
        extendFraction: 2,
      },
      {
        products: [{ product: P("Cod fillets"), count: 1, start_C: -22 }],
        shipper: S("Quillfield lined"),
        materials: D.materials,
        packs: [{ pack: K("Eutectic"), count: 2, conditioning_C: -30 }],
        route: D.routes[1],
        ruleSet: D.rulesets[0],
        uncertainty: noBand,
        extendFraction: 2,
      },
    ];
    for (const c of cases) {
      const a = run(c);
      const b = run(c, { resolution: 2 });
      const ta = a.holdTime_s ?? a.routeLength_s + a.margin_s!;
      const tb = b.holdTime_s ?? b.routeLength_s + b.margin_s!;
      expect(a.marginIsLowerBound).toBe(false);
      console.log(`refinement: hold ${(ta / 3600).toFixed(3)} h → ${(tb / 3600).toFixed(3)} h with twice the nodes and half the steps (${((ta / tb - 1) * 100).toFixed(3)} %)`);
      expect(Math.abs(ta / tb - 1)).toBeLessThan(0.01);
      expect(a.energyBalanceError).toBeLessThan(1e-9);
      expect(b.energyBalanceError).toBeLessThan(1e-9);
    }
  });
});

describe("heat by path is the net heat through each face; the balance says when it means nothing", () => {
  // Hand reasoning: a cold box in warm, sunny air gains heat through every face (air and sun both push
  // heat in), so no face's net gain can be negative. Before, the sun was booked apart and the lid's
  // "exchange with outside air" came out negative (the sunlit lid is warmer than the air).
  it("cold load, 30 °C air and 900 W/m² of sun: every face gains, sun is folded into the face it hits", () => {
    const r = run({
      products: [{ product: P("Roast chicken"), count: 1, start_C: 3 }],
      shipper: { ...S("Quillfield thin"), finishMaterial: "Black paint" },
      materials: D.materials,
      packs: [{ pack: K("Gel pack"), count: 4, conditioning_C: -18 }],
      route: constantRoute(30, 6, 900),
      ruleSet: D.rulesets[1],
      uncertainty: noBand,
      extendFraction: 0,
    });
    const g = r.heatGain_J;
    console.log(`net heat by face (Wh): sides ${(g.sides / 3600).toFixed(1)}, base ${(g.base / 3600).toFixed(1)}, lid ${(g.lid / 3600).toFixed(1)}`);
    for (const v of [g.sides, g.base, g.lid, g.edgesAndCorners]) expect(v).toBeGreaterThan(0);
    // The sunlit lid takes more per square metre than the shaded base.
    expect(g.lid).toBeGreaterThan(g.base);
    expect(r.energyBalanceError!).toBeLessThan(1e-9);
  });

  // Hand reasoning: load, box and air all at 5 °C on a 5 °C route with no sun: no temperature differs, so
  // no heat moves and a relative balance error is 0/0 — the planner must say "not meaningful".
  it("everything at 5 °C: no heat moves, the energy balance is null (not meaningful), not a ratio of noise", () => {
    const r = run({
      products: [{ product: P("Roast chicken"), count: 1, start_C: 5 }],
      shipper: S("Quillfield thin"),
      materials: D.materials,
      packs: [],
      route: constantRoute(5, 4),
      ruleSet: D.rulesets.find((x) => x.name.startsWith("England"))!,
      boxStart_C: 5,
      uncertainty: noBand,
      extendFraction: 0,
    });
    expect(r.energyBalanceError).toBeNull();
    expect(Math.abs(r.energyBalanceError_J)).toBeLessThan(1);
  });
});

describe("step error target and largest step, chosen by measured accuracy (the solver's own refinement as reference)", () => {
  // The network's error target (LTE_PER_TARGET) and the planner's 1 h largest step were chosen so that the
  // band's hold times stay within about 0.1 % of a run with 4× the nodes, 1/4 of the largest step and 1/4 of the
  // step error. Checked here at 0.2 % on the 48 h frozen bench plan (a reference for a time-stepping claim
  // is the method's own limit: no published table covers this network).
  it("frozen 48 h route with its band: low, central and high within 0.2 % of the 4×-refined run; energy closes", async () => {
    const { holdInput } = await import("../../scripts/bench-cases");
    const inp = holdInput(true);
    const a = runHoldParsed(inp);
    const b = runHoldParsed(inp, { resolution: 4 });
    for (const k of ["low", "central", "high"] as const) {
      const x = a.band[k]!;
      const y = b.band[k]!;
      console.log(`band ${k}: ${(x / 3600).toFixed(4)} h at the defaults, ${(y / 3600).toFixed(4)} h refined 4× (${((x / y - 1) * 100).toFixed(3)} %)`);
      expect(Math.abs(x / y - 1)).toBeLessThan(0.002);
    }
    expect(a.energyBalanceError!).toBeLessThan(1e-12);
  }, 60_000);

  // The demo's summer lunch run in the thin cooler, three gel packs on top kept apart from the load, England's rules.
  const saladInThinCooler = (products: HoldInput["products"]) =>
    holdInputSchema.parse({
      products,
      shipper: S("Quillfield thin"),
      materials: D.materials,
      packs: [{ pack: K("Gel"), count: 3, conditioning_C: -18, placement: "top", contactWith: "none" }],
      route: D.routes.find((r) => r.name.startsWith("Summer"))!,
      ruleSet: D.rulesets.find((x) => x.name.startsWith("England"))!,
      uncertainty: noBand,
      extendFraction: 0.5,
    });

  // Packed near its limit into a box still at room temperature: the inside air (24 °C, the first segment's)
  // warms the tub's surface past 8 °C within seconds, before the packs and the load cool the air. The first
  // 60 s step used to be kept whatever it missed: 2,299 s at the defaults against 6 s refined 8×.
  it("a salad tub at 7.5 °C put into the thin cooler at 24 °C: its surface leaves the band within the first minute at the defaults too", () => {
    const inp = saladInThinCooler([{ product: P("Mixed salad"), count: 2, start_C: 7.5 }]);
    const a = runHoldParsed(inp);
    const b = runHoldParsed(inp, { resolution: 8 });
    console.log(`salad at 7.5 °C: surface above 8 °C after ${a.holdTime_s!.toFixed(1)} s at the defaults, ${b.holdTime_s!.toFixed(1)} s refined 8×`);
    for (const r of [a, b]) expect(r.failsFirst).toMatchObject({ point: "surface", limit: "upper" });
    expect(a.holdTime_s!).toBeLessThan(60);
    expect(b.holdTime_s!).toBeLessThan(60);
  }, 60_000);

  // Short events and the product's surface: the demo's own lunch route has lid openings of 20, 30 and 45 s,
  // each a little warm air on a chilled load. A salad tub in the thin cooler, packed at 4.2 °C, leaves its
  // band at its surface during the second drop's opening. Before, the whole opening was one backward-Euler
  // step and the tub had a uniform 9-node grid: its surface peak was about 0.27 K low, so the model missed
  // that opening and said 1.455 h against 1.273 h refined (14 %). Now the peak is within about 0.04 K.
  // The central run is checked: a crossing decided by a peak a few hundredths of a kelvin above the limit
  // flips with any model change of that size (the band's corners each have such a start temperature), and
  // at 4.2 °C the peak the central run crosses is about 0.2 K over the limit.
  it("chilled lunch route with 20–45 s lid openings: the surface crosses 8 °C in the same opening, within 0.2 % of the 4×-refined run", () => {
    const inp = saladInThinCooler([
      { product: P("Roast chicken"), count: 1, start_C: 3 },
      { product: P("Mixed salad"), count: 2, start_C: 4.2 },
    ]);
    const a = runHoldParsed(inp);
    const b = runHoldParsed(inp, { resolution: 4 });
    const x = a.holdTime_s!;
    const y = b.holdTime_s!;
    console.log(`lunch route, salad at 4.2 °C: ${(x / 3600).toFixed(4)} h at the defaults, ${(y / 3600).toFixed(4)} h refined 4× (${((x / y - 1) * 100).toFixed(3)} %)`);
    for (const r of [a, b]) expect(r.failsFirst).toMatchObject({ product: P("Mixed salad").name, point: "surface", limit: "upper" });
    // The refined run crosses during a lid opening (at most 45 s long, plus the minute after it).
    expect(b.openings_s.some((o) => y >= o && y <= o + 105)).toBe(true);
    expect(Math.abs(x / y - 1)).toBeLessThan(0.002);
  }, 60_000);
});
