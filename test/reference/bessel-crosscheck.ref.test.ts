import { describe, it, expect } from "vitest";
import besselj0 from "@stdlib/math-base-special-besselj0";
import besselj1 from "@stdlib/math-base-special-besselj1";
import bessel from "bessel";
import { eigen } from "../../lib/physics/conduction";

/**
 * Cross-check of the cylinder's series solution against an independent Bessel implementation:
 * lib/physics/conduction.ts evaluates J0 and J1 with the `bessel` package; here stdlib's J0 and J1
 * (rational approximations after Hart et al., Computer Approximations, 1968, as used by the Cephes
 * library) re-evaluate the eigen-equation ζ J1(ζ) − Bi J0(ζ) = 0 and the coefficient
 * C = (2/ζ) J1(ζ) / (J0(ζ)² + J1(ζ)²) (Incropera & DeWitt, 6th ed., eq. 5.49c–5.50; from memory).
 */
describe("cylinder eigenvalues with an independent J0 and J1 (stdlib)", () => {
  it("the two Bessel implementations agree on 0 ≤ x ≤ 40", () => {
    for (let x = 0; x <= 40; x += 0.173) {
      expect(Math.abs(bessel.besselj(x, 0) - besselj0(x))).toBeLessThan(1e-6);
      expect(Math.abs(bessel.besselj(x, 1) - besselj1(x))).toBeLessThan(1e-6);
    }
  });

  for (const Bi of [0.01, 0.1, 0.5, 1, 2, 5, 10, 50, 100]) {
    it(`Bi = ${Bi}: the first six roots solve the eigen-equation, match the roots found with stdlib's J0 and J1, and give the same C`, () => {
      const { zeta, C } = eigen("cylinder", Bi, 6);
      zeta.forEach((z, i) => {
        // The root of the same equation with stdlib's J0 and J1, by bisection around ζ.
        const f = (x: number) => x * besselj1(x) - Bi * besselj0(x);
        let lo = z - 0.01;
        let hi = z + 0.01;
        expect(Math.sign(f(lo))).not.toBe(Math.sign(f(hi)));
        for (let k = 0; k < 60; k++) {
          const mid = (lo + hi) / 2;
          if (Math.sign(f(mid)) === Math.sign(f(lo))) lo = mid;
          else hi = mid;
        }
        expect(Math.abs(z - (lo + hi) / 2)).toBeLessThan(1e-6);
        if (i > 0) expect(z).toBeGreaterThan(zeta[i - 1]);
        const c = ((2 / z) * besselj1(z)) / (besselj0(z) ** 2 + besselj1(z) ** 2);
        expect(C[i]).toBeCloseTo(c, 6);
      });
      // ζ1 lies in (0, 2.4048): below the first zero of J0 (2.404826, Abramowitz & Stegun, Table 9.5).
      expect(zeta[0]).toBeGreaterThan(0);
      expect(zeta[0]).toBeLessThan(2.404826);
    });
  }
});
