// The shared helpers that replaced per-planner copies: crossing times, interpolation, the surface
// coefficient that follows the surface temperature, and the text put into the user's units.
import { describe, it, expect } from "vitest";
import { firstCrossing, firstTimeReaching, interpolateAt } from "../../lib/physics/numerics";
import { followingSurface } from "../../lib/physics/surfaces";
import { localizeText } from "../../lib/units";

describe("crossings and interpolation", () => {
  const t = [0, 10, 20, 30];
  const y = [0, 4, 8, 12];
  it("finds the first crossing up or down, interpolated, 0 at the start, null when never", () => {
    expect(firstCrossing(t, y, 6, "up")).toBeCloseTo(15, 12);
    expect(firstCrossing(t, y, 0, "up")).toBe(0);
    expect(firstCrossing(t, y, 13, "up")).toBeNull();
    expect(firstCrossing(t, [12, 8, 4, 0], 6, "down")).toBeCloseTo(15, 12);
    expect(firstCrossing([], [], 1, "up")).toBeNull();
  });
  it("interpolates, clamps at the ends or refuses outside them", () => {
    expect(interpolateAt(t, y, 25)).toBeCloseTo(10, 12);
    expect(interpolateAt(t, y, -5)).toBe(0);
    expect(interpolateAt(t, y, -5, false)).toBeNull();
    expect(interpolateAt(t, y, 31, false)).toBeNull();
  });
  it("times a closed-form curve reaching a level with Brent's method (exponential approach, exact ln 2 / k)", () => {
    // T(t) = 20 − 20·exp(−k t) reaches 10 at t = ln 2 / k.
    const k = 1 / 600;
    const T = (s: number) => 20 - 20 * Math.exp(-k * s);
    expect(firstTimeReaching(T, 10, "up", 10_000)!).toBeCloseTo(Math.LN2 / k, 2);
    expect(firstTimeReaching(T, 25, "up", 10_000)).toBeNull();
    expect(firstTimeReaching((s) => 20 - T(s), 10, "down", 10_000)!).toBeCloseTo(Math.LN2 / k, 2);
  });
});

describe("the surface coefficient that follows the surface", () => {
  it("re-evaluates only after the surface moved more than 0.25 K", () => {
    let calls = 0;
    const h = followingSurface((Ts) => (calls++, 5 + Ts));
    expect(h(0, 10)).toBe(15);
    expect(h(1, 10.2)).toBe(15);
    expect(calls).toBe(1);
    expect(h(2, 10.3)).toBeCloseTo(15.3, 12);
    expect(calls).toBe(2);
  });
});

describe("sentences in the user's units", () => {
  const F = { temperatureUnit: "F", massUnit: "lb", lengthUnit: "in" } as const;
  it("turns °C, ranges, K differences, mm and kg into °F, in and lb (NIST SP 811 factors), leaving units of coefficients alone", () => {
    expect(localizeText("from 57 °C to 21 °C within 2 h", F)).toBe("from 134.6 °F to 69.8 °F within 2 h");
    expect(localizeText("kept 2–8 °C", F)).toBe("kept 35.6–46.4 °F");
    expect(localizeText("conditioning ±2 K", F)).toBe("conditioning ±3.6 °F");
    expect(localizeText("h = 10 W/(m²·K), ρ 1050 kg/m³", F)).toBe("h = 10 W/(m²·K), ρ 1050 kg/m³");
    expect(localizeText("a 50.8 mm slab of 2.5 kg", F)).toBe("a 2 in slab of 5.51 lb");
    expect(localizeText("−18 °C", F)).toBe("−0.4 °F");
    expect(localizeText("from 57 °C", { temperatureUnit: "C", massUnit: "kg", lengthUnit: "mm" })).toBe("from 57 °C");
  });
});
