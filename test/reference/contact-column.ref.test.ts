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
const exactAt = (hc: number, t: number) => {
  const beta = (hc * Math.sqrt(alpha * t)) / k;
  // exp(β²)·erfc(β), with its asymptote 1/(β√π) where exp(β²) would overflow.
  const g = beta > 25 ? 1 / (beta * Math.sqrt(Math.PI)) : Math.exp(beta * beta) * erfc(beta);
  return Ti + (Tinf - Ti) * (1 - g);
};
const exact = (t: number) => exactAt(h, t);
/** A level every temperature is below: the column is stepped finely throughout (never carried across). */
const TRACK = Infinity;
const column = (refine = 1, hc = h) => contactColumn({ material: mat, depth_m: 0.3, start_C: Ti, pack_C: Tinf, contact_W_m2K: hc, refine });

describe("the touching face's column vs the semi-infinite contact solution (Carslaw & Jaeger §2.7)", () => {
  it("follows the face temperature within 0.2 % of the gap from 5 s to 2 h, stepped as the box model steps", () => {
    const col = column();
    let t = 0;
    const worst: number[] = [];
    for (const step of [5, 15, 40, 60, 180, 300, 600, 1800, 3600, 600]) {
      t += step;
      col.advance(t, Tinf, Ti, TRACK);
      worst.push(Math.abs(col.surface_C - exact(t)) / (Ti - Tinf));
    }
    console.log(`contact column: worst face error ${(100 * Math.max(...worst)).toFixed(2)} % of the gap over ${t} s`);
    expect(Math.max(...worst)).toBeLessThan(0.002);
  });

  it("finds when the face crosses a limit within 1 % of the exact time, for contacts from 20 to 10⁴ W/m²K, whatever the box model's step", () => {
    // Levels 1/21, 3.2/21 and 8/21 of the gap below the start; the exact times run from 40 µs to 20 min.
    let worst = 0;
    for (const hc of [20, 50, 500, 2000, 1e4]) {
      const ex = (t: number) => exactAt(hc, t);
      for (const level of [2, -0.2, -5]) {
        const tExact = brent((t) => ex(t) - level, 1e-9, 1e6).x;
        for (const step of [1, 60, 3600]) {
          const col = column(1, hc);
          let found: number | null = null;
          for (let t = step; found === null && t <= 1e6; t += step) found = col.advance(t, Tinf, Ti, level);
          const e = Math.abs(found! - tExact) / tExact;
          worst = Math.max(worst, e);
          expect(e, `h ${hc}, level ${level} °C, box step ${step} s: ${found} vs ${tExact}`).toBeLessThan(0.01);
        }
      }
    }
    console.log(`contact column: worst crossing-time error ${(100 * worst).toFixed(2)} % (h 20–10⁴ W/m²K)`);
  });

  it("gives the same crossing time on a grid and steps refined fourfold (within 1 %)", () => {
    for (const level of [-0.2, -5]) {
      const at = (refine: number) => column(refine).advance(3600, Tinf, Ti, level)!;
      console.log(`contact column, face below ${level} °C: ${at(1).toFixed(2)} s, refined ×4 ${at(4).toFixed(2)} s`);
      expect(Math.abs(at(1) - at(4)) / at(4)).toBeLessThan(0.01);
    }
  });

  it("a pack that warms as it goes: the same answer given in one box step or in sixty (linear in between)", () => {
    // The pack's surface warms from −18 to −10 °C over a minute; the centre stays at the start.
    const one = column();
    one.advance(60, -10, Ti, TRACK);
    const many = column();
    for (let s = 1; s <= 60; s++) many.advance(s, Tinf + (8 * s) / 60, Ti, TRACK);
    expect(Math.abs(one.surface_C - many.surface_C)).toBeLessThan(0.05);
    // And it stays between the exact answers for a pack held at −18 and at −10 °C throughout.
    expect(one.surface_C).toBeGreaterThan(exact(60));
    expect(one.surface_C).toBeLessThan(Ti + ((-10 - Ti) / (Tinf - Ti)) * (exact(60) - Ti));
  });

  it("carried across while nothing can reach the level (maximum principle), it still finds a later crossing within 1 %", () => {
    // A pack at +1 °C for 2 h (no crossing of −0.2 °C possible), then cooling steadily to −18 °C over the
    // next 2 h, as packs and load do on a route in freezing air; the reference is stepped finely throughout, ×4 refined.
    const pack = (t: number) => (t <= 7200 ? 1 : 1 - (19 * Math.min(1, (t - 7200) / 7200)));
    const crossing = (level: number, refine: number) => {
      const col = contactColumn({ material: mat, depth_m: 0.3, start_C: Ti, pack_C: 1, contact_W_m2K: h, refine });
      let found: number | null = null;
      for (let t = 60; found === null && t <= 4 * 3600; t += 60) {
        const r = col.advance(t, pack(t), Ti, t <= 7200 ? level : -0.2);
        if (t > 7200) found = r;
      }
      return found!;
    };
    const carried = crossing(-0.2, 1);
    const tracked = crossing(TRACK, 4);
    console.log(`contact column, pack cooling from +1 °C after 2 h: crossing carried across ${carried.toFixed(1)} s, tracked ×4 ${tracked.toFixed(1)} s`);
    expect(Math.abs(carried - tracked) / (tracked - 7200)).toBeLessThan(0.01);
  });
});
