import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { solve1D } from "../../lib/physics/solver1d";
import { simpleMaterial } from "../../lib/physics/properties";
import { makeTable, tableC, tableCell, tableH, tableK, tableT } from "../../lib/physics/table";

// Our own numerics: the time stepping is second order, and a pack's table holds its piecewise-linear H and k exactly.
describe("1-D solver time stepping", () => {
  const mat = simpleMaterial({ rho_kg_m3: 1000, cSolid_J_kgK: 2000, cLiquid_J_kgK: 4000, kSolid_W_mK: 2, kLiquid_W_mK: 0.5, melt_C: 0, latent_J_kg: 300_000, mushy_K: 0.5 });
  const run = (dt_s: number) =>
    solve1D({ shape: "slab", halfSize_m: 0.02, nodes: 11, material: mat, initial_C: 5, boundary: { kind: "convective", h_W_m2K: () => 20, fluid_C: () => 25 }, tEnd_s: 3600, dt_s });
  it("halving the step cuts the time error about fourfold (second order), with the energy balance closed", () => {
    const ref = run(2).profile_C[0];
    const e1 = Math.abs(run(240).profile_C[0] - ref);
    const e2 = Math.abs(run(120).profile_C[0] - ref);
    expect(e1 / e2).toBeGreaterThan(3);
    const r = run(120);
    expect(Math.abs(r.energyError_J) / Math.abs(r.storedChange_J)).toBeLessThan(1e-9);
  });
  it("a pack's table gives its H, slope and k exactly (band edges on grid points)", () => {
    const t = mat.table;
    // H(−0.25) = 0 (start of the band), H(0.25) = L + mean c × band; solid and liquid slopes outside.
    expect(tableH(t, -0.25)).toBeCloseTo(0, 6);
    expect(tableH(t, 0.25)).toBeCloseTo(300_000 + 3000 * 0.5, 4);
    expect(tableH(t, -10.25)).toBeCloseTo(-2000 * 10, 4);
    expect(tableC(t, 5)).toBeCloseTo(4000, 6);
    expect(tableC(t, 0)).toBeCloseTo(300_000 / 0.5 + 3000, 3);
    expect(tableK(t, -5)).toBeCloseTo(2, 9);
    expect(tableK(t, 0)).toBeCloseTo(1.25, 9);
  });
});

describe("the table's inverse (T from H)", () => {
  const mat = simpleMaterial({ rho_kg_m3: 1000, cSolid_J_kgK: 2000, cLiquid_J_kgK: 4000, kSolid_W_mK: 2, kLiquid_W_mK: 0.5, melt_C: 0, latent_J_kg: 300_000, mushy_K: 0.5 });
  const t = mat.table;
  it("gives back T from tableH(T) in every cell, in the band and beyond both ends", () => {
    for (const T of [-200, -40.3, -10.25, -0.25, -0.1, 0, 0.2, 0.25, 3.7, 40, 150]) expect(tableT(t, tableH(t, T))).toBeCloseTo(T, 8);
  });
  it("where H is flat over a range of T, the top of that range", () => {
    const flat = makeTable(0, 1, new Float64Array([0, 10, 10, 20]), new Float64Array([1, 1, 1, 1]));
    expect(tableT(flat, 10)).toBe(2);
    expect(tableT(flat, 15)).toBeCloseTo(2.5, 12);
    expect(tableCell(flat, 2.5)).toBe(2);
    expect(tableCell(flat, -4)).toBe(0);
  });
  it("gives exactly the binary search's answer from any hint cell, near or far, on rising tables with flat cells", () => {
    fc.assert(
      fc.property(
        fc.array(fc.oneof(fc.constant(0), fc.double({ min: 0, max: 1e5, noNaN: true })), { minLength: 1, maxLength: 40 }),
        fc.double({ min: -1e5, max: 5e6, noNaN: true }),
        fc.integer({ min: 0, max: 60 }),
        (steps, H, hint) => {
          const Ht = new Float64Array(steps.length + 1);
          for (let i = 0; i < steps.length; i++) Ht[i + 1] = Ht[i] + steps[i];
          const tb = makeTable(-10, 0.5, Ht, new Float64Array(Ht.length).fill(1));
          expect(Object.is(tableT(tb, H, hint), tableT(tb, H))).toBe(true);
          for (const g of Ht) expect(Object.is(tableT(tb, g, hint), tableT(tb, g))).toBe(true);
        },
      ),
      { numRuns: 400 },
    );
    expect(tableT(t, NaN, 3)).toBeNaN();
  });
});
