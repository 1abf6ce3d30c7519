import { describe, it, expect } from "vitest";
import { runHoldParsed, holdPieces } from "../../lib/physics/hold";
import { plannerOf } from "../../lib/planners/registry";
import { holdPlanner } from "../../lib/planners/hold";
import { runPlannerPieces } from "../../lib/planners/run";
import { TestBoard } from "../helpers/piece-board";
import { holdInputSchema, type HoldInput } from "../../lib/schemas/hold";
import { runValidated } from "../../lib/schemas/run";
import { PhysicsInputError } from "../../lib/physics/validation";
import { DEMO_SCENARIO as D } from "../../lib/db/demo-scenario";
import { interpolate } from "../../lib/calibration/align";
import { holdInput } from "../../scripts/bench-cases";
import { lunchPlan } from "../helpers/synthetic-log";

const P = (n: string) => D.products.find((p) => p.name.startsWith(n))!;
const K = (n: string) => D.packs.find((p) => p.name.startsWith(n))!;
const S = (n: string) => D.shippers.find((p) => p.name.startsWith(n))!;
/** Parse then plan, as every caller does; bad input becomes a PhysicsInputError naming its field. */
const runHold = (raw: HoldInput) => {
  const parsed = holdInputSchema.safeParse(raw);
  if (!parsed.success) throw new PhysicsInputError(parsed.error.issues[0].path.join("."), parsed.error.issues[0].message);
  return runHoldParsed(parsed.data);
};
const noBand = { outerH_frac: 0, insulationK_frac: 0, conditioning_K: 0 };
const slowRoute = { ...D.routes[0], segments: D.routes[0].segments.map((s) => ({ ...s, duration_s: s.duration_s * 3 })) };
const base: HoldInput = {
  products: [{ product: P("Roast chicken"), count: 1, start_C: 1 }],
  shipper: S("Quillfield thin"),
  materials: D.materials,
  packs: [{ pack: K("Water ice"), count: 2, conditioning_C: -18 }],
  route: slowRoute,
  ruleSet: D.rulesets[1],
  boxStart_C: 8,
  uncertainty: noBand,
  extendFraction: 3,
};
const holdOf = (x: HoldInput) => {
  const r = runHoldParsed(holdInputSchema.parse(x));
  expect(r.energyBalanceError).toBeLessThan(1e-9);
  return r.holdTime_s ?? r.routeLength_s + r.margin_s!;
};

describe("hold planner: physics direction", () => {
  const t0 = holdOf(base);
  it("more insulation holds longer", () => {
    const thick = { ...base.shipper, wallLayers: [{ material: "EPS foam, 16 kg/m³", thickness_m: 0.05 }] };
    expect(holdOf({ ...base, shipper: thick })).toBeGreaterThan(t0);
  });
  it("more packs hold longer", () => {
    expect(holdOf({ ...base, packs: [{ pack: K("Water ice"), count: 4, conditioning_C: -18 }] })).toBeGreaterThan(t0);
  });
  it("colder conditioning holds longer", () => {
    expect(holdOf({ ...base, packs: [{ pack: K("Water ice"), count: 2, conditioning_C: -30 }] })).toBeGreaterThan(t0);
  });
  it("sun on a black finish shortens the hold against a white one", () => {
    const sunny = { ...slowRoute, segments: slowRoute.segments.map((s) => ({ ...s, sun_W_m2: 800 })) };
    const black = holdOf({ ...base, route: sunny, shipper: { ...base.shipper, finishMaterial: "Black paint" } });
    const white = holdOf({ ...base, route: sunny, shipper: { ...base.shipper, finishMaterial: "White TiO₂ coating" } });
    expect(black).toBeLessThan(white);
  });
});

describe("hold planner: results", () => {
  it("reports hold, margin, what fails first, the band, heat by path and a closed energy balance", () => {
    const r = runHold({ ...base, uncertainty: { outerH_frac: 0.3, insulationK_frac: 0.1, conditioning_K: 2 } });
    expect(r.failsFirst?.product).toBe(P("Roast chicken").name);
    expect(r.band.low!).toBeLessThanOrEqual(r.band.central!);
    expect(r.band.high!).toBeGreaterThanOrEqual(r.band.central!);
    const g = r.heatGain_J;
    expect(g.sides + g.base + g.lid + g.edgesAndCorners + g.lidOpenings).toBeGreaterThan(0);
    expect(g.lidOpenings).toBeGreaterThan(0);
    expect(r.series[0].products[0].center_C).toBeCloseTo(1, 6);
    expect(r.series.length).toBeGreaterThan(20);
    expect(r.assumptions.join(" ")).toMatch(/moisture/);
  });

  it("a freeze-sensitive product next to a dry-ice pack fails on its lower limit", () => {
    const r = runHold({
      ...base,
      products: [{ product: P("Mixed salad"), count: 1, start_C: 3 }],
      packs: [{ pack: K("Dry ice"), count: 1, conditioning_C: -78.5, contactWith: 0, contact_W_m2K: 50, placement: "top" }],
      shipper: S("Quillfield thick"),
    });
    expect(r.failsFirst).toMatchObject({ limit: "lower" });
    expect(r.hasDryIce).toBe(true);
    expect(r.co2Released_m3).toBeGreaterThan(0);
    expect(r.series.at(-1)!.packs[0].massLeft_kg).toBeLessThan(K("Dry ice").mass_kg);
  });

  it("hot food with no coolant is judged against the hot-holding limit", () => {
    const r = runHold({ ...base, products: [{ product: P("Steamed rice"), count: 1, start_C: 85 }], packs: [], ruleSet: D.rulesets[0] });
    expect(r.failsFirst).toMatchObject({ limit: "lower", limit_C: 57 });
  });

  it("reports the pack's latent heat running out", () => {
    const r = runHold({ ...base, extendFraction: 3 });
    const left = r.series.map((p) => p.packs[0].latentLeft);
    expect(left[0]).toBe(1);
    expect(Math.min(...left)).toBeLessThan(1);
  });
});

describe("hold planner: bad input changes nothing and says what to fix", () => {
  it("contents larger than the box", () => {
    const r = runValidated(holdInputSchema, { ...base, products: [{ product: P("Whole turkey"), count: 8, start_C: 2 }] }, (x) => runHoldParsed(x));
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.fieldErrors.products[0]).toMatch(/larger than the box/);
  });
  it("a product with no band in the rule set", () => {
    const r = runValidated(holdInputSchema, { ...base, products: [{ product: P("Roast chicken"), count: 1, start_C: 30 }] }, (x) => runHoldParsed(x));
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.fieldErrors["products.0.start_C"][0]).toMatch(/no band/);
  });
  it("a route of zero length and an empty load are schema errors", () => {
    expect(holdInputSchema.safeParse({ ...base, route: { ...slowRoute, segments: [] } }).success).toBe(false);
    expect(holdInputSchema.safeParse({ ...base, products: [], packs: [] }).success).toBe(false);
    expect(() => runHold({ ...base, route: { ...slowRoute, segments: [{ ...slowRoute.segments[0], duration_s: 0 }] } })).toThrow(PhysicsInputError);
  });
  it("a pack starts in the state its conditioning means: frozen at its melt point, partly melted just above it", () => {
    const gel = K("Gel");
    const at = (c: number) => runHold({ ...base, packs: [{ pack: gel, count: 2, conditioning_C: c }], extendFraction: 0 });
    expect(at(gel.phaseChange_C).series[0].packs[0].latentLeft).toBeCloseTo(1, 6);
    const half = at(gel.phaseChange_C + 0.125);
    expect(half.series[0].packs[0].latentLeft).toBeCloseTo(0.5, 2);
    expect(half.warnings.join(" ")).toMatch(/50 % melted/);
    expect(at(gel.phaseChange_C + 1).series[0].packs[0].latentLeft).toBe(0);
  });

  it("a pack warmer than its melt point is allowed, with a note", () => {
    const r = runHold({ ...base, packs: [{ pack: K("Water ice"), count: 2, conditioning_C: 4 }] });
    expect(r.warnings.join(" ")).toMatch(/above its melt point/);
  });
});

describe("hold planner: the box model's time stepping on a user's plan", () => {
  const dry = K("Dry ice");
  const dryOnly = (hours: number) =>
    runHold({
      products: [],
      shipper: S("Quillfield thin"),
      materials: D.materials,
      packs: [{ pack: dry, count: 1, conditioning_C: dry.conditioning_C }],
      route: { name: "constant", notes: "", segments: [{ label: "constant", duration_s: hours * 3600, airTemp_C: 25, airSpeed_m_s: 0, sun_W_m2: 0, lidOpenings: 0, lidOpenDuration_s: 0 }] },
      ruleSet: D.rulesets[0],
      overrides: { outerH_W_m2K: 10, innerH_W_m2K: 50, wallUA_W_K: 0.3, sunShareSides: 0.25, lidOpenAirChangesPerMinute: 6, wellMixedInside: true },
      uncertainty: noBand,
      extendFraction: 0,
    });
  it("no sun and no heat source inside: nothing gets warmer than the outside air, also as the last dry ice goes", () => {
    // A maximum principle of the heat equation; a long step run through the end of sublimation once put the
    // inside air at 48 °C in 25 °C air. Allowed: the step controller's own error aim (under 0.8 K a step at
    // the defaults; BDF2 overshoots by about 0.2 K as the box warms back to the outside air).
    const r = dryOnly(48);
    expect(r.dryIceGone_s).not.toBeNull();
    const hottest = Math.max(...r.series.map((p) => Math.max(p.air_C, p.packs[0].T_C)));
    expect(hottest).toBeLessThan(25 + 0.5);
    expect(r.energyBalanceError).toBeLessThan(1e-9);
  });
  it("the dry ice's end is placed within its step, not at the step's end", () => {
    const r = dryOnly(48);
    const after = r.series.find((p) => p.packs[0].latentLeft === 0)!;
    const before = r.series[r.series.indexOf(after) - 1];
    expect(r.dryIceGone_s!).toBeGreaterThan(before.t_s);
    expect(r.dryIceGone_s!).toBeLessThan(after.t_s);
  });
  it("the 48 h bench plan (demo library, dry ice and packs, frozen load) needs no Newton retries", () => {
    const r = runHoldParsed(holdInput(false));
    expect(r.newtonFailures).toBe(0);
    expect(r.energyBalanceError).toBeLessThan(1e-9);
  });
  it("the answer moves smoothly with the inputs (calibration fits it by finite differences)", () => {
    // A 0.1 % change in the wall's conductance moves the inside air by much less than a logger's noise at
    // every 5-minute reading, across segment changes and lid openings.
    const plan = (w: number) => runHold({ ...lunchPlan, uncertainty: noBand, calibration: { wallConductance: w, innerH: 1, contact: 1, source: "" } });
    const a = plan(1);
    const b = plan(1.001);
    const at = (r: typeof a, t: number) => interpolate({ t_s: r.series.map((p) => p.t_s), T_C: r.series.map((p) => p.air_C) }, t)!;
    let worst = 0;
    for (let t = 0; t <= 5 * 3600; t += 300) worst = Math.max(worst, Math.abs(at(a, t) - at(b, t)));
    expect(worst).toBeLessThan(0.05);
    expect(worst).toBeGreaterThan(0);
  });
});

describe("hold planner: the face next to a pack, on the page's default plan", () => {
  // The hold page's defaults: one roast chicken half tray packed at 2 °C, the thick catering box, gel packs
  // as conditioned in the library, placed around the load and touching it, the first demo route.
  const gel = K("Gel pack, 600");
  const pagePlan = (packs: number, salad: boolean): HoldInput => ({
    products: [{ product: P("Roast chicken"), count: 1, start_C: 2 }, ...(salad ? [{ product: P("Mixed salad"), count: 1, start_C: 3 }] : [])],
    shipper: S("Quillfield thick"),
    materials: D.materials,
    packs: [{ pack: gel, count: packs, conditioning_C: gel.conditioning_C, placement: "around" as const, contactWith: null, contact_W_m2K: 50 }],
    route: D.routes[0],
    ruleSet: D.rulesets.find((r) => r.isDefault)!,
    boxStart_C: null,
  });
  it("the number of packs decides whether the chicken holds the route", () => {
    const four = runHold(pagePlan(4, false));
    const one = runHold(pagePlan(1, false));
    expect(four.holdTime_s).toBeNull();
    expect(one.holdTime_s).not.toBeNull();
    expect(one.margin_s!).toBeLessThan(0);
  });
  it("salad leaves touching packs from the freezer: the face crosses its lower limit at a time that does not depend on the box model's grid", () => {
    // Before the face had its own column the time was one node of the body's grid cooling over the first
    // box step: 32, 17 and 10 s at refinements 1, 2 and 4. With the column, 0.79 s at all three while the
    // box's first step was a fixed 60 s (÷ refinement). Since that step is error-controlled (16 s at
    // refinement 1, shorter when refined, down to the network's shortest step of 1 s), the packs' surface
    // warms during it as the column sees it: 0.791, 0.800, 0.811 and 0.812 s at refinements 1, 2, 4 and 8
    // (4 and 8 both at the 1 s step; with a 0.1 s shortest step, 0.815 and 0.827 s). The column takes the
    // pack's surface linearly between box steps, so with a longer first step it sees the pack a little
    // colder in the first second than it is (it warms like √t): earlier, on the side of an earlier warning.
    // A crossing within the first second of packing is as exact as packing is instantaneous; what this
    // checks is that it stays within the first seconds at every grid. The contact solution for leaves
    // this loose puts it within the first second or two (see test/reference/contact-column.ref.test.ts).
    const parsed = holdInputSchema.parse(pagePlan(4, true));
    const at = [1, 2, 4].map((res) => runHoldParsed(parsed, { resolution: res }));
    for (const r of at) expect(r.failsFirst).toMatchObject({ product: P("Mixed salad").name, point: "next to a pack", limit: "lower" });
    expect(at[0].warnings.join(" ")).toMatch(/face against the packs .* keep it apart from the packs/);
    const t = at.map((r) => r.holdTime_s!);
    expect(t[0]).toBeLessThan(5);
    // The column alone is within 1 % of the contact solution (the reference check); here, 3 % between
    // grids at that shortest step, and the coarser grids never later than the finer (the early side).
    expect(Math.abs(t[0] - t[2]) / t[2]).toBeLessThan(0.03);
    expect(Math.abs(t[1] - t[2]) / t[2]).toBeLessThan(0.03);
    expect(t[0]).toBeLessThanOrEqual(t[2]);
  });
});

describe("hold planner: the band run in pieces on several threads (as the server's pool does)", () => {
  // The page's lead shows the quick answer from its own central run (PlannerPieces.quick): it must be what
  // the quick stage gives when run apart, for every kind of input the quick input differs in (only the
  // spreads are zeroed; calibrated boxes draw their band from fitted intervals).
  it("the quick answer from the lead's central run equals the quick input run apart, plain, extended, overridden, calibrated", () => {
    const intervals = { wallConductance: { low: 0.9, high: 1.1 }, innerH: { low: 0.8, high: 1.2 }, contact: { low: 0.7, high: 1.3 } };
    const calibration = { wallConductance: 1.2, innerH: 0.9, contact: 0.8, source: "test" };
    const base = holdInput(true);
    const variants: Partial<HoldInput>[] = [
      {},
      { extendFraction: 3 },
      { overrides: { ...base.overrides, outerH_W_m2K: 7, innerH_W_m2K: 4, wallUA_W_K: 0.8, sunShareSides: 0.6 } },
      { uncertainty: { outerH_frac: 0, insulationK_frac: 0, conditioning_K: 3 } },
      { uncertainty: { outerH_frac: 0.2, insulationK_frac: 0, conditioning_K: 0 } },
      { calibration: { ...calibration, intervals } },
      { calibration: { ...calibration, intervals }, uncertainty: { outerH_frac: 0, insulationK_frac: 0, conditioning_K: 2 } },
      { calibration },
    ];
    for (const v of variants) {
      const p = holdInputSchema.parse({ ...base, ...v });
      const q = holdPlanner.quick(p)!;
      const pieces = holdPieces(p);
      pieces.runLead();
      expect(pieces.quick(q.input)).toEqual(runHoldParsed(q.input));
    }
  });

  it("gives exactly the one-piece answer however the pieces are shared, through the registry's entry", () => {
    const inp = holdInput(true);
    const whole = runHoldParsed(inp);
    const entry = plannerOf("hold");
    expect(holdPieces(inp).count).toBe(9); // the central run and 8 corners
    for (const helperTook of [0, 1, 3, 8]) {
      const board = new TestBoard().helper(helperTook);
      expect(runPlannerPieces(entry, inp, board, "helper")).toEqual({ ok: true, value: null, parsed: null });
      expect(board.values.size).toBe(helperTook);
      // The lead takes what is left and collects the helper's; the answer is the same to the last digit.
      expect(runPlannerPieces(entry, inp, board.lead(), "lead")).toEqual({ ok: true, value: whole, parsed: expect.anything() });
      expect(board.values.size).toBe(8);
    }
  });
  it("a piece a helper gave up is run by the lead; a run too big for the board is run whole", () => {
    const inp = holdInput(true);
    const whole = runHoldParsed(inp);
    const entry = plannerOf("hold");
    const board = new TestBoard(1024, [2, 3]).helper(4);
    runPlannerPieces(entry, inp, board, "helper");
    expect(Number.isNaN(board.values.get(2))).toBe(true);
    expect(runPlannerPieces(entry, inp, board.lead(), "lead")).toEqual({ ok: true, value: whole, parsed: expect.anything() });
    const small = new TestBoard(4);
    expect(runPlannerPieces(entry, inp, small, "helper")).toEqual({ ok: true, value: null, parsed: null });
    expect(runPlannerPieces(entry, inp, small, "lead")).toEqual({ ok: true, value: whole, parsed: expect.anything() });
    expect(small.taken).toBe(0);
  });
  it("bad input: the lead answers with field errors, a helper takes nothing; a missing hold is an error, not a partial band", () => {
    const inp = holdInput(true);
    const board = new TestBoard();
    expect(runPlannerPieces(plannerOf("hold"), { ...inp, route: null }, board, "helper")).toEqual({ ok: true, value: null, parsed: null });
    expect(board.taken).toBe(0);
    const bad = runPlannerPieces(plannerOf("hold"), { ...inp, route: null }, board, "lead");
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(Object.keys(bad.fieldErrors)).toContain("route");
    const pieces = holdPieces(inp);
    pieces.runLead();
    expect(() => pieces.finish(new Float64Array(9).fill(NaN))).toThrow(/piece 1 of 9 is missing/);
  });
});

