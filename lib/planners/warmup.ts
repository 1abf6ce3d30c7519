/** The warm-up / cool-down check's registry entry: when centre, surface and mean cross the rule-set limit. */
import { warmupInputSchema, LIMIT_LABELS } from "../schemas/warmup";
import { runWarmup, type WarmupResult } from "../physics/warmup";
import type { PlannerEntry } from "./types";
import { kit, limitLines, PALETTE, tCol, csvT, SIGNATURE_LINE } from "./view-kit";

const METHOD_NAMES = { lumped: "lumped capacitance", series: "exact series", numerical: "numerical enthalpy solver" } as const;

export const warmupPlanner: PlannerEntry<typeof warmupInputSchema, WarmupResult> = {
  kind: "warmup",
  title: "Warm-up and cool-down",
  path: "/warmup",
  question: "Out of the fridge or off the heat: how long until the food crosses its limit?",
  schema: warmupInputSchema,
  refs: { top: { product: "products", ruleSet: "rulesets" } },
  cliHelp: ["warm-up / cool-down check: time until centre, surface", "and mean cross the rule-set limit (JSON in, JSON out;", '"product" and "ruleSet" may be template names)'],
  timeLimit_s: 30,
  tooLongHint: "look at a shorter horizon",
  run: (p) => runWarmup(p),
  quick: () => null,
  defaultName: (p) => `${p.product.name}, ${LIMIT_LABELS[p.limit].toLowerCase()}`,
  view(input, r, u) {
    const k = kit(u);
    const corner = r.surfacePoint === "corner" || r.surfacePoint === "edge";
    const data = r.series.map((p) => ({ t_h: p.t_s / 3600, center: k.T(p.center_C), surface: k.T(p.surface_C), midFace: k.T(p.midFace_C), mean: k.T(p.mean_C) }));
    const t = (x: number | null) => (x === null ? "not within the time looked at" : k.dur(x));
    const word = r.direction === "warming" ? "rises above" : "falls below";
    const surfaceLabel = r.surfacePoint === "corner" ? "Surface (corner, first to cross)" : r.surfacePoint === "edge" ? "Surface (rim, first to cross)" : r.surfacePoint === "mid-face" ? "Surface (middle of the largest face)" : "Surface";
    return {
      title: "Warm-up / cool-down record",
      headline: `Estimated time until the food ${word} ${k.temp(r.limit_C)}: ${t(r.timeToLimit_s.surface)} at the surface, ${t(r.timeToLimit_s.center)} at the centre`,
      headlineTestId: "warmup-headline",
      facts: [
        { label: surfaceLabel, testId: "ttl-surface", value: t(r.timeToLimit_s.surface) },
        ...(r.surfacePoint === "corner" ? [{ label: "Edge", testId: "ttl-edge", value: t(r.timeToLimit_s.edge) }] : []),
        ...(corner ? [{ label: "Middle of the face", testId: "ttl-midface", value: t(r.timeToLimit_s.midFace) }] : []),
        { label: "Centre", testId: "ttl-center", value: t(r.timeToLimit_s.center) },
        { label: "Mass average", testId: "ttl-mean", value: t(r.timeToLimit_s.mean) },
        { label: "Method", testId: "method", value: `${METHOD_NAMES[r.method]}: ${r.methodReason}` },
      ],
      inputs: [
        { label: "Food", value: input.product.name },
        { label: "Starting temperature", value: k.temp(input.start_C) },
        { label: "Surroundings", value: `${input.surroundings.medium} at ${k.temp(input.surroundings.T_C)}, ${input.surroundings.speed_m_s} m/s` },
        { label: "Limit", value: `${LIMIT_LABELS[input.limit]} ${k.temp(r.limit_C)}, from the rule set "${input.ruleSet.name}"` },
      ],
      charts: [
        {
          testId: "temperature-chart",
          title: "Temperatures against the limit",
          yTitle: k.yTitle,
          unit: k.tUnit,
          data,
          limits: limitLines(k, [{ T_C: r.limit_C, label: "limit" }]),
          lines: [
            { key: "surface", label: r.surfacePoint === "corner" ? "surface (corner)" : r.surfacePoint === "edge" ? "surface (rim)" : "surface", color: PALETTE[1] },
            ...(corner ? [{ key: "midFace", label: "middle of the face", color: "#c9a27a", dashed: true }] : []),
            { key: "center", label: "centre", color: PALETTE[0] },
            { key: "mean", label: "mass average", color: "#6b7378", dashed: true },
          ],
        },
      ],
      tables: [],
      compliance: { title: "Against the rule set", lines: k.lines(r.compliance) },
      assumptions: k.texts([
        ...r.assumptions,
        `Biot number ${r.biotLumped.toFixed(3)} on V/A; ${r.biot.toFixed(3)} on the half-thickness ${k.length(r.biotLength_m)}. Fourier number at the end: ${r.fourierAtHorizon.toFixed(2)}`,
        `Surface coefficient ${r.h_W_m2K.toFixed(1)} W/(m²·K) (convection ${r.hConvective_W_m2K.toFixed(1)}, radiation ${r.hRadiative_W_m2K.toFixed(1)})`,
        `Properties: ρ ${r.properties.rho_kg_m3.toFixed(0)} kg/m³, k ${r.properties.k_W_mK.toFixed(3)} W/(m·K), c ${(r.properties.c_J_kgK / 1000).toFixed(2)} kJ/(kg·K), initial freezing point ${k.temp(r.properties.Tf_C)}`,
        ...(r.estimates ? [`Closed-form thaw estimates (second opinion): Plank ${k.dur(r.estimates.plank_s)}, Pham ${k.dur(r.estimates.pham_s)}`] : []),
        ...(r.energyBalanceError !== null ? [`Energy balance closes to ${r.energyBalanceError.toExponential(1)} of the heat stored`] : []),
        `The limit ${k.temp(r.limit_C)} comes from the rule set "${input.ruleSet.name}", which you can edit in the library`,
      ]),
      warnings: k.texts(r.warnings),
      signOff: { title: "Temperature check", lines: [`Probe reading at the start (${k.tUnit}, time): ____________________`, `Probe reading at the check (${k.tUnit}, time): ____________________`, SIGNATURE_LINE] },
      cautions: { dryIce: false, extra: [] },
    };
  },
  csv: (_i, r, u) =>
    r.series.map((p) => ({ t_s: Math.round(p.t_s), [tCol("center", u)]: csvT(p.center_C, u), [tCol("surface", u)]: csvT(p.surface_C, u), [tCol("mid_face", u)]: csvT(p.midFace_C, u), [tCol("mean", u)]: csvT(p.mean_C, u) })),
};
