import { describe, it, expect } from "vitest";
import erf from "@stdlib/math-base-special-erf";
import erfc from "@stdlib/math-base-special-erfc";
import { solve1D } from "../../lib/physics/solver1d";
import { simpleMaterial } from "../../lib/physics/properties";

/**
 * Neumann's similarity solution for melting of a semi-infinite solid initially at Ti < Tm whose
 * surface is held at Ts > Tm: Carslaw & Jaeger, Conduction of Heat in Solids, 2nd ed. (1959), §11.2.
 *   X(t) = 2λ√(α_l t), with λ from
 *   e^{−λ²}/erf λ − (k_s/k_l)√(α_l/α_s)(Tm − Ti)/(Ts − Tm) e^{−λ²α_l/α_s}/erfc(λ√(α_l/α_s)) = λ L √π/(c_l (Ts − Tm))
 *   liquid: T = Ts − (Ts − Tm) erf(x/2√(α_l t))/erf λ;  solid: T = Ti + (Tm − Ti) erfc(x/2√(α_s t))/erfc(λ√(α_l/α_s)).
 * erf and erfc from the general-purpose @stdlib packages. Properties: ice/water-like, invented for the check.
 */
const P = { rho: 1000, cs: 2000, cl: 4200, ks: 2.2, kl: 0.6, L: 333_600, Tm: 0, Ti: -10, Ts: 10 };
const as = P.ks / (P.rho * P.cs);
const al = P.kl / (P.rho * P.cl);

function lambda(): number {
  const f = (l: number) =>
    Math.exp(-l * l) / erf(l) -
    (P.ks / P.kl) * Math.sqrt(al / as) * ((P.Tm - P.Ti) / (P.Ts - P.Tm)) * (Math.exp((-l * l * al) / as) / erfc(l * Math.sqrt(al / as))) -
    (l * P.L * Math.sqrt(Math.PI)) / (P.cl * (P.Ts - P.Tm));
  let a = 1e-6;
  let b = 3;
  for (let i = 0; i < 200; i++) {
    const m = (a + b) / 2;
    if (f(m) > 0) a = m;
    else b = m;
  }
  return (a + b) / 2;
}

function exact(x: number, t: number, lam: number): number {
  const X = 2 * lam * Math.sqrt(al * t);
  if (x <= X) return P.Ts - ((P.Ts - P.Tm) * erf(x / (2 * Math.sqrt(al * t)))) / erf(lam);
  return P.Ti + ((P.Tm - P.Ti) * erfc(x / (2 * Math.sqrt(as * t)))) / erfc(lam * Math.sqrt(al / as));
}

describe("enthalpy solver vs Neumann's melting solution (Carslaw & Jaeger 1959, §11.2)", () => {
  const lam = lambda();
  const depth = 0.6; // far enough that the far end stays at Ti
  const nodes = 601;
  const t = 6 * 3600;
  const mat = simpleMaterial({ rho_kg_m3: P.rho, cSolid_J_kgK: P.cs, cLiquid_J_kgK: P.cl, kSolid_W_mK: P.ks, kLiquid_W_mK: P.kl, melt_C: P.Tm, latent_J_kg: P.L, mushy_K: 0.2 });
  const r = solve1D({
    shape: "slab",
    halfSize_m: depth,
    nodes,
    material: mat,
    initial_C: P.Ti,
    boundary: { kind: "fixed", T_C: () => P.Ts },
    tEnd_s: t,
    dt_s: 5,
  });
  const dx = depth / (nodes - 1);
  // Distance from the heated surface: node i sits at depth − i·dx.
  const prof = r.profile_C.map((T, i) => ({ x: depth - i * dx, T }));

  it("λ is a root of the transcendental equation", () => {
    expect(lam).toBeGreaterThan(0.01);
    expect(lam).toBeLessThan(1);
  });

  it("puts the melt front within 2 % of X = 2λ√(α_l t)", () => {
    const X = 2 * lam * Math.sqrt(al * t);
    let front = NaN;
    for (let i = 1; i < prof.length; i++) {
      const a = prof[i - 1];
      const b = prof[i];
      if ((a.T - P.Tm) * (b.T - P.Tm) <= 0 && a.T !== b.T) {
        front = a.x + ((P.Tm - a.T) / (b.T - a.T)) * (b.x - a.x);
      }
    }
    expect(Math.abs(front - X) / X).toBeLessThan(0.02);
  });

  it("matches the temperature profile within 1 % of (Ts − Ti)", () => {
    let worst = 0;
    for (const { x, T } of prof) worst = Math.max(worst, Math.abs(T - exact(x, t, lam)) / (P.Ts - P.Ti));
    expect(worst).toBeLessThan(0.01);
  });

  it("conserves energy: stored enthalpy change equals the heat in through the surface", () => {
    expect(Math.abs(r.energyError_J)).toBeLessThan(1e-9 * Math.abs(r.storedChange_J));
  });
});
