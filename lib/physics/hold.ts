/**
 * The hold planner: will this pack-out keep this load inside its limits for this route?
 * Builds the box network (shipper.ts) from templates, runs it over the route (and a little past its
 * end, to measure the margin), finds the first moment any product's centre or surface leaves its
 * band, and repeats the run over a small deterministic sample for an uncertainty band.
 */
import type { HoldCalibration, HoldParsed } from "../schemas/hold";
import { DEFAULT_CONTACT_W_M2K, effectiveHoldCalibration } from "../schemas/defaults";
import type { Material, Pack, Product } from "../schemas/templates";
import { productThermal, simpleMaterial } from "./properties";
import { boxOuterDimensions, itemShape } from "./geometry";
import { solAirTemperature, airProps, rayleigh, CP_AIR_J_KGK, P_ATM_PA, R_AIR_J_KGK, SIGMA_W_M2K4 } from "./surfaces";
import { boxOuterCoefficient, radiationAt, runNetwork, type BodySpec, type FaceSpec, type Gains, type NetworkState, type WallLayerSpec } from "./shipper";
import { layoutBox, type Layout } from "./placement";
import { KELVIN_OFFSET, PhysicsInputError } from "./validation";
import type { EnthalpyMaterial } from "./solver1d";
import { holdCompliance, type ComplianceLine } from "./compliance";
import { contactColumn, type ContactColumn } from "./contact-column";

/** CO₂ gas volume per kg of dry ice at 20 °C and 1 atm, ideal gas: 0.547 m³/kg (published-values.md §4.4, COMPUTED). */
export const CO2_M3_PER_KG = 0.547;
/** Inside convective coefficient of a closed cooler, 3 W/(m²·K): middle of the 2–5 range (published-values.md §6.1, from memory). */
export const INNER_CONVECTIVE_W_M2K = 3;

const PACK_K: Record<Pack["kind"], [number, number]> = {
  // [solid, liquid] W/(m·K): ice 2.2 and water 0.57 (Choi & Okos 1986 at 0 °C); gels as water;
  // eutectic/PCM packs about 1.0 / 0.5 (from memory, uncertain); dry ice is one node (k unused).
  water_ice: [2.2, 0.57],
  gel: [2.0, 0.55],
  pcm: [1.0, 0.5],
  dry_ice: [0.6, 0.6],
};

export interface ProductBand {
  upper_C: number | null;
  lower_C: number | null;
  mode: "chilled" | "frozen" | "hot";
  lowerReason: string | null;
}

export interface HoldSeriesPoint {
  t_s: number;
  air_C: number;
  /** The lower and upper halves of the inside air. */
  airLower_C: number;
  airUpper_C: number;
  products: { center_C: number; surface_C: number }[];
  packs: { T_C: number; latentLeft: number; massLeft_kg: number }[];
}

/** Where a product left its band: its centre, its surface, or its surface where a pack touches it. */
export type HoldPoint = "centre" | "surface" | "next to a pack";

export interface HoldRun {
  holdTime_s: number | null;
  failsFirst: { product: string; line: number; point: HoldPoint; limit: "upper" | "lower"; limit_C: number } | null;
  endTime_s: number;
  /** Net heat that entered the box during the route through each path (J): each face's outer film, sun and sky together. */
  heatGain_J: { sides: number; base: number; lid: number; edgesAndCorners: number; lidOpenings: number };
  /** Relative energy-balance error; null when almost no heat moved (less than would warm the contents by 1 mK), where a ratio means nothing. */
  energyBalanceError: number | null;
  energyBalanceError_J: number;
  steps: number;
  newtonIterations: number;
  /** Steps the box model took again (Newton not converged; error estimate too large). */
  newtonFailures: number;
  rejectedSteps: number;
  series: HoldSeriesPoint[];
  co2Released_m3: number;
  /** When the last dry ice sublimated (null if none was packed or some is left). */
  dryIceGone_s: number | null;
}

export interface HoldResult extends HoldRun {
  routeLength_s: number;
  margin_s: number | null;
  marginIsLowerBound: boolean;
  band: { low: number | null; central: number | null; high: number | null };
  bands: ProductBand[];
  segments: { label: string; start_s: number; end_s: number }[];
  openings_s: number[];
  ua: { walls_W_K: number; lid_W_K: number; edges_W_K: number; total_W_K: number };
  outerH_W_m2K: number[];
  innerH_W_m2K: number;
  hasDryIce: boolean;
  /** Rule-set lines for products that leave their band (time as a control, tolerance periods). */
  compliance: ComplianceLine[];
  assumptions: string[];
  warnings: string[];
}

const MAX_POINTS = 300;

export function productBand(p: Product, start_C: number, rules: HoldParsed["ruleSet"], Tf_C: number): ProductBand | string {
  const lower = p.freezeSensitive ? Tf_C : null;
  const lowerReason = p.freezeSensitive ? `must not freeze: initial freezing point ${Tf_C.toFixed(1)} °C` : null;
  if (start_C >= rules.hotHoldMin_C) return { mode: "hot", upper_C: null, lower_C: rules.hotHoldMin_C, lowerReason: "hot-holding lower limit" };
  if (start_C <= rules.frozenMax_C + 0.5) return { mode: "frozen", upper_C: rules.frozenMax_C, lower_C: null, lowerReason: null };
  if (start_C <= rules.chilledMax_C) return { mode: "chilled", upper_C: rules.chilledMax_C, lower_C: lower, lowerReason };
  return `packed at ${start_C} °C, which is above the chilled limit (${rules.chilledMax_C} °C) and below the hot-holding limit (${rules.hotHoldMin_C} °C) of "${rules.name}": no band of that rule set applies`;
}

interface Variant {
  /** Mesh and time-step refinement factor (1 = normal). */
  resolution?: number;
  /** Scales the network's step error target (see NetworkSpec.errorScale). */
  errorScale?: number;
  outerHScale: number;
  insulationKScale: number;
  conditioningShift_K: number;
  keepSeries: boolean;
  /** Stop the run at this time (s) if nothing has failed by then: the run is only asked whether it fails earlier. */
  stopAt_s?: number;
}

interface Prepared {
  inp: HoldParsed;
  warnings: string[];
  assumptions: string[];
  bands: ProductBand[];
  productMats: { mat: EnthalpyMaterial & { Tf_C: number }; shapeM: 0 | 1 | 2; R: number; V: number; A: number; footprint: number }[];
  /** Each pack line's material, built once and shared by every corner's run. */
  packMats: (EnthalpyMaterial & { Tf_C: number })[];
  routeLength_s: number;
  segments: { label: string; start_s: number; end_s: number; seg: HoldParsed["route"]["segments"][number] }[];
  openings: { start_s: number; end_s: number }[];
  finish: Material;
  wallLayers: WallLayerSpec[];
  lidLayers: WallLayerSpec[];
  inner: { L: number; W: number; H: number };
  outer: { length_m: number; width_m: number; height_m: number };
  edgeG: number;
  innerH: number;
  airVolume_m3: number;
  kScaleForUA: number;
  hasDryIce: boolean;
  layout: Layout;
  /** Open part of the horizontal mid-plane between the two halves of the inside air, m². */
  midPlane_m2: number;
}

function prepare(given: HoldParsed): Prepared {
  // A calibration's contact factor scales every pack line's contact coefficient (the wall and inside factors are applied below).
  const cal = effectiveHoldCalibration(given);
  const inp = cal && cal.contact !== 1 ? { ...given, packs: given.packs.map((p) => ({ ...p, contact_W_m2K: p.contact_W_m2K * cal.contact })) } : given;
  const warnings: string[] = [];
  const assumptions: string[] = [];
  const mats = new Map(inp.materials.map((m) => [m.name, m]));
  const mat = (name: string, field: string): Material => {
    const m = mats.get(name);
    if (!m) throw new PhysicsInputError(field, `the box names a material "${name}" that is not in the input`);
    return m;
  };
  const s = inp.shipper;
  const toLayers = (ls: { material: string; thickness_m: number }[], field: string): WallLayerSpec[] =>
    ls.map((l, i) => {
      const m = mat(l.material, `${field}.${i}.material`);
      return { thickness_m: l.thickness_m, k_W_mK: m.conductivity_W_mK, rho_kg_m3: m.density_kg_m3, c_J_kgK: m.specificHeat_J_kgK, insulation: m.category === "insulation" };
    });
  const wallLayers = toLayers(s.wallLayers, "shipper.wallLayers");
  const lidLayers = s.lidLayers ? toLayers(s.lidLayers, "shipper.lidLayers") : wallLayers;
  const finish = mat(s.finishMaterial, "shipper.finishMaterial");
  const { wall_m: tw, ...outerDims } = boxOuterDimensions(s);
  const inner = { L: s.innerLength_m, W: s.innerWidth_m, H: s.innerHeight_m };
  const outer = { length_m: outerDims.length_m, width_m: outerDims.width_m, height_m: outerDims.height_m };
  const innerVolume = inner.L * inner.W * inner.H;

  // Products and packs: volumes, properties, bands.
  const bands: ProductBand[] = [];
  const productMats: Prepared["productMats"] = [];
  let contentsVolume = 0;
  inp.products.forEach((line, i) => {
    const shape = itemShape(line.product);
    const f = productThermal(line.product, shape);
    for (const w of f.warnings) warnings.push(`${line.product.name}: ${w}`);
    const b = productBand(line.product, line.start_C, inp.ruleSet, f.Tf_C);
    if (typeof b === "string") throw new PhysicsInputError(`products.${i}.start_C`, `${line.product.name} is ${b}`);
    bands.push(b);
    const m = shape.oneD.shape === "slab" ? 0 : shape.oneD.shape === "cylinder" ? 1 : 2;
    const cv = shape.convection;
    // The area it rests on: a block or slab lies flat, a cylinder stands upright, a sphere on its projected area.
    const footprint = "width_m" in cv && "length_m" in cv ? cv.width_m * cv.length_m : "diameter_m" in cv ? (Math.PI / 4) * cv.diameter_m ** 2 : shape.area_m2 / 6;
    productMats.push({ mat: f, shapeM: m, R: ((m + 1) * shape.volume_m3) / shape.area_m2, V: shape.volume_m3, A: shape.area_m2, footprint });
    contentsVolume += shape.volume_m3 * line.count;
  });
  let hasDryIce = false;
  inp.packs.forEach((line) => {
    const p = line.pack;
    contentsVolume += p.length_m * p.width_m * p.thickness_m * line.count;
    if (p.kind === "dry_ice") hasDryIce = true;
    const w = packMeltBand_K(p);
    if (p.kind === "dry_ice" && line.conditioning_C > p.phaseChange_C) {
      warnings.push(`${p.name} is given at ${line.conditioning_C} °C, above its sublimation point (${p.phaseChange_C} °C), where dry ice cannot exist at atmospheric pressure: it is modelled as solid at ${p.phaseChange_C} °C`);
    } else if (line.conditioning_C >= p.phaseChange_C + w / 2) {
      warnings.push(`${p.name} is conditioned at ${line.conditioning_C} °C, above its melt point (${p.phaseChange_C} °C): it starts melted and gives sensible cooling only`);
    } else if (p.kind !== "dry_ice" && line.conditioning_C <= p.phaseChange_C && line.conditioning_C >= p.phaseChange_C - w / 2) {
      warnings.push(`${p.name} is conditioned at ${line.conditioning_C} °C, at its melt point: modelled as fully frozen, as meant — a cabinet that warm cannot freeze it through, so it must have been frozen colder first`);
    } else if (line.conditioning_C > p.phaseChange_C) {
      const f = (line.conditioning_C - p.phaseChange_C) / (w / 2);
      warnings.push(`${p.name} is conditioned at ${line.conditioning_C} °C, just above its melt point (${p.phaseChange_C} °C): it is modelled as ${Math.round(f * 100)} % melted when packed. Condition it at or below ${p.phaseChange_C} °C to start it frozen`);
    }
  });
  if (contentsVolume > innerVolume) {
    throw new PhysicsInputError("products", `the contents (${(contentsVolume * 1000).toFixed(1)} L) are larger than the box's inner volume (${(innerVolume * 1000).toFixed(1)} L)`);
  }
  if (contentsVolume > 0.9 * innerVolume) warnings.push(`The contents fill ${((contentsVolume / innerVolume) * 100).toFixed(0)} % of the box: packing that tight leaves little air to circulate`);

  // Route: segments and lid openings.
  const segments: Prepared["segments"] = [];
  const openings: Prepared["openings"] = [];
  let t0 = 0;
  for (const seg of inp.route.segments) {
    const start = t0;
    const end = t0 + seg.duration_s;
    segments.push({ label: seg.label, start_s: start, end_s: end, seg });
    if (seg.lidOpenings > 0 && seg.lidOpenDuration_s > 0) {
      const spacing = seg.duration_s / seg.lidOpenings;
      const d = Math.min(seg.lidOpenDuration_s, spacing * 0.9);
      if (d < seg.lidOpenDuration_s) warnings.push(`"${seg.label || "a segment"}": the openings do not fit its length; each is shortened to ${d.toFixed(0)} s`);
      for (let k = 0; k < seg.lidOpenings; k++) {
        const mid = start + (k + 0.5) * spacing;
        openings.push({ start_s: mid - d / 2, end_s: mid + d / 2 });
      }
    }
    t0 = end;
  }
  const routeLength_s = t0;

  // Edges and corners: Incropera Table 4.1 shape factors with the wall's overall thickness and effective k.
  const kEff = tw / wallLayers.reduce((a, l) => a + l.thickness_m / l.k_W_mK, 0);
  const edgeLength = 4 * (inner.L + inner.W + inner.H);
  const S = 0.54 * edgeLength + 8 * 0.15 * tw;
  const edgeG = kEff * S;
  if (Math.min(inner.L, inner.W, inner.H) < tw / 5) warnings.push("Some inner dimension is below a fifth of the wall thickness: the edge shape factor S = 0.54 D is outside its range");

  // Inside coefficient: convection plus linearised radiation at a representative inside temperature.
  const temps = [...inp.products.map((l) => l.start_C), ...inp.packs.map((l) => Math.max(l.conditioning_C, l.pack.phaseChange_C))];
  const Tin = temps.length ? temps.reduce((a, b) => a + b, 0) / temps.length : 5;
  const innerH = (inp.overrides.innerH_W_m2K ?? INNER_CONVECTIVE_W_M2K + radiationAt(0.9, Math.max(-80, Math.min(90, Tin)))) * (cal?.innerH ?? 1);
  const bodiesVolume = contentsVolume;
  const airVolume_m3 = Math.max(innerVolume - bodiesVolume, 0.02 * innerVolume);

  // Steady UA with the films of the first segment, and the scale of k that matches a UA override.
  let kScaleForUA = 1;
  if (inp.overrides.wallUA_W_K) {
    const target = inp.overrides.wallUA_W_K;
    const hOut0 = inp.overrides.outerH_W_m2K ?? 10;
    const f = (k: number) => steadyUA(wallLayers, lidLayers, inner, hOut0, innerH, k, edgeG).total_W_K;
    let lo = 1e-4;
    let hi = 1e4;
    for (let i = 0; i < 200; i++) {
      const mid = Math.sqrt(lo * hi);
      if (f(mid) < target) lo = mid;
      else hi = mid;
    }
    kScaleForUA = Math.sqrt(lo * hi);
    assumptions.push(`Wall UA given as ${target} W/K: every layer's conductivity scaled by ${kScaleForUA.toFixed(3)} to match it (with the films of a 10 W/(m²·K) outer coefficient unless given)`);
  }
  if (cal) {
    kScaleForUA *= cal.wallConductance;
    assumptions.push(
      `Calibrated${cal.source ? ` from ${cal.source}` : ""}: wall, lid and edge conductivities ×${cal.wallConductance.toPrecision(3)}, inside coefficient ×${cal.innerH.toPrecision(3)}, pack contact ×${cal.contact.toPrecision(3)}`,
    );
  }

  assumptions.push(
    `Walls and base: ${s.wallLayers.map((l) => `${(l.thickness_m * 1000).toFixed(0)} mm ${l.material}`).join(" + ")}; lid: ${(s.lidLayers ?? s.wallLayers).map((l) => `${(l.thickness_m * 1000).toFixed(0)} mm ${l.material}`).join(" + ")}. Areas are the inner faces; the 12 edges and 8 corners add conduction shape factors S = 0.54·D and 0.15·L (Incropera & DeWitt Table 4.1)`,
  );
  assumptions.push(
    `Inside, the air is two well-mixed halves, lower and upper; every surface open to the air exchanges with its half at ${innerH.toFixed(1)} W/(m²·K) (natural convection ${inp.overrides.innerH_W_m2K ? "and radiation as given" : `${INNER_CONVECTIVE_W_M2K} + linearised radiation`}). Cold air sinks: when the upper half is colder (packs on top) the halves mix by natural convection (Globe–Dropkin correlation for a horizontal air layer heated from below); when the lower half is colder (packs underneath) the air is stably stratified and only conduction and radiation cross between the halves, so the top of the box stays warmer`,
  );
  assumptions.push(`Sun: the lid takes all of it, the sides ${Math.round(inp.overrides.sunShareSides * 100)} %, the base none, through the sol-air temperature with the finish "${finish.name}" (α = ${finish.solarAbsorptivity}, ε = ${finish.emissivity})`);
  assumptions.push(`Lid openings replace inside air at ${inp.overrides.lidOpenAirChangesPerMinute} air changes per minute while open; moisture and frost are ignored`);
  assumptions.push(
    "Products and packs are each modelled in one dimension with their real volume and surface. The load rests on the base; packs underneath lie on the base under it, packs on top lie on it under the lid, packs at the sides stand between it and the side walls, and \"around\" shares a line's packs over the three (the remainder on top first, then underneath). Packs cover the part of the face they lie against — that part exchanges heat with the packs directly, not with the inside air — and touch the load's face towards them (the whole load by area, or the one product a line names), all through the line's contact coefficient; the rest of their surface faces the air. Where a pack touches a product with a lower limit, the touching face itself is followed on its own fine one-dimensional column from the face to the product's centre, against each touching pack's surface through the contact coefficient, and checked against that limit; a pack's edges and the product's corners are not modelled, and a real face pressed unevenly may stay warmer",
  );
  assumptions.push(`The box and inside air start at ${inp.boxStart_C ?? inp.route.segments[0].airTemp_C} °C`);
  if (inp.packs.length) {
    assumptions.push(
      "A pack conditioned at or below its melt (or sublimation) point starts fully frozen. The model melts it over a narrow band centred on that point (0.5 K; 0.2 K for dry ice); a conditioning temperature in the upper half of that band, just above the melt point, starts the pack partly melted in proportion, and anything warmer fully melted. The conditioning uncertainty moves a frozen pack's starting temperature but never melts it; dry ice always starts solid",
    );
  }
  if (hasDryIce) assumptions.push("Dry ice stays at −78.5 °C while any is left; the CO₂ gas leaves the box. Temperatures next to dry ice can fall below −78.5 °C in real shippers (published measurements show −93 °C); not modelled");

  const layout = layoutBox(
    inner,
    inp.products.map((l, i) => ({ area_m2: productMats[i].A, footprint_m2: productMats[i].footprint, count: l.count })),
    inp.packs.map((l) => ({
      face_m2: l.pack.length_m * l.pack.width_m,
      area_m2: 2 * (l.pack.length_m * l.pack.width_m + l.pack.length_m * l.pack.thickness_m + l.pack.width_m * l.pack.thickness_m),
      count: l.count,
      placement: l.placement,
      contactWith: l.contactWith,
    })),
  );
  warnings.push(...layout.warnings);
  // The load blocks the middle of the box: the halves of the air meet over the rest of the mid-plane (at least a tenth of it).
  const midPlane_m2 = Math.max(inner.L * inner.W - layout.loadFootprint_m2, 0.1 * inner.L * inner.W);

  const packMats = inp.packs.map((l) => packMaterial(l.pack));
  return { inp, warnings, assumptions, bands, productMats, packMats, routeLength_s, segments, openings, finish, wallLayers, lidLayers, inner, outer, edgeG, innerH, airVolume_m3, kScaleForUA, hasDryIce, layout, midPlane_m2 };
}

export function steadyUA(
  wallLayers: WallLayerSpec[],
  lidLayers: WallLayerSpec[],
  inner: { L: number; W: number; H: number },
  hOut: number,
  hIn: number,
  kScale: number,
  edgeG: number,
): { walls_W_K: number; lid_W_K: number; edges_W_K: number; total_W_K: number } {
  const Aw = 2 * (inner.L + inner.W) * inner.H + inner.L * inner.W;
  const Al = inner.L * inner.W;
  const r = (ls: WallLayerSpec[]) => 1 / hOut + ls.reduce((a, l) => a + l.thickness_m / (l.k_W_mK * kScale), 0) + 1 / hIn;
  const walls = Aw / r(wallLayers);
  const lid = Al / r(lidLayers);
  const edges = edgeG * kScale;
  return { walls_W_K: walls, lid_W_K: lid, edges_W_K: edges, total_W_K: walls + lid + edges };
}

/**
 * Width of a pack's modelled melting (or sublimation) band, K: the latent heat is spread over
 * [T_pc − w/2, T_pc + w/2], centred on the phase-change point T_pc so the pack melts at its own temperature.
 */
export function packMeltBand_K(p: Pick<Pack, "kind">): number {
  return p.kind === "dry_ice" ? 0.2 : 0.5;
}

/** A coolant pack as an enthalpy material (melt or sublimation over a narrow band centred on its phase-change point). */
export function packMaterial(p: Pack): EnthalpyMaterial & { Tf_C: number } {
  const [ks, kl] = PACK_K[p.kind];
  const rho = p.mass_kg / (p.length_m * p.width_m * p.thickness_m);
  return simpleMaterial({
    rho_kg_m3: rho,
    cSolid_J_kgK: p.cpSolid_J_kgK,
    // Sublimated CO₂ leaves the box: what is left of a dry-ice pack after it has gone has almost no capacity.
    cLiquid_J_kgK: p.kind === "dry_ice" ? 1 : p.cpLiquid_J_kgK,
    kSolid_W_mK: ks,
    kLiquid_W_mK: kl,
    melt_C: p.phaseChange_C,
    latent_J_kg: p.latentHeat_J_kg,
    mushy_K: packMeltBand_K(p),
  }) as EnthalpyMaterial & { Tf_C: number };
}

/**
 * The model temperature a pack line starts at, for a conditioning temperature (plus the shift of an
 * uncertainty corner), so that it starts in the state the user means:
 * - at or below the phase-change point T_pc: fully solid, just below the modelled band (at most
 *   T_pc − w/2; the sensible heat of that w/2 is under 0.2 % of the latent heat). The conditioning shift
 *   moves its temperature but never melts it.
 * - between T_pc and T_pc + w/2: melted in proportion, (T − T_pc)/(w/2);
 * - above: fully melted (sensible cooling only).
 * - Dry ice exists only at or below its sublimation point at 1 atm: it always starts solid, and takes no shift.
 */
export function packStart_C(p: Pack, conditioning_C: number, shift_K: number): number {
  const Tm = p.phaseChange_C;
  const half = packMeltBand_K(p) / 2;
  const solidTop = Tm - half;
  if (p.kind === "dry_ice") return Math.min(conditioning_C, solidTop);
  if (conditioning_C <= Tm) return Math.min(conditioning_C + shift_K, solidTop);
  const x = conditioning_C + shift_K;
  if (x <= Tm) return Math.min(x, solidTop);
  if (x < Tm + half) return solidTop + 2 * (x - Tm);
  return x;
}

/**
 * Exchange between the lower and upper halves of the inside air across the open part of the mid-plane,
 * W/K: natural convection of a horizontal air layer of depth δ = H/2 plus radiation across it.
 * - Colder above than below (a pack on top: unstable, cold air sinks): Nu = 0.069 Ra^(1/3) Pr^0.074,
 *   Globe & Dropkin for a horizontal cavity heated from below, 3×10⁵ < Ra < 7×10⁹ [globeDropkin1959];
 *   below the onset (Ra < 1708) and never less than conduction, Nu = 1 [incroperaEnclosure].
 * - Colder below than above (a pack underneath: stably stratified, the warm air stays on top): no
 *   convection, Nu = 1 (conduction only) [incroperaEnclosure].
 * - Radiation between the surfaces of the two halves crosses either way: linearised black-body
 *   coefficient 4σT³ with two grey surfaces of ε = 0.9, 1/(1/ε + 1/ε − 1) [incroperaRadiation].
 */
export function zoneExchange_W_K(lower_C: number, upper_C: number, area_m2: number, depth_m: number, warnings?: Set<string>): number {
  const mean = (lower_C + upper_C) / 2;
  const ap = airProps(Math.max(-50, Math.min(150, mean)));
  const dT = lower_C - upper_C;
  let Nu = 1;
  if (dT > 0) {
    const Ra = rayleigh(ap, dT, depth_m);
    if (Ra > 1708) Nu = Math.max(1, 0.069 * Math.cbrt(Ra) * Math.pow(ap.Pr, 0.074));
    if (Ra > 7e9) warnings?.add("The inside air layer's Rayleigh number is above 7×10⁹, outside the Globe–Dropkin range: the exchange between the halves of the box is extrapolated");
  }
  const eps = 1 / (1 / 0.9 + 1 / 0.9 - 1);
  const T = mean + KELVIN_OFFSET;
  const hRad = 4 * eps * SIGMA_W_M2K4 * T * T * T;
  return ((Nu * ap.k_W_mK) / depth_m + hRad) * area_m2;
}

/**
 * A product's nodes (9, centre to surface) are graded towards its surface, the surface interval 0.2 of
 * the uniform one (nodePositions in shipper.ts): a lid opening of 20–45 s heats the surface only about
 * √(α·t) ≈ 2 mm deep (α ≈ 1.4·10⁻⁷ m²/s, that of water, Table A.6 of [incropera6], from memory), less
 * than a uniform grid's surface cell (a sixteenth of the half size: 3 mm for a 5 cm tub). Measured on
 * the demo's lunch route (salad tub, thin cooler): the surface peak during the second drop was 0.30 K
 * below a 144-node run with uniform nodes and 0.04 K with these; the band's central hold was 16.9 %
 * longer than the run refined 4×, and 16.8 % with only the first-step error check of shipper.ts
 * (RESTART_FRACTION), 0.06 % with both. On the 48 h frozen bench plan, an overnight turkey and frozen
 * cod the band moved by under 0.06 % (test/reference/hold.ref.test.ts).
 */
const PRODUCT_SURFACE_RATIO = 0.2;

/**
 * Nodes across a coolant pack (centre to surface; dry ice is one node), chosen by measured accuracy. With 4
 * instead of 5 the 48 h frozen bench plan's band stayed as close to the run refined 4× (low −0.100 against
 * −0.107 %), but frozen cod with two eutectic plates on the overnight route, whose hold is set by the
 * plates' melt, moved from −0.065 % to −0.533 % from the run with twice the nodes and half the steps
 * (test/reference/hold.ref.test.ts): the plates' melt front is carried node by node, and 4 nodes place it
 * too coarsely.
 */
const PACK_NODES = 5;

function runOnce(P: Prepared, v: Variant): HoldRun {
  const inp = P.inp;
  const o = inp.overrides;
  const kScale = P.kScaleForUA;
  const scaleLayers = (ls: WallLayerSpec[]) => ls.map((l) => ({ ...l, k_W_mK: l.k_W_mK * kScale * (l.insulation ? v.insulationKScale : 1) }));
  const wallLayers = scaleLayers(P.wallLayers);
  const lidLayers = scaleLayers(P.lidLayers);
  const hot = P.bands.some((b) => b.mode === "hot");
  const extendTo = P.routeLength_s * (1 + inp.extendFraction);
  const lastSeg = P.segments[P.segments.length - 1];

  // Per-segment outer coefficients (correlations at a surface 3 K colder, or warmer for hot loads).
  const hOuter = P.segments.map((s) =>
    (o.outerH_W_m2K ?? boxOuterCoefficient(P.outer, s.seg.airTemp_C, s.seg.airSpeed_m_s, P.finish.emissivity, hot ? 3 : -3)) * v.outerHScale,
  );
  // Outside air swept in while the lid is open: ρc of air (ideal gas at the segment's air temperature is
  // within 10 % of 20 °C over a route, so 20 °C is used) times the air changes per second.
  const openG = (P.airVolume_m3 * (P_ATM_PA / (R_AIR_J_KGK * (20 + KELVIN_OFFSET))) * CP_AIR_J_KGK * o.lidOpenAirChangesPerMinute) / 60;
  // Each segment's conditions, worked out once per run (the network asks at every step); past the route's
  // end, the last segment's continue (lid openings stop with the route).
  const conditionsOf = (i: number, onRoute: boolean) => {
    const seg = P.segments[i].seg;
    const h = hOuter[i];
    const sun = onRoute ? seg.sun_W_m2 : lastSeg.seg.sun_W_m2;
    const lid = solAirTemperature({ airTemp_C: seg.airTemp_C, solarAbsorptivity: P.finish.solarAbsorptivity, irradiance_W_m2: sun, hOuter_W_m2K: h, emissivity: P.finish.emissivity, facingSky: sun > 0 });
    // The sides take a share of the sun on the lid's area spread over their own area; the base none.
    const sides = seg.airTemp_C + (P.finish.solarAbsorptivity * sun * o.sunShareSides) / h;
    return { air_C: seg.airTemp_C, solAir_C: { base: seg.airTemp_C, sidesLower: sides, sidesUpper: sides, lid }, outerH_W_m2K: h };
  };
  const onRouteConditions = P.segments.map((_, i) => conditionsOf(i, true));
  const pastRouteConditions = conditionsOf(P.segments.length - 1, false);
  // One object handed to the network at every step (it reads it at once and keeps nothing).
  const amb = { air_C: 0, solAir_C: { base: 0, sidesLower: 0, sidesUpper: 0, lid: 0 }, outerH_W_m2K: 0, openExchange_W_K: 0 };
  let segHint = 0;
  const ambient = (t: number) => {
    let c = pastRouteConditions;
    let open = 0;
    if (t < P.routeLength_s) {
      // Steps move forward in time (a retried step only shorter): start from the last segment found.
      if (segHint > 0 && t < P.segments[segHint - 1].end_s) segHint = 0;
      while (segHint < P.segments.length - 1 && t >= P.segments[segHint].end_s) segHint++;
      c = onRouteConditions[segHint];
      for (const op of P.openings) if (t >= op.start_s && t < op.end_s) open = openG;
    }
    amb.air_C = c.air_C;
    amb.solAir_C.base = c.solAir_C.base;
    amb.solAir_C.sidesLower = c.solAir_C.sidesLower;
    amb.solAir_C.sidesUpper = c.solAir_C.sidesUpper;
    amb.solAir_C.lid = c.solAir_C.lid;
    amb.outerH_W_m2K = c.outerH_W_m2K;
    amb.openExchange_W_K = open;
    return amb;
  };

  // Bodies: each pack line's packs at each position (underneath, on top, at the sides), then the products.
  const L = P.layout;
  const hi = P.innerH;
  const bodies: BodySpec[] = [];
  L.groups.forEach((g) => {
    const line = inp.packs[g.line];
    const p = line.pack;
    const V = p.length_m * p.width_m * p.thickness_m;
    const A = 2 * (p.length_m * p.width_m + p.length_m * p.thickness_m + p.width_m * p.thickness_m);
    bodies.push({
      label: p.name,
      material: P.packMats[g.line],
      shapeM: 0,
      halfSize_m: V / A,
      volume_m3: V,
      area_m2: A,
      count: g.count,
      nodes: p.kind === "dry_ice" ? 1 : PACK_NODES * (v.resolution ?? 1),
      start_C: packStart_C(p, line.conditioning_C, v.conditioningShift_K),
      zoneG_W_K: [hi * g.exposed_m2 * g.zoneShare[0], hi * g.exposed_m2 * g.zoneShare[1]],
    });
  });
  const nGroups = bodies.length;
  inp.products.forEach((line, i) => {
    const pm = P.productMats[i];
    const ex = L.products[i].exposed_m2;
    bodies.push({ label: line.product.name, material: pm.mat, shapeM: pm.shapeM, halfSize_m: pm.R, volume_m3: pm.V, area_m2: pm.A, count: line.count, nodes: 9 * (v.resolution ?? 1), surfaceRatio: PRODUCT_SURFACE_RATIO, start_C: line.start_C, zoneG_W_K: [hi * ex[0], hi * ex[1]] });
  });
  const contacts: { a: number; b: number; conductance_W_K: number }[] = [];
  L.groups.forEach((g, k) => g.load_m2.forEach((a, j) => a > 0 && contacts.push({ a: k, b: nGroups + j, conductance_W_K: inp.packs[g.line].contact_W_m2K * a })));
  // Faces: the open part of each exchanges with its half of the inside air; covered parts touch packs or the load.
  const faces: FaceSpec[] = [];
  const add = (kind: FaceSpec["kind"], layers: WallLayerSpec[], area: number, inner: FaceSpec["inner"]) => {
    if (area > 1e-9) faces.push({ kind, layers, area_m2: area, inner });
  };
  add("base", wallLayers, L.open.base, { zone: 0, h_W_m2K: hi });
  add("sidesLower", wallLayers, L.open.sides / 2, { zone: 0, h_W_m2K: hi });
  add("sidesUpper", wallLayers, L.open.sides / 2, { zone: 1, h_W_m2K: hi });
  add("lid", lidLayers, L.open.lid, { zone: 1, h_W_m2K: hi });
  L.groups.forEach((g, k) => {
    const hc = inp.packs[g.line].contact_W_m2K;
    if (g.position === "bottom") add("base", wallLayers, g.cover_m2, { body: k, h_W_m2K: hc });
    if (g.position === "top") add("lid", lidLayers, g.cover_m2, { body: k, h_W_m2K: hc });
    if (g.position === "side") {
      add("sidesLower", wallLayers, g.cover_m2 / 2, { body: k, h_W_m2K: hc });
      add("sidesUpper", wallLayers, g.cover_m2 / 2, { body: k, h_W_m2K: hc });
    }
  });
  L.products.forEach((pr, j) => add("base", wallLayers, pr.onBase_m2, { body: nGroups + j, h_W_m2K: DEFAULT_CONTACT_W_M2K }));

  // Freeze check next to packs: the product's face where a pack touches it, on its own fine column from
  // the face to the centre (contact-column.ts), against the surface of each touching pack group, so the
  // time it crosses the lower limit does not depend on the box model's step or grid. Built at packing.
  const touching = inp.products.map((_, j) => L.groups.map((g, k) => ({ k, hc: inp.packs[g.line].contact_W_m2K, a: g.load_m2[j] })).filter((x) => x.a > 0));
  let columns: { k: number; col: ContactColumn; crossed: boolean }[][] | null = null;
  const breakpoints = [...P.segments.map((s) => s.end_s), ...P.openings.flatMap((op) => [op.start_s, op.end_s])];
  let holdTime: number | null = null;
  let failsFirst: HoldRun["failsFirst"] = null;
  const series: HoldSeriesPoint[] = [];
  const prevC = new Float64Array(inp.products.length);
  const prevS = new Float64Array(inp.products.length);
  let prevT = 0;
  let routeGains: Gains | null = null;
  const groupLatent = L.groups.map((g) => {
    const line = inp.packs[g.line];
    return { Htop: P.packMats[g.line].H_J_kg(line.pack.phaseChange_C + packMeltBand_K(line.pack) / 2), L: line.pack.latentHeat_J_kg };
  });
  const prevDryH = new Float64Array(L.groups.length);
  const dryGroups = L.groups.map((g, k) => (inp.packs[g.line].pack.kind === "dry_ice" ? k : -1)).filter((k) => k >= 0);
  let dryIceGone: number | null = null;
  const latentLeft = (k: number, st: NetworkState) => Math.min(1, Math.max(0, (groupLatent[k].Htop - st.bodyMeanH_J_kg[k]) / groupLatent[k].L));
  const lineState = (st: NetworkState) =>
    inp.packs.map((line, i) => {
      let left = 0;
      let T = 0;
      for (let k = 0; k < L.groups.length; k++) {
        if (L.groups[k].line !== i) continue;
        left += (latentLeft(k, st) * L.groups[k].count) / line.count;
        T += (st.bodySurface_C[k] * L.groups[k].count) / line.count;
      }
      return { T_C: T, latentLeft: left, massLeft_kg: line.pack.kind === "dry_ice" ? line.pack.mass_kg * line.count * left : line.pack.mass_kg * line.count };
    });
  let lastLines: HoldSeriesPoint["packs"] = [];
  // Without curves, the packs' state is read once, from the network's last state (it updates one object in place).
  let lastState: NetworkState | null = null;
  // Band check on a product's centre or surface after the step that ended at t (defined once: it runs every step).
  const check = (t: number, j: number, point: HoldPoint, T: number, Tp: number, limit: "upper" | "lower", Lim: number | null) => {
    if (Lim === null) return;
    const out = limit === "upper" ? T > Lim : T < Lim;
    if (!out) return;
    const f = t === 0 || T === Tp ? 1 : (Lim - Tp) / (T - Tp);
    const tc = t === 0 ? 0 : prevT + Math.min(1, Math.max(0, f)) * (t - prevT);
    if (holdTime === null || tc < holdTime) {
      holdTime = tc;
      failsFirst = { product: inp.products[j].product.name, line: j, point, limit, limit_C: Lim };
    }
  };
  const net = runNetwork({
    faces,
    zones: [{ volume_m3: P.airVolume_m3 / 2 }, { volume_m3: P.airVolume_m3 / 2 }],
    // Well mixed on request: a conductance between the halves far above every other path (10⁴ W/K).
    zoneExchange: o.wellMixedInside ? () => 1e4 : (z) => zoneExchange_W_K(z[0], z[1], P.midPlane_m2, P.inner.H / 2),
    edgeConductance_W_K: P.edgeG * kScale * v.insulationKScale,
    edgeZoneShare: [0.5, 0.5],
    openZoneShare: [0.5, 0.5],
    bodies,
    contacts,
    boxStart_C: inp.boxStart_C ?? inp.route.segments[0].airTemp_C,
    ambient,
    breakpoints_s: [...breakpoints, P.routeLength_s],
    tEnd_s: extendTo,
    refine: v.resolution ?? 1,
    // Largest step 1 h: with the error control of the network, the hold time is within about 0.1 % of a
    // 4×-refined run (see LTE_PER_TARGET in shipper.ts); segment changes and lid openings stay exact.
    dtMax_s: 3600 / (v.resolution ?? 1),
    targetChange_K: 2 / (v.resolution ?? 1),
    errorScale: v.errorScale,
    onStep: (t, st) => {
      if (columns === null)
        columns = inp.products.map((line, j) =>
          P.bands[j].lower_C === null
            ? []
            : touching[j].map((x) => ({
                k: x.k,
                col: contactColumn({ material: P.productMats[j].mat, depth_m: P.productMats[j].R, start_C: line.start_C, pack_C: st.bodySurface_C[x.k], contact_W_m2K: x.hc, refine: v.resolution ?? 1 }),
                crossed: false,
              })),
        );
      for (let j = 0; j < inp.products.length; j++) {
        const b = P.bands[j];
        const c = st.bodyCenter_C[nGroups + j];
        const s = st.bodySurface_C[nGroups + j];
        check(t, j, "surface", s, prevS[j], "upper", b.upper_C);
        check(t, j, "surface", s, prevS[j], "lower", b.lower_C);
        check(t, j, "centre", c, prevC[j], "upper", b.upper_C);
        check(t, j, "centre", c, prevC[j], "lower", b.lower_C);
        if (b.lower_C !== null && columns !== null && t > 0) {
          for (const x of columns[j]) {
            // Only the first crossing counts: a column that has crossed is not stepped again.
            if (x.crossed) continue;
            const tc = x.col.advance(t, st.bodySurface_C[x.k], c, b.lower_C);
            if (tc !== null) x.crossed = true;
            if (tc !== null && (holdTime === null || tc < holdTime)) {
              holdTime = tc;
              failsFirst = { product: inp.products[j].product.name, line: j, point: "next to a pack", limit: "lower", limit_C: b.lower_C };
            }
          }
        }
        prevC[j] = c;
        prevS[j] = s;
      }
      // The dry ice is gone when the last group's mean enthalpy reaches the top of its band: the time
      // within the step by linear interpolation of each group's mean H, as the band crossings above.
      if (dryGroups.length && dryIceGone === null) {
        if (dryGroups.every((k) => st.bodyMeanH_J_kg[k] >= groupLatent[k].Htop)) {
          let f = 0;
          for (const k of dryGroups) {
            const H = st.bodyMeanH_J_kg[k];
            const Hp = prevDryH[k];
            if (t > 0 && Hp < groupLatent[k].Htop && H > Hp) f = Math.max(f, (groupLatent[k].Htop - Hp) / (H - Hp));
          }
          dryIceGone = prevT + Math.min(1, f) * (t - prevT);
        }
        for (const k of dryGroups) prevDryH[k] = st.bodyMeanH_J_kg[k];
      }
      prevT = t;
      if (routeGains === null && t >= P.routeLength_s - 1e-6) routeGains = { ...st.gains, faces: { ...st.gains.faces } };
      if (v.keepSeries) {
        lastLines = lineState(st);
        series.push({
          t_s: t,
          air_C: st.air_C,
          airLower_C: st.zone_C[0],
          airUpper_C: st.zone_C[1],
          products: inp.products.map((_, j) => ({ center_C: st.bodyCenter_C[nGroups + j], surface_C: st.bodySurface_C[nGroups + j] })),
          packs: lastLines,
        });
      } else lastState = st;
      // Past the end of the route, stop as soon as the band is left (the margin is known then).
      return (holdTime !== null && !v.keepSeries) || (v.stopAt_s !== undefined && t >= v.stopAt_s);
    },
  });
  if (!v.keepSeries && dryGroups.length && lastState) lastLines = lineState(lastState);
  const dryIceSublimated = inp.packs.reduce((a, line, k) => (line.pack.kind !== "dry_ice" ? a : a + line.pack.mass_kg * line.count * (1 - (lastLines[k]?.latentLeft ?? 1))), 0);
  const all = net.gains_J;
  const moved = Math.abs(all.faces.base) + Math.abs(all.faces.sidesLower) + Math.abs(all.faces.sidesUpper) + Math.abs(all.faces.lid) + Math.abs(all.edges) + Math.abs(all.openings);
  // The breakdown the user sees covers the route itself, not the extension used for the margin.
  const g: Gains = routeGains ?? all;
  // A relative balance error means nothing when almost no heat moves: less than would warm the contents by 1 mK.
  const meaningful = Math.max(moved, Math.abs(net.storedChange_J)) >= 1e-3 * net.heatCapacity_J_K;
  return {
    holdTime_s: holdTime,
    failsFirst,
    endTime_s: net.t_end_s,
    heatGain_J: { sides: g.faces.sidesLower + g.faces.sidesUpper, base: g.faces.base, lid: g.faces.lid, edgesAndCorners: g.edges, lidOpenings: g.openings },
    energyBalanceError: meaningful ? Math.abs(net.energyError_J) / Math.max(moved, Math.abs(net.storedChange_J)) : null,
    energyBalanceError_J: net.energyError_J,
    steps: net.steps,
    newtonIterations: net.newtonIterations,
    newtonFailures: net.newtonFailures,
    rejectedSteps: net.rejectedSteps,
    series: v.keepSeries ? downsample(series) : [],
    co2Released_m3: dryIceSublimated * CO2_M3_PER_KG,
    dryIceGone_s: dryIceGone,
  };
}

function downsample(s: HoldSeriesPoint[]): HoldSeriesPoint[] {
  if (s.length <= MAX_POINTS) return s;
  const every = Math.ceil(s.length / MAX_POINTS);
  const out = s.filter((_, i) => i % every === 0);
  if (out[out.length - 1] !== s[s.length - 1]) out.push(s[s.length - 1]);
  return out;
}

/** A corner of the uncertainty sample: scales on the outer coefficient and insulation k, and a conditioning shift (K). */
export interface HoldCorner {
  outerHScale: number;
  insulationKScale: number;
  conditioningShift_K: number;
}

/**
 * The uncertainty sample, shared by the hold planner's band and the sizer's judging (one list): the central
 * run first, then every corner of (outer h ± f, insulation k ± f, conditioning ± K), a spread of zero giving
 * one value instead of two. No corner is assumed the worst: with sun, a higher outer coefficient lowers the
 * sol-air excess αI/h_o and can lengthen the hold [ashraeSolAir], so the low end is the minimum over all.
 */
export function uncertaintyCorners(u: HoldParsed["uncertainty"]): HoldCorner[] {
  const out: HoldCorner[] = [{ outerHScale: 1, insulationKScale: 1, conditioningShift_K: 0 }];
  const signs = (x: number) => (x === 0 ? [0] : [-1, 1]);
  for (const sh of signs(u.outerH_frac)) for (const sk of signs(u.insulationK_frac)) for (const sc of signs(u.conditioning_K)) {
    if (sh === 0 && sk === 0 && sc === 0) continue;
    out.push({ outerHScale: 1 + sh * u.outerH_frac, insulationKScale: 1 + sk * u.insulationK_frac, conditioningShift_K: sc * u.conditioning_K });
  }
  return out;
}

const CALIBRATED_FACTORS = ["wallConductance", "innerH", "contact"] as const;

/**
 * The uncertainty sample of a plan calibrated with fitted intervals (a box saved from a calibration) that
 * asks for a band (an outer-coefficient or insulation spread above zero): every corner of the fitted
 * factors' 95 % intervals, each at pack conditioning ± its spread. The wall factor absorbed the outer
 * coefficient and insulation conductivity in the fit, so its interval replaces their default spreads.
 * Null: no intervals, or no band asked for — the default corners apply.
 */
export function calibratedCorners(inp: HoldParsed): { inp: HoldParsed; conditioningShift_K: number }[] | null {
  const cal = effectiveHoldCalibration(inp);
  const iv = cal?.intervals;
  if (!cal || !iv || (inp.uncertainty.outerH_frac === 0 && inp.uncertainty.insulationK_frac === 0)) return null;
  const names = CALIBRATED_FACTORS.filter((n) => iv[n]);
  if (!names.length) return null;
  let sets: HoldCalibration[] = [cal];
  for (const n of names) sets = sets.flatMap((c) => [{ ...c, [n]: iv[n]!.low }, { ...c, [n]: iv[n]!.high }]);
  const k = inp.uncertainty.conditioning_K;
  const shifts = k === 0 ? [0] : [-k, k];
  return sets.flatMap((c) => shifts.map((sh) => ({ inp: { ...inp, calibration: c }, conditioningShift_K: sh })));
}

function calibratedIntervalText(inp: HoldParsed): string {
  const iv = effectiveHoldCalibration(inp)?.intervals ?? {};
  const label = { wallConductance: "wall conductance", innerH: "inside coefficient", contact: "pack contact" };
  return CALIBRATED_FACTORS.flatMap((n) => (iv[n] ? [`${label[n]} ×${iv[n].low.toPrecision(3)}–${iv[n].high.toPrecision(3)}`] : [])).join(", ");
}

/**
 * Runs the corners asked for, without curves, each stopping at its first failure: what the pack-out sizer
 * needs. With `lowOnly`, each run after the first also stops at the earliest failure found so far (it can
 * only lower the minimum before then), so the minimum hold over the corners is exact and found sooner.
 * With `stopBelow_s`, the corners stop once the minimum is below it (`complete: false`: the minimum
 * found is then an upper bound of the low end).
 * Throws PhysicsInputError for contents that do not fit or a product with no band.
 */
export function holdRuns(
  inp: HoldParsed,
  corners: HoldCorner[],
  opts: { lowOnly?: boolean; stopBelow_s?: number } = {},
): { runs: HoldRun[]; routeLength_s: number; hasLowerLimit: boolean; complete: boolean } {
  const P = prepare(inp);
  const runs: HoldRun[] = [];
  let low = Infinity;
  // Where only the minimum matters, drop the corners that provably cannot give it: the box network is
  // cooperative (every coupling moves heat from warm to cold), so warmer packs at the start keep every
  // temperature at least as warm at every later time (comparison principle for cooperative systems,
  // [smith1995Monotone]). With upper limits only, the colder-conditioning corners fail no earlier than
  // their warmer twins; with lower limits only, the warmer ones. Sun, h and k are not pruned.
  const hasUpper = P.bands.some((b) => b.upper_C !== null);
  const hasLower = P.bands.some((b) => b.lower_C !== null);
  const list = opts.lowOnly ? corners.filter((c, i) => i === 0 || (hasUpper && hasLower) || (hasUpper ? c.conditioningShift_K >= 0 : c.conditioningShift_K <= 0)) : corners;
  for (const c of list) {
    const r = runOnce(P, { ...c, keepSeries: false, stopAt_s: opts.lowOnly && Number.isFinite(low) ? low : undefined });
    runs.push(r);
    if (r.holdTime_s !== null && r.holdTime_s < low) low = r.holdTime_s;
    // Asked only for the minimum down to a threshold: once below it, the rest cannot change the verdict.
    if (opts.stopBelow_s !== undefined && low < opts.stopBelow_s && runs.length < list.length) {
      return { runs, routeLength_s: P.routeLength_s, hasLowerLimit: hasLower, complete: false };
    }
  }
  return { runs, routeLength_s: P.routeLength_s, hasLowerLimit: hasLower, complete: true };
}

/**
 * The runs of the hold planner's own uncertainty sample, for the sizer: the central run first, then, for a
 * calibrated box, every corner of its fitted intervals (calibratedCorners, as runHoldParsed's band), else
 * the default corners given. Stops early, as holdRuns does, once the minimum is below `stopBelow_s`.
 */
export function holdSampleRuns(inp: HoldParsed, corners: HoldCorner[], opts: { lowOnly?: boolean; stopBelow_s?: number } = {}): ReturnType<typeof holdRuns> {
  const cal = calibratedCorners(inp);
  if (!cal) return holdRuns(inp, corners, opts);
  const first = holdRuns(inp, [{ outerHScale: 1, insulationKScale: 1, conditioningShift_K: 0 }]);
  const runs = [...first.runs];
  let low = first.runs[0].holdTime_s ?? Infinity;
  for (let i = 0; i < cal.length; i++) {
    if (opts.stopBelow_s !== undefined && low < opts.stopBelow_s) return { ...first, runs, complete: false };
    const r = holdRuns(cal[i].inp, [{ outerHScale: 1, insulationKScale: 1, conditioningShift_K: cal[i].conditioningShift_K }]).runs[0];
    runs.push(r);
    if (r.holdTime_s !== null && r.holdTime_s < low) low = r.holdTime_s;
  }
  return { ...first, runs, complete: true };
}

type HoldOpts = { resolution?: number; errorScale?: number };

/** The band's sample after the central run: the calibrated corners (each with its own input) or the default corners. */
function bandSample(inp: HoldParsed): { inp: HoldParsed | null; corner: HoldCorner }[] {
  const cal = calibratedCorners(inp);
  if (cal) return cal.map((c) => ({ inp: c.inp, corner: { outerHScale: 1, insulationKScale: 1, conditioningShift_K: c.conditioningShift_K } }));
  return uncertaintyCorners(inp.uncertainty)
    .slice(1)
    .map((corner) => ({ inp: null, corner }));
}

/**
 * A hold plan prepared once (per thread), as pieces that threads may take side by side (the registry's
 * PlannerPieces, the server's pool): piece 0 is the central run with its curves, kept by the thread that runs
 * it (runLead); pieces 1 … count − 1 are the band's sample in its order, each giving its hold (Infinity where
 * the run never left its band). `finish` with every piece's hold gives exactly what runHoldParsed gives.
 */
export function holdPieces(inp: HoldParsed, opts: HoldOpts = {}) {
  const P = prepare(inp);
  const sample = bandSample(inp);
  let central: HoldRun | null = null;
  return {
    count: sample.length + 1,
    runLead(): void {
      central = runOnce(P, { resolution: opts.resolution, errorScale: opts.errorScale, outerHScale: 1, insulationKScale: 1, conditioningShift_K: 0, keepSeries: true });
    },
    runPiece(at: number): number {
      const s = sample[at - 1];
      if (!s) throw new Error(`hold plan: there is no piece ${at} of ${sample.length + 1}`);
      // A calibrated corner starts from its own input (`inp` as given, not P.inp).
      const r = runOnce(s.inp ? prepare(s.inp) : P, { ...s.corner, resolution: opts.resolution, errorScale: opts.errorScale, keepSeries: false });
      return r.holdTime_s ?? Infinity;
    },
    // The plan without its band (the planner's quick input: the same plan, every spread zero) from the
    // central run alone: neither prepare nor the central run reads the spreads, and without them there
    // are no corners, so this is runHoldParsed(quickInput) without running the central run again.
    quick(quickInput: HoldParsed): HoldResult {
      if (!central) throw new Error("hold plan: the central run has not been run");
      if (bandSample(quickInput).length > 0) throw new Error("hold plan: the quick input still has a band");
      return holdResult(P, quickInput, central, [central.holdTime_s]);
    },
    finish(holds: ArrayLike<number>): HoldResult {
      if (!central) throw new Error("hold plan: the central run has not been run");
      const all: (number | null)[] = [central.holdTime_s];
      for (let at = 1; at <= sample.length; at++) {
        const h = holds[at];
        if (typeof h !== "number" || Number.isNaN(h)) throw new Error(`hold plan: the hold of piece ${at} of ${sample.length + 1} is missing`);
        all.push(h === Infinity ? null : h);
      }
      return holdResult(P, inp, central, all);
    },
  };
}

export function runHoldParsed(inp: HoldParsed, opts: HoldOpts = {}): HoldResult {
  const pieces = holdPieces(inp, opts);
  pieces.runLead();
  const holds = new Float64Array(pieces.count);
  for (let at = 1; at < pieces.count; at++) holds[at] = pieces.runPiece(at);
  return pieces.finish(holds);
}

/** The result from the central run and the holds of the central run and every corner of the sample, in the sample's order. */
function holdResult(P: Prepared, inp: HoldParsed, central: HoldRun, holds: (number | null)[]): HoldResult {
  // A calibrated box's band comes from its fitted intervals; otherwise from the default spreads.
  const calSample = calibratedCorners(inp);
  const asNumber = (x: number | null) => (x === null ? Infinity : x);
  const low = Math.min(...holds.map(asNumber));
  const high = Math.max(...holds.map(asNumber));
  const route = P.routeLength_s;
  const hold = central.holdTime_s;
  const extended = route * (1 + inp.extendFraction);
  const warnings = [...P.warnings];
  if (hold !== null && hold === 0) warnings.push(`${central.failsFirst?.product} is already outside its band when packed`);
  const ff = central.failsFirst;
  if (ff?.point === "next to a pack" && hold !== null && hold <= P.routeLength_s)
    warnings.push(
      `${ff.product}: its face against the packs is estimated to fall below ${ff.limit_C.toFixed(1)} °C long before the rest of it. To hold it without freezing that face, keep it apart from the packs (set the pack line's "Touching" to nothing or to another product, with card or an empty tray between) or condition the packs warmer`,
    );
  const hOuter = P.segments.map((s) => inp.overrides.outerH_W_m2K ?? boxOuterCoefficient(P.outer, s.seg.airTemp_C, s.seg.airSpeed_m_s, P.finish.emissivity, -3));
  const ua = steadyUA(P.wallLayers, P.lidLayers, P.inner, hOuter[0], P.innerH, P.kScaleForUA, P.edgeG);
  const assumptions = [...P.assumptions];
  assumptions.push(
    calSample
      ? `Uncertainty band: the lowest and highest hold over the central run and every corner of the fitted 95 % intervals (${calibratedIntervalText(inp)}) and pack conditioning ±${inp.uncertainty.conditioning_K} K; the fitted wall factor stands in for the default outer-coefficient and insulation spreads`
      : `Uncertainty band: the lowest and highest hold over the central run and every corner of outer coefficient ±${Math.round(inp.uncertainty.outerH_frac * 100)} %, insulation conductivity ±${Math.round(inp.uncertainty.insulationK_frac * 100)} % and pack conditioning ±${inp.uncertainty.conditioning_K} K`,
  );
  assumptions.push(`After the route ends, the last segment's conditions are continued for ${Math.round(inp.extendFraction * 100)} % of the route length to measure the margin`);
  return {
    ...central,
    holdTime_s: hold !== null && hold <= route ? hold : null,
    routeLength_s: route,
    margin_s: hold === null ? extended - route : hold - route,
    marginIsLowerBound: hold === null,
    band: {
      low: Number.isFinite(low) ? low : null,
      central: hold,
      high: Number.isFinite(high) ? high : null,
    },
    bands: P.bands,
    segments: P.segments.map((s) => ({ label: s.label, start_s: s.start_s, end_s: s.end_s })),
    openings_s: P.openings.map((o) => o.start_s),
    ua,
    outerH_W_m2K: hOuter,
    innerH_W_m2K: P.innerH,
    hasDryIce: P.hasDryIce,
    compliance: holdCompliance(inp.ruleSet, inp.products.map((l, j) => ({ name: l.product.name, start_C: l.start_C, mode: P.bands[j].mode })), central.series, route, Number.isFinite(low) ? low : null),
    assumptions,
    warnings,
  };
}
