declare module "bessel" {
  /** Bessel function of the first kind, J_n(x). */
  export function besselj(x: number, n: number): number;
  export function bessely(x: number, n: number): number;
  export function besseli(x: number, n: number): number;
  export function besselk(x: number, n: number): number;
}
