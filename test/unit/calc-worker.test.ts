/** The pool's worker: a result with a number JSON cannot carry is a 500 naming where it is, never a silent null. */
import { describe, it, expect } from "vitest";
import fc from "fast-check";
import run, { nonFinitePath } from "../../app/_server/calc-worker";

describe("calculation worker: non-finite numbers in a result", () => {
  it("names the path of the first NaN or ±Infinity, and null for a finite result", () => {
    expect(nonFinitePath({ band: { low: 1, high: null }, series: [{ t_s: 0 }, { t_s: 1, products: [{ center_C: NaN }] }] })).toBe("series.1.products.0.center_C");
    expect(nonFinitePath({ a: [0, 1, -Infinity], b: Infinity })).toBe("a.2");
    expect(nonFinitePath(Infinity)).toBe("");
    expect(nonFinitePath({ a: "NaN", b: [true, null, { c: 3 }] })).toBeNull();
  });
  it("agrees with JSON: a value round-trips unchanged exactly when no path is named", () => {
    fc.assert(
      fc.property(fc.jsonValue().chain((v) => fc.tuple(fc.constant(v), fc.constantFrom(NaN, Infinity, -Infinity, 0))), ([v, extra]) => {
        const x = { v, w: [extra] };
        const path = nonFinitePath(x);
        expect(path === null).toBe(Number.isFinite(extra) && JSON.stringify(JSON.parse(JSON.stringify(x))) === JSON.stringify(x));
      }),
    );
  });
  it("a job with a board that is not shared memory, or of an unknown kind, is refused", async () => {
    expect(await run({ kind: "hold", input: {}, pieces: { board: new ArrayBuffer(64) as unknown as SharedArrayBuffer, lead: true } })).toMatchObject({ ok: false, status: 422 });
    expect(await run({ kind: "nope" as "hold", input: {} })).toMatchObject({ ok: false, status: 422 });
  });
});
