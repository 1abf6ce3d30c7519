import { describe, it, expect } from "vitest";
import { runHoldParsed, steadyUA } from "../../lib/physics/hold";
import { holdInputSchema, type HoldInput } from "../../lib/schemas/hold";
import { DEMO_SCENARIO as D } from "../../lib/db/demo-scenario";

/**
 * Packs conditioned at their own phase-change point start fully solid.
 * Hand calculation: with no load, a pack lasts t = (m·L + Q_sensible) / (UA·ΔT), ΔT = ambient − phase-change
 * point, UA the box's steady conductance (Incropera & DeWitt, 6th ed., §3.1, Eq. 3.19, series resistances,
 * plus the edge and corner shape factors of Table 4.1, from memory) in series with the film between the
 * inside air and the pack's surface. Q_sensible: the wall gives up the heat between its start at ambient and
 * its steady mean, about halfway to the inside (hand estimate; a few per cent of the total here).
 * Both inputs are the demo library's own templates at the library's default conditioning.
 */
const K = (n: string) => D.packs.find((p) => p.name.startsWith(n))!;
const S = (n: string) => D.shippers.find((p) => p.name.startsWith(n))!;
const M = (n: string) => D.materials.find((m) => m.name === n)!;
const constantRoute = (T: number, hours: number) => ({
  name: "constant",
  notes: "",
  segments: [{ label: "constant", duration_s: hours * 3600, airTemp_C: T, airSpeed_m_s: 0, sun_W_m2: 0, lidOpenings: 0, lidOpenDuration_s: 0 }],
});
const noBand = { outerH_frac: 0, insulationK_frac: 0, conditioning_K: 0 };
const run = (x: HoldInput) => runHoldParsed(holdInputSchema.parse(x));

function wallSensible(box: ReturnType<typeof S>, dT_K: number) {
  const eps = M(box.wallLayers[0].material);
  const t = box.wallLayers[0].thickness_m;
  const inner = { L: box.innerLength_m, W: box.innerWidth_m, H: box.innerHeight_m };
  const wallVolume = (2 * (inner.L + inner.W) * inner.H + 2 * inner.L * inner.W) * t;
  return eps.density_kg_m3 * eps.specificHeat_J_kgK * wallVolume * dT_K / 2;
}

describe("packs conditioned at their phase-change point start solid: t = m·L / (UA·ΔT)", () => {
  it("dry ice at the library default −78.5 °C in a thin cooler of given UA (wallUA override)", () => {
    const box = S("Quillfield thin");
    const dry = K("Dry ice");
    expect(dry.conditioning_C).toBe(-78.5);
    const UAbox = 0.3;
    const hI = 50;
    const Tamb = 25;
    const r = run({
      products: [],
      shipper: box,
      materials: D.materials,
      packs: [{ pack: dry, count: 1, conditioning_C: dry.conditioning_C }],
      route: constantRoute(Tamb, 48),
      ruleSet: D.rulesets[0],
      overrides: { outerH_W_m2K: 10, innerH_W_m2K: hI, wallUA_W_K: UAbox, sunShareSides: 0.25, lidOpenAirChangesPerMinute: 6, wellMixedInside: true },
      uncertainty: noBand,
      extendFraction: 0,
    });
    const packArea = 2 * (dry.length_m * dry.width_m + dry.length_m * dry.thickness_m + dry.width_m * dry.thickness_m);
    const UA = 1 / (1 / UAbox + 1 / (hI * packArea));
    const dT = Tamb - dry.phaseChange_C;
    const expected = (dry.mass_kg * dry.latentHeat_J_kg + wallSensible(box, dT)) / (UA * dT);
    const gone = r.dryIceGone_s;
    expect(gone).not.toBeNull();
    console.log(`dry ice from −78.5 °C: model ${(gone! / 3600).toFixed(2)} h, m·L/(UA·ΔT) ${(expected / 3600).toFixed(2)} h (${((gone! / expected - 1) * 100).toFixed(1)} %)`);
    expect(r.series[0].packs[0].latentLeft).toBeCloseTo(1, 6);
    expect(Math.abs(gone! / expected - 1)).toBeLessThan(0.05);
  });

  it("water ice conditioned at 0 °C in the thin cooler with its computed UA", () => {
    const box = S("Quillfield thin");
    const ice = K("Water ice");
    const hO = 10;
    const hI = 50;
    const Tamb = 30;
    const r = run({
      products: [],
      shipper: box,
      materials: D.materials,
      packs: [{ pack: ice, count: 4, conditioning_C: 0 }],
      route: constantRoute(Tamb, 72),
      ruleSet: D.rulesets[0],
      boxStart_C: Tamb,
      overrides: { outerH_W_m2K: hO, innerH_W_m2K: hI, wallUA_W_K: null, sunShareSides: 0.25, lidOpenAirChangesPerMinute: 6, wellMixedInside: true },
      uncertainty: noBand,
      extendFraction: 0,
    });
    const eps = M(box.wallLayers[0].material);
    const t = box.wallLayers[0].thickness_m;
    const layers = box.wallLayers.map((l) => ({ thickness_m: l.thickness_m, k_W_mK: eps.conductivity_W_mK, rho_kg_m3: eps.density_kg_m3, c_J_kgK: eps.specificHeat_J_kgK, insulation: true }));
    const inner = { L: box.innerLength_m, W: box.innerWidth_m, H: box.innerHeight_m };
    const edgeG = eps.conductivity_W_mK * (0.54 * 4 * (inner.L + inner.W + inner.H) + 8 * 0.15 * t);
    const ua = steadyUA(layers, layers, inner, hO, hI, 1, edgeG).total_W_K;
    const packArea = 4 * 2 * (ice.length_m * ice.width_m + ice.length_m * ice.thickness_m + ice.width_m * ice.thickness_m);
    const UA = 1 / (1 / ua + 1 / (hI * packArea));
    const expected = (4 * ice.mass_kg * ice.latentHeat_J_kg + wallSensible(box, Tamb)) / (UA * Tamb);
    expect(r.series[0].packs[0].latentLeft).toBeCloseTo(1, 6);
    const melted = r.series.find((p) => p.packs[0].latentLeft <= 0);
    expect(melted).toBeDefined();
    console.log(`water ice from 0 °C: model ${(melted!.t_s / 3600).toFixed(2)} h, m·L/(UA·ΔT) ${(expected / 3600).toFixed(2)} h (${((melted!.t_s / expected - 1) * 100).toFixed(1)} %)`);
    expect(Math.abs(melted!.t_s / expected - 1)).toBeLessThan(0.05);
  });

  it("the README's dry-ice example (cod, lined carton, 2.5 kg slab, overnight route) holds the whole route", () => {
    // Before the fix the slab started half sublimated and the cod left its band after 13.4 h of the 17 h route.
    const lined = S("Quillfield lined");
    const dry = K("Dry ice");
    const r = run({
      products: [{ product: D.products.find((p) => p.name.startsWith("Cod fillets"))!, count: 1, start_C: -22 }],
      shipper: lined,
      materials: D.materials,
      packs: [{ pack: dry, count: 1, conditioning_C: dry.conditioning_C }],
      route: D.routes.find((x) => x.name.startsWith("Overnight"))!,
      ruleSet: D.rulesets[0],
    });
    console.log(`README dry-ice example: holdTime ${r.holdTime_s}, central ${(r.band.central! / 3600).toFixed(2)} h, band ${(r.band.low! / 3600).toFixed(2)}–${(r.band.high! / 3600).toFixed(2)} h, route ${(r.routeLength_s / 3600).toFixed(1)} h`);
    expect(r.holdTime_s).toBeNull();
    expect(r.assumptions.join(" ")).toMatch(/starts fully frozen/);
  });
});
