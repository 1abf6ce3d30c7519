/**
 * The warm-up / cool-down check: how long until a product's centre, surface and mean cross a
 * rule-set limit in given surroundings. Chooses the simplest method that is valid:
 *  lumped capacitance (Bi < 0.1 on V/A) → exact series product solution (no phase change) →
 *  the numerical enthalpy solver (phase change or strongly varying properties).
 */
import { firstCrossing, firstTimeReaching } from "./numerics";
import { warmupInputSchema, type WarmupInput, type LimitKind } from "../schemas/warmup";
import { productThermal, warnPropertyRange } from "./properties";
import { itemShape } from "./geometry";
import { followingSurface, itemSurfaceCoefficient, type Surroundings } from "./surfaces";
import { lumpedTheta, seriesMeanTheta, seriesTheta } from "./conduction";
import { solve1D } from "./solver1d";
import { closedFormEstimates } from "./phase-change";
import { PhysicsInputError } from "./validation";
import { warmupCompliance, type ComplianceLine } from "./compliance";

export interface WarmupPoint {
  t_s: number;
  center_C: number;
  /** The warmest (in cooling: the coldest) surface point: a block's corner, a cylinder's rim, else the surface. */
  surface_C: number;
  mean_C: number;
  /** Middle of the face that changes first (the largest face of a block); equals surface_C where there is no corner. */
  midFace_C: number;
}

/** Which surface point the "surface" time is for. */
export type SurfacePoint = "corner" | "edge" | "mid-face" | "surface";

export interface WarmupResult {
  method: "lumped" | "series" | "numerical";
  methodReason: string;
  limit_C: number;
  limitKind: LimitKind;
  direction: "warming" | "cooling";
  /**
   * surface: the surface point that crosses first (a corner or edge beside the mid-face), the one to judge a
   * safety limit by; midFace, edge, corner: each point where the method resolves it (null where the shape has
   * none or the one-dimensional solver cannot tell).
   */
  timeToLimit_s: { center: number | null; surface: number | null; mean: number | null; midFace: number | null; edge: number | null; corner: number | null };
  surfacePoint: SurfacePoint;
  biot: number;
  biotLength_m: number;
  biotLumped: number;
  fourierAtHorizon: number;
  h_W_m2K: number;
  hConvective_W_m2K: number;
  hRadiative_W_m2K: number;
  properties: { rho_kg_m3: number; k_W_mK: number; c_J_kgK: number; alpha_m2_s: number; Tf_C: number; latent_J_kg: number };
  estimates: { plank_s: number | null; pham_s: number | null } | null;
  energyBalanceError: number | null;
  series: WarmupPoint[];
  /** Rule-set lines: two-stage cooling for a cool-down from hot, cold-food time as a control for a warm-up. */
  compliance: ComplianceLine[];
  assumptions: string[];
  warnings: string[];
}

const MAX_POINTS = 240;
const NODES = 81;

export function limitFor(kind: LimitKind, r: { chilledMax_C: number; hotHoldMin_C: number; frozenMax_C: number }): number {
  return kind === "chilledMax" ? r.chilledMax_C : kind === "hotHoldMin" ? r.hotHoldMin_C : r.frozenMax_C;
}

export function runWarmup(raw: WarmupInput): WarmupResult {
  const parsed = warmupInputSchema.safeParse(raw);
  if (!parsed.success) throw new PhysicsInputError(parsed.error.issues[0].path.join("."), parsed.error.issues[0].message);
  const inp = parsed.data;
  const p = inp.product;
  const warnings: string[] = [];
  const assumptions: string[] = [];
  const shape = itemShape(p);
  const props = productThermal(p, shape);
  warnings.push(...props.warnings);
  const limit_C = limitFor(inp.limit, inp.ruleSet);
  const Ti = inp.start_C;
  const Tinf = inp.surroundings.T_C;
  const direction: "warming" | "cooling" = inp.limit === "hotHoldMin" ? "cooling" : "warming";
  const way = direction === "warming" ? "up" : "down";
  /** When a closed-form temperature f(t) first reaches the limit within the horizon. */
  const reaches = (f: (t: number) => number) => firstTimeReaching(f, limit_C, way, inp.horizon_s);
  if (direction === "warming" ? Ti > limit_C : Ti < limit_C) warnings.push(`The starting temperature is already beyond the limit (${limit_C} °C)`);
  if (direction === "warming" && Tinf <= limit_C) warnings.push("The surroundings are not warmer than the limit, so the food never crosses it in this model");
  if (direction === "cooling" && Tinf >= limit_C) warnings.push("The surroundings are not colder than the limit, so the food never falls below it in this model");
  if (direction === "cooling" && Ti < Tinf) warnings.push("The food starts colder than its surroundings: it warms, it does not cool");

  // Surface coefficient: correlations at a representative surface temperature, or the given value.
  const s: Surroundings = { fluid: inp.surroundings.medium, T_C: Tinf, speed_m_s: inp.surroundings.speed_m_s };
  const eps = inp.surroundings.medium === "air" ? inp.surroundings.emissivity : 0;
  const Tref = (Ti + Tinf) / 2;
  const hOverride = inp.surroundings.h_W_m2K;
  const hc = hOverride ? null : itemSurfaceCoefficient(shape.convection, Tref, s, eps, warnings);
  const h = hOverride ?? hc!.h_W_m2K;
  if (hOverride) assumptions.push(`Surface coefficient given: ${hOverride} W/(m²·K), used for every face and for the whole time`);
  else {
    assumptions.push(
      `Surface coefficient ${h.toFixed(1)} W/(m²·K) (convection ${hc!.hConvective_W_m2K.toFixed(1)} by ${hc!.correlations.join(", ")}; radiation ${hc!.hRadiative_W_m2K.toFixed(1)} with ε = ${eps}), area-weighted over the faces`,
    );
  }
  assumptions.push(`Uniform starting temperature ${Ti} °C; surroundings steady at ${Tinf} °C`);
  assumptions.push("Nothing touches the item but the surrounding " + inp.surroundings.medium + "; packaging, containers and contact surfaces are not modelled here");

  // Representative constant properties for the analytic methods.
  const Tm = Math.min(Math.max(Tref, Math.min(Ti, Tinf)), Math.max(Ti, Tinf));
  const k = props.k_W_mK(Tm);
  const c = props.c_J_kgK(Tm);
  const rho = props.rho_kg_m3;
  const alpha = k / (rho * c);
  const biotLumped = (h * shape.lumpedLength_m) / k;
  const Lmin = shape.hollow ? shape.hollow.wall_m : Math.min(...shape.factors.map((f) => f.halfSize_m));
  const biot = (h * Lmin) / k;
  const phaseChange = Math.min(Ti, Tinf) < props.Tf_C + 1;

  let method: WarmupResult["method"];
  let reason: string;
  if (inp.method !== "auto") {
    method = inp.method;
    reason = `Chosen by the user`;
    if (method !== "numerical" && phaseChange) warnings.push("Freezing or thawing is involved but the chosen method ignores latent heat; use the numerical method");
    if (method === "lumped" && biotLumped >= 0.1) warnings.push(`Lumped capacitance needs Bi < 0.1; here Bi = ${biotLumped.toFixed(2)}`);
    if (method === "series" && shape.hollow) warnings.push("The series solution is for the solid shape: it ignores the cavity of this hollow item; use the numerical method");
  } else if (phaseChange) {
    method = "numerical";
    reason = `Temperatures reach the freezing range (initial freezing point ${props.Tf_C.toFixed(1)} °C), so latent heat and changing properties matter: numerical enthalpy solver`;
  } else if (shape.hollow && biotLumped >= 0.1) {
    method = "numerical";
    reason = `Bi = ${biotLumped.toFixed(2)} ≥ 0.1 on V/A and the item is hollow, which the series solutions here do not cover: numerical solver on the shell`;
  } else if (biotLumped < 0.1) {
    method = "lumped";
    reason = `Bi = ${biotLumped.toFixed(3)} < 0.1 on V/A: the inside stays nearly uniform, lumped capacitance is valid`;
  } else {
    method = "series";
    reason = `Bi = ${biotLumped.toFixed(2)} ≥ 0.1 on V/A and no phase change: exact series solution (product of one-dimensional solutions)`;
  }

  const horizon = inp.horizon_s;
  const fourierAtHorizon = (alpha * horizon) / (Lmin * Lmin);
  const dTi = Ti - Tinf;
  let series: WarmupPoint[] = [];
  let tc: number | null, ts: number | null, tm: number | null;
  let tMid: number | null = null;
  let tEdge: number | null = null;
  let tCorner: number | null = null;
  let surfacePoint: SurfacePoint = "surface";
  let energyBalanceError: number | null = null;

  if (method === "lumped") {
    const f = (t: number) => Tinf + dTi * lumpedTheta(h, shape.area_m2, rho, shape.volume_m3, c, t);
    tc = ts = tm = tMid = reaches(f);
    for (let i = 0; i <= MAX_POINTS; i++) {
      const t = (horizon * i) / MAX_POINTS;
      const T = f(t);
      series.push({ t_s: t, center_C: T, surface_C: T, mean_C: T, midFace_C: T });
    }
    assumptions.push(`Constant properties at ${Tm.toFixed(1)} °C: k = ${k.toFixed(3)} W/(m·K), c = ${(c / 1000).toFixed(2)} kJ/(kg·K), ρ = ${rho.toFixed(0)} kg/m³`);
  } else if (method === "series") {
    // Product solution (Incropera §5.8): a point on n faces at once takes the surface value of those n factors
    // and the centre value of the rest. Mid-face: the thinnest direction only; edge: the two thinnest; corner: all.
    const order = shape.factors.map((f, i) => ({ i, L: f.halfSize_m })).sort((x, y) => x.L - y.L).map((x) => x.i);
    // `where`: "center", "mean", or how many of the thinnest directions are at their surface (1 mid-face, 2 edge, 3 corner).
    const thetaAt = (t: number, where: "center" | "mean" | number) => {
      let th = 1;
      const atSurface = typeof where === "number" ? where : 0;
      shape.factors.forEach((fct, i) => {
        const Bi = (h * fct.halfSize_m) / k;
        const Fo = (alpha * t) / (fct.halfSize_m * fct.halfSize_m);
        if (where === "mean") th *= seriesMeanTheta(fct.shape, Bi, Fo);
        else th *= seriesTheta(fct.shape, Bi, Fo, order.indexOf(i) < atSurface ? 1 : 0);
      });
      return Tinf + dTi * th;
    };
    const nF = shape.factors.length;
    const warmest = nF; // every factor at its surface: a block's corner, a cylinder's rim
    tc = reaches((t) => thetaAt(t, "center"));
    tMid = reaches((t) => thetaAt(t, 1));
    if (nF === 3) {
      tEdge = reaches((t) => thetaAt(t, 2));
      tCorner = reaches((t) => thetaAt(t, 3));
      surfacePoint = "corner";
    } else if (nF === 2) {
      tEdge = reaches((t) => thetaAt(t, 2));
      surfacePoint = "edge";
    } else surfacePoint = shape.factors[0].shape === "slab" ? "mid-face" : "surface";
    ts = nF === 3 ? tCorner : nF === 2 ? tEdge : tMid;
    tm = reaches((t) => thetaAt(t, "mean"));
    for (let i = 0; i <= MAX_POINTS; i++) {
      const t = (horizon * i) / MAX_POINTS;
      series.push({ t_s: t, center_C: thetaAt(t, "center"), surface_C: thetaAt(t, warmest), mean_C: thetaAt(t, "mean"), midFace_C: thetaAt(t, 1) });
    }
    assumptions.push(`Constant properties at ${Tm.toFixed(1)} °C: k = ${k.toFixed(3)} W/(m·K), c = ${(c / 1000).toFixed(2)} kJ/(kg·K), ρ = ${rho.toFixed(0)} kg/m³`);
    assumptions.push(
      surfacePoint === "corner"
        ? `"Surface" is the corner, the point that ${direction === "warming" ? "warms" : "cools"} first, and the one the limit is judged by; the middle of the largest face and an edge are shown beside it`
        : surfacePoint === "edge"
          ? `"Surface" is the rim where the side meets an end, the point that ${direction === "warming" ? "warms" : "cools"} first, and the one the limit is judged by; the middle of the face is shown beside it`
          : `"Surface" is the outer surface, the same everywhere on this shape`,
    );
    const oneTermFrom = (0.2 * Lmin * Lmin) / alpha;
    assumptions.push(`The one-term approximation would be within 2 % after ${(oneTermFrom / 60).toFixed(0)} min (Fo > 0.2); the full series is used throughout`);
  } else {
    const oneD = shape.oneD;
    if (oneD.note && !(p.shape === "sphere")) assumptions.push(oneD.note);
    const hFn = hOverride
      ? () => hOverride
      : followingSurface((Ts) => itemSurfaceCoefficient(shape.convection, Ts, s, 0, []).hConvective_W_m2K);
    const alphaMax = Math.max(props.k_W_mK(Math.min(Ti, Tinf)) / (rho * props.c_J_kgK(Math.min(Ti, Tinf) - 5)), alpha, 1e-8);
    const depth = oneD.halfSize_m - oneD.innerRadius_m;
    const tau = (depth * depth) / alphaMax;
    const dt = Math.min(Math.max(tau / 300, 1), horizon / 1000);
    const dtMax = Math.min(900, horizon / 100);
    const r = solve1D({
      shape: oneD.shape,
      halfSize_m: oneD.halfSize_m,
      innerRadius_m: oneD.innerRadius_m,
      nodes: NODES,
      material: props,
      initial_C: Ti,
      boundary: { kind: "convective", h_W_m2K: hFn, fluid_C: () => Tinf, emissivity: hOverride ? 0 : eps, radiant_C: () => Tinf },
      tEnd_s: horizon,
      dt_s: dt,
      adaptive: { target_K: 1, dtMax_s: dtMax },
    });
    warnPropertyRange(warnings, r.minT_C, r.maxT_C);
    tc = firstCrossing(r.t_s, r.center_C, limit_C, way);
    ts = tMid = firstCrossing(r.t_s, r.surface_C, limit_C, way);
    if (p.shape === "block" || p.shape === "slab" || p.shape === "cylinder") {
      surfacePoint = "mid-face";
      assumptions.push(
        `The numerical solver is one-dimensional: its "surface" is the middle of the largest face. Corners and edges ${direction === "warming" ? "warm" : "cool"} sooner than that, so the surface time here is later than at the ${p.shape === "cylinder" ? "rim" : "corners"}; judge a limit with that margin in mind`,
      );
    }
    tm = firstCrossing(r.t_s, r.mean_C, limit_C, way);
    const every = Math.max(1, Math.ceil(r.t_s.length / MAX_POINTS));
    for (let i = 0; i < r.t_s.length; i += every) series.push({ t_s: r.t_s[i], center_C: r.center_C[i], surface_C: r.surface_C[i], mean_C: r.mean_C[i], midFace_C: r.surface_C[i] });
    const last = r.t_s.length - 1;
    if (series[series.length - 1].t_s !== r.t_s[last]) series.push({ t_s: r.t_s[last], center_C: r.center_C[last], surface_C: r.surface_C[last], mean_C: r.mean_C[last], midFace_C: r.surface_C[last] });
    energyBalanceError = Math.abs(r.energyError_J) / Math.max(Math.abs(r.storedChange_J), 1e-30);
    assumptions.push(`Numerical: ${NODES} nodes, ${r.steps} implicit steps (adaptive, at most ${dtMax.toFixed(0)} s); properties follow temperature (Choi–Okos, ice fraction); energy balance closes to ${energyBalanceError.toExponential(1)} of the heat stored`);
    assumptions.push("Mean temperature is the volume average of the node temperatures");
  }

  let estimates: WarmupResult["estimates"] = null;
  if (phaseChange && Ti < props.Tf_C && Tinf > props.Tf_C) {
    // Same latent heat and sensible (latent-free) specific heats as the enthalpy model.
    const closed = closedFormEstimates({ food: props, shape, productShape: p.shape, h_W_m2K: h, start_C: Ti, end_C: Math.max(props.Tf_C + 0.5, 0), medium_C: Tinf });
    estimates = { plank_s: closed.plank_s, pham_s: closed.pham_s };
    warnings.push(...closed.warnings.filter((w) => !warnings.includes(w)));
    assumptions.push(
      `Plank and Pham are closed-form second opinions with the numerical model's latent heat (${(closed.inputs.latent_J_kg / 1000).toFixed(0)} kJ/kg, the ice present at the start) and sensible specific heats; they melt all the ice at one temperature and use one conductivity, so they differ from the numerical answer, usually by tens of per cent. Pham's thawing form is from memory and unverified`,
    );
  }

  series = series.map((pt) => ({ t_s: pt.t_s, center_C: round(pt.center_C), surface_C: round(pt.surface_C), mean_C: round(pt.mean_C), midFace_C: round(pt.midFace_C) }));
  return {
    method,
    methodReason: reason,
    limit_C,
    limitKind: inp.limit,
    direction,
    timeToLimit_s: { center: tc, surface: ts, mean: tm, midFace: tMid, edge: tEdge, corner: tCorner },
    surfacePoint,
    biot,
    biotLength_m: Lmin,
    biotLumped,
    fourierAtHorizon,
    h_W_m2K: h,
    hConvective_W_m2K: hc ? hc.hConvective_W_m2K : h,
    hRadiative_W_m2K: hc ? hc.hRadiative_W_m2K : 0,
    properties: { rho_kg_m3: rho, k_W_mK: k, c_J_kgK: c, alpha_m2_s: alpha, Tf_C: props.Tf_C, latent_J_kg: props.latent_J_kg },
    estimates,
    energyBalanceError,
    series,
    compliance: warmupCompliance(inp.ruleSet, direction, limit_C, Ti, series, horizon),
    assumptions,
    warnings,
  };
}

const round = (x: number) => Math.round(x * 1000) / 1000;
