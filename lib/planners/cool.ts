/**
 * The cooling planner's registry entry: will this cooked food, in this pan (or whole), by this method,
 * cool through both stages of the rule set in time, and how deep may the layer be? Physics in
 * lib/physics/cooling.ts; the schema in lib/schemas/cool.ts.
 */
import { coolInputSchema, COOL_METHOD_LABELS, GASTRONORM_SIZES, PAN_MATERIALS, type CoolParsed } from "../schemas/cool";
import { coolingRecord, runCoolParsed, type CoolResult, type CoolStageResult, type RunnableMethod } from "../physics/cooling";
import type { ChartSpec, PlannerEntry } from "./types";
import { kit, limitLines, PALETTE, tCol, csvT, SIGNATURE_LINE, type Kit } from "./view-kit";

/** What the kitchen writes by hand in the printed record. */
const BLANK = "__________";

const SUPPORT_LABELS = { rack: "on a wire rack", shelf: "on a solid shelf" } as const;

/** A method with its settings, in the person's units: "Blast chiller, air −5 °C at 3 m/s, 85 % humidity, on a wire rack". */
export function methodText(m: CoolParsed["method"], k: Kit): string {
  const label = COOL_METHOD_LABELS[m.kind];
  switch (m.kind) {
    case "walk_in":
    case "blast_chiller":
      return `${label}, air ${k.temp(m.air_C)} at ${m.speed_m_s} m/s, ${Math.round(m.relativeHumidity * 100)} % relative humidity, ${SUPPORT_LABELS[m.support]}`;
    case "ice_bath":
      return `${label}, water ${k.temp(m.water_C)}, level ${m.level_m === null ? "with the food" : k.length(m.level_m)}; room air ${k.temp(m.air_C)}, ${Math.round(m.relativeHumidity * 100)} % relative humidity`;
    case "cold_plate":
      return `${label} at ${k.temp(m.plate_C)} (pan-to-plate contact ${m.contact_W_m2K} W/(m²·K)); room air ${k.temp(m.air_C)}, ${Math.round(m.relativeHumidity * 100)} % relative humidity`;
    case "ice_paddle":
      return label;
  }
}

function setupText(p: CoolParsed, k: Kit): string {
  const s = p.setup;
  if (s.kind === "piece") return `Whole piece (${p.product.shape}, as in the library)`;
  const [L, W] = GASTRONORM_SIZES[s.size];
  return `${k.length(s.depth_m)} layer in a ${s.size} pan (${k.length(L)} × ${k.length(W)}, ${k.length(s.height_m)} high), ${PAN_MATERIALS[s.material].label.toLowerCase()}, lid ${s.lid ? "on" : "off"}`;
}

const verdict = (m: boolean | null) => (m === true ? "meets" : m === false ? "misses" : "not judged");

function stageText(s: CoolStageResult | undefined, k: Kit): string {
  if (!s) return "not set by the rule set";
  const reached = s.reached_s === null ? "not reached within the time looked at" : `reached after ${k.dur(s.reached_s)}`;
  return `${k.temp(s.from_C)} to ${k.temp(s.to_C)}: ${reached} of ${k.dur(s.limit_s)} allowed — ${verdict(s.meets)}`;
}

function shortStage(s: CoolStageResult | undefined, k: Kit): string {
  if (!s) return "—";
  return `${s.reached_s === null ? "not reached" : k.dur(s.reached_s)} (${verdict(s.meets)})`;
}

function depthText(r: CoolResult, k: Kit, pending: boolean): string {
  const d = r.maxDepth;
  // The quick first answer leaves the search out; the full one follows.
  if (pending) return "being worked out…";
  if (d.limitedBy === "not searched") return k.text(d.detail);
  if (r.maxDepth_m === null) return k.text(d.detail);
  return `${k.length(r.maxDepth_m)}${d.limitedBy === "pan" ? " (the whole pan)" : ""}: ${k.text(d.detail)}`;
}

export const coolPlanner: PlannerEntry<typeof coolInputSchema, CoolResult> = {
  kind: "cool",
  title: "Cooling planner",
  path: "/cool",
  question: "Will this cooked food cool through both stages in time, and how shallow must the pan be?",
  schema: coolInputSchema,
  refs: { top: { product: "products", ruleSet: "rulesets" } },
  cliHelp: ["cooling planner: two-stage cooling of cooked food in a pan", "or whole; the deepest layer that meets both stages and", 'the methods side by side ("product", "ruleSet" by name)'],
  timeLimit_s: 60,
  tooLongHint: "turn off the method comparison (compare: false) or the depth search (searchDepth: false), or look at a shorter horizon (horizon_s)",
  run: (p) => runCoolParsed(p),
  quick: (p) => (p.searchDepth || p.compare ? { input: { ...p, searchDepth: false, compare: false }, pending: "Finding the deepest layer and comparing methods…" } : null),
  defaultName: (p) => `${p.product.name}${p.setup.kind === "pan" ? ` in a ${p.setup.size} pan` : ""}, ${COOL_METHOD_LABELS[p.method.kind].toLowerCase()}`,
  view(input, r, u, stage) {
    const k = kit(u);
    const s1 = r.stages.find((s) => s.stage === 1);
    const s2 = r.stages.find((s) => s.stage === 2);
    const pan = input.setup.kind === "pan";
    const rs = input.ruleSet;
    const record = coolingRecord(input, r);
    const data = r.series.map((p) => ({ t_h: p.t_s / 3600, slowest: k.T(p.slowest_C), surface: k.T(p.surface_C), ...(pan ? { base: k.T(p.bottom_C) } : {}) }));
    const markers: NonNullable<ChartSpec["markers"]> = record.rows
      .filter((x) => x.limit_C !== null || /clock starts/.test(x.label))
      .map((x) => ({ x: x.t_s / 3600, label: x.limit_C !== null ? `stage ${x.limit_C === rs.coolStage1To_C ? 1 : 2} due` : "clock starts", kind: "segment" as const }));
    const headline =
      r.meetsAll === true
        ? `Estimated to meet both cooling stages: the slowest point reaches ${k.temp(s1!.to_C)} after ${k.dur(s1!.reached_s)} and ${k.temp(s2!.to_C)} after ${k.dur(s2!.reached_s)}`
        : r.meetsAll === false
          ? `Estimated to miss ${r.stages
              .filter((s) => s.meets === false)
              .map((s) => `stage ${s.stage}`)
              .join(" and ")} of the cooling limits${r.maxDepth_m !== null && pan ? `; a layer of at most ${k.length(r.maxDepth_m)} would meet both` : ""}`
          : r.stages.length === 0
            ? `The rule set "${rs.name}" sets no two-stage cooling limit: nothing judged`
            : "Not judged within the time looked at: look further ahead";
    const blanks = record.blanks.map((b) => b.replace("°C", k.tUnit));
    return {
      title: "Cooling record",
      headline,
      headlineTestId: "cool-headline",
      facts: [
        { label: "Stage 1", testId: "cool-stage-1", value: stageText(s1, k) },
        { label: "Stage 2", testId: "cool-stage-2", value: stageText(s2, k) },
        { label: pan ? "Deepest layer that meets both stages" : "Deepest layer", testId: "cool-max-depth", value: depthText(r, k, !!stage?.quick && input.searchDepth) },
        ...(r.waterEvaporated_kg > 0 ? [{ label: "Water evaporated", testId: "cool-evaporated", value: `${k.mass(r.waterEvaporated_kg)} of ${k.mass(r.mass_kg)}; ${Math.round(r.evaporationShare * 100)} % of the heat lost left by evaporation` }] : []),
      ],
      inputs: [
        { label: "Food", value: input.product.name },
        { label: "Starting temperature", value: k.temp(input.start_C) },
        { label: "How it sits", value: setupText(input, k) },
        { label: "Method", value: methodText(input.method, k) },
        { label: "Rule set", value: rs.name },
        { label: "Looked ahead", value: k.dur(input.horizon_s) },
      ],
      charts: [
        {
          testId: "temperature-chart",
          title: "Slowest point against the stage limits",
          yTitle: k.yTitle,
          unit: k.tUnit,
          data,
          lines: [
            { key: "slowest", label: "slowest point", color: PALETTE[0] },
            { key: "surface", label: pan ? "open top" : "surface", color: PALETTE[1], dashed: true },
            ...(pan ? [{ key: "base", label: "base of the layer", color: PALETTE[2], dashed: true }] : []),
          ],
          limits: limitLines(k, [
            { T_C: rs.coolFrom_C, label: "clock starts" },
            { T_C: rs.coolStage1To_C, label: "stage 1" },
            { T_C: rs.coolStage2To_C, label: "stage 2" },
          ]),
          markers,
        },
      ],
      tables: [
        ...(r.comparison
          ? [
              {
                title: "Methods side by side",
                testId: "cool-compare",
                columns: ["Method", "Stage 1", "Stage 2", "Both stages", ...(pan ? ["Deepest layer"] : [])],
                rows: r.comparison.map((c) => [
                  k.text(methodText(c.method as RunnableMethod, k)),
                  c.stages.length === 0 && c.meetsAll === null ? "food starts below the coolant" : shortStage(c.stages.find((s) => s.stage === 1), k),
                  shortStage(c.stages.find((s) => s.stage === 2), k),
                  verdict(c.meetsAll),
                  ...(pan ? [c.maxDepth_m === null ? "none meets" : k.length(c.maxDepth_m)] : []),
                ]),
                note: "Each other method with its usual settings, the same food, pan and starting temperature.",
              },
            ]
          : []),
        {
          title: k.text(record.title),
          testId: "cool-record",
          columns: ["After", "Check", `Model estimate (${k.tUnit})`, `Limit (${k.tUnit})`, ...blanks],
          rows: record.rows.map((x) => [k.dur(x.t_s), k.text(x.label), k.temp(x.expected_C), x.limit_C === null ? "—" : `at or below ${k.temp(x.limit_C)}`, ...blanks.map(() => BLANK)]),
          note: `Probe the thickest part at the centre of the pan. The deadlines are placed where the model expects the food to reach ${rs.coolFrom_C === null ? "the start temperature" : k.temp(rs.coolFrom_C)}; on the day, count them from when the probe reads it.`,
        },
      ],
      compliance: { title: "Against the rule set's cooling stages", lines: k.lines(r.compliance) },
      assumptions: k.texts([...r.assumptions, `Energy balance closes to ${r.energyBalanceError.toExponential(1)} of the heat the food lost`, `The stage limits come from the rule set "${rs.name}", which you can edit in the library`]),
      warnings: k.texts(r.warnings),
      signOff: {
        title: "Cooling sign-off",
        lines: [
          "Cooling started (clock time): ____________________   by: ________",
          "Probe thermometer used, last checked on: ____________________",
          "If a stage was missed, what was done (reheat and cool again, or discard, as your food code says): ____________________________",
          SIGNATURE_LINE,
        ],
      },
      cautions: { dryIce: false, extra: [] },
    };
  },
  csv: (input, r, u) =>
    r.series.map((p) => ({
      t_s: Math.round(p.t_s),
      [tCol("slowest", u)]: csvT(p.slowest_C, u),
      [tCol(input.setup.kind === "pan" ? "top" : "surface", u)]: csvT(p.surface_C, u),
      ...(input.setup.kind === "pan" ? { [tCol("base", u)]: csvT(p.bottom_C, u) } : {}),
    })),
};
