/** Volume, surface and the characteristic lengths of a product's shape. SI units. */
import type { ProductShape } from "../schemas/templates";
import { requirePositive, PhysicsInputError } from "./validation";
import type { ItemGeometry } from "./surfaces";
import type { ProductFactor } from "./conduction";
import { factorsFor } from "./conduction";
import { equivalentDimensionality } from "./phase-change";
import type { Shape1D } from "./conduction";

export interface ShapeInput {
  shape: ProductShape;
  dimA_m: number;
  dimB_m?: number | null;
  dimC_m?: number | null;
}

export interface ItemShape {
  volume_m3: number;
  area_m2: number;
  /** Lumped length V/A. */
  lumpedLength_m: number;
  /** For convection correlations. */
  convection: ItemGeometry;
  /** Exact analytic solution as a product of 1-D factors. */
  factors: ProductFactor[];
  /** 1-D stand-in for the numerical solver and the closed-form estimates. */
  oneD: { shape: Shape1D; halfSize_m: number; E: number; note: string | null };
  /** Dimensions, for E. */
  dims_m: number[];
}

export function itemShape(s: ShapeInput): ItemShape {
  const a = requirePositive("dimA_m", s.dimA_m);
  const need = (v: number | null | undefined, name: string) => {
    if (v === null || v === undefined) throw new PhysicsInputError(name, `required for a ${s.shape}`);
    return requirePositive(name, v);
  };
  switch (s.shape) {
    case "sphere": {
      const R = a / 2;
      return {
        volume_m3: (4 / 3) * Math.PI * R ** 3,
        area_m2: 4 * Math.PI * R * R,
        lumpedLength_m: R / 3,
        convection: { shape: "sphere", diameter_m: a },
        factors: factorsFor({ shape: "sphere", diameter_m: a }),
        oneD: { shape: "sphere", halfSize_m: R, E: 3, note: null },
        dims_m: [a, a, a],
      };
    }
    case "cylinder": {
      const L = need(s.dimB_m, "dimB_m");
      const R = a / 2;
      const V = Math.PI * R * R * L;
      const A = 2 * Math.PI * R * L + 2 * Math.PI * R * R;
      const { E, shortest_m } = equivalentDimensionality([a, a, L]);
      const oneD = pick1D(E, shortest_m, "cylinder");
      return {
        volume_m3: V,
        area_m2: A,
        lumpedLength_m: V / A,
        convection: { shape: "cylinder", diameter_m: a, length_m: L, upright: true },
        factors: factorsFor({ shape: "cylinder", diameter_m: a, length_m: L }),
        oneD,
        dims_m: [a, a, L],
      };
    }
    case "slab":
    case "block": {
      const b = need(s.dimB_m, "dimB_m");
      const c = need(s.dimC_m, "dimC_m");
      const V = a * b * c;
      const A = 2 * (a * b + b * c + a * c);
      // Convection: dimA is the height (thickness) for both; a slab lies flat.
      const { E, shortest_m } = equivalentDimensionality([a, b, c]);
      return {
        volume_m3: V,
        area_m2: A,
        lumpedLength_m: V / A,
        convection: { shape: s.shape, height_m: a, width_m: b, length_m: c },
        factors: factorsFor({ shape: "block", a_m: a, b_m: b, c_m: c }),
        oneD: pick1D(E, shortest_m, s.shape),
        dims_m: [a, b, c],
      };
    }
  }
}

/** Chooses the 1-D shape closest to the item's equivalent heat-transfer dimensionality E [ashraeEHTD]. */
function pick1D(E: number, shortest_m: number, what: string): ItemShape["oneD"] {
  const shape: Shape1D = E < 1.5 ? "slab" : E < 2.5 ? "cylinder" : "sphere";
  return {
    shape,
    halfSize_m: shortest_m / 2,
    E,
    note: `The ${what} is modelled in one dimension as ${shape === "slab" ? "a slab" : shape === "cylinder" ? "an infinite cylinder" : "a sphere"} on its smallest dimension (${(shortest_m * 1000).toFixed(0)} mm), the nearest match to its equivalent heat-transfer dimensionality E = ${E.toFixed(2)}`,
  };
}
