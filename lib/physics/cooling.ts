/**
 * The cooling planner: cooked food cooled as a layer in a pan (or as a whole piece) in a walk-in
 * refrigerator, a blast chiller, an ice-water bath or on a cold plate, judged at its slowest point
 * against the rule set's two cooling stages, with the deepest layer that meets both.
 *
 * Model of a layer in a pan:
 * - Transient conduction through the depth of the food: the implicit enthalpy solver (solver1d.ts) on a
 *   slab from the pan's base (x = 0) to the open top (x = depth), properties from composition
 *   (properties.ts, Choi–Okos) [patankar1980, choiOkos1986].
 * - Open top: natural convection above a horizontal plate, or forced flow along it blended by the
 *   mixed-convection rule [incroperaFreeConv, incroperaForced, incroperaMixed]; exact σT⁴ radiation to
 *   surroundings at the air temperature; evaporation by the Chilton–Colburn analogy with the air's
 *   humidity (psychrometrics.ts) [chiltonColburn, hylandWexler1983].
 * - Lid on: no evaporation; the headspace by conduction across still air plus radiation between food
 *   and lid, then the lid wall and its outside (convection and radiation).
 * - Base: food-to-pan contact, the wall by conduction, then a wire rack (air below: convection and
 *   radiation), a solid shelf (taken as insulated), the bath water (natural convection in water) or a
 *   cold plate (a contact conductance to the plate temperature).
 * - Sides: the pan's walls (contact, wall, outside; the wetted part in water for a bath) cool the layer
 *   from its edges too. Their effect on the slowest point is taken by the product-solution factor of
 *   two slabs across the pan's width and length at constant properties [incroperaProduct, incroperaSeries]:
 *   T = T_side + (T_depth − T_side)·θ_width·θ_length. Near 1 for a wide pan for hours; it matters for
 *   narrow pans (1/6, 1/9) and long times.
 * A whole piece uses its own one-dimensional stand-in (geometry.ts) with the combined surface
 * coefficient of its shape (surfaces.ts), radiation and evaporation over the faces open to the air.
 */
import { coolInputSchema, coolMethodSchema, COOL_METHOD_LABELS, GASTRONORM_SIZES, PAN_MATERIALS, type CoolInput, type CoolMethod, type CoolMethodKind, type CoolParsed } from "../schemas/cool";
import { productThermal, warnPropertyRange, type FoodThermal } from "./properties";
import { itemShape } from "./geometry";
import { followingSurface, forcedFlatPlate, itemSurfaceCoefficient, mixedConvection, naturalHorizontalPlate, naturalVerticalPlate, radiationCoefficient, airProps, type Fluid } from "./surfaces";
import { evaporation } from "./psychrometrics";
import { solve1D, solverScale, type Boundary, type Solver1DResult } from "./solver1d";
import { seriesTheta } from "./conduction";
import { coolingStages, hasCoolingStages, reaches, type ComplianceLine, type CoolingStage, type Curve } from "./compliance";
import { brent, interpolateAt } from "./numerics";
import { PhysicsInputError } from "./validation";

export type RunnableMethod = Exclude<CoolMethod, { kind: "ice_paddle" }>;
export type RunnableKind = RunnableMethod["kind"];
export const RUNNABLE_METHODS: RunnableKind[] = ["walk_in", "blast_chiller", "ice_bath", "cold_plate"];

/** A judged cooling stage as the answer names it: compliance.ts's stage, flattened with its compliance line. */
export type CoolStageResult = Omit<CoolingStage, "line" | "countedFrom_s"> & Pick<ComplianceLine, "rule" | "status" | "detail">;

export interface CoolPoint {
  t_s: number;
  /** The slowest (warmest) point of the food. */
  slowest_C: number;
  /** The open top surface (a piece: its surface). */
  surface_C: number;
  /** The food at the pan's base (a piece: its centre). */
  bottom_C: number;
}

export interface CoolComparisonRow {
  kind: RunnableKind;
  label: string;
  method: RunnableMethod;
  stages: CoolStageResult[];
  meetsAll: boolean | null;
  maxDepth_m: number | null;
}

export interface CoolResult {
  stages: CoolStageResult[];
  /** Both stages met (true), one missed (false), or not judged (null). */
  meetsAll: boolean | null;
  /** Deepest layer that meets both stages with this pan and method, m; null if none does or it is not a pan. */
  maxDepth_m: number | null;
  maxDepth: { limitedBy: "pan" | "stages" | "none" | "not searched"; evaluations: number; detail: string };
  /** Water evaporated from the open top over the time looked at, kg. */
  waterEvaporated_kg: number;
  /** Share of the heat the food lost over the time looked at that left by evaporation from the open top. */
  evaporationShare: number;
  mass_kg: number;
  energyBalanceError: number;
  warnings: string[];
  assumptions: string[];
  series: CoolPoint[];
  comparison: CoolComparisonRow[] | null;
  compliance: ComplianceLine[];
}

const MAX_POINTS = 240;
/** Shallowest layer the depth search tries, m. */
export const MIN_SEARCH_DEPTH_M = 0.005;
/** Depth-search tolerance on the layer depth, m. */
const DEPTH_TOL_M = 0.0005;
/** Headspace under a lid below which the lid is taken to touch the food, m. */
const MIN_HEADSPACE_M = 0.002;

/** The air over the open surface of any method. */
function airOf(m: RunnableMethod): { T_C: number; speed_m_s: number; rh: number } {
  return { T_C: m.air_C, speed_m_s: m.speed_m_s, rh: m.relativeHumidity };
}

/**
 * Convective coefficient of one face: natural convection by its orientation (a horizontal face with
 * L = A/P, a vertical one with its height) blended with forced flow along its length by the
 * mixed-convection rule; still fluid below 0.05 m/s.
 */
function faceConvection(fluid: Fluid, Ts_C: number, T_C: number, face: { orientation: "up" | "down" | "vertical"; L_m: number; flow_m: number }, speed_m_s: number, warnings: string[]): number {
  const dT = Math.abs(Ts_C - T_C) < 0.05 ? 0.05 * (Ts_C >= T_C ? 1 : -1) : Ts_C - T_C;
  const Ts = T_C + dT;
  const hN = face.orientation === "vertical" ? naturalVerticalPlate(fluid, Ts, T_C, face.L_m, warnings).h_W_m2K : naturalHorizontalPlate(fluid, Ts, T_C, face.L_m, face.orientation, warnings).h_W_m2K;
  if (speed_m_s < 0.05 || fluid === "water") return hN;
  return mixedConvection(forcedFlatPlate(fluid, Ts, T_C, face.flow_m, speed_m_s, warnings).h_W_m2K, hN);
}

interface Faces {
  /** Boundary at the open top (or the lid), per m² of top. */
  top: Extract<Boundary, { kind: "convective" }>;
  /** Boundary at the base; absent when insulated. */
  bottom: Extract<Boundary, { kind: "convective" }> | undefined;
  /** Convective coefficient of the open top at Ts (for the water evaporated), or null with a lid / override. */
  topConvection: ((Ts_C: number) => number) | null;
}

interface Prepared {
  inp: CoolParsed;
  method: RunnableMethod;
  food: FoodThermal;
  warnings: string[];
  assumptions: string[];
  /** Pan layer or piece. */
  kind: "pan" | "piece";
  /** Top (open) area, m² (pan footprint; a piece: its open area). */
  topArea_m2: number;
  faces: (depth_m: number) => Faces;
  /** Lateral correction: the side coefficient and medium, constant properties. */
  lateral: ((depth_m: number) => { U_W_m2K: number; T_C: number }) | null;
  footprint: { length_m: number; width_m: number } | null;
  piece: { shape: "slab" | "cylinder" | "sphere"; halfSize_m: number; innerRadius_m: number; volume_m3: number; area_m2: number } | null;
  kConst_W_mK: number;
  alphaConst_m2_s: number;
  /** Medium the slowest point cools towards (for the time scale). */
  coolant_C: number;
}

function prepare(inp: CoolParsed, method: RunnableMethod): Prepared {
  const warnings: string[] = [];
  const assumptions: string[] = [];
  const p = inp.product;
  const shape = itemShape(p);
  const food = productThermal(p, shape);
  warnings.push(...food.warnings);
  const air = airOf(method);
  const eps = inp.emissivity;
  const o = inp.overrides;
  const Ti = inp.start_C;
  const coolant_C = method.kind === "ice_bath" ? method.water_C : method.kind === "cold_plate" ? method.plate_C : method.air_C;
  const Tm = (Ti + coolant_C) / 2;
  const k = food.k_W_mK(Tm);
  const alpha = k / (food.rho_kg_m3 * food.c_J_kgK(Tm));
  const scratch: string[] = [];

  // The evaporation takes the very coefficient the convection uses (held while the surface moves less than
  // 0.25 K): a coefficient evaluated afresh at every Newton iterate jumps where the surface crosses the air
  // temperature (the natural-convection correlation changes from a warm to a cold face there), and the
  // evaporation heat with it, which left the surface balance without a root (an ice bath under 3 °C air).
  const evaporationFlux = (h: (t: number, Ts: number) => number, fraction: number) => (t: number, Ts: number) => {
    const e = evaporation(h(t, Ts) / fraction, Ts, air.T_C, air.rh, 1, scratch);
    return { q_W_m2: -fraction * e.heat_W_m2, dq_dT_W_m2K: -fraction * e.slope_W_m2K };
  };

  if (inp.setup.kind === "piece") {
    if (method.kind !== "walk_in" && method.kind !== "blast_chiller") throw new PhysicsInputError("setup.kind", "A whole piece is planned in refrigerator or chiller air");
    const oneD = shape.oneD;
    const footprint = p.shape === "sphere" ? 0 : p.shape === "cylinder" ? Math.PI * (p.dimA_m / 2) ** 2 : (p.dimB_m ?? 0) * (p.dimC_m ?? 0);
    const open = method.support === "shelf" ? Math.max(0.05, 1 - (p.shape === "sphere" ? 0 : footprint / shape.area_m2)) : 1;
    const surroundings = { fluid: "air" as const, T_C: air.T_C, speed_m_s: air.speed_m_s };
    itemSurfaceCoefficient(shape.convection, Tm, surroundings, eps, warnings);
    const hc = (Ts: number) => itemSurfaceCoefficient(shape.convection, Ts, surroundings, 0, scratch).hConvective_W_m2K;
    const top: Faces["top"] =
      o.topH_W_m2K !== null
        ? { kind: "convective", h_W_m2K: () => o.topH_W_m2K! * open, fluid_C: () => air.T_C }
        : (() => {
            const h = followingSurface((Ts) => open * hc(Ts));
            return { kind: "convective" as const, h_W_m2K: h, fluid_C: () => air.T_C, emissivity: open * eps, radiant_C: () => air.T_C, surfaceFlux: evaporationFlux(h, open) };
          })();
    assumptions.push(
      `A whole piece: ${oneD.note ?? `the ${oneD.shape} stand-in for its shape`}; its slowest point is the centre`,
      o.topH_W_m2K !== null
        ? `Surface coefficient given: ${o.topH_W_m2K} W/(m²·K), used as given`
        : `Its faces open to the air exchange by convection (combined correlations for its shape), radiation (ε = ${eps}) and evaporation of water from a wet surface (Chilton–Colburn analogy, air at ${Math.round(air.rh * 100)} % relative humidity)`,
      method.support === "shelf" ? `On a solid shelf: the face it stands on (${Math.round((1 - open) * 100)} % of its surface) is taken as insulated` : "On a wire rack: every face is open to the air",
    );
    if (oneD.shape !== "slab" && oneD.innerRadius_m > 0) assumptions.push("Hollow item: the cavity face is insulated");
    return {
      inp,
      method,
      food,
      warnings,
      assumptions,
      kind: "piece",
      topArea_m2: shape.area_m2 * open,
      faces: () => ({ top, bottom: undefined, topConvection: o.topH_W_m2K !== null ? null : (Ts) => open * hc(Ts) }),
      lateral: null,
      footprint: null,
      piece: { shape: oneD.shape, halfSize_m: oneD.halfSize_m, innerRadius_m: oneD.innerRadius_m, volume_m3: shape.volume_m3, area_m2: shape.area_m2 },
      kConst_W_mK: k,
      alphaConst_m2_s: alpha,
      coolant_C,
    };
  }

  // ---- a layer in a pan
  const s = inp.setup;
  const [Lp, Wp] = GASTRONORM_SIZES[s.size];
  const mat = PAN_MATERIALS[s.material];
  const wall = s.wall_m ?? mat.wall_m;
  const Rwall = wall / mat.k_W_mK;
  const area = Lp * Wp;
  const Lc = area / (2 * (Lp + Wp));
  const topFace = { orientation: "up" as const, L_m: Lc, flow_m: Lp };
  const hcTop = (Ts: number) => faceConvection("air", Ts, air.T_C, topFace, air.speed_m_s, scratch);
  faceConvection("air", Tm, air.T_C, topFace, air.speed_m_s, warnings);
  const epsPan = mat.emissivity;

  // Series path food → contact → wall → outside coefficient hOut(T_outer wall), the outer wall temperature found by two passes.
  const throughWall = (Ts: number, medium_C: number, hOut: (Tw: number) => number) => {
    let U = 0;
    let Tw = (Ts + medium_C) / 2;
    for (let i = 0; i < 3; i++) {
      const ho = Math.max(hOut(Tw), 1e-6);
      U = 1 / (1 / s.contact_W_m2K + Rwall + 1 / ho);
      Tw = medium_C + (U / ho) * (Ts - medium_C);
    }
    return U;
  };
  // Outside of a wall in air: convection on the face plus linearised radiation to surroundings at the air temperature.
  const inAir = (face: { orientation: "up" | "down" | "vertical"; L_m: number; flow_m: number }, e: number) => (Tw: number) =>
    faceConvection("air", Tw, air.T_C, face, air.speed_m_s, scratch) + radiationCoefficient(e, Tw, air.T_C);
  const baseFaceAir = { orientation: "down" as const, L_m: Lc, flow_m: Lp };
  const baseFaceWater = { orientation: "down" as const, L_m: Lc, flow_m: Lp };

  const faces = (depth: number): Faces => {
    let top: Faces["top"];
    let topConvection: Faces["topConvection"] = null;
    if (o.topH_W_m2K !== null) top = { kind: "convective", h_W_m2K: () => o.topH_W_m2K!, fluid_C: () => air.T_C };
    else if (!s.lid) {
      const h = followingSurface(hcTop);
      top = { kind: "convective", h_W_m2K: h, fluid_C: () => air.T_C, emissivity: eps, radiant_C: () => air.T_C, surfaceFlux: evaporationFlux(h, 1) };
      topConvection = hcTop;
    } else {
      const gap = s.height_m - depth;
      const lidOut = inAir({ orientation: "up", L_m: Lc, flow_m: Lp }, epsPan);
      const hLid = (Ts: number) => {
        // Headspace: still-air conduction plus radiation between food (ε) and the lid's underside (ε_pan).
        let TL = (Ts + air.T_C) / 2;
        let U = 0;
        for (let i = 0; i < 3; i++) {
          const epsEff = 1 / (1 / eps + 1 / epsPan - 1);
          const hGap = gap < MIN_HEADSPACE_M ? s.contact_W_m2K : airProps((Ts + TL) / 2).k_W_mK / gap + radiationCoefficient(epsEff, Ts, TL);
          const ho = lidOut(TL);
          U = 1 / (1 / hGap + Rwall + 1 / ho);
          TL = air.T_C + (U / ho) * (Ts - air.T_C);
        }
        return U;
      };
      top = { kind: "convective", h_W_m2K: followingSurface(hLid), fluid_C: () => air.T_C };
    }
    let bottom: Faces["bottom"];
    if (o.bottomH_W_m2K !== null) bottom = { kind: "convective", h_W_m2K: () => o.bottomH_W_m2K!, fluid_C: () => coolant_C };
    else if ((method.kind === "walk_in" || method.kind === "blast_chiller") && method.support === "shelf") bottom = undefined;
    else if (method.kind === "walk_in" || method.kind === "blast_chiller") {
      const out = inAir(baseFaceAir, epsPan);
      bottom = { kind: "convective", h_W_m2K: followingSurface((Ts) => throughWall(Ts, air.T_C, out)), fluid_C: () => air.T_C };
    } else if (method.kind === "ice_bath") {
      const out = (Tw: number) => faceConvection("water", Tw, method.water_C, baseFaceWater, 0, scratch);
      bottom = { kind: "convective", h_W_m2K: followingSurface((Ts) => throughWall(Ts, method.water_C, out)), fluid_C: () => method.water_C };
    } else {
      bottom = { kind: "convective", h_W_m2K: followingSurface((Ts) => throughWall(Ts, method.plate_C, () => method.contact_W_m2K)), fluid_C: () => method.plate_C };
    }
    return { top, bottom, topConvection };
  };

  // Sides: area-weighted between water (below the bath level) and air, at a representative temperature.
  const lateral = (depth: number) => {
    const side = { orientation: "vertical" as const, L_m: depth, flow_m: depth };
    const Uair = throughWall(Tm, air.T_C, inAir(side, epsPan));
    if (method.kind === "ice_bath") {
      const level = Math.min(method.level_m ?? depth, depth);
      const f = level / depth;
      const Uw = throughWall(Tm, method.water_C, (Tw) => faceConvection("water", Tw, method.water_C, { orientation: "vertical", L_m: Math.max(level, 0.005), flow_m: level }, 0, scratch));
      const U = f * Uw + (1 - f) * Uair;
      return { U_W_m2K: U, T_C: (f * Uw * method.water_C + (1 - f) * Uair * air.T_C) / Math.max(U, 1e-9) };
    }
    return { U_W_m2K: Uair, T_C: air.T_C };
  };

  const wallCap = mat.rho_kg_m3 * mat.c_J_kgK * wall;
  assumptions.push(
    `A ${(s.height_m * 1000).toFixed(0)} mm gastronorm ${s.size} pan (${(Lp * 1000).toFixed(0)} × ${(Wp * 1000).toFixed(0)} mm, nominal size taken as the food's footprint) of ${mat.label.toLowerCase()} with ${(wall * 1000).toFixed(1)} mm walls (k = ${mat.k_W_mK} W/(m·K); ${mat.source}); food-to-pan contact ${s.contact_W_m2K} W/(m²·K)`,
    `Conduction through the food's depth by the implicit enthalpy solver; the slowest point is the warmest point of the layer at each moment. The food is a solid: stirring and liquid convection inside it (a thin soup) are outside the model, so for liquids the estimate errs slow`,
    o.topH_W_m2K !== null
      ? `Top coefficient given: ${o.topH_W_m2K} W/(m²·K), used as given (no separate radiation or evaporation)`
      : s.lid
        ? `Lid on: no evaporation (vapour condensing under the lid is taken to drip back, and the heat it carries across the headspace is neglected); the headspace by still-air conduction and radiation, without the natural convection of air heated from below, then the lid and its outside. Both neglected paths would speed the cooling, so with a lid the estimate errs slow`
        : `Open top: convection (horizontal plate${air.speed_m_s >= 0.05 ? ", blended with forced flow along the pan's length" : ""}), radiation (ε = ${eps}) to surroundings at the air temperature, and evaporation of water from the wet surface (surface water activity 1) by the Chilton–Colburn analogy, air at ${air.T_C} °C and ${Math.round(air.rh * 100)} % relative humidity. The mass lost by evaporation is not taken off the layer`,
    o.bottomH_W_m2K !== null
      ? `Base coefficient given: ${o.bottomH_W_m2K} W/(m²·K) to ${coolant_C} °C, used as given`
      : (method.kind === "walk_in" || method.kind === "blast_chiller") && method.support === "shelf"
        ? "On a solid shelf: the pan's base is taken as insulated (a metal shelf would carry some heat away, so this errs slow)"
        : method.kind === "ice_bath"
          ? `In an ice-water bath at ${method.water_C} °C kept at that temperature (enough ice), water level ${method.level_m === null ? "with the food" : `${(method.level_m * 1000).toFixed(0)} mm`} against the pan; still water (natural convection) on the base and the wetted sides`
          : method.kind === "cold_plate"
            ? `On a cold plate held at ${method.plate_C} °C, pan-to-plate contact ${method.contact_W_m2K} W/(m²·K)`
            : "On a wire rack: the pan's base is open to the air (convection and radiation; the wires are not modelled)",
    `The pan wall's heat capacity (${(wallCap / 1000).toFixed(1)} kJ/(m²·K)) is neglected beside the food's`,
    `Sides: the pan's walls cool the edges; their effect on the slowest point is the product-solution factor of slabs across the width and length at constant properties (k = ${k.toFixed(3)} W/(m·K), α = ${alpha.toExponential(2)} m²/s at ${Tm.toFixed(0)} °C)`,
  );
  return {
    inp,
    method,
    food,
    warnings,
    assumptions,
    kind: "pan",
    topArea_m2: area,
    faces,
    lateral,
    footprint: { length_m: Lp, width_m: Wp },
    piece: null,
    kConst_W_mK: k,
    alphaConst_m2_s: alpha,
    coolant_C,
  };
}

interface Run {
  curve: Curve;
  surface_C: number[];
  bottom_C: number[];
  solver: Solver1DResult;
}

/** One run of the layer (depth_m) or the piece, until tEnd_s or until `stop` says so. */
function simulate(P: Prepared, depth_m: number, tEnd_s: number, stop?: (t_s: number, slowest_C: number) => boolean): Run {
  const f = P.faces(depth_m);
  const L = P.piece ? P.piece.halfSize_m : depth_m;
  const inner = P.piece ? P.piece.innerRadius_m : 0;
  const span = L - inner;
  const tau = (span * span) / Math.max(P.alphaConst_m2_s, 1e-9);
  const dt = Math.min(Math.max(tau / 3000, 0.5), 30);
  const solver = solve1D({
    shape: P.piece ? P.piece.shape : "slab",
    halfSize_m: L,
    innerRadius_m: inner || undefined,
    nodes: 41,
    material: P.food,
    initial_C: P.inp.start_C,
    boundary: f.top,
    innerBoundary: f.bottom,
    tEnd_s,
    dt_s: dt,
    adaptive: { target_K: 0.3, dtMax_s: Math.min(300, tEnd_s / 200) },
    stopWhen: stop ? (st) => stop(st.t_s, st.max_C) : undefined,
  });
  const max = solver.max_C!;
  let slowest = max;
  if (P.lateral && P.footprint) {
    const lat = P.lateral(depth_m);
    const k = P.kConst_W_mK;
    const a = P.alphaConst_m2_s;
    // Below Fo = 0.005 the centre of a slab has not felt its faces (erfc(1/(2√Fo)) < 10⁻²⁰): the factor is 1.
    const factor = (half: number, t: number) => {
      const Fo = (a * t) / (half * half);
      return Fo < 0.005 ? 1 : seriesTheta("slab", Math.max((lat.U_W_m2K * half) / k, 1e-9), Fo, 0);
    };
    const hw = P.footprint.width_m / 2;
    const hl = P.footprint.length_m / 2;
    slowest = max.map((T, i) => {
      const t = solver.t_s[i];
      return lat.T_C + (T - lat.T_C) * factor(hw, t) * factor(hl, t);
    });
  }
  return { curve: { t_s: solver.t_s, T_C: slowest }, surface_C: solver.surface_C, bottom_C: solver.center_C, solver };
}

/** A curve's temperature at t, held at the ends (numerics.ts interpolateAt). */
// Every curve starts with its first point, so the clamped interpolation always has a value.
const at = (c: Curve, t: number): number => interpolateAt(c.t_s, c.T_C, t)!;

/** Longest a search run goes (it stops once both deadlines are past). */
const SEARCH_CAP_S = 48 * 3600;

/**
 * How far a layer of this depth is from meeting both stages, in kelvin at the deadlines: the smaller of
 * (stage-1 end temperature − slowest point at the stage-1 deadline) and the same for stage 2. Positive:
 * meets both; it falls as the layer deepens, so its zero is the deepest layer that just meets them.
 */
function stageMargin_K(P: Prepared, depth_m: number): number {
  const rs = P.inp.ruleSet;
  const from = rs.coolFrom_C!;
  const to1 = rs.coolStage1To_C!;
  const to2 = rs.coolStage2To_C!;
  const max1 = rs.coolStage1Max_s!;
  const max2 = rs.coolStage2Max_s!;
  const inAll = rs.coolStage2Counted === "in_all";
  let t0: number | null = P.inp.start_C <= from ? 0 : null;
  let t1: number | null = null;
  // The uncorrected warmest point is never below the corrected one, so its clock times are upper bounds.
  const run = simulate(P, depth_m, SEARCH_CAP_S, (t, T) => {
    if (t0 === null && T <= from) t0 = t;
    if (t0 !== null && t1 === null && T <= to1) t1 = t;
    if (t0 !== null && t1 === null && t > t0 + max1 + 60) return true;
    if (t1 !== null && t > (inAll ? t0! : t1) + max2 + 60) return true;
    return false;
  });
  const c = run.curve;
  const c0 = P.inp.start_C <= from ? 0 : reaches(c, from, true);
  if (c0 === null) return to1 - c.T_C[c.T_C.length - 1];
  const m1 = to1 - at(c, c0 + max1);
  const c1 = reaches(c, to1, true, c0);
  if (c1 === null) return Math.min(m1, to2 - at(c, c0 + max2));
  const m2 = to2 - at(c, (inAll ? c0 : c1) + max2);
  return Math.min(m1, m2);
}

function stagesOf(P: Prepared, run: Run, horizon_s: number): CoolStageResult[] {
  return coolingStages(P.inp.ruleSet, run.curve, horizon_s).map((s) => ({ stage: s.stage, from_C: s.from_C, to_C: s.to_C, limit_s: s.limit_s, reached_s: s.reached_s, meets: s.meets, rule: s.line.rule, status: s.line.status, detail: s.line.detail }));
}

function meetsAllOf(st: CoolStageResult[]): boolean | null {
  if (st.some((s) => s.meets === false)) return false;
  if (st.length === 2 && st.every((s) => s.meets === true)) return true;
  return null;
}

function searchDepth(P: Prepared): { value: number | null; limitedBy: CoolResult["maxDepth"]["limitedBy"]; evaluations: number; detail: string } {
  if (P.kind !== "pan" || P.inp.setup.kind !== "pan") return { value: null, limitedBy: "not searched", evaluations: 0, detail: "A whole piece has no layer depth to search; cut or portion it to cool it faster" };
  if (!hasCoolingStages(P.inp.ruleSet)) return { value: null, limitedBy: "not searched", evaluations: 0, detail: `"${P.inp.ruleSet.name}" sets no two-stage cooling limit` };
  if (P.inp.start_C <= P.inp.ruleSet.coolStage1To_C!) return { value: null, limitedBy: "not searched", evaluations: 0, detail: "The food starts at or below the stage-1 end temperature: the two-stage limit does not apply" };
  const hi = P.inp.setup.height_m;
  const lo = Math.min(MIN_SEARCH_DEPTH_M, hi);
  const fHi = stageMargin_K(P, hi);
  if (fHi >= 0) return { value: hi, limitedBy: "pan", evaluations: 1, detail: `A full ${(hi * 1000).toFixed(0)} mm pan meets both stages: the pan, not the cooling, limits the depth` };
  const fLo = stageMargin_K(P, lo);
  if (fLo < 0) return { value: null, limitedBy: "none", evaluations: 2, detail: `Even a ${(lo * 1000).toFixed(0)} mm layer misses a stage with this method: choose another method` };
  const r = brent((d) => stageMargin_K(P, d), lo, hi, { xtol_abs: DEPTH_TOL_M, fa: fLo, fb: fHi, maxEvaluations: 40 });
  // The root is where the margin is zero; report the side that meets.
  const value = r.fx >= 0 ? r.x : Math.max(lo, r.x - DEPTH_TOL_M);
  return { value, limitedBy: "stages", evaluations: r.evaluations + 2, detail: `Deepest layer meeting both stages, found by Brent's method to ±${(DEPTH_TOL_M * 1000).toFixed(1)} mm [brent1973]` };
}

function downsample(run: Run): CoolPoint[] {
  const n = run.curve.t_s.length;
  const every = Math.max(1, Math.ceil(n / MAX_POINTS));
  const r2 = (x: number) => Math.round(x * 100) / 100;
  const out: CoolPoint[] = [];
  for (let i = 0; i < n; i += every) out.push({ t_s: run.curve.t_s[i], slowest_C: r2(run.curve.T_C[i]), surface_C: r2(run.surface_C[i]), bottom_C: r2(run.bottom_C[i]) });
  if (out[out.length - 1].t_s !== run.curve.t_s[n - 1]) out.push({ t_s: run.curve.t_s[n - 1], slowest_C: r2(run.curve.T_C[n - 1]), surface_C: r2(run.surface_C[n - 1]), bottom_C: r2(run.bottom_C[n - 1]) });
  return out;
}

function depthOf(inp: CoolParsed): number {
  return inp.setup.kind === "pan" ? inp.setup.depth_m : 0;
}

/** One method's plan: its run, its stages and (optionally) its deepest layer. */
function planOne(inp: CoolParsed, method: RunnableMethod, withDepth: boolean) {
  const P = prepare(inp, method);
  const run = simulate(P, depthOf(inp), inp.horizon_s);
  const stages = stagesOf(P, run, inp.horizon_s);
  const depth = withDepth ? searchDepth(P) : { value: null, limitedBy: "not searched" as const, evaluations: 0, detail: "Depth search not asked for" };
  return { P, run, stages, depth };
}

/** Runs the cooling planner on untrusted input (throws a PhysicsInputError naming the field on bad input). */
export function runCool(raw: CoolInput): CoolResult {
  const parsed = coolInputSchema.safeParse(raw);
  if (!parsed.success) throw new PhysicsInputError(parsed.error.issues[0].path.join("."), parsed.error.issues[0].message);
  return runCoolParsed(parsed.data);
}

/** The cooling planner on a parsed input. */
export function runCoolParsed(inp: CoolParsed): CoolResult {
  if (inp.method.kind === "ice_paddle") throw new PhysicsInputError("method.kind", "Ice paddle: not modelled (see the schema's message)");
  const method = inp.method;
  const { P, run, stages, depth } = planOne(inp, method, inp.searchDepth);
  // The initial freezing point matters only if some of the food comes near it.
  const nearFreezing = run.solver.minT_C < P.food.Tf_C + 1;
  const warnings = P.warnings.filter((w) => nearFreezing || !w.startsWith("Initial freezing point not given"));
  const assumptions = [...P.assumptions];
  warnPropertyRange(warnings, run.solver.minT_C, run.solver.maxT_C);
  const rs = inp.ruleSet;
  if (!hasCoolingStages(rs)) warnings.push(`"${rs.name}" sets no two-stage cooling limit: the stages are not judged; check your food code`);
  if (method.kind === "walk_in") warnings.push("The refrigerator air is taken to stay at its set temperature: hot pans warm a loaded walk-in, which then cools them more slowly than estimated here");
  const coldest = Math.min(...run.surface_C, ...run.bottom_C);
  if (coldest < P.food.Tf_C) warnings.push(`The food's surface falls below its initial freezing point (${P.food.Tf_C.toFixed(1)} °C, to ${coldest.toFixed(1)} °C) within the ${(inp.horizon_s / 3600).toFixed(0)} h looked at: it starts to freeze there (included in the model); a chiller's cycle usually ends before that`);
  // A slowest point that levels off above the stage-2 end temperature never gets there: say where it settles.
  const s2 = stages.find((x) => x.stage === 2);
  if (hasCoolingStages(rs) && stages.length > 0 && (!s2 || s2.reached_s === null)) {
    const c = run.curve;
    const tl = c.t_s[c.t_s.length - 1];
    const drop = at(c, tl - 3600) - at(c, tl);
    if (tl >= 2 * 3600 && drop < 0.2) {
      warnings.push(
        `The slowest point levels off near ${at(c, tl).toFixed(1)} °C, above ${rs.coolStage2To_C} °C: ${P.kind === "pan" && method.kind !== "walk_in" && method.kind !== "blast_chiller" ? `the open top faces air at ${method.air_C} °C; cover it or move the pan to a refrigerator` : "the air is not cold enough to finish stage 2"}`,
      );
    }
  }

  // Evaporation over the run: the water lost and its share of the heat through the top.
  let water = 0;
  let evapHeat = 0;
  const f = P.faces(depthOf(inp));
  const air = airOf(method);
  const area = P.topArea_m2;
  const scratch: string[] = [];
  const evap = (Ts: number) => (f.topConvection ? evaporation(f.topConvection(Ts), Ts, air.T_C, air.rh, 1, scratch) : null);
  for (let i = 1; i < run.curve.t_s.length; i++) {
    const dt = run.curve.t_s[i] - run.curve.t_s[i - 1];
    const a = evap(run.surface_C[i - 1]);
    const b = evap(run.surface_C[i]);
    if (a && b) {
      water += 0.5 * (a.flux_kg_m2s + b.flux_kg_m2s) * dt * area;
      evapHeat += 0.5 * (a.heat_W_m2 + b.heat_W_m2) * dt * area;
    }
  }
  // Heat the food lost: the solver's stored change per unit measure, scaled to the pan's footprint or the piece.
  const heatLost = -run.solver.storedChange_J * (P.piece ? solverScale(P.piece.shape, P.piece.area_m2, P.piece.halfSize_m) : area);
  const mass = P.piece ? P.food.rho_kg_m3 * P.piece.volume_m3 : P.food.rho_kg_m3 * area * depthOf(inp);
  if (water > 0.05 * mass) warnings.push(`About ${((water / mass) * 100).toFixed(0)} % of the food's mass evaporates in the ${(inp.horizon_s / 3600).toFixed(0)} h looked at; the model keeps the mass and the properties as they were`);

  const comparison: CoolComparisonRow[] | null = inp.compare
    ? RUNNABLE_METHODS.filter((k) => P.kind === "pan" || k === "walk_in" || k === "blast_chiller").map((kind) => {
        const m: RunnableMethod = kind === method.kind ? method : (coolMethodSchema.parse({ kind }) as RunnableMethod);
        if (inp.start_C <= (m.kind === "ice_bath" ? m.water_C : m.kind === "cold_plate" ? m.plate_C : m.air_C)) {
          return { kind, label: COOL_METHOD_LABELS[kind], method: m, stages: [], meetsAll: null, maxDepth_m: null };
        }
        const one = kind === method.kind ? { stages, depth } : planOne(inp, m, inp.searchDepth);
        return { kind, label: COOL_METHOD_LABELS[kind], method: m, stages: one.stages, meetsAll: meetsAllOf(one.stages), maxDepth_m: one.depth.value };
      })
    : null;
  if (comparison) assumptions.push("Side by side: each other method with its usual settings (the schema's defaults), the same pan or piece, the same food and starting temperature");

  return {
    stages,
    meetsAll: meetsAllOf(stages),
    maxDepth_m: depth.value,
    maxDepth: { limitedBy: depth.limitedBy, evaluations: depth.evaluations, detail: depth.detail },
    waterEvaporated_kg: water,
    evaporationShare: heatLost > 0 ? Math.min(1, Math.max(0, evapHeat / heatLost)) : 0,
    mass_kg: mass,
    energyBalanceError: Math.abs(run.solver.energyError_J) / Math.max(Math.abs(run.solver.storedChange_J), 1e-30),
    warnings: [...new Set(warnings)],
    assumptions,
    series: downsample(run),
    comparison,
    compliance: stages.map((s) => ({ rule: s.rule, status: s.status, detail: s.detail })),
  };
}

export type { CoolMethodKind };

export interface CoolingRecordRow {
  /** Time since the food went into the cooling, s. */
  t_s: number;
  label: string;
  /** The model's slowest-point temperature then (°C), for comparison with the probe. */
  expected_C: number;
  /** The rule set's limit that falls due at this row, if any. */
  limit_C: number | null;
}

export interface CoolingRecord {
  title: string;
  /** What the kitchen fills in on each row. */
  blanks: string[];
  rows: CoolingRecordRow[];
  /** The stage lines, as judged on the model. */
  stages: CoolStageResult[];
}

/**
 * The cooling record a kitchen keeps, laid out from a plan: a row at the start, every `every_s`
 * (default hourly) and at each stage deadline, each with the model's slowest-point temperature and the
 * limit due, and blanks for the probe reading, the clock time and the initials. Deadlines are placed where
 * the model puts the stage clocks (the food reaching `coolFrom_C`); on the day they start when the probe
 * reads that temperature, as the rule says.
 */
export function coolingRecord(inp: CoolParsed, r: CoolResult, every_s = 3600): CoolingRecord {
  const rs = inp.ruleSet;
  const curve: Curve = { t_s: r.series.map((p) => p.t_s), T_C: r.series.map((p) => p.slowest_C) };
  const rows: CoolingRecordRow[] = [];
  const due: { t: number; label: string; limit: number }[] = [];
  const s1 = r.stages.find((s) => s.stage === 1);
  if (hasCoolingStages(rs) && s1) {
    const t0 = inp.start_C <= rs.coolFrom_C! ? 0 : reaches(curve, rs.coolFrom_C!, true);
    if (t0 !== null) {
      due.push({ t: t0 + rs.coolStage1Max_s!, label: `Stage 1 due: at or below ${rs.coolStage1To_C} °C`, limit: rs.coolStage1To_C! });
      const base = rs.coolStage2Counted === "in_all" ? t0 : s1.reached_s !== null ? t0 + s1.reached_s : null;
      if (base !== null) due.push({ t: base + rs.coolStage2Max_s!, label: `Stage 2 due: at or below ${rs.coolStage2To_C} °C`, limit: rs.coolStage2To_C! });
      if (t0 > 0) rows.push({ t_s: t0, label: `Expected at ${rs.coolFrom_C} °C: the stage clock starts`, expected_C: at(curve, t0), limit_C: null });
    }
  }
  const end = Math.min(inp.horizon_s, Math.max(...due.map((d) => d.t), every_s));
  for (let t = 0; t <= end + 1e-9; t += every_s) rows.push({ t_s: t, label: t === 0 ? "Into the cooling" : `Check after ${(t / 3600).toFixed(1)} h`, expected_C: at(curve, t), limit_C: null });
  for (const d of due) if (d.t <= inp.horizon_s) rows.push({ t_s: d.t, label: d.label, expected_C: at(curve, d.t), limit_C: d.limit });
  rows.sort((a, b) => a.t_s - b.t_s);
  const what = inp.setup.kind === "pan" ? `${inp.product.name}, ${(inp.setup.depth_m * 1000).toFixed(0)} mm in a ${inp.setup.size} pan${inp.setup.lid ? " with its lid" : ""}` : `${inp.product.name}, whole`;
  return {
    title: `Cooling record: ${what}, ${COOL_METHOD_LABELS[inp.method.kind].toLowerCase()}, from ${inp.start_C} °C (${rs.name})`,
    blanks: ["Clock time", "Probe reading (°C)", "Initials", "Action if over the limit"],
    rows,
    stages: r.stages,
  };
}
