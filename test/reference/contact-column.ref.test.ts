import { describe, it, expect } from "vitest";
import erfc from "@stdlib/math-base-special-erfc";
import { contactColumn } from "../../lib/physics/contact-column";
import { simpleMaterial } from "../../lib/physics/properties";
import { brent } from "../../lib/physics/numerics";

/**
 * A face pressed against a cold pack: the semi-infinite solid initially at Ti whose surface exchanges
 * heat by a coefficient h with a medium at T∞ (Carslaw & Jaeger 1959, §2.7; Incropera et al. 6th ed.,
 * Eq. 5.60, from memory): (Ts − Ti)/(T∞ − Ti) = 1 − exp(β²)·erfc(β), β = h√(αt)/k. erfc from the
 * general-purpose @stdlib package. Properties: a moist food above freezing (k 0.5 W/m·K, ρ 1000 kg/m³,
 * c 3900 J/kg·K), chosen for the check; the column is made deep (0.3 m) so that it stays semi-infinite.
 */
const k = 0.5;
const rho = 1000;
const c = 3900;
const alpha = k / (rho * c);
const h = 50;
const Ti = 3;
const Tinf = -18;
const mat = simpleMaterial({ rho_kg_m3: rho, cSolid_J_kgK: c, cLiquid_J_kgK: c, kSolid_W_mK: k, kLiquid_W_mK: k, melt_C: -80, latent_J_kg: 1 });
const exact = (t: number) => {
  const beta = (h * Math.sqrt(alpha * t)) / k;
  // exp(β²)·erfc(β) written without overflow for the β used here (< 3).
  return Ti + (Tinf - Ti) * (1 - Math.exp(beta * beta) * erfc(beta));
};
const column = (refine = 1) => contactColumn({ material: mat, depth_m: 0.3, start_C: Ti, pack_C: Tinf, contact_W_m2K: h, refine });

describe("the touching face's column vs the semi-infinite contact solution (Carslaw & Jaeger §2.7)", () => {
  it("follows the face temperature within 1 % of the gap from 5 s to 2 h, stepped as the box model steps", () => {
    const col = column();
    let t = 0;
    const worst: number[] = [];
    for (const step of [5, 15, 40, 60, 180, 300, 600, 1800, 3600, 600]) {
      t += step;
      col.advance(t, Tinf, Ti, -1000);
      worst.push(Math.abs(col.surface_C - exact(t)) / (Ti - Tinf));
    }
    console.log(`contact column: worst face error ${(100 * Math.max(...worst)).toFixed(2)} % of the gap over ${t} s`);
    expect(Math.max(...worst)).toBeLessThan(0.01);
  });

  it("finds when the face crosses a limit within 2 % of the exact time, whatever the box model's step", () => {
    for (const level of [-0.2, -5]) {
      const tExact = brent((t) => exact(t) - level, 0.01, 1e5).x;
      for (const step of [1, 60, 3600]) {
        const col = column();
        let found: number | null = null;
        for (let t = step; found === null && t <= 1e5; t += step) found = col.advance(t, Tinf, Ti, level);
        if (step === 60) console.log(`contact column, face below ${level} °C: ${found!.toFixed(2)} s, exact ${tExact.toFixed(2)} s`);
        expect(Math.abs(found! - tExact) / tExact, `level ${level} °C, box step ${step} s: ${found} vs ${tExact}`).toBeLessThan(0.02);
      }
    }
  });

  it("gives the same crossing time on a grid and steps refined fourfold (within 2 %: first order in space and time)", () => {
    for (const level of [-0.2, -5]) {
      const at = (refine: number) => column(refine).advance(3600, Tinf, Ti, level)!;
      console.log(`contact column, face below ${level} °C: ${at(1).toFixed(2)} s, refined ×4 ${at(4).toFixed(2)} s`);
      expect(Math.abs(at(1) - at(4)) / at(4)).toBeLessThan(0.02);
    }
  });
});
