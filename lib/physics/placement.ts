/**
 * Where the packs go and what they touch: the geometry behind the hold planner's placement.
 *
 * The load (every product line) sits on the base, in the middle of the box. A pack line's packs go
 * underneath the load (lying flat on the base), on top of it (lying flat under the lid), or at the sides
 * (standing against the side walls, big face to the wall, between wall and load); "around" shares them
 * out over all three (placementSplit). Packs at a position:
 * - cover part of the face they lie against: that part of the face exchanges with the packs through a
 *   contact coefficient, not with the inside air (it is shielded from it);
 * - touch the load's face towards them (its footprint for top and bottom, its sides for side packs),
 *   shared over the product lines by area unless the line names one product;
 * - expose the rest of their surface to the air of their half of the box.
 * The load rests on the base where no packs lie under it. Contact with a sphere or cylinder over its
 * projected area overstates a real point or line contact: the contact coefficient stands for that.
 * Stacking: packs beyond one layer still cover at most the face; their extra surface faces the air.
 */
import type { Placement } from "../schemas/hold";

export type Position = "bottom" | "top" | "side";
export const POSITIONS: Position[] = ["bottom", "top", "side"];

/**
 * How many of a line's packs go underneath, on top and at the sides. "around" shares them as evenly as
 * possible over the three, the remainder going first on top (cold air sinks from there), then underneath
 * (1 pack: on top; 2: one on top, one underneath; 3: one each; 4: two on top, one underneath, one at the sides).
 */
export function placementSplit(placement: Placement, count: number): Record<Position, number> {
  if (placement === "top") return { bottom: 0, top: count, side: 0 };
  if (placement === "bottom") return { bottom: count, top: 0, side: 0 };
  if (placement === "side") return { bottom: 0, top: 0, side: count };
  const each = Math.floor(count / 3);
  const rest = count - 3 * each;
  return { bottom: each + (rest >= 2 ? 1 : 0), top: each + (rest >= 1 ? 1 : 0), side: each };
}

export interface LayoutProduct {
  /** One item's surface and footprint (area it rests on), m². */
  area_m2: number;
  footprint_m2: number;
  count: number;
}

export interface LayoutPackLine {
  /** One pack's big face (length × width) and whole surface, m². */
  face_m2: number;
  area_m2: number;
  count: number;
  placement: Placement;
  /** Only this product line, null for the whole load, or "none" (packs kept apart from the load). */
  contactWith: number | null | "none";
}

export interface PackGroup {
  line: number;
  position: Position;
  count: number;
  /** Area of box face it covers (base, lid, or the sides — half in each half of the box), m². */
  cover_m2: number;
  /** Contact area with each product line, m². */
  load_m2: number[];
  /** Surface left facing the air, m², and its share in the lower and upper half of the box. */
  exposed_m2: number;
  zoneShare: [number, number];
}

export interface Layout {
  groups: PackGroup[];
  /** Per product line: area resting directly on the base, and exposed area in the lower and upper half. */
  products: { onBase_m2: number; exposed_m2: [number, number] }[];
  /** Open (uncovered) area of each face, m². */
  open: { base: number; sides: number; lid: number };
  /** The load's footprint on the base (at most the base), m². */
  loadFootprint_m2: number;
  warnings: string[];
}

export function layoutBox(inner: { L: number; W: number; H: number }, products: LayoutProduct[], packs: LayoutPackLine[]): Layout {
  const warnings: string[] = [];
  const baseA = inner.L * inner.W;
  const sidesA = 2 * (inner.L + inner.W) * inner.H;
  const fpTotal = products.reduce((a, p) => a + p.footprint_m2 * p.count, 0);
  const fpCap = Math.min(fpTotal, baseA);
  const share = products.map((p) => (fpTotal > 0 ? (p.footprint_m2 * p.count) / fpTotal : 0));
  // The load's faces: top and bottom (its footprint, at most the base), sides (the rest of a single layer).
  const topF = share.map((s) => s * fpCap);
  const sideF = products.map((p) => Math.max(0, p.area_m2 * p.count - 2 * p.footprint_m2 * p.count));
  const groups: PackGroup[] = [];
  packs.forEach((l, i) => {
    const split = placementSplit(l.placement, l.count);
    for (const pos of POSITIONS) if (split[pos] > 0) groups.push({ line: i, position: pos, count: split[pos], cover_m2: 0, load_m2: products.map(() => 0), exposed_m2: 0, zoneShare: pos === "bottom" ? [1, 0] : pos === "top" ? [0, 1] : [0.5, 0.5] });
  });
  const faceOf = (pos: Position) => (pos === "side" ? sidesA : baseA);
  for (const pos of POSITIONS) {
    const gs = groups.filter((g) => g.position === pos);
    if (!gs.length) continue;
    const want = gs.reduce((a, g) => a + packs[g.line].face_m2 * g.count, 0);
    const scale = Math.min(1, faceOf(pos) / want);
    if (scale < 1) warnings.push(`The packs placed ${pos === "side" ? "at the sides" : pos === "top" ? "on top" : "underneath"} need more than the face they lie against: they are modelled in more than one layer`);
    for (const g of gs) g.cover_m2 = packs[g.line].face_m2 * g.count * scale;
    // Contact with the load's face towards them, shared by area, capped at what each product offers.
    const F = pos === "side" ? sideF : topF;
    const demand = gs.map((g) => {
      const cw = packs[g.line].contactWith;
      const eligible = products.map((_, j) => cw !== "none" && (cw === null || cw === j));
      const sumF = F.reduce((a, f, j) => a + (eligible[j] ? f : 0), 0);
      return F.map((f, j) => (eligible[j] && sumF > 0 ? (g.cover_m2 * f) / sumF : 0));
    });
    products.forEach((_, j) => {
      const tot = demand.reduce((a, d) => a + d[j], 0);
      const cap = tot > F[j] ? F[j] / tot : 1;
      gs.forEach((g, k) => (g.load_m2[j] = demand[k][j] * cap));
    });
  }
  for (const g of groups) {
    const total = packs[g.line].area_m2 * g.count;
    g.exposed_m2 = Math.max(0, total - g.cover_m2 - g.load_m2.reduce((a, x) => a + x, 0));
  }
  const covered = (pos: Position) => groups.filter((g) => g.position === pos).reduce((a, g) => a + g.cover_m2, 0);
  const sumLoad = (pos: Position, j: number) => groups.filter((g) => g.position === pos).reduce((a, g) => a + g.load_m2[j], 0);
  const baseFree = Math.max(0, baseA - covered("bottom"));
  const prods = products.map((p, j) => {
    const onPacks = sumLoad("bottom", j);
    const onBase = Math.min(Math.max(0, topF[j] - onPacks), baseFree * share[j]);
    const topOpen = Math.max(0, topF[j] - sumLoad("top", j));
    const sideOpen = Math.max(0, sideF[j] - sumLoad("side", j));
    const bottomOpen = Math.max(0, topF[j] - onPacks - onBase);
    // What a single layer does not account for (items stacked, or a load wider than the base) faces the air, half each side of the middle.
    const rest = Math.max(0, p.area_m2 * p.count - 2 * topF[j] - sideF[j]);
    return { onBase_m2: onBase, exposed_m2: [bottomOpen + sideOpen / 2 + rest / 2, topOpen + sideOpen / 2 + rest / 2] as [number, number] };
  });
  const onBaseAll = prods.reduce((a, p) => a + p.onBase_m2, 0);
  return {
    groups,
    products: prods,
    open: { base: Math.max(0, baseFree - onBaseAll), sides: Math.max(0, sidesA - covered("side")), lid: Math.max(0, baseA - covered("top")) },
    loadFootprint_m2: fpCap,
    warnings,
  };
}
