import { describe, it, expect } from "vitest";
import { runSizing, evaluateHere, planSizing, candidateHoldInput, requiredHold } from "../../lib/physics/sizing";
import { sizeInputSchema, type SizeInput } from "../../lib/schemas/size";
import { runValidated } from "../../lib/schemas/run";
import { DEMO_SCENARIO as D } from "../../lib/db/demo-scenario";

const f = <T extends { name: string }>(xs: T[], s: string) => xs.find((x) => x.name.startsWith(s))!;
const base: SizeInput = {
  products: [{ product: f(D.products, "Roast chicken"), count: 1, start_C: 2 }],
  route: f(D.routes, "Overnight"),
  ruleSet: D.rulesets[1],
  materials: D.materials,
  boxes: [{ shipper: f(D.shippers, "Quillfield thin"), thicknessVariants_m: [0.04] }, { shipper: f(D.shippers, "Quillfield lined"), thicknessVariants_m: [] }],
  packs: [
    { pack: f(D.packs, "Water ice"), minCount: 0, maxCount: 5, conditioning_C: [-18, -25] },
    { pack: f(D.packs, "Gel"), minCount: 0, maxCount: 5, conditioning_C: [-18] },
  ],
  margin: { kind: "percent", value: 20 },
};
const run = (x: SizeInput) => {
  const p = sizeInputSchema.parse(x);
  return runSizing(p, evaluateHere(p));
};
const summary = (r: Awaited<ReturnType<typeof run>>) => ({
  holds: r.candidates.map((c) => [c.index, c.verdict]),
  pareto: r.pareto,
});

describe("pack-out sizer", { timeout: 180_000 }, () => {
  it("pruned and unpruned searches give the identical answer (and brute force agrees)", async () => {
    const pruned = await run({ ...base, prune: true });
    const brute = await run({ ...base, prune: false });
    expect(pruned.pruned).toBeGreaterThan(0);
    expect(brute.pruned).toBe(0);
    expect(summary(pruned)).toEqual(summary(brute));
    expect(pruned.pareto.length).toBeGreaterThan(0);
    // Colder first: a warmer twin of a failing pack-out is decided without a run, and its "at most" hold
    // is no shorter than the hold brute force finds for it.
    const twins = pruned.candidates.filter((c) => c.pruned && c.verdict === "fails");
    expect(twins.length).toBeGreaterThan(0);
    for (const c of twins) {
      const b = brute.candidates.find((x) => x.index === c.index)!;
      expect(c.holdIsUpperBound).toBe(true);
      expect(b.hold_s ?? Infinity).toBeLessThanOrEqual((c.hold_s ?? Infinity) + 1e-6);
    }
  });

  it("pruning stays identical to brute force on a sunny route, judged at the low end over every corner", async () => {
    const sunny = { ...f(D.routes, "Overnight"), segments: f(D.routes, "Overnight").segments.map((s) => ({ ...s, sun_W_m2: 800, duration_s: s.duration_s / 3 })) };
    const x: SizeInput = { ...base, route: sunny, boxes: [{ shipper: f(D.shippers, "Quillfield thin"), thicknessVariants_m: [] }], packs: [{ pack: f(D.packs, "Gel"), minCount: 0, maxCount: 8, conditioning_C: [-18] }] };
    const pruned = await run({ ...x, prune: true });
    const brute = await run({ ...x, prune: false });
    expect(pruned.pruned).toBeGreaterThan(0);
    expect(summary(pruned)).toEqual(summary(brute));
    // The monotone claim pruning rests on: with sun too, more packs never shorten the judged hold.
    const holds = brute.candidates.map((c) => c.hold_s ?? Infinity);
    for (let i = 1; i < holds.length; i++) expect(holds[i]).toBeGreaterThanOrEqual(holds[i - 1]);
  });

  it("never prunes when a product could freeze (lower limit), and still agrees with brute force", async () => {
    const salad = { ...base, products: [{ product: f(D.products, "Mixed salad"), count: 1, start_C: 3 }], packs: [{ pack: f(D.packs, "Eutectic"), minCount: 0, maxCount: 4, conditioning_C: [-30] }] };
    const a = await run({ ...salad, prune: true });
    const b = await run({ ...salad, prune: false });
    expect(a.pruned).toBe(0);
    expect(summary(a)).toEqual(summary(b));
  });

  it("more margin never picks a lighter pack-out", async () => {
    const lightest = async (m: number) => {
      const r = await run({ ...base, margin: { kind: "percent", value: m } });
      const front = r.candidates.filter((c) => r.pareto.includes(c.index));
      return front.length ? Math.min(...front.map((c) => c.mass_kg)) : Infinity;
    };
    const ms = [0, 20, 60];
    const masses = [];
    for (const m of ms) masses.push(await lightest(m));
    for (let i = 1; i < masses.length; i++) expect(masses[i]).toBeGreaterThanOrEqual(masses[i - 1]);
  });

  it("gives near misses with reasons, and says clearly when nothing holds", async () => {
    const r = await run({ ...base, boxes: [base.boxes[0]], packs: [{ pack: f(D.packs, "Gel"), minCount: 0, maxCount: 3, conditioning_C: [-18] }], margin: { kind: "hours", value: 200 } });
    expect(r.candidates.every((c) => !c.holds)).toBe(true);
    expect(r.message).toMatch(/No candidate holds/);
  });

  it("refuses a search over the cap at once, and an empty pack list", () => {
    const big = { ...base, maxCandidates: 100, packs: [{ pack: f(D.packs, "Water ice"), minCount: 0, maxCount: 60, conditioning_C: [-18, -20, -25] }] };
    expect(() => planSizing(sizeInputSchema.parse(big))).toThrow(/more than the 100 allowed/);
    const r = runValidated(sizeInputSchema, { ...base, packs: [] }, (x) => x);
    expect(r.ok).toBe(false);
  });

  it("marks combinations that do not fit", async () => {
    const r = await run({ ...base, boxes: [{ shipper: f(D.shippers, "Quillfield lined"), thicknessVariants_m: [] }], packs: [{ pack: f(D.packs, "Water ice"), minCount: 12, maxCount: 16, conditioning_C: [-18] }] });
    expect(r.doesNotFit).toBeGreaterThan(0);
  });

  it("required hold = route × (1 + margin %) or route + hours", () => {
    const p = sizeInputSchema.parse(base);
    const L = p.route.segments.reduce((a, s) => a + s.duration_s, 0);
    expect(requiredHold(p, L)).toBeCloseTo(L * 1.2, 6);
    expect(requiredHold({ ...p, margin: { kind: "hours", value: 2 } }, L)).toBeCloseTo(L + 7200, 6);
    const plan = planSizing(p);
    const h = candidateHoldInput(p, plan.candidates[0], 0.3);
    expect(h.packs.every((l) => l.count > 0)).toBe(true);
  });
});

describe("colder first, with repeated conditioning temperatures", { timeout: 120_000 }, () => {
  it("every candidate is decided once: run + decided without a run = all, and the verdicts match brute force", async () => {
    const x: SizeInput = { ...base, packs: [{ pack: f(D.packs, "Gel"), minCount: 0, maxCount: 3, conditioning_C: [-18, -18] }] };
    const pruned = await run({ ...x, prune: true });
    const brute = await run({ ...x, prune: false });
    expect(pruned.evaluated + pruned.pruned).toBe(pruned.candidates.length);
    expect(summary(pruned)).toEqual(summary(brute));
  });
});
