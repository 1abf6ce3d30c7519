"use client";
import { CartesianGrid, Legend, Line, LineChart, ReferenceArea, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";

export interface ChartLine {
  key: string;
  label: string;
  color: string;
  dashed?: boolean;
}

/**
 * Temperature against time (hours), with limit lines, an optional shaded band (the allowed range)
 * and vertical markers (route segments, stops). Values arrive already in display units.
 */
export function TemperatureChart(props: {
  data: Record<string, number>[];
  lines: ChartLine[];
  limits: { y: number; label: string }[];
  unit: string;
  height?: number;
  band?: { y1: number; y2: number } | null;
  markers?: { x: number; label: string; kind: "segment" | "stop" }[];
  testId?: string;
  /** The y-axis title with its unit ("temperature (°F)"); default: the unit alone. */
  yTitle?: string;
  /** A fixed y range (pack state on 0–100 %). */
  yDomain?: [number, number];
}) {
  return (
    <div className="chart" data-testid={props.testId ?? "temperature-chart"} style={{ width: "100%", height: props.height ?? 340 }}>
      <ResponsiveContainer>
        <LineChart data={props.data} margin={{ top: 10, right: 24, bottom: 24, left: 8 }}>
          <CartesianGrid stroke="#e3e6e8" />
          <XAxis dataKey="t_h" type="number" domain={["dataMin", "dataMax"]} tickFormatter={(v: number) => `${Number(v.toFixed(1))}`} label={{ value: "time (h)", position: "insideBottom", offset: -12 }} />
          <YAxis width={56} tickFormatter={(v: number) => `${Number(v.toFixed(1))}`} label={{ value: props.yTitle ?? props.unit, angle: -90, position: "insideLeft" }} domain={props.yDomain ?? ["auto", "auto"]} />
          <Tooltip formatter={(v) => `${Number(Number(v).toFixed(2))} ${props.unit}`} labelFormatter={(v) => `${Number(Number(v).toFixed(2))} h`} />
          <Legend verticalAlign="top" height={28} />
          {props.band ? <ReferenceArea y1={props.band.y1} y2={props.band.y2} fill="#7fb08a" fillOpacity={0.12} stroke="none" ifOverflow="extendDomain" /> : null}
          {(props.markers ?? []).map((m, i) => (
            <ReferenceLine
              key={`${m.kind}-${i}`}
              x={m.x}
              stroke={m.kind === "segment" ? "#9aa3a8" : "#c9a227"}
              strokeDasharray={m.kind === "segment" ? "2 4" : "1 2"}
              label={m.kind === "segment" && m.label ? { value: m.label, position: "insideTopLeft", fill: "#6b7378", fontSize: 10, angle: -90, offset: 12 } : undefined}
            />
          ))}
          {props.limits.map((l) => (
            <ReferenceLine key={l.label} y={l.y} stroke="#a3231b" strokeDasharray="6 3" label={{ value: l.label, position: "insideTopRight", fill: "#a3231b", fontSize: 12 }} />
          ))}
          {props.lines.map((l) => (
            <Line key={l.key} type="monotone" dataKey={l.key} name={l.label} stroke={l.color} strokeWidth={2} dot={false} isAnimationActive={false} strokeDasharray={l.dashed ? "4 3" : undefined} />
          ))}
        </LineChart>
      </ResponsiveContainer>
    </div>
  );
}
