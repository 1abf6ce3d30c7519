/**
 * The calibration planner's registry entry: fit the few physical factors of a hold or thaw plan to a data
 * logger's readings, and show the log against the model before and after the fit. The nested `plan` names
 * its templates as the hold or thaw entry does (refs.inner).
 */
import { calibrateInputSchema, CHANNEL_ROLE_LABELS, FACTOR_LABELS } from "../schemas/calibrate";
import { THAW_METHOD_LABELS } from "../schemas/thaw";
import { runCalibrationParsed, type CalibrationResult } from "../physics/calibrate";
import type { ChannelComparison, LogComparison } from "../calibration/align";
import { toDisplay, unitLabel, type UnitPrefs } from "../units";
import type { ChartSpec, CsvRow, PlannerEntry } from "./types";
import { kit, PALETTE, tCol, csvT, round3, thin, SIGNATURE_LINE } from "./view-kit";

/** A temperature difference in the person's units (K or °F-degrees), as a number. */
export const diffInUnits = (dK: number, u: UnitPrefs) => toDisplay("temperatureDifference", dK, u);
/** A residual as text: "0.15 K", "0.27 °F" (two decimals: residuals are tenths of a kelvin). */
export const diffText = (dK: number | null, u: UnitPrefs) => (dK === null ? "—" : `${diffInUnits(dK, u).toFixed(2)} ${unitLabel("temperatureDifference", u)}`);
const MAX_POINTS = 400;

/** What a channel is, in words: "Inside air", "Product probe, line 1, centre". */
function channelWhat(c: Pick<ChannelComparison, "role" | "line" | "point">): string {
  const base = CHANNEL_ROLE_LABELS[c.role];
  if (c.role === "product") return `${base}, line ${c.line + 1}, ${c.point}`;
  if (c.role === "pack") return `${base}, line ${c.line + 1}`;
  return base;
}

/**
 * A log against a plan's model, one chart of every compared channel: the logged readings, and for each
 * comparison given (the plan as built, the fitted plan) the model at the same times. Display units.
 */
export function logChart(testId: string, title: string, comparisons: { key: string; label: string; cmp: LogComparison; dashed?: boolean }[], u: UnitPrefs): ChartSpec {
  const k = kit(u);
  const rows = new Map<number, Record<string, number>>();
  const lines: ChartSpec["lines"] = [];
  const first = comparisons[0]?.cmp.channels ?? [];
  first.forEach((ch, j) => {
    lines.push({ key: `log${j}`, label: `${ch.label} (logged)`, color: PALETTE[j % PALETTE.length] });
    comparisons.forEach((c, ci) => lines.push({ key: `${c.key}${j}`, label: `${ch.label}: ${c.label}`, color: PALETTE[(j + 2 + ci) % PALETTE.length], dashed: c.dashed }));
  });
  const put = (t_s: number, key: string, T_C: number) => {
    const t = Math.round(t_s);
    const row = rows.get(t) ?? { t_h: t / 3600 };
    row[key] = k.T(T_C);
    rows.set(t, row);
  };
  first.forEach((ch, j) => ch.t_s.forEach((t, i) => put(t, `log${j}`, ch.log_C[i])));
  for (const c of comparisons) c.cmp.channels.forEach((ch, j) => ch.t_s.forEach((t, i) => put(t, `${c.key}${j}`, ch.model_C[i])));
  const data = thin([...rows.entries()].sort((a, b) => a[0] - b[0]).map(([, r]) => r), MAX_POINTS);
  const worst = comparisons.at(-1)?.cmp.maxResidualAt;
  return {
    testId,
    title,
    yTitle: k.yTitle,
    unit: k.tUnit,
    data,
    lines,
    limits: [],
    band: null,
    markers: worst ? [{ x: worst.t_s / 3600, label: `largest gap (${worst.label})`, kind: "stop" }] : [],
  };
}

export const calibratePlanner: PlannerEntry<typeof calibrateInputSchema, CalibrationResult> = {
  kind: "calibrate",
  title: "Calibration from a logged trip",
  path: "/calibrate",
  question: "What do the box and packs really do? Fit the plan's physical factors to a data logger's readings of a real trip.",
  schema: calibrateInputSchema,
  refs: { top: {}, inner: { field: "plan", by: "planner" } },
  cliHelp: [
    "fit a hold or thaw plan's factors to a logger CSV; also",
    "holdline calibrate --plan FILE --log CSV [--columns …]",
  ],
  timeLimit_s: 120,
  tooLongHint: "fit fewer factors, use a shorter log or one read every few minutes, or a plan with fewer lines",
  run: (p) => runCalibrationParsed(p),
  quick: () => null,
  defaultName: (p) => `${p.planner === "hold" ? p.plan.shipper.name : p.plan.product.name} calibrated from ${p.log.name}`,
  view(input, r, u) {
    const k = kit(u);
    const fitted = r.factors.filter((f) => f.identifiable);
    const interval = (f: CalibrationResult["factors"][number]) => (f.identifiable && f.low !== null && f.high !== null ? `${f.low.toPrecision(3)} – ${f.high.toPrecision(3)}` : "not identifiable");
    const worst = r.maxResidualAt;
    const charts: ChartSpec[] = [
      logChart(
        "calibrate-chart",
        "The log against the model, before and after the fit",
        [
          { key: "before", label: "model as built", cmp: r.comparisonBefore, dashed: true },
          { key: "after", label: "fitted model", cmp: r.comparison },
        ],
        u,
      ),
    ];
    const residuals: ChartSpec = {
      testId: "calibrate-residual-chart",
      title: "Residual (logged − fitted model)",
      yTitle: `residual (${u.temperatureUnit === "F" ? "°F" : "K"})`,
      unit: u.temperatureUnit === "F" ? "°F" : "K",
      data: thin(
        r.comparison.channels
          .flatMap((c, j) => c.t_s.map((t, i) => ({ t, j, v: c.residual_K[i] })))
          .sort((a, b) => a.t - b.t)
          .map((x) => ({ t_h: x.t / 3600, [`r${x.j}`]: Math.round(diffInUnits(x.v, u) * 1000) / 1000 })),
        MAX_POINTS * 2,
      ),
      lines: r.comparison.channels.map((c, j) => ({ key: `r${j}`, label: c.label, color: PALETTE[j % PALETTE.length] })),
      limits: [{ y: 0, label: "0" }],
    };
    charts.push(residuals);
    return {
      title: "Calibration record",
      headline: fitted.length
        ? `Fitted ${fitted.map((f) => `${f.label.toLowerCase()} ${f.value.toPrecision(3)}`).join(", ")}: the model follows the log to ${diffText(r.rms_K, u)} RMS (as built: ${diffText(r.before.rms_K, u)})`
        : `The log cannot tell any of the factors asked for: the plan stays as built (${diffText(r.rms_K, u)} RMS against the log)`,
      headlineTestId: "calibrate-headline",
      facts: [
        { label: "RMS residual", testId: "calibrate-rms", value: `${diffText(r.rms_K, u)} (as built: ${diffText(r.before.rms_K, u)})` },
        { label: "Largest residual", testId: "calibrate-max", value: `${diffText(r.maxResidual_K, u)}${worst ? ` (${worst.label}, at ${k.dur(worst.t_s)})` : ""} (as built: ${diffText(r.before.maxResidual_K, u)})` },
        { label: "Readings fitted", value: `${r.readings} (${r.log.readings} rows over ${k.dur(r.log.duration_s)})` },
        { label: "Fit", value: `${r.iterations} Levenberg–Marquardt steps, ${r.modelRuns} model runs; reading noise about ${diffText(r.noise_K, u)}` },
      ],
      inputs: [
        { label: "Plan", value: input.planner === "hold" ? `hold: ${input.plan.shipper.name} on ${input.plan.route.name}` : `thaw: ${input.plan.product.name}, ${THAW_METHOD_LABELS[input.plan.method.kind].toLowerCase()}` },
        { label: "Log", value: `${input.log.name}${r.log.start ? `, first reading ${r.log.start.slice(0, 16).replace("T", " ")}` : ""}` },
        { label: "Columns", value: r.comparison.channels.map((c) => `"${c.label}" → ${channelWhat(c)}`).join("; ") || "none compared" },
        { label: "Factors asked for", value: input.fit.map((f) => FACTOR_LABELS[f]).join(", ") },
        { label: "Logged outside air drives the model", value: input.useLoggedOutsideAir && input.format.channels.some((c) => c.role === "outside_air") ? "yes" : "no" },
      ],
      charts,
      tables: [
        {
          title: "Fitted factors (1 = the model as built)",
          testId: "calibrate-factors",
          columns: ["Factor", "Value", "95 % interval", "Starting guess", "Note"],
          rows: r.factors.map((f) => [f.label, f.identifiable ? f.value.toPrecision(3) : "1 (held)", interval(f), String(f.initial), f.note]),
          note: "Intervals from the Jacobian at the optimum; they assume the model's structure is right.",
        },
        {
          title: "Channel by channel",
          testId: "calibrate-channels",
          columns: ["Column", "Compared with", "Readings", "RMS as built", "RMS fitted", "Largest gap fitted"],
          rows: r.comparison.channels.map((c, j) => [c.label, k.text(c.comparedWith), String(c.t_s.length), diffText(r.comparisonBefore.channels[j]?.rms_K ?? 0, u), diffText(c.rms_K, u), `${diffText(c.maxAbs_K, u)} at ${k.dur(c.maxAt_s)}`]),
        },
      ],
      compliance: { title: "Against the rule set", lines: [] },
      assumptions: k.texts(r.assumptions),
      warnings: k.texts(r.warnings),
      signOff: {
        title: "Calibration record",
        lines: [
          "Logger (make, serial number, last calibration date): ____________________________________",
          "Trip (date, route, who packed): ____________________________________________",
          SIGNATURE_LINE,
        ],
      },
      cautions: { dryIce: input.planner === "hold" && input.plan.packs.some((p) => p.pack.kind === "dry_ice"), extra: ["A calibration is as good as its logger: use a logger with a current calibration certificate, and refit after the box is damaged or repaired."] },
    };
  },
  csv(_input, r, u): CsvRow[] {
    const out: CsvRow[] = [];
    const dCol = `residual_${u.temperatureUnit === "F" ? "F" : "K"}`;
    r.comparison.channels.forEach((c, j) => {
      const before = r.comparisonBefore.channels[j];
      c.t_s.forEach((t, i) => {
        out.push({
          t_s: Math.round(t),
          channel: c.label,
          [tCol("logged", u)]: csvT(c.log_C[i], u),
          [tCol("model_before", u)]: before && before.t_s[i] === t ? csvT(before.model_C[i], u) : null,
          [tCol("model_after", u)]: csvT(c.model_C[i], u),
          [dCol]: round3(diffInUnits(c.residual_K[i], u)),
        });
      });
    });
    return out;
  },
};

