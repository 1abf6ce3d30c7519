/** The hold planner's registry entry: how long this box with these packs keeps this load inside its band. */
import { holdInputSchema, type HoldParsed } from "../schemas/hold";
import { MAX_HOLD_LINES } from "../schemas/hold";
import { PACK_KIND_LABELS } from "../schemas/templates";
import { runHoldParsed, holdPieces, type HoldResult } from "../physics/hold";
import type { PlannerEntry, ChartSpec } from "./types";
import { kit, limitLines, PALETTE, tCol, csvT, round3, mCol, csvM, SIGNATURE_LINE } from "./view-kit";

const WH = 3600;
/** How a placement reads: "around the load", "on top"… */
export const PLACEMENT_LABELS: Record<HoldParsed["packs"][number]["placement"], string> = { around: "around the load", top: "on top", bottom: "underneath", side: "at one side" };

export const holdPlanner: PlannerEntry<typeof holdInputSchema, HoldResult> = {
  kind: "hold",
  title: "Hold planner",
  path: "/hold",
  question: "Will this box, with these packs, keep this load inside its limits for the whole route — and with how much to spare?",
  schema: holdInputSchema,
  refs: {
    top: { shipper: "shippers", route: "routes", ruleSet: "rulesets" },
    lines: [
      { key: "products", field: "product", kind: "products", max: MAX_HOLD_LINES, what: "product lines" },
      { key: "packs", field: "pack", kind: "packs", max: MAX_HOLD_LINES, what: "pack lines", fill: { field: "conditioning_C", from: "conditioning_C" } },
    ],
    materialsFrom: { field: "shipper" },
  },
  cliHelp: ["hold planner: how long this box and these packs keep the", "load inside its band on the route (templates by name)"],
  timeLimit_s: 30,
  tooLongHint: "use a shorter route, fewer segments or lid openings, or fewer product and pack lines",
  run: (p) => runHoldParsed(p),
  // The central run and each of the band's corners as pieces (the server's threads take them side by side);
  // four threads at most: the central run alone takes about a sixth of the work.
  pieces: { threads: 4, start: (p) => holdPieces(p) },
  quick: (p) =>
    p.uncertainty.outerH_frac === 0 && p.uncertainty.insulationK_frac === 0 && p.uncertainty.conditioning_K === 0
      ? null
      : { input: { ...p, uncertainty: { ...p.uncertainty, outerH_frac: 0, insulationK_frac: 0, conditioning_K: 0 } }, pending: "Working out the uncertainty range…" },
  defaultName: (p) => `${p.shipper.name} on ${p.route.name}`,
  view(input, r, u, stage) {
    const k = kit(u);
    const data = r.series.map((p) => {
      const row: Record<string, number> = { t_h: p.t_s / 3600, airLo: k.T(p.airLower_C), airUp: k.T(p.airUpper_C) };
      p.products.forEach((q, j) => {
        row[`c${j}`] = k.T(q.center_C);
        row[`s${j}`] = k.T(q.surface_C);
      });
      p.packs.forEach((x, j) => {
        row[`l${j}`] = Math.round((1 - x.latentLeft) * 1000) / 10;
      });
      return row;
    });
    const limits = limitLines(
      k,
      r.bands.flatMap((b) => [
        { T_C: b.upper_C, label: "upper" },
        { T_C: b.lower_C, label: "lower" },
      ]),
    );
    const b0 = r.bands[0];
    const markers = [
      ...r.segments.slice(1).map((s) => ({ x: s.start_s / 3600, label: s.label, kind: "segment" as const })),
      { x: r.routeLength_s / 3600, label: "route ends", kind: "segment" as const },
      ...r.openings_s.map((t) => ({ x: t / 3600, label: "", kind: "stop" as const })),
    ];
    const charts: ChartSpec[] = [
      {
        testId: "temperature-chart",
        title: "Temperatures against the band",
        yTitle: k.yTitle,
        unit: k.tUnit,
        data,
        lines: [
          { key: "airLo", label: "inside air, lower half", color: "#6b7378", dashed: true },
          { key: "airUp", label: "inside air, upper half", color: "#a0a6aa", dashed: true },
          ...input.products.flatMap((p, j) => [
            { key: `c${j}`, label: `${p.product.name} — centre`, color: PALETTE[j % PALETTE.length] },
            { key: `s${j}`, label: `${p.product.name} — surface`, color: PALETTE[(j + 3) % PALETTE.length], dashed: true },
          ]),
        ],
        limits,
        band: b0 && (b0.lower_C !== null || b0.upper_C !== null) ? { y1: b0.lower_C === null ? -Infinity : k.T(b0.lower_C), y2: b0.upper_C === null ? Infinity : k.T(b0.upper_C) } : null,
        markers,
      },
    ];
    if (input.packs.length)
      charts.push({
        testId: "pack-chart",
        title: "Coolant used",
        yTitle: "pack used (%)",
        unit: "%",
        packState: "used",
        data,
        limits: [],
        lines: input.packs.map((x, j) => ({ key: `l${j}`, label: `${x.pack.name} × ${x.count}`, color: PALETTE[(j + 2) % PALETTE.length] })),
        markers,
      });
    const g = r.heatGain_J;
    const total = g.sides + g.base + g.lid + g.edgesAndCorners + g.lidOpenings;
    const ff = r.failsFirst;
    const dryIceLeft_kg = r.series.at(-1)?.packs.reduce((a, p, j) => a + (input.packs[j]?.pack.kind === "dry_ice" ? p.massLeft_kg : 0), 0) ?? 0;
    const lowText = r.band.low === null ? "beyond the time simulated" : k.dur(r.band.low);
    const highText = r.band.high === null ? "beyond the time simulated" : k.dur(r.band.high);
    return {
      title: "Hold plan record",
      headline:
        r.holdTime_s === null
          ? `Estimated to stay inside its band for the whole route (${k.dur(r.routeLength_s)})`
          : `Estimated to leave its band after ${k.dur(r.holdTime_s)} of a ${k.dur(r.routeLength_s)} route`,
      headlineTestId: "hold-headline",
      facts: [
        { label: "Hold time", testId: "hold-time", value: r.band.central === null ? `more than ${k.dur(r.routeLength_s + (r.margin_s ?? 0))}` : k.dur(r.band.central) },
        { label: "Margin on the route", testId: "hold-margin", value: r.margin_s === null ? "—" : `${r.margin_s < 0 ? "short by " : r.marginIsLowerBound ? "at least " : ""}${k.dur(Math.abs(r.margin_s))}` },
        { label: "Range (uncertainty)", testId: "hold-band", value: stage?.quick ? "being worked out…" : `${lowText} – ${highText}` },
        { label: "Fails first", testId: "hold-fails-first", value: ff ? `${ff.product}, ${ff.point}, crossing the ${ff.limit} limit ${k.temp(ff.limit_C)}` : "nothing within the time simulated" },
        ...(r.hasDryIce ? [{ label: "Dry ice left at the end", value: `${k.mass(dryIceLeft_kg)}; about ${r.co2Released_m3.toFixed(2)} m³ of CO₂ gas given off` }] : []),
      ],
      inputs: [
        { label: "Box", value: input.shipper.name },
        { label: "Route", value: `${input.route.name} (${k.dur(r.routeLength_s)})` },
        { label: "Rule set", value: input.ruleSet.name },
        { label: "Load", value: input.products.map((p) => `${p.count} × ${p.product.name} packed at ${k.temp(p.start_C)}`).join("; ") || "none" },
        { label: "Packs", value: input.packs.map((x) => `${x.count} × ${x.pack.name} (${PACK_KIND_LABELS[x.pack.kind]}) conditioned at ${k.temp(x.conditioning_C)}, ${PLACEMENT_LABELS[x.placement]}`).join("; ") || "none" },
        { label: "Box temperature when packed", value: input.boxStart_C === null ? "the first segment's air" : k.temp(input.boxStart_C) },
      ],
      charts,
      tables: [
        {
          title: "Where the heat came in during the route",
          testId: "heat-gain",
          columns: ["Path", "Wh"],
          rows: (
            [
              ["Side walls", g.sides],
              ["Base", g.base],
              ["Lid", g.lid],
              ["Edges and corners", g.edgesAndCorners],
              ["Lid openings", g.lidOpenings],
              ["Total", total],
            ] as const
          ).map(([n, v]) => [n, (v / WH).toFixed(1)]),
          note: "Each face's figure is the net heat through it from outside: air, sun and sky together (negative where the face lost heat).",
        },
        {
          title: "Bands used",
          testId: "bands-used",
          columns: ["Product", "Kept as", "Not below", "Not above"],
          rows: input.products.map((p, j) => {
            const b = r.bands[j];
            return [p.product.name, b.mode, b.lower_C === null ? "—" : `${k.temp(b.lower_C)}${b.lowerReason ? ` (${k.text(b.lowerReason)})` : ""}`, b.upper_C === null ? "—" : k.temp(b.upper_C)];
          }),
          note: `From the rule set "${input.ruleSet.name}".`,
        },
      ],
      compliance: { title: "Out of its band: against the rule set", lines: k.lines(r.compliance) },
      assumptions: k.texts([
        ...r.assumptions,
        r.energyBalanceError === null
          ? `Energy balance not meaningful: almost no heat moved (absolute difference ${Math.abs(r.energyBalanceError_J).toExponential(1)} J)`
          : `Energy balance: stored heat equals heat in to ${r.energyBalanceError.toExponential(1)} (relative). Box UA ≈ ${r.ua.total_W_K.toFixed(2)} W/K (walls ${r.ua.walls_W_K.toFixed(2)}, lid ${r.ua.lid_W_K.toFixed(2)}, edges and corners ${r.ua.edges_W_K.toFixed(2)}), outer coefficient ${r.outerH_W_m2K[0].toFixed(1)} W/(m²·K), inner ${r.innerH_W_m2K.toFixed(1)} W/(m²·K)`,
      ]),
      warnings: k.texts(r.warnings),
      signOff: {
        title: "Packing record",
        lines: [
          "Packed by: ____________________   Date and time: ____________________",
          `Probe readings when packed (product, ${k.tUnit}): ____________________________________________`,
          `Probe readings on arrival (${k.tUnit}): ____________________________________________`,
          SIGNATURE_LINE,
        ],
      },
      cautions: { dryIce: r.hasDryIce, extra: r.hasDryIce ? ["Carbon dioxide from dry ice builds up in closed vans and cold rooms: open the load space before reaching in."] : [] },
    };
  },
  csv(input, r, u) {
    return r.series.map((p) => {
      const row: Record<string, number | string | null> = { t_s: Math.round(p.t_s), [tCol("inside_air", u)]: csvT(p.air_C, u), [tCol("inside_air_lower", u)]: csvT(p.airLower_C, u), [tCol("inside_air_upper", u)]: csvT(p.airUpper_C, u) };
      p.products.forEach((q, j) => {
        const n = input.products[j].product.name;
        row[tCol(`${n} center`, u)] = csvT(q.center_C, u);
        row[tCol(`${n} surface`, u)] = csvT(q.surface_C, u);
      });
      p.packs.forEach((x, j) => {
        const n = input.packs[j].pack.name;
        row[tCol(`${n} T`, u)] = csvT(x.T_C, u);
        row[`${n} latent_left`] = round3(x.latentLeft);
        if (input.packs[j].pack.kind === "dry_ice") row[mCol(`${n} mass_left`, u)] = csvM(x.massLeft_kg, u);
      });
      return row;
    });
  },
};
