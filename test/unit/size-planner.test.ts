import { describe, it, expect } from "vitest";
import { DEMO_SCENARIO as D } from "../../lib/db/demo-scenario";
import { sizeInputSchema, type SizeInput } from "../../lib/schemas/size";
import { holdInputSchema } from "../../lib/schemas/hold";
import { planSizing, runSizing, evaluateHere, candidateHoldInput } from "../../lib/physics/sizing";
import { runHoldParsed } from "../../lib/physics/hold";
import { sizePlanner, candidateHold, candidateHandoffSchema, carriedLabel } from "../../lib/planners/size";
import { packOutSheet } from "../../lib/planners/pack-out-sheet";
import { encodeHandoff, decodeHandoff, MAX_HANDOFF_CHARS } from "../../lib/planners/handoff";
import { kit } from "../../lib/planners/view-kit";
import type { UnitPrefs } from "../../lib/units";

const f = <T extends { name: string }>(xs: T[], s: string) => xs.find((x) => x.name.startsWith(s))!;
const US: UnitPrefs = { temperatureUnit: "F", massUnit: "lb", lengthUnit: "in" };
const base: SizeInput = {
  products: [{ product: f(D.products, "Roast chicken"), count: 1, start_C: 2 }],
  route: f(D.routes, "Overnight"),
  ruleSet: D.rulesets[0],
  materials: D.materials,
  boxes: [{ shipper: f(D.shippers, "Quillfield thin"), thicknessVariants_m: [0.04] }],
  packs: [
    { pack: f(D.packs, "Gel"), minCount: 0, maxCount: 4, conditioning_C: [-18] },
    { pack: f(D.packs, "Dry ice"), minCount: 0, maxCount: 1, conditioning_C: [-78.5] },
  ],
  margin: { kind: "percent", value: 20 },
  judgeBy: "central",
};
const names = [...D.products, ...D.shippers, ...D.packs, ...D.routes, ...D.rulesets, ...D.materials].map((x) => x.name).sort((a, b) => b.length - a.length);
/** The text a person reads, with template names (their own words, units and all) taken out. */
const prose = (xs: string[]) => names.reduce((t, n) => t.split(n).join("«name»"), xs.join("\n"));

describe("carrying a candidate in the address", () => {
  const inp = sizeInputSchema.parse(base);
  const plan = planSizing(inp);
  const c = plan.candidates.find((x) => x.counts[0] === 3 && x.counts[1] === 0 && x.variant_m === null)!;

  it("keeps only the box's own materials, and the hold planner computes the same hold from it", () => {
    const h = candidateHold(inp, c);
    expect(h.materials.length).toBeGreaterThan(0);
    expect(h.materials.length).toBeLessThan(inp.materials.length);
    const central = { outerH_frac: 0, insulationK_frac: 0, conditioning_K: 0 };
    const full = runHoldParsed({ ...candidateHoldInput(inp, c, 0.5), uncertainty: central });
    const carried = runHoldParsed({ ...h, uncertainty: central });
    expect(carried.holdTime_s).toBe(full.holdTime_s);
  });

  it("round-trips through the address, compactly, and the hold schema accepts what arrives", async () => {
    const text = await encodeHandoff({ input: candidateHold(inp, c) });
    expect(text).toMatch(/^[A-Za-z0-9_-]+$/);
    expect(text.length).toBeLessThan(MAX_HANDOFF_CHARS);
    const back = candidateHandoffSchema.safeParse(await decodeHandoff(text));
    expect(back.success).toBe(true);
    expect(back.success && back.data.input.packs.map((p) => [p.pack.name, p.count])).toEqual([["Gel pack, 600 g", 3]]);
    expect(holdInputSchema.safeParse(back.success && back.data.input).success).toBe(true);
    // How it reads is made on arrival, in that page's units.
    expect(back.success && carriedLabel(back.data.input, kit(US))).toBe("Quillfield thin foam cooler with 3 × Gel pack, 600 g at -0.4 °F");
  });

  it("answers null, never throws, for anything that is not a carried input", async () => {
    const bomb = await encodeHandoff("x".repeat(2_000_000)); // inflates far past the limit
    expect(bomb.length).toBeLessThan(MAX_HANDOFF_CHARS);
    for (const bad of [undefined, "", 42, ["a"], "not base64!", "AAAA", "x".repeat(MAX_HANDOFF_CHARS + 1), bomb, (await encodeHandoff("ok")).slice(0, -2)]) {
      expect(await decodeHandoff(bad)).toBeNull();
    }
  });
});

describe("the sizer's view and the pack-out sheet in the person's units", { timeout: 120_000 }, () => {
  it("a sizing record in °F, lb and in: no SI unit and no raw kind code outside template names", async () => {
    const inp = sizeInputSchema.parse(base);
    const r = await runSizing(inp, evaluateHere(inp));
    expect(r.candidates.some((c) => c.holds)).toBe(true);
    const v = sizePlanner.view(inp, r, US);
    const text = prose([v.headline, ...v.facts.map((x) => x.value), ...v.inputs.map((x) => x.value), ...v.tables.flatMap((t) => [t.title, ...t.columns, ...t.rows.flat()]), ...v.assumptions]);
    expect(text).not.toMatch(/°C|\d\s?kg\b|\d\s?mm\b|\d\s?K\b/);
    expect(text).not.toMatch(/dry_ice|water_ice|\bpcm\b|\bgel\b/);
    expect(text).toContain("Dry ice (solid CO₂)");
    // 0.04 m insulation variant = 1.575 in (1 in = 25.4 mm exactly, NIST SP 811 Appendix B).
    expect(text).toContain("1.575 in");
    const csvRow = sizePlanner.csv(inp, r, US)[0];
    expect(Object.keys(csvRow)).toContain("mass_lb");
  });

  it("the pack-out sheet in °F says 134.6 °F for the 57 °C hot limit, never 135 °F, and keeps to one formatter", () => {
    // 57 °C × 9/5 + 32 = 134.6 °F exactly (NIST SP 811 Appendix B).
    const inp = sizeInputSchema.parse(base);
    const plan = planSizing(inp);
    const h = candidateHold(inp, plan.candidates.find((x) => x.counts[0] === 2 && x.counts[1] === 1)!);
    const fake = { routeLength_s: 36000, band: { low: 30000, central: 40000, high: 50000 }, failsFirst: null } as unknown as Parameters<typeof packOutSheet>[1];
    const s = packOutSheet(h, fake, true, [3600, null], US);
    const all = [s.box, ...s.packRows.flat(), s.conditioningNote, s.wallsLabel, s.hold ?? "", s.limits, s.reminder, s.route, ...s.cautions, ...s.signOff];
    const text = prose(all);
    expect(s.limits).toContain("134.6 °F");
    expect(text).not.toContain("135 °F");
    expect(text).not.toMatch(/°C|\d\s?kg\b|\d\s?mm\b|\d\s?K\b/);
    expect(s.packRows.map((r) => r[1])).toEqual(["Gel pack", "Dry ice (solid CO₂)"]);
    expect(s.packRows[1][3]).toBe("as delivered");
    // Every temperature on the sheet is the kit's own reading of an SI value.
    const k = kit(US);
    expect(s.packRows[0][3]).toBe(k.temp(-18));
    expect(s.cautions[0]).toContain(k.mass(f(D.packs, "Dry ice").mass_kg));
    expect(s.conditioningNote).toContain("68 °F"); // the 20 °C start
  });
});
