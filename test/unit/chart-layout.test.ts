import { describe, it, expect } from "vitest";
import fc from "fast-check";
import { axisTicks, bandInDomain, drawnLines, normaliseBand, placeLimitLabels, placeTopLabels, shade, xDomain, yAxisTitle, yDomain } from "../../app/_components/chart-layout";
import { toDisplay } from "../../lib/units";

const F = { temperatureUnit: "F", massUnit: "kg", lengthUnit: "mm" } as const;

describe("chart Y range", () => {
  it("always includes the limit lines, far from the curves", () => {
    // A frozen load (−20 … −15 °C) with the chill limit 5 °C and hot holding 57 °C drawn.
    const [lo, hi] = yDomain({ values: [-20, -18, -15], limits: [5, 57] });
    expect(lo).toBeLessThan(-20);
    expect(hi).toBeGreaterThan(57);
  });

  it("includes the band's edges and pads every side", () => {
    const [lo, hi] = yDomain({ values: [2, 3], limits: [], band: { y1: 8, y2: -1 } });
    expect(lo).toBeLessThan(-1);
    expect(hi).toBeGreaterThan(8);
  });

  it("ignores NaN and missing values, and is [0, 1] with nothing to show", () => {
    expect(yDomain({ values: [NaN, Infinity] })).toEqual([0, 1]);
    const d = yDomain({ values: [NaN, 4, undefined as unknown as number, 6] });
    expect(d[0]).toBeLessThan(4);
    expect(d[1]).toBeGreaterThan(6);
  });

  it("holds every finite value, limit and band edge strictly inside for any input (property)", () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -300, max: 300, noNaN: true }), { maxLength: 30 }),
        fc.array(fc.double({ min: -300, max: 300, noNaN: true }), { maxLength: 4 }),
        fc.option(fc.tuple(fc.double({ min: -300, max: 300, noNaN: true }), fc.double({ min: -300, max: 300, noNaN: true }))),
        (values, limits, band) => {
          const [lo, hi] = yDomain({ values, limits, band: band ? { y1: band[0], y2: band[1] } : null });
          expect(Number.isFinite(lo) && Number.isFinite(hi) && hi > lo).toBe(true);
          for (const v of [...values, ...limits, ...(band ?? [])]) {
            expect(v).toBeGreaterThan(lo);
            expect(v).toBeLessThan(hi);
          }
          const ticks = axisTicks([lo, hi]);
          expect(ticks.length).toBeGreaterThanOrEqual(3);
          expect(ticks.length).toBeLessThanOrEqual(13);
          expect(ticks.every((t) => t >= lo && t <= hi)).toBe(true);
        },
      ),
    );
  });

  it("rounds out to a nice step, with ticks on it", () => {
    // 1.3 … 5 padded by 0.5 (the least pad) is 0.8 … 5.5, rounded out to halves; ticks every 1.
    const d = yDomain({ values: [1.3, 4.2], limits: [5] });
    expect(d).toEqual([0.5, 5.5]);
    expect(axisTicks(d)).toEqual([1, 2, 3, 4, 5]);
    // −18 … 63 padded by 6 % is about −22.9 … 67.9, rounded out to tens; ticks every 20.
    const wide = yDomain({ values: [-18, 63] });
    expect(wide).toEqual([-30, 70]);
    expect(axisTicks(wide)).toEqual([-20, 0, 20, 40, 60]);
  });

  it("X runs from the first to the last time; one instant gets a width", () => {
    expect(xDomain([{ t_h: 0.5 }, { t_h: 3 }, { t_h: NaN }])).toEqual([0.5, 3]);
    expect(xDomain([{ t_h: 2 }])).toEqual([2, 3]);
    expect(xDomain([])).toEqual([0, 1]);
  });
});

describe("in-limit band", () => {
  it("covers the same side of the limit in °F as in °C, whatever order the edges come in", () => {
    // Chilled band: up to 5 °C from a −1 °C floor, given high edge first.
    const c = normaliseBand({ y1: 5, y2: -1 })!;
    const f = normaliseBand({ y1: toDisplay("temperature", 5, F), y2: toDisplay("temperature", -1, F) })!;
    expect(c).toEqual({ lo: -1, hi: 5 });
    expect(f.lo).toBeCloseTo(30.2, 9);
    expect(f.hi).toBeCloseTo(41, 9);
    // A chart of 35–39 °F sees the band under the 41 °F limit, not above it.
    const drawn = bandInDomain({ y1: 41, y2: 30.2 }, [28, 44])!;
    expect(drawn.hi).toBe(41);
    expect(drawn.lo).toBeCloseTo(30.2, 9);
  });

  it("an open side (only an upper limit) runs to the chart's edge", () => {
    expect(normaliseBand({ lower: null, upper: 41 })).toEqual({ lo: null, hi: 41 });
    expect(bandInDomain({ lower: null, upper: 41 }, [20, 50])).toEqual({ lo: 20, hi: 41 });
    expect(bandInDomain({ lower: 135, upper: null }, [100, 180])).toEqual({ lo: 135, hi: 180 });
    // The open side does not stretch the Y range.
    expect(yDomain({ values: [35, 38], band: { lower: null, upper: 41 } })[0]).toBeGreaterThan(30);
  });

  it("no band for missing or non-finite edges, or out of view", () => {
    expect(normaliseBand(null)).toBeNull();
    expect(normaliseBand({ y1: NaN, y2: 4 })).toBeNull();
    expect(normaliseBand({ lower: null, upper: null })).toBeNull();
    expect(bandInDomain({ y1: 60, y2: 70 }, [0, 10])).toBeNull();
  });
});

describe("line styles", () => {
  it("centre and surface of one product differ in colour and in dash pattern", () => {
    const [centre, surface] = drawnLines([
      { key: "c0", color: "#235a6b" },
      { key: "s0", color: "#235a6b", dashed: true },
    ]);
    expect(centre.stroke).toBe("#235a6b");
    expect(surface.stroke).not.toBe(centre.stroke);
    expect(centre.dash).toBeUndefined();
    expect(surface.dash).toBeDefined();
  });

  it("style wins over dashed; dotted and dashed differ", () => {
    const [a, b] = drawnLines([
      { key: "a", color: "#111111", dashed: true, style: "dotted" },
      { key: "b", color: "#222222", style: "dashed" },
    ]);
    expect(a.dash).not.toBe(b.dash);
    expect(a.dash).toBeDefined();
  });

  it("three lines of one colour get three colours", () => {
    const s = drawnLines(["a", "b", "c"].map((key) => ({ key, color: "#6b7378" }))).map((l) => l.stroke);
    expect(new Set(s).size).toBe(3);
  });

  it("shade lightens and darkens, and leaves other notations alone", () => {
    expect(shade("#000000", 0.5)).toBe("#808080");
    expect(shade("#ffffff", -0.5)).toBe("#808080");
    expect(shade("rebeccapurple", 0.3)).toBe("rebeccapurple");
  });
});

describe("segment labels above the plot", () => {
  const widthOf = (text: string) => text.length * 6;
  const overlaps = (placed: ReturnType<typeof placeTopLabels>) => {
    const bad: string[] = [];
    for (const a of placed)
      for (const b of placed)
        if (a !== b && a.text && b.text && a.row === b.row && a.x_px < b.x_px && a.x_px + widthOf(a.text) > b.x_px) bad.push(`${a.text} / ${b.text}`);
    return bad;
  };

  it("labels far apart share the first row in full", () => {
    const p = placeTopLabels(
      [
        { x_px: 100, text: "Van" },
        { x_px: 300, text: "Drop" },
      ],
      { right_px: 800 },
    );
    expect(p.map((l) => [l.row, l.text])).toEqual([
      [0, "Van"],
      [0, "Drop"],
    ]);
  });

  it("close labels go to the next row, and the third is shortened rather than overlapping", () => {
    const p = placeTopLabels(
      [
        { x_px: 100, text: "Van to the office park" },
        { x_px: 130, text: "First drop, on the pavement" },
        { x_px: 160, text: "Van to the gallery" },
      ],
      { right_px: 800, rows: 2, charWidth_px: 6 },
    );
    expect(p[0].row).toBe(0);
    expect(p[1].row).toBe(1);
    expect(p[2].row).toBe(0);
    expect(p[0].text.endsWith("…")).toBe(true);
    expect(p[2].text).toBe("Van to the gallery");
    expect(overlaps(p)).toEqual([]);
  });

  it("never overlaps and never runs past the right edge, for any labels (property)", () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ x_px: fc.integer({ min: 60, max: 700 }), text: fc.string({ minLength: 1, maxLength: 40 }) }), { maxLength: 12 }),
        fc.integer({ min: 1, max: 3 }),
        (labels, rows) => {
          const p = placeTopLabels(labels, { right_px: 760, rows, charWidth_px: 6, gap_px: 0 });
          expect(overlaps(p)).toEqual([]);
          for (const l of p) {
            expect(l.row).toBeLessThan(rows);
            if (l.text) expect(l.x_px + widthOf(l.text)).toBeLessThanOrEqual(760);
          }
        },
      ),
    );
  });

  it("keeps the full text for a hover title, and the order given", () => {
    const p = placeTopLabels(
      [
        { x_px: 400, text: "Second" },
        { x_px: 100, text: "First" },
      ],
      { right_px: 800 },
    );
    expect(p.map((l) => l.full)).toEqual(["Second", "First"]);
  });
});

describe("limit labels", () => {
  it("far-apart limits both sit at the right end, above their lines", () => {
    const p = placeLimitLabels([{ y_px: 200 }, { y_px: 60 }], { top_px: 10 });
    expect(p).toEqual([
      { index: 0, side: "right", above: true },
      { index: 1, side: "right", above: true },
    ]);
  });

  it("close limits go to alternating ends, then below the line", () => {
    const p = placeLimitLabels([{ y_px: 100 }, { y_px: 106 }, { y_px: 112 }], { top_px: 10, minGap_px: 16 });
    expect(p[0]).toMatchObject({ side: "right", above: true });
    expect(p[1]).toMatchObject({ side: "left", above: true });
    expect(p[2].above).toBe(false);
  });

  it("a limit at the very top puts its label below the line", () => {
    expect(placeLimitLabels([{ y_px: 14 }], { top_px: 10 })[0]).toMatchObject({ above: false });
  });

  it("labels on one side stay apart whenever there is room (property)", () => {
    fc.assert(
      fc.property(fc.uniqueArray(fc.integer({ min: 30, max: 300 }), { maxLength: 3 }), (ys) => {
        const spaced = ys.every((a) => ys.every((b) => a === b || Math.abs(a - b) >= 40));
        const p = placeLimitLabels(ys.map((y_px) => ({ y_px })), { top_px: 0, minGap_px: 16 });
        if (spaced) expect(p.every((l) => l.side === "right" && l.above)).toBe(true);
        const at = p.map((l, i) => ({ side: l.side, y: l.above ? ys[i] - 8 : ys[i] + 8 }));
        for (const a of at) for (const b of at) if (a !== b && a.side === b.side && ys.length <= 2) expect(Math.abs(a.y - b.y)).toBeGreaterThanOrEqual(16);
      }),
    );
  });
});

describe("axis titles", () => {
  it("names temperature with its unit, and keeps any other unit", () => {
    expect(yAxisTitle("°C")).toBe("temperature (°C)");
    expect(yAxisTitle("°F")).toBe("temperature (°F)");
    expect(yAxisTitle("% latent left")).toBe("% latent left");
  });
});
