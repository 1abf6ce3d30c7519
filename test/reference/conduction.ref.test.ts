import { describe, it, expect } from "vitest";
import { eigen, seriesTheta, seriesMeanTheta, oneTermTheta, type Shape1D } from "../../lib/physics/conduction";
import { solve1D } from "../../lib/physics/solver1d";

/**
 * Source: Incropera & DeWitt, Fundamentals of Heat and Mass Transfer, 6th ed., Table 5.1
 * (coefficients of the one-term approximation). Values from memory, cross-checked against the
 * values recomputed from the eigen-equations in shared/reference/published-values.md §1.3 and
 * against the ASHRAE Refrigeration Handbook j-factors for Bi → ∞ (slab 1.273, cylinder 1.6015).
 */
const TABLE_5_1: Record<Shape1D, [number, number, number][]> = {
  // [Bi, ζ1, C1]
  slab: [
    [0.01, 0.0998, 1.0017],
    [0.1, 0.3111, 1.0161],
    [0.5, 0.6533, 1.0701],
    [1.0, 0.8603, 1.1191],
    [2.0, 1.0769, 1.1785],
    [5.0, 1.3138, 1.2402],
    [10.0, 1.4289, 1.262],
    [50.0, 1.54, 1.2727],
    [100.0, 1.5552, 1.2731],
  ],
  cylinder: [
    [0.01, 0.1412, 1.0025],
    [0.1, 0.4417, 1.0246],
    [0.5, 0.9408, 1.1143],
    [1.0, 1.2558, 1.2071],
    [2.0, 1.5994, 1.3384],
    [5.0, 1.9898, 1.5029],
    [10.0, 2.1795, 1.5677],
    [50.0, 2.3572, 1.6002],
    [100.0, 2.3809, 1.6015],
  ],
  sphere: [
    [0.01, 0.173, 1.003],
    [0.1, 0.5423, 1.0298],
    [0.5, 1.1656, 1.1441],
    [1.0, 1.5708, 1.2732],
    [2.0, 2.0288, 1.4793],
    [5.0, 2.5704, 1.787],
    [10.0, 2.8363, 1.9249],
    [50.0, 3.0788, 1.9962],
    [100.0, 3.1102, 1.999],
  ],
};

describe("one-term coefficients vs Incropera & DeWitt Table 5.1 (from memory)", () => {
  for (const shape of ["slab", "cylinder", "sphere"] as Shape1D[]) {
    it(`${shape}: ζ1 and C1 to the table's 4 decimals`, () => {
      for (const [Bi, z1, C1] of TABLE_5_1[shape]) {
        const e = eigen(shape, Bi, 1);
        expect(Math.abs(e.zeta[0] - z1), `${shape} Bi=${Bi} ζ1`).toBeLessThan(6e-5);
        expect(Math.abs(e.C[0] - C1), `${shape} Bi=${Bi} C1`).toBeLessThan(6e-5);
      }
    });
  }
});

describe("exact series vs one-term form (Incropera & DeWitt 6th ed. §5.6: one-term error < 2 % for Fo > 0.2)", () => {
  // The textbook's 2 % statement is about the centre; at the surface the one-term form reaches 2 % a
  // little later (2.2 % for a slab at Bi = 1, Fo = 0.2), so the surface is checked from Fo = 0.3.
  it("agree within 2 % of θ at the centre for Fo ≥ 0.2, and across the body for Fo ≥ 0.3", () => {
    for (const shape of ["slab", "cylinder", "sphere"] as Shape1D[]) {
      for (const Bi of [0.1, 1, 10, 100]) {
        for (const Fo of [0.2, 0.3, 0.5, 1, 2]) {
          for (const x of Fo < 0.3 ? [0] : [0, 0.5, 1]) {
            const ex = seriesTheta(shape, Bi, Fo, x);
            const one = oneTermTheta(shape, Bi, Fo, x);
            expect(Math.abs(one - ex) / ex, `${shape} Bi=${Bi} Fo=${Fo} x=${x}`).toBeLessThan(0.02);
          }
        }
      }
    }
  });

  it("the series starts at θ = 1 inside and satisfies the surface condition as Bi → ∞", () => {
    expect(seriesTheta("slab", 5, 1e-4, 0)).toBeCloseTo(1, 6);
    expect(seriesTheta("slab", 1e6, 0.05, 1)).toBeLessThan(0.01);
    expect(seriesMeanTheta("sphere", 1, 0)).toBe(1);
  });
});

describe("numerical solver vs exact series (target: < 0.5 % of the initial temperature difference)", () => {
  // Constant properties, convective surface; the exact series is the reference (Incropera §5.5).
  const k = 0.5;
  const rho = 1000;
  const c = 4000;
  const mat = { rho_kg_m3: rho, H_J_kg: (T: number) => c * T, c_J_kgK: () => c, k_W_mK: () => k };
  const L = 0.04;
  const alpha = k / (rho * c);
  for (const shape of ["slab", "cylinder", "sphere"] as Shape1D[]) {
    for (const Bi of [0.5, 5]) {
      it(`${shape}, Bi = ${Bi}: centre, surface and mean at Fo = 0.1, 0.3, 1; energy conserved`, () => {
        const h = (Bi * k) / L;
        const Ti = 20;
        const Tinf = 60;
        const r = solve1D({
          shape,
          halfSize_m: L,
          nodes: 101,
          material: mat,
          initial_C: Ti,
          boundary: { kind: "convective", h_W_m2K: () => h, fluid_C: () => Tinf },
          tEnd_s: (1 * L * L) / alpha,
          dt_s: (0.001 * L * L) / alpha,
        });
        let worst = 0;
        for (const Fo of [0.1, 0.3, 1]) {
          const t = (Fo * L * L) / alpha;
          const i = r.t_s.findIndex((x) => Math.abs(x - t) < 1e-6 * t);
          expect(i).toBeGreaterThan(0);
          const dT = Ti - Tinf;
          worst = Math.max(
            worst,
            Math.abs(r.center_C[i] - (Tinf + dT * seriesTheta(shape, Bi, Fo, 0))) / Math.abs(dT),
            Math.abs(r.surface_C[i] - (Tinf + dT * seriesTheta(shape, Bi, Fo, 1))) / Math.abs(dT),
            Math.abs(r.mean_C[i] - (Tinf + dT * seriesMeanTheta(shape, Bi, Fo))) / Math.abs(dT),
          );
        }
        expect(worst).toBeLessThan(0.005);
        expect(Math.abs(r.energyError_J) / Math.abs(r.storedChange_J)).toBeLessThan(1e-9);
      });
    }
  }
});
