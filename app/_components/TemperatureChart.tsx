"use client";
import { CartesianGrid, Legend, Line, LineChart, ReferenceArea, ReferenceLine, ResponsiveContainer, Tooltip, usePlotArea, useXAxisScale, useYAxisScale, XAxis, YAxis } from "recharts";
import { axisTicks, bandInDomain, drawnLines, placeLimitLabels, placeTopLabels, xDomain, yAxisTitle, yDomain, type ChartBand, type LineStyle } from "./chart-layout";

export type { ChartBand, LineStyle } from "./chart-layout";

export interface ChartLine {
  key: string;
  label: string;
  color: string;
  /** Older spelling of `style: "dashed"`. */
  dashed?: boolean;
  /** Dash pattern; lines given the same colour also get distinct shades (chart-layout.ts, drawnLines). */
  style?: LineStyle;
}

export interface ChartMarker {
  x: number;
  label: string;
  kind: "segment" | "stop";
}

/** Rows of segment labels in the band above the plot, and their height. */
const LABEL_ROWS = 2;
const ROW_PX = 13;
const LABEL_FONT_PX = 10;
/** Average width of a character of the small chart text (system sans-serif at 10 px). */
const CHAR_PX = 5.6;
const MUTED = "#5d686e";
const LIMIT = "#a3231b";

/** Room for the plot plus the legend below it (about two entries a row on a planner's results column). */
const defaultHeight = (lines: number) => 300 + 18 * Math.ceil(lines / 2);

/** Segment labels in a band above the plot, each starting at its marker, in rows so none overlaps. */
function MarkerLabels({ markers }: { markers: ChartMarker[] }) {
  const plot = usePlotArea();
  const x = useXAxisScale();
  if (!plot || !x) return null;
  const shown = markers.filter((m) => m.kind === "segment" && m.label);
  const placed = placeTopLabels(
    shown.map((m) => ({ x_px: x(m.x) ?? NaN, text: m.label })),
    { right_px: plot.x + plot.width + 20, rows: LABEL_ROWS, charWidth_px: CHAR_PX },
  );
  return (
    <g className="chart-segment-labels" data-testid="segment-labels">
      {placed.map((p) =>
        p.text ? (
          <g key={p.index}>
            {p.row > 0 ? <line x1={p.x_px} x2={p.x_px} y1={plot.y} y2={plot.y - p.row * ROW_PX - 2} stroke="#c3c9cc" strokeDasharray="2 2" /> : null}
            <text x={p.x_px + 3} y={plot.y - 4 - p.row * ROW_PX} fontSize={LABEL_FONT_PX} fill={MUTED}>
              <title>{p.full}</title>
              {p.text}
            </text>
          </g>
        ) : null,
      )}
    </g>
  );
}

/** Limit-line labels at alternating ends, or below their line, when two limits are close. */
function LimitLabels({ limits }: { limits: { y: number; label: string }[] }) {
  const plot = usePlotArea();
  const y = useYAxisScale();
  if (!plot || !y) return null;
  const ys = limits.map((l) => y(l.y) ?? NaN);
  const placed = placeLimitLabels(
    ys.map((y_px) => ({ y_px })),
    { top_px: plot.y },
  );
  return (
    <g className="chart-limit-labels" data-testid="limit-labels">
      {placed.map((p) => {
        const yp = ys[p.index];
        if (!Number.isFinite(yp)) return null;
        const right = p.side === "right";
        return (
          <text key={p.index} x={right ? plot.x + plot.width - 4 : plot.x + 4} y={p.above ? yp - 4 : yp + 12} textAnchor={right ? "end" : "start"} fontSize={11} fill={LIMIT} paintOrder="stroke" stroke="#ffffff" strokeWidth={3}>
            {limits[p.index].label}
          </text>
        );
      })}
    </g>
  );
}

interface TimeChartProps {
  data: Record<string, number>[];
  lines: ChartLine[];
  limits: { y: number; label: string }[];
  yDomain: [number, number];
  yTicks: number[];
  yTitle: string;
  valueSuffix: string;
  height: number;
  band?: ChartBand | null;
  markers?: ChartMarker[];
  testId: string;
  xTitle: string;
}

/** The one chart of values against time (hours) behind TemperatureChart and PackStateChart. */
function TimeChart(p: TimeChartProps) {
  const styles = drawnLines(p.lines);
  const x = xDomain(p.data);
  const markers = (p.markers ?? []).filter((m) => Number.isFinite(m.x) && m.x >= x[0] && m.x <= x[1]);
  const hasSegmentLabels = markers.some((m) => m.kind === "segment" && m.label);
  const band = bandInDomain(p.band, p.yDomain);
  const fmt = (v: number) => `${Number(v.toFixed(1))}`;
  return (
    <div className="chart" data-testid={p.testId} style={{ width: "100%", height: p.height }}>
      <ResponsiveContainer>
        <LineChart data={p.data} margin={{ top: hasSegmentLabels ? LABEL_ROWS * ROW_PX + 8 : 10, right: 24, bottom: 22, left: 8 }}>
          <CartesianGrid stroke="#e3e6e8" />
          <XAxis dataKey="t_h" type="number" domain={x} ticks={axisTicks(x)} allowDataOverflow tickFormatter={fmt} label={{ value: p.xTitle, position: "insideBottom", offset: -14, fill: MUTED }} />
          <YAxis
            width={66}
            domain={p.yDomain}
            ticks={p.yTicks}
            allowDataOverflow
            tickFormatter={fmt}
            label={{ value: p.yTitle, angle: -90, position: "insideLeft", offset: 4, fill: MUTED, style: { textAnchor: "middle" } }}
          />
          <Tooltip formatter={(v) => `${Number(Number(v).toFixed(2))}${p.valueSuffix}`} labelFormatter={(v) => `${Number(Number(v).toFixed(2))} h`} />
          <Legend verticalAlign="bottom" iconSize={18} wrapperStyle={{ paddingTop: 14, fontSize: 12, lineHeight: "16px" }} />
          {band ? <ReferenceArea y1={band.lo} y2={band.hi} fill="#7fb08a" fillOpacity={0.14} stroke="none" ifOverflow="hidden" /> : null}
          {markers.map((m, i) => (
            <ReferenceLine key={`${m.kind}-${i}`} x={m.x} stroke={m.kind === "segment" ? "#9aa3a8" : "#c9a227"} strokeDasharray={m.kind === "segment" ? "2 4" : "1 2"} />
          ))}
          {p.limits.map((l, i) => (
            <ReferenceLine key={`limit-${i}`} y={l.y} stroke={LIMIT} strokeDasharray="6 3" />
          ))}
          {p.lines.map((l, i) => (
            <Line
              key={l.key}
              type="monotone"
              dataKey={l.key}
              name={l.label}
              stroke={styles[i].stroke}
              strokeWidth={styles[i].width}
              strokeDasharray={styles[i].dash}
              legendType="plainline"
              dot={false}
              isAnimationActive={false}
            />
          ))}
          {hasSegmentLabels ? <MarkerLabels markers={markers} /> : null}
          {p.limits.length ? <LimitLabels limits={p.limits} /> : null}
        </LineChart>
      </ResponsiveContainer>
    </div>
  );
}

/**
 * Temperature against time (hours), with limit lines, an optional shaded band (the allowed range) and
 * vertical markers (route segments, stops). Values arrive already in display units. The Y range always
 * shows every curve, every limit line and the band's edges; segment labels sit in a band above the plot
 * and limit labels move apart when limits are close (chart-layout.ts).
 */
export function TemperatureChart(props: {
  data: Record<string, number>[];
  lines: ChartLine[];
  limits: { y: number; label: string }[];
  unit: string;
  height?: number;
  band?: ChartBand | null;
  markers?: ChartMarker[];
  testId?: string;
  /** Y axis title; "temperature (°C)" / "temperature (°F)" by default for a temperature unit, else the unit. */
  yTitle?: string;
  /** X axis title; "time (h)" by default. */
  xTitle?: string;
}) {
  const values = function* () {
    for (const d of props.data) for (const l of props.lines) yield d[l.key];
  };
  const domain = yDomain({ values: values(), limits: props.limits.map((l) => l.y), band: props.band });
  return (
    <TimeChart
      data={props.data}
      lines={props.lines}
      limits={props.limits}
      yDomain={domain}
      yTicks={axisTicks(domain)}
      yTitle={props.yTitle ?? yAxisTitle(props.unit)}
      valueSuffix={` ${props.unit}`}
      height={props.height ?? defaultHeight(props.lines.length)}
      band={props.band}
      markers={props.markers}
      testId={props.testId ?? "temperature-chart"}
      xTitle={props.xTitle ?? "time (h)"}
    />
  );
}

/**
 * The state of the coolant packs against time on a fixed 0–100 % axis: how much of each pack's latent
 * heat is used (`measure: "used"`) or left (`"left"`), as the data says — the caller names which.
 */
export function PackStateChart(props: {
  data: Record<string, number>[];
  lines: ChartLine[];
  measure: "used" | "left";
  height?: number;
  markers?: ChartMarker[];
  testId?: string;
}) {
  return (
    <TimeChart
      data={props.data}
      lines={props.lines}
      limits={[]}
      yDomain={[0, 100]}
      yTicks={[0, 25, 50, 75, 100]}
      yTitle={`pack ${props.measure} (%)`}
      valueSuffix=" %"
      height={props.height ?? 220}
      markers={props.markers?.filter((m) => m.kind === "stop")}
      testId={props.testId ?? "pack-chart"}
      xTitle="time (h)"
    />
  );
}
