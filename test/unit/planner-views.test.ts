/**
 * The planners' views and CSV in the person's units: the demo hold, thaw and warm-up inputs (the pages'
 * defaults, built from the demo scenario) run through each registry entry's run → view → csv in SI and in
 * °F / lb / in. Unit conversions are exact by definition (NIST SP 811, Appendix B: T_F = T_C × 9/5 + 32).
 */
import { describe, it, expect } from "vitest";
import { DEMO_SCENARIO as D } from "../../lib/db/demo-scenario";
import { holdPlanner } from "../../lib/planners/hold";
import { thawPlanner } from "../../lib/planners/thaw";
import { warmupPlanner } from "../../lib/planners/warmup";
import type { PlannerEntry, PlanView } from "../../lib/planners/types";
import { defaultMethod } from "../../lib/physics/thaw";
import { DEFAULT_UNIT_PREFS, localizeText, type UnitPrefs } from "../../lib/units";

const SI: UnitPrefs = DEFAULT_UNIT_PREFS;
const US: UnitPrefs = { temperatureUnit: "F", massUnit: "lb", lengthUnit: "in" };
const byName = <T extends { name: string }>(xs: T[], re: RegExp) => xs.find((x) => re.test(x.name))!;
const ruleSet = D.rulesets[0];

/** The pages' first inputs (app/hold/HoldPlanner.tsx, app/thaw/ThawPlanner.tsx, app/warmup/WarmupPlanner.tsx). */
const DEMO = {
  hold: {
    products: [{ product: byName(D.products, /chicken/i), count: 1, start_C: 2 }],
    shipper: byName(D.shippers, /thick/i),
    materials: D.materials,
    packs: [{ pack: byName(D.packs, /gel/i), count: 4, conditioning_C: byName(D.packs, /gel/i).conditioning_C, placement: "around", contactWith: null, contact_W_m2K: 50 }],
    route: D.routes[0],
    ruleSet,
    boxStart_C: null,
  },
  thaw: { product: byName(D.products, /turkey/i), start_C: -18, endMargin_K: 0.5, endPoint_C: null, ruleSet, method: defaultMethod("fridge_air", null), compare: true, readyBy: "2026-12-05T11:00:00Z" },
  warmup: { product: byName(D.products, /chicken/i), start_C: 4, surroundings: { medium: "air", T_C: 25, speed_m_s: 0, emissivity: 0.9, h_W_m2K: null }, ruleSet, limit: "chilledMax", horizon_s: 8 * 3600, method: "auto" },
} as const;

async function run(entry: PlannerEntry, raw: unknown) {
  const parsed = entry.schema.parse(raw);
  const result = await entry.run(parsed);
  return { parsed, result, view: (u: UnitPrefs) => entry.view(parsed, result, u), csv: (u: UnitPrefs) => entry.csv(parsed, result, u) };
}

/** The displayed figure in a limit's label ("chill limit 41 °F" → 41). */
const labelValue = (label: string) => Number(/(-?\d+(?:\.\d+)?) (?:°F|°C)$/.exec(label)?.[1]);

function checkCharts(si: PlanView, us: PlanView) {
  expect(us.charts.length).toBe(si.charts.length);
  us.charts.forEach((c, i) => {
    const values = c.data.flatMap((d) => c.lines.map((l) => d[l.key]).filter((v): v is number => Number.isFinite(v)));
    expect(values.length).toBeGreaterThan(0);
    const lo = Math.min(...values);
    const hi = Math.max(...values);
    const span = Math.max(hi - lo, 1);
    for (const [j, l] of c.limits.entries()) {
      // Inside the fixed domain, or near the curves: a limit far off the data is in the wrong units.
      if (c.packState) expect(l.y >= 0 && l.y <= 100, `${c.testId}: ${l.label} in 0–100 %`).toBe(true);
      else expect(l.y >= lo - span && l.y <= hi + span, `${c.testId}: ${l.label} (${l.y}) against data ${lo}…${hi}`).toBe(true);
      // The same limit as in °C, converted exactly, and labelled with the figure it is drawn at.
      const inC = si.charts[i].limits[j].y;
      expect(l.y).toBeCloseTo((inC * 9) / 5 + 32, 1);
      expect(l.label.endsWith(c.unit)).toBe(true);
      expect(labelValue(l.label)).toBeCloseTo(l.y, 1);
    }
    if (c.unit === "°F") expect(c.yTitle).toContain("°F");
  });
}

/** Template names are the user's own words and stay as written; everything else is in their units. */
function textWithoutNames(view: PlanView, names: string[]) {
  let s = JSON.stringify(view);
  for (const n of names) s = s.split(JSON.stringify(n).slice(1, -1)).join("<name>");
  return s;
}

const names = (raw: Record<string, unknown>) =>
  JSON.stringify(raw)
    .match(/"name":"[^"]*"/g)!
    .map((m) => m.slice(8, -1));

describe.each([
  ["hold", holdPlanner as unknown as PlannerEntry, DEMO.hold],
  ["thaw", thawPlanner as unknown as PlannerEntry, DEMO.thaw],
  ["warmup", warmupPlanner as unknown as PlannerEntry, DEMO.warmup],
] as const)("%s view and CSV in the person's units (demo input)", (kind, entry, raw) => {
  it("°F / lb / in: no °C, kg or mm anywhere in the view, limits on the chart in °F, CSV columns _F", async () => {
    const r = await run(entry, raw);
    const si = r.view(SI);
    const us = r.view(US);
    const text = textWithoutNames(us, names(raw as Record<string, unknown>));
    expect(text).not.toMatch(/°C/);
    expect(text).not.toMatch(/\d\s?mm\b/);
    expect(text).not.toMatch(/\d\s?kg\b(?![/·])/);
    // A temperature difference in kelvin ("plus 0.5 K)") is a °F difference for this person.
    expect(text).not.toMatch(/\d\s?K\b(?![/·²])/);
    expect(text).toMatch(/°F/);
    // SI view: the same view in °C.
    expect(JSON.stringify(si)).toMatch(/°C/);
    expect(JSON.stringify(si)).not.toMatch(/°F/);
    expect(us.charts.flatMap((c) => c.limits).length).toBeGreaterThan(0);
    checkCharts(si, us);
    // No raw kind codes in anything a person reads.
    expect(text).not.toMatch(/fridge_air|still_water|running_water|room_air|dry_ice|\bpcm\b|chilledMax|hotHoldMin|frozenMax/);

    const csvUs = r.csv(US);
    const csvSi = r.csv(SI);
    expect(csvUs.length).toBeGreaterThan(10);
    const headUs = Object.keys(csvUs[0]);
    const headSi = Object.keys(csvSi[0]);
    expect(headUs[0]).toBe("t_s");
    expect(headUs.filter((h) => h.endsWith("_F")).length).toBeGreaterThan(0);
    expect(headUs.some((h) => h.endsWith("_C"))).toBe(false);
    expect(headSi.filter((h) => h.endsWith("_C")).length).toBe(headUs.filter((h) => h.endsWith("_F")).length);
    // Each °F column is its °C column converted.
    for (const h of headSi.filter((x) => x.endsWith("_C"))) {
      const f = h.replace(/_C$/, "_F");
      for (const i of [0, Math.floor(csvSi.length / 2), csvSi.length - 1]) expect(Number(csvUs[i][f])).toBeCloseTo((Number(csvSi[i][h]) * 9) / 5 + 32, 2);
    }
    expect(kind).toBe(entry.kind);
  }, 60_000);
});

describe("sentences from the model in °F (localizeText)", () => {
  it("converts a kelvin difference before a closing bracket, and leaves the K of a unit alone", () => {
    // A difference has no offset: 0.5 K = 0.9 °F (NIST SP 811, Appendix B).
    expect(localizeText("(initial freezing point −1.0 °C plus 0.5 K)", US)).toBe("(initial freezing point 30.2 °F plus 0.9 °F)");
    expect(localizeText("Surface coefficient 9.1 W/(m²·K) and 2.59 kJ/(kg·K)", US)).toBe("Surface coefficient 9.1 W/(m²·K) and 2.59 kJ/(kg·K)");
    expect(localizeText("within ±1 K", US)).toBe("within ±1.8 °F");
  });
});
