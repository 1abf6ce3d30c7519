/**
 * Volume, surface and the characteristic lengths of a product's shape. SI units.
 *
 * A sphere or cylinder with a wall thickness is hollow: a shell around a closed cavity (a whole bird
 * with its body cavity, a ring). Its volume is the shell's, so mass ÷ volume checks against the food's
 * density; heat enters through the outer face only, the cavity face being insulated (a closed, air-filled
 * cavity: our assumption). Transient conduction in such a shell is the standard hollow sphere or cylinder
 * problem (Carslaw & Jaeger 1959, §9.4 and §7.8; section numbers from memory) [carslawJaeger].
 */
import type { ProductShape } from "../schemas/templates";
import { requirePositive, PhysicsInputError } from "./validation";
import type { ItemGeometry } from "./surfaces";
import type { ProductFactor } from "./conduction";
import { factorsFor } from "./conduction";
import { equivalentDimensionality, shellEstimateGeometry } from "./phase-change";
import type { Shape1D } from "./conduction";

export interface ShapeInput {
  shape: ProductShape;
  dimA_m: number;
  dimB_m?: number | null;
  dimC_m?: number | null;
  /** Hollow sphere or cylinder: thickness of the solid wall around the cavity. */
  wallThickness_m?: number | null;
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
  oneD: { shape: Shape1D; halfSize_m: number; E: number; note: string | null; innerRadius_m: number };
  /** Dimensions, for E. */
  dims_m: number[];
  /** A hollow item: its wall and cavity (null when solid). */
  hollow: { wall_m: number; inner_m: number; outer_m: number; cavity_m3: number } | null;
}

export function itemShape(s: ShapeInput): ItemShape {
  const a = requirePositive("dimA_m", s.dimA_m);
  const need = (v: number | null | undefined, name: string) => {
    if (v === null || v === undefined) throw new PhysicsInputError(name, `required for a ${s.shape}`);
    return requirePositive(name, v);
  };
  const wall = s.wallThickness_m ?? null;
  if (wall !== null) {
    requirePositive("wallThickness_m", wall);
    if (s.shape !== "sphere" && s.shape !== "cylinder") throw new PhysicsInputError("wallThickness_m", "only a sphere or a cylinder can be hollow");
    if (wall >= a / 2) throw new PhysicsInputError("wallThickness_m", `the wall (${(wall * 1000).toFixed(0)} mm) must be thinner than the radius (${((a / 2) * 1000).toFixed(0)} mm); leave it empty for a solid item`);
  }
  switch (s.shape) {
    case "sphere": {
      const R = a / 2;
      if (wall !== null) {
        const Ri = R - wall;
        const V = (4 / 3) * Math.PI * (R ** 3 - Ri ** 3);
        const A = 4 * Math.PI * R * R;
        return {
          volume_m3: V,
          area_m2: A,
          lumpedLength_m: V / A,
          convection: { shape: "sphere", diameter_m: a },
          factors: factorsFor({ shape: "sphere", diameter_m: a }),
          oneD: {
            shape: "sphere",
            halfSize_m: R,
            innerRadius_m: Ri,
            E: shellEstimateGeometry("sphere", R, Ri).E,
            note: `Hollow: a spherical shell ${(wall * 1000).toFixed(0)} mm thick around a closed cavity of ${((4 / 3) * Math.PI * Ri ** 3 * 1000).toFixed(1)} L, heated from outside only`,
          },
          dims_m: [a, a, a],
          hollow: { wall_m: wall, inner_m: Ri, outer_m: R, cavity_m3: (4 / 3) * Math.PI * Ri ** 3 },
        };
      }
      return {
        volume_m3: (4 / 3) * Math.PI * R ** 3,
        area_m2: 4 * Math.PI * R * R,
        lumpedLength_m: R / 3,
        convection: { shape: "sphere", diameter_m: a },
        factors: factorsFor({ shape: "sphere", diameter_m: a }),
        oneD: { shape: "sphere", halfSize_m: R, E: 3, note: null, innerRadius_m: 0 },
        dims_m: [a, a, a],
        hollow: null,
      };
    }
    case "cylinder": {
      const L = need(s.dimB_m, "dimB_m");
      const R = a / 2;
      if (wall !== null) {
        // A tube closed at both ends: solid annular ends, heat in through the outer side and the ends;
        // the 1-D model is an infinite hollow cylinder (the ends' extra heat is left out: slower, stated).
        const Ri = R - wall;
        const V = Math.PI * (R * R - Ri * Ri) * L;
        const A = 2 * Math.PI * R * L + 2 * Math.PI * (R * R - Ri * Ri);
        return {
          volume_m3: V,
          area_m2: A,
          lumpedLength_m: V / A,
          convection: { shape: "cylinder", diameter_m: a, length_m: L, upright: true },
          factors: factorsFor({ shape: "cylinder", diameter_m: a, length_m: L }),
          oneD: {
            shape: "cylinder",
            halfSize_m: R,
            innerRadius_m: Ri,
            E: shellEstimateGeometry("cylinder", R, Ri).E,
            note: `Hollow: a cylindrical shell ${(wall * 1000).toFixed(0)} mm thick around a closed cavity, heated through its outer side (the ends' share is left out, which errs slow)`,
          },
          dims_m: [a, a, L],
          hollow: { wall_m: wall, inner_m: Ri, outer_m: R, cavity_m3: Math.PI * Ri * Ri * L },
        };
      }
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
        hollow: null,
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
        hollow: null,
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
    innerRadius_m: 0,
    E,
    note: `The ${what} is modelled in one dimension as ${shape === "slab" ? "a slab" : shape === "cylinder" ? "an infinite cylinder" : "a sphere"} on its smallest dimension (${(shortest_m * 1000).toFixed(0)} mm), the nearest match to its equivalent heat-transfer dimensionality E = ${E.toFixed(2)}`,
  };
}

/**
 * A box's outer dimensions from its inner ones and its layers: the walls add their total thickness on
 * each side, the base the wall thickness and the top the lid's (the wall build-up when the lid has none).
 */
export function boxOuterDimensions(s: { innerLength_m: number; innerWidth_m: number; innerHeight_m: number; wallLayers: { thickness_m: number }[]; lidLayers: { thickness_m: number }[] | null }): { length_m: number; width_m: number; height_m: number; wall_m: number; lid_m: number } {
  const wall_m = s.wallLayers.reduce((a, l) => a + l.thickness_m, 0);
  const lid_m = (s.lidLayers ?? s.wallLayers).reduce((a, l) => a + l.thickness_m, 0);
  return { length_m: s.innerLength_m + 2 * wall_m, width_m: s.innerWidth_m + 2 * wall_m, height_m: s.innerHeight_m + wall_m + lid_m, wall_m, lid_m };
}
