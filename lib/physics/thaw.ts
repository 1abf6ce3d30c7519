/**
 * The thaw planner: how long a frozen item takes to thaw by a given method, how long its surface sits
 * above the chill limit meanwhile, and whether that meets the chosen rule set. Every method runs on
 * the core's implicit enthalpy solver (solver1d.ts) with the item's own shape and properties.
 */
import { firstCrossing } from "./numerics";
import { thawInputSchema, THAW_METHOD_LABELS, type ThawInput, type ThawMethod, type ThawMethodKind, type ThawParsed } from "../schemas/thaw";
import type { Material, Product, RuleSet } from "../schemas/templates";
import { productThermal, warnPropertyRange, type FoodThermal } from "./properties";
import { itemShape, type ItemShape } from "./geometry";
import { followingSurface, itemSurfaceCoefficient, naturalHorizontalPlate, forcedFlatPlate, mixedConvection, radiationCoefficient, type Surroundings } from "./surfaces";
import { annularFinEfficiency, straightFinEfficiency } from "./fins";
import { solve1D, type Boundary, type Solver1DResult } from "./solver1d";
import { closedFormEstimates, type EstimateInputs } from "./phase-change";
import { PhysicsInputError } from "./validation";
import { thawTimeAboveLine, type ComplianceLine } from "./compliance";

/** Share of a round item's projected area that actually touches a tray: a circle of half its radius (our assumption). */
export const ROUND_CONTACT_FRACTION = 0.25;
/** Coefficient between a bath's outside and the room, 10 W/(m²·K) (common practice for a tub in still air, convection plus radiation). */
export const BATH_TO_ROOM_W_M2K = 10;
/** Density and specific heat of the bath water near 15 °C: 999 kg/m³, 4186 J/(kg·K) (Incropera 6th ed., Table A.6; from memory). */
const WATER_RHO = 999;
const WATER_C = 4186;

export type { ComplianceLine };

export interface ThawMethodResult {
  kind: ThawMethodKind;
  label: string;
  settings: ThawMethod;
  thawTime_s: number | null;
  surfaceAboveLimit_s: number;
  maxSurface_C: number;
  compliance: ComplianceLine[];
  estimates: { plank_s: number | null; pham_s: number | null; inputs: EstimateInputs };
  h_W_m2K: number;
  startBy: string | null;
  fridgeSpaceTime_m3h: number | null;
  energyBalanceError: number;
  steps: number;
  series: { t_s: number; center_C: number; surface_C: number }[];
  notes: string[];
}

export interface ThawResult extends ThawMethodResult {
  /** Whether the "start by" time has already passed (null when there is none). */
  startByPassed: boolean | null;
  endPoint_C: number;
  chillLimit_C: number;
  comparison: ThawMethodResult[] | null;
  assumptions: string[];
  warnings: string[];
  advice: string[];
}

/**
 * Step control (lib/physics/solver1d.ts) and nodes across the item, chosen by measurement (the five
 * methods for the demo cod block against 121 nodes with 0.02 K steps): at 31 nodes and 1 K the thaw time
 * is within 0.1 % and the time the surface sits above the chill limit within 0.2 % (21 nodes: 0.35 %).
 */
const THAW_TARGET_K = 1;
const NODES = 31;
const MAX_POINTS = 240;

/**
 * The tray used by `compare` when no tray was chosen: a 6 mm anodised aluminium defrost plate.
 * k, ρ, c of pure aluminium (Incropera & DeWitt 6th ed., Table A.1); ε ≈ 0.8 and α ≈ 0.15 for
 * anodised aluminium (general radiative-property tables; from memory).
 */
export const DEFAULT_TRAY: Material = {
  name: "Anodised aluminium plate (built-in default)",
  category: "tray",
  conductivity_W_mK: 237,
  conductivitySource: "Incropera & DeWitt, 6th ed., Table A.1",
  density_kg_m3: 2702,
  densitySource: "Incropera & DeWitt, 6th ed., Table A.1",
  specificHeat_J_kgK: 903,
  specificHeatSource: "Incropera & DeWitt, 6th ed., Table A.1",
  emissivity: 0.8,
  emissivitySource: "Anodised aluminium, general radiative-property tables (from memory)",
  solarAbsorptivity: 0.15,
  solarAbsorptivitySource: "General radiative-property tables (from memory)",
  notes: "",
};

/** The usual settings of each method, for `compare`. The tray is the chosen one, else DEFAULT_TRAY. */
export function defaultMethod(kind: ThawMethodKind, tray: Material | null): ThawMethod | null {
  switch (kind) {
    case "fridge_air":
      return { kind, air_C: 4, speed_m_s: 0.3 };
    case "room_air":
      return { kind, air_C: 21, speed_m_s: 0.1 };
    case "running_water":
      return { kind, water_C: 15, speed_m_s: 0.05, packaging: { thickness_m: 0.0001, k_W_mK: 0.33 } };
    case "still_water":
      return { kind, water_C: 15, bath_m3: 0.02, changeEvery_s: 1800, room_C: 21, packaging: { thickness_m: 0.0001, k_W_mK: 0.33 } };
    case "tray":
      return { kind, air_C: 4, speed_m_s: 0.3, tray: tray ?? DEFAULT_TRAY, trayThickness_m: 0.006, trayLength_m: 0.6, trayWidth_m: 0.4, undersideExposed: true, contact_W_m2K: 200 };
  }
}

interface Item {
  p: Product;
  shape: ItemShape;
  food: FoodThermal;
  m: 0 | 1 | 2;
  R: number;
  /** Radius of the insulated cavity face of a hollow item (0 when solid). */
  Ri: number;
  footprint: { area_m2: number; contact_m2: number; round: boolean; r_m: number; a_m: number; b_m: number };
}

function makeItem(p: Product): Item {
  const shape = itemShape(p);
  const food = productThermal(p, shape);
  const m = shape.oneD.shape === "slab" ? 0 : shape.oneD.shape === "cylinder" ? 1 : 2;
  // A solid item: the 1-D shape with the item's own V/A. A hollow one: its real shell.
  const R = shape.hollow ? shape.hollow.outer_m : ((m + 1) * shape.volume_m3) / shape.area_m2;
  const Ri = shape.hollow ? shape.hollow.inner_m : 0;
  let footprint: Item["footprint"];
  if (p.shape === "sphere") {
    const r = p.dimA_m / 2;
    footprint = { area_m2: Math.PI * r * r, contact_m2: ROUND_CONTACT_FRACTION * Math.PI * r * r, round: true, r_m: r, a_m: 2 * r, b_m: 2 * r };
  } else if (p.shape === "cylinder") {
    const r = p.dimA_m / 2;
    footprint = { area_m2: Math.PI * r * r, contact_m2: Math.PI * r * r, round: true, r_m: r, a_m: 2 * r, b_m: 2 * r };
  } else {
    const a = p.dimB_m!;
    const b = p.dimC_m!;
    footprint = { area_m2: a * b, contact_m2: a * b, round: false, r_m: Math.sqrt((a * b) / Math.PI), a_m: a, b_m: b };
  }
  return { p, shape, food, m, R, Ri, footprint };
}

function seriesDown(r: Solver1DResult) {
  const every = Math.max(1, Math.ceil(r.t_s.length / MAX_POINTS));
  const out: { t_s: number; center_C: number; surface_C: number }[] = [];
  for (let i = 0; i < r.t_s.length; i += every) out.push({ t_s: r.t_s[i], center_C: round(r.center_C[i]), surface_C: round(r.surface_C[i]) });
  const l = r.t_s.length - 1;
  if (out[out.length - 1].t_s !== r.t_s[l]) out.push({ t_s: r.t_s[l], center_C: round(r.center_C[l]), surface_C: round(r.surface_C[l]) });
  return out;
}
const round = (x: number) => Math.round(x * 1000) / 1000;

/** Time above a limit along a sampled curve (linear between samples), up to time tEnd. */
function timeAbove(t: number[], y: number[], limit: number, tEnd: number): number {
  let s = 0;
  for (let i = 1; i < t.length && t[i - 1] < tEnd; i++) {
    const t0 = t[i - 1];
    const t1 = Math.min(t[i], tEnd);
    const a = y[i - 1] - limit;
    const b = y[i] - limit;
    if (a >= 0 && b >= 0) s += t1 - t0;
    else if (a > 0 || b > 0) {
      const f = a / (a - b); // crossing fraction
      s += a > 0 ? f * (t1 - t0) : (1 - f) * (t1 - t0);
    }
  }
  return s;
}

function runMethod(item: Item, inp: ThawParsed, method: ThawMethod, endPoint_C: number, warnings: string[]): ThawMethodResult {
  const { food, shape, p } = item;
  const rs = inp.ruleSet;
  const chill = rs.chilledMax_C;
  const notes: string[] = [];
  const eps = inp.overrides.emissivity;
  const g = shape.convection;
  const Tref = (inp.start_C + endPoint_C) / 2;
  const stop = (st: { center_C: number }) => st.center_C >= endPoint_C;
  const base = { shape: item.m === 0 ? ("slab" as const) : item.m === 1 ? ("cylinder" as const) : ("sphere" as const), halfSize_m: item.R, innerRadius_m: item.Ri, nodes: NODES, material: food, initial_C: inp.start_C, tEnd_s: inp.horizon_s, stopWhen: stop };
  const depth = item.R - item.Ri;
  const dt0 = Math.max(1, Math.min(60, (depth * depth) / 2e-6 / 300));
  const adaptive = { target_K: THAW_TARGET_K, dtMax_s: 900 };
  let hShown = 0;
  // A calibration's factor scales the surface's convective (or given) coefficient; radiation is not scaled.
  const hf = inp.calibration?.surfaceH ?? 1;
  let medium_C = 0;
  let result: Solver1DResult;

  const hAirFn = (air: Surroundings) => {
    if (inp.overrides.h_W_m2K) return () => inp.overrides.h_W_m2K! * hf;
    return followingSurface((Ts) => itemSurfaceCoefficient(g, Ts, air, 0, []).hConvective_W_m2K * hf);
  };

  if (method.kind === "fridge_air" || method.kind === "room_air") {
    const air: Surroundings = { fluid: "air", T_C: method.air_C, speed_m_s: method.speed_m_s };
    const hc = itemSurfaceCoefficient(g, Tref, air, eps, warnings);
    hShown = inp.overrides.h_W_m2K ? inp.overrides.h_W_m2K * hf : hc.h_W_m2K + (hf - 1) * hc.hConvective_W_m2K;
    medium_C = method.air_C;
    const boundary: Boundary = { kind: "convective", h_W_m2K: hAirFn(air), fluid_C: () => method.air_C, emissivity: inp.overrides.h_W_m2K ? 0 : eps, radiant_C: () => method.air_C };
    result = solve1D({ ...base, boundary, dt_s: dt0, adaptive });
  } else if (method.kind === "tray") {
    const fp = item.footprint;
    const tL = Math.max(method.trayLength_m, method.trayWidth_m);
    const tW = Math.min(method.trayLength_m, method.trayWidth_m);
    if (Math.max(fp.a_m, fp.b_m) > tL + 1e-9 || Math.min(fp.a_m, fp.b_m) > tW + 1e-9) {
      throw new PhysicsInputError("method.trayLength_m", `the item (${(fp.a_m * 1000).toFixed(0)} × ${(fp.b_m * 1000).toFixed(0)} mm footprint) is larger than the tray (${(tL * 1000).toFixed(0)} × ${(tW * 1000).toFixed(0)} mm)`);
    }
    const air: Surroundings = { fluid: "air", T_C: method.air_C, speed_m_s: method.speed_m_s };
    const tray = method.tray;
    const faces: 1 | 2 = method.undersideExposed ? 2 : 1;
    // Tray coefficient: natural convection on the cold plate's faces (stable on top, rising flow below), forced flow along it, radiation.
    const Tt = (method.air_C + item.food.Tf_C) / 2;
    const Lc = (tL * tW) / (2 * (tL + tW));
    const up = naturalHorizontalPlate("air", Tt, method.air_C, Lc, "up", warnings).h_W_m2K;
    const down = naturalHorizontalPlate("air", Tt, method.air_C, Lc, "down", warnings).h_W_m2K;
    const hN = faces === 2 ? (up + down) / 2 : up;
    const hF = method.speed_m_s >= 0.05 ? forcedFlatPlate("air", Tt, method.air_C, tL, method.speed_m_s, warnings).h_W_m2K : 0;
    const hTray = (hF > 0 ? mixedConvection(hF, hN) : hN) + radiationCoefficient(tray.emissivity, Tt, method.air_C);
    const finArea = Math.max(0, tL * tW - fp.area_m2);
    let eta: number;
    if (finArea <= 0) eta = 1;
    else if (fp.round) eta = annularFinEfficiency(hTray, tray.conductivity_W_mK, method.trayThickness_m, fp.r_m, Math.sqrt((tL * tW) / Math.PI), faces);
    else eta = straightFinEfficiency(hTray, tray.conductivity_W_mK, method.trayThickness_m, finArea / (2 * (fp.a_m + fp.b_m)), faces);
    // The tray node sits at mid-thickness: half the tray's thickness lies between it and each face
    // (negligible for metal, not for a thick plastic or wooden board).
    const half_m2K_W = method.trayThickness_m / 2 / tray.conductivity_W_mK;
    const underside = method.undersideExposed ? fp.area_m2 / (1 / hTray + half_m2K_W) : 0;
    const exchange_W_K = eta * hTray * finArea * faces + underside;
    const A = shape.area_m2;
    const cap_J_K = tray.density_kg_m3 * tray.specificHeat_J_kgK * method.trayThickness_m * fp.area_m2;
    const contact_W_K = fp.contact_m2 / (1 / method.contact_W_m2K + half_m2K_W);
    const exposed = Math.max(0, (A - fp.contact_m2) / A);
    const hc = itemSurfaceCoefficient(g, Tref, air, eps, warnings);
    hShown = inp.overrides.h_W_m2K ? inp.overrides.h_W_m2K * hf : hc.h_W_m2K + (hf - 1) * hc.hConvective_W_m2K;
    medium_C = method.air_C;
    const hItem = hAirFn(air);
    const boundary: Boundary = {
      kind: "node",
      contact_W_m2K: contact_W_K / A,
      capacity_J_m2K: cap_J_K / A,
      exchange_W_m2K: () => exchange_W_K / A,
      fluid_C: () => method.air_C,
      node0_C: method.air_C,
      air: { h_W_m2K: (t, Ts) => hItem(t, Ts) * exposed, fluid_C: () => method.air_C, emissivity: inp.overrides.h_W_m2K ? 0 : eps * exposed, radiant_C: () => method.air_C },
    };
    notes.push(
      `Tray: ${(method.trayThickness_m * 1000).toFixed(1)} mm ${tray.name}, ${(tL * 1000).toFixed(0)} × ${(tW * 1000).toFixed(0)} mm; the part beyond the item is a ${fp.round ? "round (annular)" : "straight"} fin with efficiency ${eta.toFixed(2)} at ${hTray.toFixed(1)} W/(m²·K) on ${faces === 2 ? "both faces" : "its top face"}; contact ${method.contact_W_m2K} W/(m²·K) over ${(fp.contact_m2 * 1e4).toFixed(0)} cm²`,
    );
    result = solve1D({ ...base, boundary, dt_s: dt0, adaptive });
  } else if (method.kind === "running_water") {
    const water: Surroundings = { fluid: "water", T_C: method.water_C, speed_m_s: method.speed_m_s };
    const pack = method.packaging;
    const hBare = itemSurfaceCoefficient(g, Tref, water, 0, warnings).h_W_m2K * hf;
    const eff = (h: number) => (pack ? 1 / (1 / h + pack.thickness_m / pack.k_W_mK) : h);
    hShown = inp.overrides.h_W_m2K ? inp.overrides.h_W_m2K * hf : eff(hBare);
    medium_C = method.water_C;
    const hFn = inp.overrides.h_W_m2K ? () => inp.overrides.h_W_m2K! * hf : followingSurface((Ts) => eff(itemSurfaceCoefficient(g, Ts, water, 0, []).hConvective_W_m2K * hf));
    if (pack) notes.push(`Packaging: ${(pack.thickness_m * 1000).toFixed(2)} mm at k = ${pack.k_W_mK} W/(m·K) in series with the water film`);
    result = solve1D({ ...base, boundary: { kind: "convective", h_W_m2K: hFn, fluid_C: () => method.water_C }, dt_s: dt0, adaptive });
  } else {
    // Still water in a finite bath, reset to the fresh-water temperature at every change.
    const water: Surroundings = { fluid: "water", T_C: method.water_C, speed_m_s: 0 };
    const pack = method.packaging;
    const hBare = itemSurfaceCoefficient(g, Tref, water, 0, warnings).h_W_m2K * hf;
    const h = inp.overrides.h_W_m2K ? inp.overrides.h_W_m2K * hf : pack ? 1 / (1 / hBare + pack.thickness_m / pack.k_W_mK) : hBare;
    hShown = h;
    medium_C = method.water_C;
    const A = shape.area_m2;
    const bathArea = 5 * Math.pow(method.bath_m3, 2 / 3);
    const itemVolume = shape.volume_m3;
    if (itemVolume > 0.9 * method.bath_m3) throw new PhysicsInputError("method.bath_m3", "the bath is too small to cover the item");
    const cap = WATER_RHO * WATER_C * (method.bath_m3 - itemVolume);
    notes.push(`Bath: ${(method.bath_m3 * 1000).toFixed(0)} L changed every ${(method.changeEvery_s / 60).toFixed(0)} min, warming from the room through ${bathArea.toFixed(2)} m² at ${BATH_TO_ROOM_W_M2K} W/(m²·K)`);
    let profile: number[] | null = null;
    let t0 = 0;
    // Chunk k runs from k·changeEvery to (k+1)·changeEvery (or the horizon). Boundaries come from the
    // index, not from summing chunk ends, and a remainder shorter than a rounding error of the horizon is
    // not a chunk: 3 × 100.1 s can fall 6e-14 s short of 300.3 s, and that sliver takes no solver step.
    const tol_s = 1e-9 * Math.max(1, inp.horizon_s);
    let change = 0;
    const merged: Solver1DResult = { t_s: [], center_C: [], surface_C: [], mean_C: [], node_C: [], steps: 0, newtonIterations: 0, storedChange_J: 0, boundaryHeat_J: 0, energyError_J: 0, profile_C: [], minT_C: inp.start_C, maxT_C: inp.start_C, stoppedEarly: false };
    while (inp.horizon_s - t0 > tol_s) {
      const prof = profile;
      const chunkEnd_s = Math.min((change + 1) * method.changeEvery_s, inp.horizon_s);
      const chunk = solve1D({
        ...base,
        initial_C: prof ? (x: number) => prof[Math.round(x * (prof.length - 1))] : inp.start_C,
        boundary: { kind: "node", contact_W_m2K: h, capacity_J_m2K: cap / A, exchange_W_m2K: () => (BATH_TO_ROOM_W_M2K * bathArea) / A, fluid_C: () => method.room_C, node0_C: method.water_C },
        tEnd_s: chunkEnd_s - t0,
        dt_s: Math.min(dt0, method.changeEvery_s / 20),
        adaptive: { target_K: THAW_TARGET_K, dtMax_s: Math.min(900, method.changeEvery_s / 10) },
      });
      const skip = merged.t_s.length ? 1 : 0;
      for (let i = skip; i < chunk.t_s.length; i++) {
        merged.t_s.push(t0 + chunk.t_s[i]);
        merged.center_C.push(chunk.center_C[i]);
        merged.surface_C.push(chunk.surface_C[i]);
        merged.mean_C.push(chunk.mean_C[i]);
      }
      merged.steps += chunk.steps;
      merged.newtonIterations += chunk.newtonIterations;
      merged.storedChange_J += chunk.storedChange_J;
      merged.boundaryHeat_J += chunk.boundaryHeat_J;
      merged.energyError_J += chunk.energyError_J;
      merged.minT_C = Math.min(merged.minT_C, chunk.minT_C);
      merged.maxT_C = Math.max(merged.maxT_C, chunk.maxT_C);
      const reached_s = chunk.t_s.length ? chunk.t_s[chunk.t_s.length - 1] : 0;
      profile = chunk.profile_C;
      if (!(reached_s > 0)) break; // a chunk that did not advance time would repeat for ever
      t0 = chunk.stoppedEarly ? t0 + reached_s : chunkEnd_s;
      change++;
      if (chunk.stoppedEarly) {
        merged.stoppedEarly = true;
        break;
      }
    }
    merged.profile_C = profile ?? [];
    result = merged;
  }

  warnPropertyRange(warnings, result.minT_C, result.maxT_C);
  const thawTime = firstCrossing(result.t_s, result.center_C, endPoint_C, "up");
  const tEnd = thawTime ?? result.t_s[result.t_s.length - 1];
  const above = timeAbove(result.t_s, result.surface_C, chill, tEnd);
  let maxSurf = -Infinity;
  for (let i = 0; i < result.t_s.length && result.t_s[i] <= tEnd + 1e-9; i++) maxSurf = Math.max(maxSurf, result.surface_C[i]);

  // Second opinion: Plank and Pham's thawing form, with the same coefficient, medium, latent heat and sensible heats.
  const closed = closedFormEstimates({ food, shape, productShape: p.shape, h_W_m2K: Math.max(hShown, 0.01), start_C: inp.start_C, end_C: endPoint_C, medium_C });

  const compliance = complianceFor(method, rs, above, chill, p.readyToEat);
  const startBy = inp.readyBy && thawTime !== null ? new Date(new Date(inp.readyBy).getTime() - thawTime * 1000).toISOString() : null;
  const inFridge = (method.kind === "fridge_air" || method.kind === "tray") && method.air_C <= chill;
  return {
    kind: method.kind,
    label: THAW_METHOD_LABELS[method.kind],
    settings: method,
    thawTime_s: thawTime,
    surfaceAboveLimit_s: above,
    maxSurface_C: maxSurf,
    compliance,
    estimates: { plank_s: closed.plank_s, pham_s: closed.pham_s, inputs: closed.inputs },
    h_W_m2K: hShown,
    startBy,
    fridgeSpaceTime_m3h: inFridge && thawTime !== null ? ((shape.volume_m3 + (shape.hollow?.cavity_m3 ?? 0)) * thawTime) / 3600 : null,
    energyBalanceError: Math.abs(result.energyError_J) / Math.max(Math.abs(result.storedChange_J), 1e-30),
    steps: result.steps,
    series: seriesDown(result),
    notes,
  };
}

/** One sentence on why Plank and Pham differ from the numerical answer, with the figures. */
function estimateSpread(r: ThawMethodResult): string {
  const t = r.thawTime_s;
  const pct = (e: number | null) => (e === null || t === null || t <= 0 ? "—" : `${e >= t ? "+" : "−"}${Math.abs((e / t - 1) * 100).toFixed(0)} %`);
  return (
    `Plank and Pham (closed-form second opinions) get the same latent heat as the numerical model (${(r.estimates.inputs.latent_J_kg / 1000).toFixed(0)} kJ/kg, the ice present at the start) and sensible specific heats; ` +
    `they differ from it by ${pct(r.estimates.plank_s)} (Plank) and ${pct(r.estimates.pham_s)} (Pham) because they melt all the ice at one temperature behind a sharp front and use one conductivity, where the food melts gradually below its freezing point and conducts better while still partly frozen; ` +
    `Plank also ignores warming the frozen core. Pham's thawing form is from memory and unverified. Plan with the numerical figure; a large spread means the item is outside the formulas' usual range`
  );
}

function complianceFor(method: ThawMethod, rs: RuleSet, above_s: number, chill: number, readyToEat: boolean): ComplianceLine[] {
  const out: ComplianceLine[] = [];
  if (method.kind === "fridge_air" || method.kind === "tray") {
    if (method.air_C <= chill) out.push({ rule: "Thawed under refrigeration", status: "meets", detail: `Air at ${method.air_C} °C, at or below the chill limit ${chill} °C` });
    else out.push({ rule: "Thawed under refrigeration", status: "not approved", detail: `Air at ${method.air_C} °C is warmer than the chill limit ${chill} °C: this is thawing in room air` });
  } else if (method.kind === "running_water") {
    if (rs.thawWaterMax_C === null) out.push({ rule: "Running-water thawing", status: "check locally", detail: `"${rs.name}" sets no water temperature; check your food code` });
    else if (method.water_C <= rs.thawWaterMax_C) out.push({ rule: `Running water at or below ${rs.thawWaterMax_C} °C`, status: "meets", detail: `Water at ${method.water_C} °C` });
    else out.push({ rule: `Running water at or below ${rs.thawWaterMax_C} °C`, status: "exceeds", detail: `Water at ${method.water_C} °C is warmer than allowed (computed anyway)` });
  } else if (method.kind === "still_water") {
    out.push({ rule: "Still water changed on a schedule", status: "check locally", detail: "Model food codes name running water; water changed every 30 minutes is consumer guidance (USDA FSIS). Check your local code" });
    if (rs.thawWaterMax_C !== null && method.water_C > rs.thawWaterMax_C) out.push({ rule: `Water at or below ${rs.thawWaterMax_C} °C`, status: "exceeds", detail: `Water at ${method.water_C} °C` });
  } else {
    out.push({ rule: "Room-air thawing", status: "not approved", detail: "Not an approved thawing method under most food codes" });
  }
  // Ready-to-eat food against its own limit (often none above the chill limit), raw food against the thawing time.
  out.push(thawTimeAboveLine(rs, readyToEat, above_s, chill));
  return out;
}

export function runThaw(raw: ThawInput): ThawResult {
  const parsed = thawInputSchema.safeParse(raw);
  if (!parsed.success) throw new PhysicsInputError(parsed.error.issues[0].path.join("."), parsed.error.issues[0].message);
  return runThawParsed(parsed.data);
}

/** `now_ms`: the time a "start by" is judged against (default: the clock). */
export function runThawParsed(inp: ThawParsed, opts: { now_ms?: number } = {}): ThawResult {
  const item = makeItem(inp.product);
  const warnings: string[] = [...item.food.warnings];
  const endPoint_C = inp.endPoint_C ?? item.food.Tf_C + inp.endMargin_K;
  if (inp.start_C >= item.food.Tf_C) {
    throw new PhysicsInputError("start_C", `starts at ${inp.start_C} °C, at or above its initial freezing point (${item.food.Tf_C.toFixed(1)} °C): there is nothing to thaw`);
  }
  if (endPoint_C <= inp.start_C) throw new PhysicsInputError("endPoint_C", "the end point must be warmer than the starting temperature");
  const main = runMethod(item, inp, inp.method, endPoint_C, warnings);
  // A "start by" already in the past cannot be met: flag it rather than print it as a plan.
  const startByPassed = main.startBy === null ? null : new Date(main.startBy).getTime() < (opts.now_ms ?? Date.now());
  if (startByPassed) warnings.push(`Start by ${main.startBy} has already passed: by this method the item will not be thawed by ${inp.readyBy}. Choose a later service time or another approved method`);
  if (main.thawTime_s === null) warnings.push(`The centre does not reach ${endPoint_C.toFixed(1)} °C within ${(inp.horizon_s / 86400).toFixed(0)} days`);
  if ((inp.method.kind === "running_water" || inp.method.kind === "still_water") && inp.ruleSet.thawWaterMax_C !== null && inp.method.water_C > inp.ruleSet.thawWaterMax_C) {
    warnings.push(`Water at ${inp.method.water_C} °C is above the rule set's maximum of ${inp.ruleSet.thawWaterMax_C} °C: computed, but not allowed`);
  }
  let comparison: ThawMethodResult[] | null = null;
  if (inp.compare) {
    const tray = inp.method.kind === "tray" ? inp.method.tray : null;
    comparison = [];
    for (const kind of ["fridge_air", "tray", "running_water", "still_water", "room_air"] as ThawMethodKind[]) {
      const m = kind === inp.method.kind ? inp.method : defaultMethod(kind, tray);
      if (!m) continue;
      try {
        // A calibration belongs to the method it was fitted for: the others run as built.
        comparison.push(kind === inp.method.kind ? main : runMethod(item, { ...inp, calibration: undefined }, m, endPoint_C, []));
      } catch (e) {
        if (!(e instanceof PhysicsInputError)) throw e;
        warnings.push(`${THAW_METHOD_LABELS[kind]} not compared: ${e.message}`);
      }
    }
  }
  const assumptions = [
    `Thawed means the centre reaches ${endPoint_C.toFixed(1)} °C (${inp.endPoint_C === null ? `initial freezing point ${item.food.Tf_C.toFixed(1)} °C plus ${inp.endMargin_K} K` : "as given"}); the item starts uniformly at ${inp.start_C} °C`,
    item.shape.hollow
      ? `The item is modelled as a hollow ${item.m === 2 ? "sphere" : "cylinder"}: a ${(item.shape.hollow.wall_m * 1000).toFixed(0)} mm wall around a closed cavity, ${(2 * item.R * 1000).toFixed(0)} mm across, heated from outside only (the cavity face insulated); properties follow temperature from the composition, with ice melting over the freezing range. A real carcass is not a uniform wall: its thickest meat sets the thaw time and its thin parts thaw sooner, so the wall should be the deepest meat over the cavity; the answer is only as good as that figure`
      : `The ${inp.product.shape} is modelled in one dimension (${item.m === 0 ? "slab" : item.m === 1 ? "cylinder" : "sphere"}) with its real volume and surface (half-size ${(item.R * 1000).toFixed(0)} mm); properties follow temperature from the composition, with ice melting over the freezing range`,
    `Surface coefficient ${main.h_W_m2K.toFixed(1)} W/(m²·K) ${inp.overrides.h_W_m2K ? "as given" : "from the core's correlations" + (inp.method.kind.includes("water") ? " in water" : " plus radiation (ε = " + inp.overrides.emissivity + ")")}`,
    ...(inp.calibration ? [`Calibrated${inp.calibration.source ? ` from ${inp.calibration.source}` : ""}: the surface's convective coefficient ×${inp.calibration.surfaceH.toPrecision(3)} for this method`] : []),
    "Microwave thawing and thawing as part of cooking are outside this model",
    "Drip loss, packaging air pockets (unless given as packaging) and the shelf around the item are not modelled",
  ];
  assumptions.push(estimateSpread(main));
  if (inp.product.initialFreezing_C === null || inp.product.initialFreezing_C === undefined) {
    assumptions.push(
      `The initial freezing point, ${item.food.Tf_C.toFixed(1)} °C, is estimated from the composition, and the end point follows it. Measured values can differ by a kelvin or more (chicken measures about −1.1 to −1.4 °C), which can lengthen or shorten a refrigerator thaw by a third: enter a measured or tabled value if you have one`,
    );
  }
  if (item.p.shape === "sphere") assumptions.push(`On a tray, a round item touches it over ${Math.round(ROUND_CONTACT_FRACTION * 100)} % of its projected area (our assumption)`);
  const advice = [
    "Once thawed, cook it or keep it refrigerated at or below the chill limit, and use it promptly.",
    "Food thawed in water or in a microwave is normally cooked straight away.",
    "Follow your local rules on refreezing thawed food.",
  ];
  return { ...main, startByPassed, endPoint_C, chillLimit_C: inp.ruleSet.chilledMax_C, comparison, assumptions, warnings, advice };
}
