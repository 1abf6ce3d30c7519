/** The pool's worker: a result with a number JSON cannot carry is a 500 naming where it is, never a silent null. */
import { describe, it, expect } from "vitest";
import fc from "fast-check";
import run, { nonFinitePath } from "../../app/_server/calc-worker";

/** The value at a dotted path ("a.2.b"). */
const at = (x: unknown, path: string): unknown => (path === "" ? x : path.split(".").reduce<unknown>((v, k) => (v as Record<string, unknown>)[k], x));

describe("calculation worker: non-finite numbers in a result", () => {
  it("names the path of the first NaN or ±Infinity, and null for a finite result", () => {
    expect(nonFinitePath({ band: { low: 1, high: null }, series: [{ t_s: 0 }, { t_s: 1, products: [{ center_C: NaN }] }] })).toBe("series.1.products.0.center_C");
    expect(nonFinitePath({ a: [0, 1, -Infinity], b: Infinity })).toBe("a.2");
    expect(nonFinitePath(Infinity)).toBe("");
    expect(nonFinitePath({ a: "NaN", b: [true, null, { c: 3 }] })).toBeNull();
  });
  it("a value JSON carries unchanged has no path; one with a non-finite number anywhere has the path of one", () => {
    // Doubles with NaN and ±Infinity (JSON writes −0 as 0, which is no loss here).
    const leaf = fc.oneof(fc.double().map((v) => (Object.is(v, -0) ? 0 : v)), fc.string(), fc.boolean(), fc.constant(null));
    const { tree } = fc.letrec((tie) => ({
      tree: fc.oneof({ depthSize: "small" }, leaf, fc.array(tie("tree"), { maxLength: 4 }), fc.dictionary(fc.string({ minLength: 1, maxLength: 4 }), tie("tree"), { maxKeys: 4 })),
    }));
    fc.assert(
      fc.property(tree, (x) => {
        const path = nonFinitePath(x);
        if (path === null) expect(JSON.parse(JSON.stringify(x))).toEqual(x);
        else {
          const v = at(x, path);
          expect(typeof v === "number" && !Number.isFinite(v)).toBe(true);
        }
      }),
      { numRuns: 500 },
    );
  });
  it("a job with a board that is not shared memory, a helper the board cannot name, or an unknown kind is refused", async () => {
    expect(await run({ kind: "hold", input: {}, pieces: { board: new ArrayBuffer(64) as unknown as SharedArrayBuffer, helper: 0 } })).toMatchObject({ ok: false, status: 422 });
    expect(await run({ kind: "hold", input: {}, pieces: { board: new SharedArrayBuffer(4096), helper: 99 } })).toMatchObject({ ok: false, status: 422 });
    expect(await run({ kind: "nope" as "hold", input: {} })).toMatchObject({ ok: false, status: 422 });
  });
});
