declare module "bessel" {
  interface Bessel {
    /** Bessel function of the first kind, J_n(x). */
    besselj(x: number, n: number): number;
    bessely(x: number, n: number): number;
    besseli(x: number, n: number): number;
    besselk(x: number, n: number): number;
  }
  const bessel: Bessel;
  export default bessel;
}
