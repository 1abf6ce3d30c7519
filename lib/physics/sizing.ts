/**
 * The pack-out sizer: every feasible combination of a candidate box (and its wall-thickness variants),
 * pack counts and conditioning temperatures goes through the hold model; the answer is the set that
 * holds for the route plus the margin, its Pareto front over packed mass, cost and outer volume, and
 * the near misses with the reason each fails.
 *
 * Judging by the low end of the uncertainty band: every candidate runs the hold planner's own sample
 * (uncertaintyCorners: the central run and every corner), and its judged hold is the minimum, exactly the
 * hold planner's band.low for that pack-out. No corner is assumed the worst: with sun a higher outer
 * coefficient can lengthen the hold (sol-air), and a lower limit fails at other corners than an upper one.
 * Each corner after the first stops at the earliest failure found so far, which keeps the minimum exact.
 *
 * Pruning: with no lower limit in play, more of the same pack at the same conditioning never shortens the
 * hold at any corner: the box network is a cooperative (monotone) system — every coupling moves heat from
 * warm to cold, so adding a colder body, or covering more of a face with one, can only lower every
 * temperature (Kamke's comparison theorem for cooperative systems, e.g. Smith 1995) — and sun only changes
 * the outside driving temperature, which more packs do not touch. So a count vector that is componentwise
 * at least one that holds (same box, same conditioning) holds too, and is never on the Pareto front (it only
 * adds mass and cost). Such candidates are marked without a run; the tests check that pruning gives the
 * same answer as brute force, on shaded and sunny routes.
 */
import type { SizeParsed } from "../schemas/size";
import type { HoldParsed } from "../schemas/hold";
import { DEFAULT_CONTACT_W_M2K, HOLD_OVERRIDE_DEFAULTS, MAX_CANDIDATES } from "../schemas/defaults";
import type { Shipper, Material } from "../schemas/templates";
import { holdRuns, holdSampleRuns, uncertaintyCorners } from "./hold";
import { boxOuterDimensions } from "./geometry";
import { PhysicsInputError } from "./validation";

export interface Candidate {
  index: number;
  box: number;
  /** Thickness of the varied insulation layer, or null for the box as it is. */
  variant_m: number | null;
  counts: number[];
  conditioning_C: number[];
  level: number;
  group: string;
}

export type Verdict = "holds" | "fails" | "does not fit";

export interface CandidateResult {
  index: number;
  verdict: Verdict;
  /** Judged hold time (low end or central), s; null when it holds past the simulated time. */
  hold_s: number | null;
  /** Hold at the other judging points, when run. */
  central_s: number | null;
  /** True when the corners stopped early, the candidate already far short: hold_s is then "at most". */
  holdIsUpperBound: boolean;
  reason: string | null;
  failsFirst: { product: string; point: string; limit: "upper" | "lower" } | null;
  dryIceGone_s: number | null;
  pruned: boolean;
}

export interface CandidateRow extends CandidateResult {
  boxName: string;
  packs: { name: string; count: number; conditioning_C: number }[];
  mass_kg: number;
  cost: number;
  outerVolume_m3: number;
  holds: boolean;
}

export interface SizingPlan {
  candidates: Candidate[];
  required_s: number;
  routeLength_s: number;
  prunable: boolean;
  levels: number[][];
  discardedBeforeRun: number;
}

export interface SizingResult {
  required_s: number;
  routeLength_s: number;
  candidates: CandidateRow[];
  pareto: number[];
  nearMisses: { index: number; reason: string; hold_s: number | null }[];
  evaluated: number;
  pruned: number;
  doesNotFit: number;
  cancelled: boolean;
  message: string | null;
}

/** The box as a candidate variant: the thickest insulation layer of walls and lid set to `t`. */
export function boxVariant(s: Shipper, materials: Material[], t: number | null): Shipper {
  if (t === null) return s;
  const isIns = (name: string) => materials.find((m) => m.name === name)?.category === "insulation";
  const vary = (layers: { material: string; thickness_m: number }[]) => {
    let best = -1;
    layers.forEach((l, i) => {
      if (isIns(l.material) && (best < 0 || l.thickness_m > layers[best].thickness_m)) best = i;
    });
    return best < 0 ? layers : layers.map((l, i) => (i === best ? { ...l, thickness_m: t } : l));
  };
  return { ...s, name: `${s.name} (${Math.round(t * 1000)} mm)`, wallLayers: vary(s.wallLayers), lidLayers: s.lidLayers ? vary(s.lidLayers) : null };
}

function outerDims(s: Shipper) {
  const o = boxOuterDimensions(s);
  return { L: o.length_m, W: o.width_m, H: o.height_m };
}

/**
 * Mass and cost of a candidate box. A thickness variant changes the shell by ΔV = V_outer(variant) −
 * V_outer(box) (the inner size is kept): the varied insulation's density × ΔV is added to the empty mass,
 * and ΔV × the insulation's cost per m³ to the cost. That cost is the box's own figure when given
 * (`extraInsulationCost_per_m3`), else the box's price spread over its shell volume — as if the box's
 * price were all insulation, stated with the answer.
 */
export function boxMassAndCost(b: SizeParsed["boxes"][number], variant: Shipper, materials: Material[]): { mass_kg: number; cost: number; costPerM3: number } {
  const base = b.shipper;
  const vol = (s: Shipper) => {
    const o = outerDims(s);
    return o.L * o.W * o.H;
  };
  const inner = base.innerLength_m * base.innerWidth_m * base.innerHeight_m;
  const shell = Math.max(vol(base) - inner, 1e-9);
  const costPerM3 = b.extraInsulationCost_per_m3 ?? base.cost / shell;
  if (variant === base) return { mass_kg: base.emptyMass_kg, cost: base.cost, costPerM3 };
  const dV = vol(variant) - vol(base);
  // The varied layer's material: the thickest insulation layer of the walls (as boxVariant chooses it).
  const ins = materials.filter((m) => m.category === "insulation");
  const layer = [...base.wallLayers].filter((l) => ins.some((m) => m.name === l.material)).sort((x, y) => y.thickness_m - x.thickness_m)[0];
  const rho = ins.find((m) => m.name === layer?.material)?.density_kg_m3 ?? 0;
  return { mass_kg: Math.max(0, base.emptyMass_kg + rho * dV), cost: Math.max(0, base.cost + costPerM3 * dV), costPerM3 };
}

/** A failing candidate that reaches at least this fraction of the required hold is a near miss. */
export const NEAR_MISS_FRACTION = 0.75;

export function requiredHold(inp: SizeParsed, routeLength_s: number): number {
  return inp.margin.kind === "percent" ? routeLength_s * (1 + inp.margin.value / 100) : routeLength_s + inp.margin.value * 3600;
}

export function planSizing(inp: SizeParsed): SizingPlan {
  const routeLength_s = inp.route.segments.reduce((a, s) => a + s.duration_s, 0);
  if (!(routeLength_s > 0)) throw new PhysicsInputError("route", "the route has no length");
  const required_s = requiredHold(inp, routeLength_s);
  // Count the space before building it, so an oversized search is refused at once.
  const boxVariants = inp.boxes.reduce((a, b) => a + 1 + b.thicknessVariants_m.length, 0);
  let size = boxVariants;
  for (const p of inp.packs) size *= (p.maxCount - p.minCount + 1) * p.conditioning_C.length;
  if (size > inp.maxCandidates) {
    throw new PhysicsInputError(
      "packs",
      `that search has ${size.toLocaleString("en")} candidates, more than the ${inp.maxCandidates.toLocaleString("en")} allowed (at most ${MAX_CANDIDATES.toLocaleString("en")}): narrow the count ranges, use fewer conditioning temperatures or fewer boxes`,
    );
  }
  const candidates: Candidate[] = [];
  const counts = inp.packs.map((p) => p.minCount);
  const conds = inp.packs.map(() => 0);
  inp.boxes.forEach((b, bi) => {
    for (const v of [null, ...b.thicknessVariants_m]) {
      // Odometer over conditioning choices, then counts.
      const nC = inp.packs.map((p) => p.conditioning_C.length);
      conds.fill(0);
      do {
        counts.forEach((_, i) => (counts[i] = inp.packs[i].minCount));
        do {
          const total = counts.reduce((a, c) => a + c, 0);
          // A pack line with no packs has no conditioning: keep only its first choice, so nothing repeats.
          const distinct = counts.every((n, i) => n > 0 || conds[i] === 0);
          if (total > 0 && distinct) {
            const c = inp.packs.map((p, i) => p.conditioning_C[conds[i]]);
            candidates.push({ index: candidates.length, box: bi, variant_m: v, counts: [...counts], conditioning_C: c, level: total, group: `${bi}|${v}|${c.join(",")}` });
          }
        } while (advance(counts, inp.packs.map((p) => p.minCount), inp.packs.map((p) => p.maxCount)));
      } while (advance(conds, nC.map(() => 0), nC.map((n) => n - 1)));
    }
  });
  if (candidates.length === 0) throw new PhysicsInputError("packs", "every candidate has no packs at all: raise the most-packs counts");
  const maxLevel = Math.max(...candidates.map((c) => c.level));
  const levels: number[][] = Array.from({ length: maxLevel + 1 }, () => []);
  for (const c of candidates) levels[c.level].push(c.index);
  return { candidates, required_s, routeLength_s, prunable: false, levels: levels.filter((l) => l.length), discardedBeforeRun: 0 };
}

function advance(v: number[], lo: number[], hi: number[]): boolean {
  for (let i = 0; i < v.length; i++) {
    if (v[i] < hi[i]) {
      v[i]++;
      return true;
    }
    v[i] = lo[i];
  }
  return false;
}

/** The hold-planner input of one candidate. */
export function candidateHoldInput(inp: SizeParsed, c: Candidate, extendFraction: number): HoldParsed {
  const b = inp.boxes[c.box];
  const shipper = boxVariant(b.shipper, inp.materials, c.variant_m);
  return {
    products: inp.products,
    shipper,
    materials: inp.materials,
    packs: inp.packs
      .map((p, i) => ({ pack: p.pack, count: c.counts[i], conditioning_C: c.conditioning_C[i], placement: p.placement, contactWith: p.touchesLoad ? null : ("none" as const), contact_W_m2K: DEFAULT_CONTACT_W_M2K }))
      .filter((l) => l.count > 0),
    route: inp.route,
    ruleSet: inp.ruleSet,
    boxStart_C: inp.boxStart_C,
    overrides: { ...HOLD_OVERRIDE_DEFAULTS, wellMixedInside: inp.wellMixedInside },
    uncertainty: inp.uncertainty,
    extendFraction,
  };
}

/** Runs one candidate through the hold model at the judging corner(s). Pure: safe to call in a worker. */
export function evaluateCandidate(inp: SizeParsed, c: Candidate, required_s: number, routeLength_s: number): CandidateResult {
  const extend = Math.max(0.05, required_s / routeLength_s - 1 + 0.02);
  let out;
  try {
    const hold = candidateHoldInput(inp, c, extend);
    // The low end: the minimum over the hold planner's own uncertainty sample (central run first).
    // A candidate already below 75 % of the required hold is no near miss: its remaining corners are skipped.
    // A calibrated box is judged on its fitted intervals, as the hold planner's band is (holdSampleRuns).
    out = (inp.judgeBy === "central" ? holdRuns : holdSampleRuns)(hold, inp.judgeBy === "central" ? uncertaintyCorners({ outerH_frac: 0, insulationK_frac: 0, conditioning_K: 0 }) : uncertaintyCorners(inp.uncertainty), {
      lowOnly: true,
      stopBelow_s: NEAR_MISS_FRACTION * required_s,
    });
  } catch (e) {
    if (e instanceof PhysicsInputError && /larger than the box/.test(e.message)) {
      return { index: c.index, verdict: "does not fit", hold_s: null, central_s: null, holdIsUpperBound: false, reason: "the contents do not fit", failsFirst: null, dryIceGone_s: null, pruned: false };
    }
    throw e;
  }
  let worst = out.runs[0];
  for (const r of out.runs) if (r.holdTime_s !== null && (worst.holdTime_s === null || r.holdTime_s < worst.holdTime_s)) worst = r;
  const hold = worst.holdTime_s;
  const holds = hold === null || hold >= required_s;
  let reason: string | null = null;
  if (!holds && worst.failsFirst) {
    const ff = worst.failsFirst;
    if (worst.dryIceGone_s !== null && worst.dryIceGone_s <= hold!) reason = `dry ice exhausted after ${(worst.dryIceGone_s / 3600).toFixed(1)} h, then ${ff.product} (${ff.point}) rose above ${ff.limit_C} °C`;
    else if (ff.limit === "lower") reason = `${ff.product} (${ff.point}) fell below ${ff.limit_C.toFixed(1)} °C: it would freeze`;
    else reason = `${ff.product} (${ff.point}) rose above ${ff.limit_C} °C`;
  }
  return {
    index: c.index,
    verdict: holds ? "holds" : "fails",
    hold_s: hold,
    central_s: out.runs[0].holdTime_s,
    holdIsUpperBound: !out.complete,
    reason,
    failsFirst: worst.failsFirst ? { product: worst.failsFirst.product, point: worst.failsFirst.point, limit: worst.failsFirst.limit } : null,
    dryIceGone_s: worst.dryIceGone_s,
    pruned: false,
  };
}

/** Whether monotone pruning is allowed: only when no product can cross a lower limit. */
export function canPrune(inp: SizeParsed): boolean {
  if (!inp.prune) return false;
  return inp.products.every((l) => !l.product.freezeSensitive && l.start_C < inp.ruleSet.hotHoldMin_C);
}

/**
 * Drives the search level by level (total pack count), asking `evaluate` for each level's candidates
 * that pruning has not already decided. `evaluate` may fan out to workers.
 */
export async function runSizing(
  inp: SizeParsed,
  evaluate: (indices: number[], plan: SizingPlan) => Promise<CandidateResult[]>,
  opts: { onProgress?: (done: number, total: number) => void; signal?: { aborted: boolean } } = {},
): Promise<SizingResult> {
  const plan = planSizing(inp);
  const prune = canPrune(inp);
  const results: (CandidateResult | null)[] = plan.candidates.map(() => null);
  const holdingByGroup = new Map<string, number[][]>();
  let done = 0;
  let evaluated = 0;
  let pruned = 0;
  let cancelled = false;
  const total = plan.candidates.length;
  for (const level of plan.levels) {
    if (opts.signal?.aborted) {
      cancelled = true;
      break;
    }
    const toRun: number[] = [];
    for (const i of level) {
      const c = plan.candidates[i];
      const holding = holdingByGroup.get(c.group);
      if (prune && holding && holding.some((h) => h.every((n, k) => c.counts[k] >= n))) {
        results[i] = { index: i, verdict: "holds", hold_s: null, central_s: null, holdIsUpperBound: false, reason: null, failsFirst: null, dryIceGone_s: null, pruned: true };
        pruned++;
        done++;
      } else toRun.push(i);
    }
    const record = (rs: CandidateResult[]) => {
      for (const r of rs) {
        results[r.index] = r;
        evaluated++;
        done++;
        if (r.verdict === "holds") {
          const c = plan.candidates[r.index];
          const list = holdingByGroup.get(c.group) ?? [];
          list.push(c.counts);
          holdingByGroup.set(c.group, list);
        }
      }
    };
    if (prune && toRun.length) {
      // Colder first: of the candidates with the same box and counts, the one with every pack line at its
      // coldest conditioning runs first. Packs that start colder keep every temperature colder at every
      // later time (the comparison principle that justifies pruning above), so with upper limits only a
      // warmer-conditioned twin fails no later: when the coldest fails, its twins fail without a run (their
      // hold is at most the coldest's); when it holds, they run.
      const coldest = (c: Candidate) => c.counts.every((n, k) => n === 0 || c.conditioning_C[k] === Math.min(...inp.packs[k].conditioning_C));
      const twinKey = (c: Candidate) => `${c.box}|${c.variant_m}|${c.counts.join(",")}`;
      const first = toRun.filter((i) => coldest(plan.candidates[i]));
      const firstOf = new Map(first.map((i) => [twinKey(plan.candidates[i]), i]));
      // Repeated conditioning temperatures or thickness variants make several "coldest" twins: all ran.
      const ran = new Set(first);
      if (first.length) record(await evaluate(first, plan));
      const rest: number[] = [];
      for (const i of toRun) {
        if (ran.has(i)) continue;
        const cold = firstOf.get(twinKey(plan.candidates[i]));
        const cr = cold === undefined ? null : results[cold];
        if (cr && cr.verdict !== "holds") {
          results[i] = {
            index: i,
            verdict: cr.verdict,
            hold_s: cr.hold_s,
            central_s: null,
            holdIsUpperBound: true,
            reason: cr.verdict === "fails" ? "the same pack-out with its packs conditioned colder already fails, so this one fails no later (decided without a run)" : cr.reason,
            failsFirst: null,
            dryIceGone_s: null,
            pruned: true,
          };
          pruned++;
          done++;
        } else rest.push(i);
      }
      if (rest.length) record(await evaluate(rest, plan));
    } else if (toRun.length) record(await evaluate(toRun, plan));
    opts.onProgress?.(done, total);
  }
  // Rows: mass, cost and outer volume of each candidate, and the fit check for pruned ones (same rule as the model's).
  const rows: CandidateRow[] = [];
  // Per box variant (the same for every candidate in it): the variant, its mass and cost, outer volume and inner space.
  const variants = new Map<string, { s: Shipper; box: { mass_kg: number; cost: number }; outer_m3: number; inner_m3: number }>();
  const loadVolume = inp.products.reduce((a, l) => a + volumeOf(l.product) * l.count, 0);
  const loadMass = inp.products.reduce((a, l) => a + l.product.mass_kg * l.count, 0);
  for (const c of plan.candidates) {
    const r = results[c.index];
    if (!r) continue;
    const vk = `${c.box}|${c.variant_m}`;
    let v = variants.get(vk);
    if (!v) {
      const b = inp.boxes[c.box];
      const s = boxVariant(b.shipper, inp.materials, c.variant_m);
      const o = outerDims(s);
      v = { s, box: boxMassAndCost(b, s, inp.materials), outer_m3: o.L * o.W * o.H, inner_m3: s.innerLength_m * s.innerWidth_m * s.innerHeight_m };
      variants.set(vk, v);
    }
    const contents = loadVolume + inp.packs.reduce((a, p, i) => a + p.pack.length_m * p.pack.width_m * p.pack.thickness_m * c.counts[i], 0);
    const fits = contents <= v.inner_m3;
    const verdict: Verdict = !fits ? "does not fit" : r.verdict;
    rows.push({
      ...r,
      verdict,
      boxName: v.s.name,
      packs: inp.packs.map((p, i) => ({ name: p.pack.name, count: c.counts[i], conditioning_C: c.conditioning_C[i] })).filter((p) => p.count > 0),
      mass_kg: v.box.mass_kg + inp.packs.reduce((a, p, i) => a + p.pack.mass_kg * c.counts[i], 0) + loadMass,
      cost: v.box.cost + inp.packs.reduce((a, p, i) => a + p.unitCost * c.counts[i], 0),
      outerVolume_m3: v.outer_m3,
      holds: verdict === "holds",
    });
  }
  const holding = rows.filter((r) => r.holds);
  // Pareto front over mass, cost and outer volume: in lexicographic order a candidate can only be
  // dominated by one before it, and if by any, then by one already on the front (dominance is transitive).
  const dominates = (b: CandidateRow, a: CandidateRow) =>
    b.mass_kg <= a.mass_kg && b.cost <= a.cost && b.outerVolume_m3 <= a.outerVolume_m3 && (b.mass_kg < a.mass_kg || b.cost < a.cost || b.outerVolume_m3 < a.outerVolume_m3);
  const front: CandidateRow[] = [];
  for (const a of [...holding].sort((x, y) => x.mass_kg - y.mass_kg || x.cost - y.cost || x.outerVolume_m3 - y.outerVolume_m3)) {
    if (!front.some((b) => dominates(b, a))) front.push(a);
  }
  const pareto = front.map((r) => r.index).sort((x, y) => x - y);
  const nearMisses = rows
    .filter((r) => r.verdict === "fails" && !r.pruned && r.hold_s !== null && r.hold_s >= NEAR_MISS_FRACTION * plan.required_s)
    .sort((a, b) => (b.hold_s ?? 0) - (a.hold_s ?? 0))
    .slice(0, 12)
    .map((r) => ({ index: r.index, reason: r.reason ?? "fails", hold_s: r.hold_s }));
  const doesNotFit = rows.filter((r) => r.verdict === "does not fit").length;
  let message: string | null = null;
  if (!cancelled && holding.length === 0) {
    const best = rows.filter((r) => r.verdict === "fails" && !r.pruned).sort((a, b) => (b.hold_s ?? 0) - (a.hold_s ?? 0))[0];
    message =
      doesNotFit === rows.length
        ? "Nothing fits: the load and packs are larger than every candidate box. Choose a bigger box or fewer packs."
        : `No candidate holds for ${(plan.required_s / 3600).toFixed(1)} h${best ? `; the best reaches ${((best.hold_s ?? 0) / 3600).toFixed(1)} h (${best.reason})` : ""}. Try thicker walls, more or colder packs, a smaller margin, or judge by the central value.`;
  }
  return { required_s: plan.required_s, routeLength_s: plan.routeLength_s, candidates: rows, pareto, nearMisses, evaluated, pruned, doesNotFit, cancelled, message };
}

function volumeOf(p: { shape: string; dimA_m: number; dimB_m?: number | null; dimC_m?: number | null }): number {
  if (p.shape === "sphere") return (Math.PI / 6) * p.dimA_m ** 3;
  if (p.shape === "cylinder") return (Math.PI / 4) * p.dimA_m ** 2 * (p.dimB_m ?? 0);
  return p.dimA_m * (p.dimB_m ?? 0) * (p.dimC_m ?? 0);
}

/** Evaluates in this thread (API, tests). */
export function evaluateHere(inp: SizeParsed) {
  return async (indices: number[], plan: SizingPlan) => indices.map((i) => evaluateCandidate(inp, plan.candidates[i], plan.required_s, plan.routeLength_s));
}
