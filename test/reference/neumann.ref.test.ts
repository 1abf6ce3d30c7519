import { describe, it, expect } from "vitest";
import erf from "@stdlib/math-base-special-erf";
import erfc from "@stdlib/math-base-special-erfc";
import { solve1D } from "../../lib/physics/solver1d";
import { simpleMaterial, foodThermal } from "../../lib/physics/properties";

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

/**
 * The same melting problem through the food-property path (lib/physics/properties.ts foodThermal) with a
 * composition of pure water and an initial freezing point of 0 °C: a food without solutes must melt at a sharp
 * front and reproduce Neumann's solution (Carslaw & Jaeger 1959, §11.2). Choi–Okos water and ice properties vary
 * a little with temperature (ice k 2.29 → 2.22 W/(m·K) from −10 to 0 °C), so λ is computed with each phase's
 * properties at its mean temperature (−5 °C and 5 °C); the band, 2 % on the melted depth, allows for that.
 * Before: the ice-fraction model (freezing point forced to −0.05 °C, x_ice = x_w(1 − t_f/t)) spread the melting
 * over several kelvin below 0 °C.
 */
describe("pure water through the food-property path vs Neumann's melting solution (Carslaw & Jaeger 1959, §11.2)", () => {
  const water = foodThermal({ composition: { water: 1, protein: 0, fat: 0, carbohydrate: 0, fibre: 0, ash: 0 }, initialFreezing_C: 0 });
  const Q = { rho: water.rho_kg_m3, cs: water.cSensible_J_kgK(-5), cl: water.cSensible_J_kgK(5), ks: water.k_W_mK(-5), kl: water.k_W_mK(5), L: water.latent_J_kg, Ti: -10, Ts: 10 };
  const aS = Q.ks / (Q.rho * Q.cs);
  const aL = Q.kl / (Q.rho * Q.cl);
  const f = (l: number) =>
    Math.exp(-l * l) / erf(l) - (Q.ks / Q.kl) * Math.sqrt(aL / aS) * ((0 - Q.Ti) / Q.Ts) * (Math.exp((-l * l * aL) / aS) / erfc(l * Math.sqrt(aL / aS))) - (l * Q.L * Math.sqrt(Math.PI)) / (Q.cl * Q.Ts);
  let lo = 1e-6;
  let hi = 3;
  for (let i = 0; i < 200; i++) {
    const m = (lo + hi) / 2;
    if (f(m) > 0) lo = m;
    else hi = m;
  }
  const lam = (lo + hi) / 2;
  const depth = 0.6;
  const nodes = 601;
  const t = 6 * 3600;
  const r = solve1D({ shape: "slab", halfSize_m: depth, nodes, material: water, initial_C: Q.Ti, boundary: { kind: "fixed", T_C: () => Q.Ts }, tEnd_s: t, dt_s: 5 });
  const dx = depth / (nodes - 1);

  it("melts at a sharp front: all the ice is gone 0.1 K below 0 °C, none melted below", () => {
    expect(water.ice(-0.1)).toBeCloseTo(1, 9);
    expect(water.ice(-1)).toBeCloseTo(1, 9);
    expect(water.ice(0.001)).toBe(0);
    expect(water.latentHeld_J_kg(-5)).toBeCloseTo(333_600, 3);
  });

  it("melted depth within 2 % of X = 2λ√(α_l t), and the profile within 2 % of (Ts − Ti)", () => {
    const X = 2 * lam * Math.sqrt(aL * t);
    // Melted depth = ∫ (1 − x_ice/x_ice,max) dx over the slab (equals X for a sharp front).
    let melted = 0;
    for (let i = 0; i < nodes; i++) melted += (1 - water.ice(r.profile_C[i])) * (i === 0 || i === nodes - 1 ? dx / 2 : dx);
    console.log(`pure water via foodThermal: melted depth ${(melted * 1000).toFixed(1)} mm, Neumann ${(X * 1000).toFixed(1)} mm (λ = ${lam.toFixed(4)})`);
    expect(Math.abs(melted / X - 1)).toBeLessThan(0.02);
    let worst = 0;
    for (let i = 0; i < nodes; i++) {
      const x = depth - i * dx;
      const s = x / (2 * Math.sqrt(aL * t));
      const exactT = x <= X ? Q.Ts - (Q.Ts * erf(s)) / erf(lam) : Q.Ti + ((0 - Q.Ti) * erfc(x / (2 * Math.sqrt(aS * t)))) / erfc(lam * Math.sqrt(aL / aS));
      worst = Math.max(worst, Math.abs(r.profile_C[i] - exactT) / (Q.Ts - Q.Ti));
    }
    expect(worst).toBeLessThan(0.02);
    expect(Math.abs(r.energyError_J)).toBeLessThan(1e-9 * Math.abs(r.storedChange_J));
  });
});
