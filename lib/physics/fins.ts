/**
 * Fin efficiencies for the part of a tray that reaches beyond the item's footprint [incropera6,
 * Table 3.5 and §3.6.4, from memory]. m = √(n h/(k t)) with n = 2 when both faces exchange heat,
 * 1 when only the top does; corrected length L_c = L + t/2 for the tip.
 * - Straight plate fin: η = tanh(m L_c)/(m L_c).
 * - Annular fin (round footprint), r2c = r2 + t/2:
 *   η = (2 r1/m)/(r2c² − r1²) · [K1(m r1) I1(m r2c) − I1(m r1) K1(m r2c)] / [I0(m r1) K1(m r2c) + K0(m r1) I1(m r2c)].
 * Modified Bessel functions from the `bessel` npm package.
 */
import bessel from "bessel";
import { requireNonNegative, requirePositive } from "./validation";

const { besseli, besselk } = bessel;

function finM(h_W_m2K: number, k_W_mK: number, t_m: number, faces: 1 | 2): number {
  return Math.sqrt((faces * h_W_m2K) / (k_W_mK * t_m));
}

export function straightFinEfficiency(h_W_m2K: number, k_W_mK: number, t_m: number, L_m: number, faces: 1 | 2 = 2): number {
  requirePositive("fin coefficient", h_W_m2K);
  requirePositive("fin conductivity", k_W_mK);
  requirePositive("fin thickness", t_m);
  requireNonNegative("fin length", L_m);
  const mL = finM(h_W_m2K, k_W_mK, t_m, faces) * (L_m + t_m / 2);
  return mL < 1e-8 ? 1 : Math.tanh(mL) / mL;
}

export function annularFinEfficiency(h_W_m2K: number, k_W_mK: number, t_m: number, r1_m: number, r2_m: number, faces: 1 | 2 = 2): number {
  requirePositive("fin coefficient", h_W_m2K);
  requirePositive("fin conductivity", k_W_mK);
  requirePositive("fin thickness", t_m);
  requirePositive("inner radius", r1_m);
  if (r2_m <= r1_m) return 1;
  const m = finM(h_W_m2K, k_W_mK, t_m, faces);
  const r2c = r2_m + t_m / 2;
  if (m * (r2c - r1_m) < 1e-6) return 1;
  // Very long fins overflow I(x): there the fin behaves like a semi-infinite one; fall back to the straight-fin value of the same length.
  if (m * r2c > 600) return straightFinEfficiency(h_W_m2K, k_W_mK, t_m, r2_m - r1_m, faces);
  const a = m * r1_m;
  const b = m * r2c;
  const num = besselk(a, 1) * besseli(b, 1) - besseli(a, 1) * besselk(b, 1);
  const den = besseli(a, 0) * besselk(b, 1) + besselk(a, 0) * besseli(b, 1);
  const eta = ((2 * r1_m) / m / (r2c * r2c - r1_m * r1_m)) * (num / den);
  return Number.isFinite(eta) ? Math.min(1, Math.max(0, eta)) : straightFinEfficiency(h_W_m2K, k_W_mK, t_m, r2_m - r1_m, faces);
}
