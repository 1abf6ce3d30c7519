/**
 * Pure layout rules of the charts (TemperatureChart, PackStateChart): the Y range, the line styles, and
 * where the labels of limit lines and route-segment markers go so that none overlaps another. No React
 * here, so the rules are unit-tested on their own (test/unit/chart-layout.test.ts). All values are in
 * display units (°C or °F, hours) and pixels.
 */

export type LineStyle = "solid" | "dashed" | "dotted";

export interface ChartLineSpec {
  key: string;
  color: string;
  dashed?: boolean;
  style?: LineStyle;
}

export interface DrawnLine {
  key: string;
  stroke: string;
  /** SVG stroke-dasharray, or undefined for a solid line. */
  dash: string | undefined;
  width: number;
}

/** Dash patterns: long dashes and dots, both far from solid and from each other at 2 px. */
export const DASH: Record<LineStyle, string | undefined> = { solid: undefined, dashed: "7 4", dotted: "1.5 3.5" };

const HEX = /^#([0-9a-f]{6})$/i;

/** `hex` mixed with white (`amount` > 0) or black (`amount` < 0); other colour notations come back as given. */
export function shade(hex: string, amount: number): string {
  const m = HEX.exec(hex.trim());
  if (!m) return hex;
  const n = parseInt(m[1], 16);
  const mix = (c: number) => Math.round(amount >= 0 ? c + (255 - c) * amount : c * (1 + amount));
  const rgb = [(n >> 16) & 255, (n >> 8) & 255, n & 255].map(mix);
  return "#" + rgb.map((c) => c.toString(16).padStart(2, "0")).join("");
}

/**
 * How each line is drawn. `style` wins over the older `dashed` flag. Lines that share a colour (the
 * centre and surface of one product) keep the first one's colour and get lighter and darker shades in
 * turn, so two lines always differ in colour as well as in dash pattern when their caller gave both the
 * same colour.
 */
export function drawnLines(lines: ChartLineSpec[]): DrawnLine[] {
  const seen = new Map<string, number>();
  return lines.map((l) => {
    const style: LineStyle = l.style ?? (l.dashed ? "dashed" : "solid");
    const key = l.color.trim().toLowerCase();
    const n = seen.get(key) ?? 0;
    seen.set(key, n + 1);
    // 0: as given; 1: lighter; 2: darker; 3: lighter still …
    const amount = n === 0 ? 0 : n % 2 === 1 ? 0.38 + 0.12 * ((n - 1) / 2) : -0.3 - 0.1 * ((n - 2) / 2);
    return { key: l.key, stroke: n === 0 ? l.color : shade(l.color, Math.max(-0.7, Math.min(0.7, amount))), dash: DASH[style], width: style === "solid" ? 2.2 : 2 };
  });
}

/**
 * The shaded in-limit band: two edges in either order (`y1`, `y2`), or a `lower` and an `upper` edge
 * where null means open on that side (only an upper limit: everything below it). Display units.
 */
export type ChartBand = { y1: number; y2: number } | { lower: number | null; upper: number | null };

const finiteOrNull = (v: number | null | undefined) => (typeof v === "number" && Number.isFinite(v) ? v : null);

/**
 * A band's edges as [low, high] whatever order or unit direction they came in; an open side is null.
 * Null when there is no band or no finite edge at all.
 */
export function normaliseBand(band: ChartBand | null | undefined): { lo: number | null; hi: number | null } | null {
  if (!band) return null;
  const [a, b] = "y1" in band ? [finiteOrNull(band.y1), finiteOrNull(band.y2)] : [finiteOrNull(band.lower), finiteOrNull(band.upper)];
  if (a === null && b === null) return null;
  if ("y1" in band && (a === null || b === null)) return null;
  if (a !== null && b !== null) return { lo: Math.min(a, b), hi: Math.max(a, b) };
  return { lo: a, hi: b };
}

/** The band as drawn on a chart with Y range `domain`: open sides run to the edge; null when out of view. */
export function bandInDomain(band: ChartBand | null | undefined, domain: [number, number]): { lo: number; hi: number } | null {
  const b = normaliseBand(band);
  if (!b) return null;
  const lo = Math.max(b.lo ?? domain[0], domain[0]);
  const hi = Math.min(b.hi ?? domain[1], domain[1]);
  return hi > lo ? { lo, hi } : null;
}

/** A step of 1, 2 or 5 × 10ⁿ near span / count (about `count` ticks). */
export function niceStep(span: number, count = 6): number {
  if (!(span > 0) || !Number.isFinite(span)) return 1;
  const raw = span / count;
  const p = Math.pow(10, Math.floor(Math.log10(raw)));
  const f = raw / p;
  return (f <= 1 ? 1 : f <= 2 ? 2 : f <= 5 ? 5 : 10) * p;
}

/**
 * The Y range of a chart: everything drawn — the lines' values, every limit line and the band — plus
 * padding (`padFraction` of the span each side, at least `minPad`), rounded out to a nice step. So a
 * limit line is always in view, however far it is from the curves. Never NaN: with nothing finite to
 * show it is [0, 1].
 */
export function yDomain(opts: { values: Iterable<number>; limits?: number[]; band?: ChartBand | null; padFraction?: number; minPad?: number }): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  const take = (v: number) => {
    if (!Number.isFinite(v)) return;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  };
  for (const v of opts.values) take(v);
  for (const v of opts.limits ?? []) take(v);
  const b = normaliseBand(opts.band);
  if (b) {
    if (b.lo !== null) take(b.lo);
    if (b.hi !== null) take(b.hi);
  }
  if (lo === Infinity) return [0, 1];
  const span = hi - lo;
  const pad = Math.max(span * (opts.padFraction ?? 0.06), opts.minPad ?? 0.5);
  // Rounded out to a step finer than the ticks' (about ten across), so little empty space is added.
  const step = niceStep(span + 2 * pad, 10);
  const round = (v: number) => Number(v.toPrecision(12));
  return [round(Math.floor((lo - pad) / step) * step), round(Math.ceil((hi + pad) / step) * step)];
}

/** About six ticks between lo and hi at a nice step (1, 2 or 5 × 10ⁿ). */
export function axisTicks(domain: [number, number]): number[] {
  const [lo, hi] = domain;
  if (!(hi > lo)) return [lo];
  const step = niceStep(hi - lo);
  const out: number[] = [];
  for (let v = Math.ceil(lo / step - 1e-9) * step; v <= hi + step * 1e-9 && out.length < 50; v += step) out.push(Number(v.toPrecision(12)));
  return out;
}

/** [first, last] time of the data (hours), or [0, 1] without data; a single instant gets a width of 1. */
export function xDomain(data: Record<string, number>[], key = "t_h"): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const d of data) {
    const v = d[key];
    if (!Number.isFinite(v)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (lo === Infinity) return [0, 1];
  return hi > lo ? [lo, hi] : [lo, lo + 1];
}

/** The Y axis title: "temperature (°C)" for a temperature unit, otherwise the unit as given. */
export function yAxisTitle(unit: string): string {
  return /^°[CF]$/.test(unit.trim()) ? `temperature (${unit.trim()})` : unit;
}

export interface PlacedTopLabel {
  /** Index into the labels as given. */
  index: number;
  x_px: number;
  /** 0 = the row nearest the plot. */
  row: number;
  /** The text drawn (shortened with "…" where it would run into the next label); "" when no room at all. */
  text: string;
  full: string;
}

/**
 * Places the labels of vertical markers (route segments) in a band of `rows` text rows above the plot,
 * each starting at its marker. A label goes into the first row where it clears the previous label by
 * `gap_px`; when no row has room, it takes the row whose last label ends first and that label is
 * shortened to end before it ("…"). Labels never run past `right_px`. Text width is estimated as
 * `charWidth_px` per character (a chart's small sans-serif text).
 */
export function placeTopLabels(
  labels: { x_px: number; text: string }[],
  opts: { right_px: number; rows?: number; charWidth_px?: number; gap_px?: number },
): PlacedTopLabel[] {
  const rows = Math.max(1, Math.floor(opts.rows ?? 2));
  const cw = opts.charWidth_px ?? 6;
  const gap = opts.gap_px ?? 6;
  const out: PlacedTopLabel[] = [];
  const last: (PlacedTopLabel | null)[] = Array.from({ length: rows }, () => null);
  const end = (p: PlacedTopLabel | null) => (p ? p.x_px + p.text.length * cw : -Infinity);
  const fit = (text: string, room_px: number) => {
    const n = Math.floor(room_px / cw);
    if (text.length <= n) return text;
    return n >= 4 ? text.slice(0, n - 1).trimEnd() + "…" : "";
  };
  const order = labels.map((l, index) => ({ ...l, index })).filter((l) => Number.isFinite(l.x_px) && l.text).sort((a, b) => a.x_px - b.x_px);
  for (const l of order) {
    let row = last.findIndex((p) => end(p) + gap <= l.x_px);
    if (row < 0) {
      row = 0;
      for (let r = 1; r < rows; r++) if (end(last[r]) < end(last[row])) row = r;
      const prev = last[row]!;
      prev.text = fit(prev.full, l.x_px - gap - prev.x_px);
    }
    const placed: PlacedTopLabel = { index: l.index, x_px: l.x_px, row, text: fit(l.text, opts.right_px - l.x_px), full: l.text };
    out.push(placed);
    last[row] = placed;
  }
  return out.sort((a, b) => a.index - b.index);
}

export interface PlacedLimitLabel {
  index: number;
  /** Which end of the line the label sits at. */
  side: "right" | "left";
  /** Above the line (true) or below it. */
  above: boolean;
}

/**
 * Places the labels of horizontal limit lines (`y_px` from the top of the plot): at the right end above
 * the line, unless another label is within `minGap_px` on that side, then at the left end; when both
 * ends are taken, below the line at the end whose nearest label is farther. A label that would leave the
 * top of the plot (`top_px`) goes below its line.
 */
export function placeLimitLabels(limits: { y_px: number }[], opts: { minGap_px?: number; top_px?: number } = {}): PlacedLimitLabel[] {
  const gap = opts.minGap_px ?? 16;
  const top = opts.top_px ?? 0;
  // Where each label's text sits vertically: just above (or below) its line.
  const textY = (y: number, above: boolean) => (above ? y - 8 : y + 8);
  const taken: Record<"right" | "left", number[]> = { right: [], left: [] };
  const clear = (side: "right" | "left", y: number) => taken[side].every((t) => Math.abs(t - y) >= gap);
  const nearest = (side: "right" | "left", y: number) => Math.min(Infinity, ...taken[side].map((t) => Math.abs(t - y)));
  const order = limits.map((l, index) => ({ ...l, index })).sort((a, b) => a.y_px - b.y_px);
  const out: PlacedLimitLabel[] = [];
  for (const l of order) {
    const canAbove = textY(l.y_px, true) - 6 >= top;
    let choice: PlacedLimitLabel | null = null;
    for (const above of canAbove ? [true, false] : [false]) {
      for (const side of ["right", "left"] as const) {
        if (!choice && clear(side, textY(l.y_px, above))) choice = { index: l.index, side, above };
      }
    }
    if (!choice) {
      const above = false;
      const side = nearest("right", textY(l.y_px, above)) >= nearest("left", textY(l.y_px, above)) ? "right" : "left";
      choice = { index: l.index, side, above };
    }
    taken[choice.side].push(textY(l.y_px, choice.above));
    out.push(choice);
  }
  return out.sort((a, b) => a.index - b.index);
}
