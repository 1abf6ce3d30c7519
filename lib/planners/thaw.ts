/** The thaw planner's registry entry: how long this frozen item takes to thaw, and how long its surface sits above the limit. */
import { format } from "date-fns";
import { thawInputSchema, THAW_METHOD_LABELS } from "../schemas/thaw";
import { runThawParsed, type ThawResult } from "../physics/thaw";
import type { PlannerEntry } from "./types";
import { kit, limitLines, PALETTE, tCol, csvT, SIGNATURE_LINE } from "./view-kit";

/** A date-time for people, in the zone of whoever reads it ("Tue 1 Dec 14:30"). */
const when = (iso: string | null) => (iso ? format(new Date(iso), "EEE d MMM yyyy HH:mm") : "—");

export const thawPlanner: PlannerEntry<typeof thawInputSchema, ThawResult> = {
  kind: "thaw",
  title: "Thaw planner",
  path: "/thaw",
  question: "How long will this frozen item take to thaw by an approved method, and how long does its surface sit above the chill limit?",
  schema: thawInputSchema,
  refs: { top: { product: "products", ruleSet: "rulesets" }, nested: [{ path: ["method", "tray"], kind: "materials" }] },
  cliHelp: ["thaw planner: thaw time, time the surface sits above the", 'chill limit, compliance; "compare": true runs every method'],
  timeLimit_s: 30,
  tooLongHint: "look at a shorter horizon (horizon_s) or change the water less often",
  run: (p) => runThawParsed(p),
  quick: (p) => (p.compare ? { input: { ...p, compare: false }, pending: "Working out the other methods…" } : null),
  defaultName: (p) => `${p.product.name}, ${THAW_METHOD_LABELS[p.method.kind].toLowerCase()}`,
  view(input, r, u) {
    const k = kit(u);
    const data = r.series.map((p) => ({ t_h: p.t_s / 3600, center: k.T(p.center_C), surface: k.T(p.surface_C) }));
    return {
      title: "Thaw plan record",
      headline: `${r.thawTime_s === null ? "Not thawed within the time looked at" : `Estimated thaw time: ${k.dur(r.thawTime_s)}`} — ${r.label.toLowerCase()}`,
      headlineTestId: "thaw-headline",
      facts: [
        { label: "Thaw time", testId: "thaw-time", value: `${k.dur(r.thawTime_s)} (centre to ${k.temp(r.endPoint_C)})` },
        { label: `Surface above ${k.temp(r.chillLimit_C)}`, testId: "surface-above", value: k.dur(r.surfaceAboveLimit_s) },
        { label: "Warmest surface", value: k.temp(r.maxSurface_C) },
        ...(r.startBy ? [{ label: "Start by", testId: "start-by", value: `${when(r.startBy)}${r.startByPassed ? " (already passed)" : ""}` }] : []),
        {
          label: "Second opinion",
          testId: "estimate-inputs",
          value: `Plank ${k.dur(r.estimates.plank_s)}, Pham ${k.dur(r.estimates.pham_s)} (closed-form, with the model's latent heat ${(r.estimates.inputs.latent_J_kg / 1000).toFixed(0)} kJ/kg and sensible specific heats ${(r.estimates.inputs.cFrozen_J_kgK / 1000).toFixed(2)} frozen, ${(r.estimates.inputs.cUnfrozen_J_kgK / 1000).toFixed(2)} thawed kJ/(kg·K); why they differ is under Assumptions)`,
        },
      ],
      inputs: [
        { label: "Item", value: input.product.name },
        { label: "Method", value: r.label },
        { label: "Starting temperature", value: k.temp(input.start_C) },
        { label: "Rule set", value: input.ruleSet.name },
        ...(input.readyBy ? [{ label: "Ready by", value: when(input.readyBy) }] : []),
      ],
      charts: [
        {
          testId: "temperature-chart",
          title: "Centre and surface against the chill limit",
          yTitle: k.yTitle,
          unit: k.tUnit,
          data,
          limits: limitLines(k, [{ T_C: r.chillLimit_C, label: "chill limit" }]),
          lines: [
            { key: "surface", label: "surface", color: PALETTE[1], dashed: true },
            { key: "center", label: "centre", color: PALETTE[0] },
          ],
        },
      ],
      tables: r.comparison
        ? [
            {
              title: "Methods side by side",
              testId: "thaw-compare",
              columns: ["Method", "Thaw time", "Surface above limit", "Compliance", "Start by", "Fridge space × time"],
              rows: r.comparison.map((m) => [
                m.kind === "tray" && "tray" in m.settings && m.settings.tray ? `${m.label} (${m.settings.tray.name})` : m.label,
                k.dur(m.thawTime_s),
                k.dur(m.surfaceAboveLimit_s),
                m.compliance.every((c) => c.status === "meets") ? "meets the rule set" : m.compliance.filter((c) => c.status !== "meets").map((c) => c.status).join(", "),
                when(m.startBy),
                m.fridgeSpaceTime_m3h === null ? "—" : `${(m.fridgeSpaceTime_m3h * 1000).toFixed(0)} L·h`,
              ]),
            },
          ]
        : [],
      compliance: { title: "Against the rule set", lines: k.lines(r.compliance) },
      assumptions: k.texts([...r.assumptions, ...r.notes, `Energy balance closes to ${r.energyBalanceError.toExponential(1)} of the heat stored`]),
      warnings: k.texts(r.warnings),
      signOff: {
        title: "Thawing record",
        lines: [
          "Taken out of the freezer at: ____________________   by: ________",
          `Surface readings while thawing (${k.tUnit}, time): ____________________________________________`,
          `Centre reading when thawed (${k.tUnit}, time): ____________________`,
          SIGNATURE_LINE,
        ],
      },
      // What to do once thawed (cook or refrigerate, refreezing) belongs with the cautions, not the assumptions.
      cautions: { dryIce: false, extra: k.texts(r.advice) },
    };
  },
  csv: (_input, r, u) => r.series.map((p) => ({ t_s: Math.round(p.t_s), [tCol("center", u)]: csvT(p.center_C, u), [tCol("surface", u)]: csvT(p.surface_C, u) })),
};
