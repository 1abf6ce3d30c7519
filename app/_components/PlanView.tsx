"use client";
import { memo, useMemo } from "react";
import { thin } from "@/lib/planners/view-kit";
import type { ChartSpec, PlanView as View } from "@/lib/planners/types";
import { PackStateChart, TemperatureChart } from "./TemperatureChart";
import { CautionBlock } from "./CautionBlock";
import { ComplianceList, FactList } from "./ResultParts";

/** Points a chart draws at most: more adds nothing a reader sees and costs the page's thread (recharts draws in SVG). */
const CHART_POINTS = 160;

/**
 * A chart of a result, as its planner's view describes it: pack state on its fixed 0–100 % axis, else
 * temperatures. Memoised on the spec, so typing in the form never redraws a chart whose result did not change.
 */
export const ChartFromSpec = memo(function ChartFromSpec({ spec: full }: { spec: ChartSpec }) {
  const spec = useMemo(() => ({ ...full, data: thin(full.data, CHART_POINTS) }), [full]);
  const edge = (v: number | undefined) => (v !== undefined && Number.isFinite(v) ? v : null);
  return (
    <figure className="chart-figure">
      <figcaption>{spec.title}</figcaption>
      {spec.packState ? (
        <PackStateChart testId={spec.testId} data={spec.data} lines={spec.lines} measure={spec.packState} markers={spec.markers} />
      ) : (
        <TemperatureChart
          testId={spec.testId}
          data={spec.data}
          lines={spec.lines}
          limits={spec.limits}
          unit={spec.unit}
          yTitle={spec.yTitle}
          band={spec.band ? { lower: edge(Math.min(spec.band.y1, spec.band.y2)), upper: edge(Math.max(spec.band.y1, spec.band.y2)) } : null}
          markers={spec.markers}
        />
      )}
    </figure>
  );
});

/**
 * A planner's result as a person reads it: headline, key figures, charts, tables, the rule-set lines,
 * assumptions, warnings and cautions. The same component shows a live result, its print view and a saved
 * plan's record. `record` adds what was planned and the blanks of the paper record (shown on screen too).
 */
export function PlanView({ view, record = false, stale = false }: { view: View; record?: boolean; stale?: boolean }) {
  return (
    <div className={stale ? "plan-view stale" : "plan-view"} aria-busy={stale || !!view.pending}>
      <ViewBody view={view} record={record} />
    </div>
  );
}

/** The view itself, memoised: while an input changes only the wrapper's "being updated" state changes. */
const ViewBody = memo(function ViewBody({ view, record }: { view: View; record: boolean }) {
  return (
    <>
      <h1 className={record ? undefined : "print-only"}>{view.title}</h1>
      <h2 data-testid={view.headlineTestId}>{view.headline}</h2>
      {view.pending ? (
        <p className="muted no-print" role="status" data-testid="result-pending">
          {view.pending}
        </p>
      ) : null}
      <table className="list summary" data-testid="result-facts">
        <tbody>
          {view.facts.map((f) => (
            <tr key={f.label}>
              <th scope="row">{f.label}</th>
              <td data-testid={f.testId}>{f.value}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <section className={record ? "plan-inputs" : "plan-inputs print-only"} aria-label="What was planned">
        <h3>What was planned</h3>
        <table className="list summary">
          <tbody>
            {view.inputs.map((f) => (
              <tr key={f.label}>
                <th scope="row">{f.label}</th>
                <td>{f.value}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>
      {view.charts.map((c) => (
        <ChartFromSpec key={c.testId} spec={c} />
      ))}
      {view.tables.map((t) => (
        <section key={t.title}>
          <h3>{t.title}</h3>
          <TextTable columns={t.columns} rows={t.rows} testId={t.testId} />
          {t.note ? <p className="muted">{t.note}</p> : null}
        </section>
      ))}
      <ComplianceList lines={view.compliance.lines} title={view.compliance.title || undefined} />
      <FactList title="Assumptions" items={view.assumptions} testId="assumptions" />
      <FactList title="Warnings" items={view.warnings} warn testId="warnings" />
      <CautionBlock dryIce={view.cautions.dryIce} extra={view.cautions.extra} />
      <section className={record ? "sign-off" : "sign-off print-only"} data-testid="sign-off">
        <h2>{view.signOff.title}</h2>
        {view.signOff.lines.map((l) => (
          <p key={l}>{l}</p>
        ))}
      </section>
    </>
  );
});

/** A table of text cells with a header row: a view's tables, the pack-out sheet's. */
export function TextTable({ columns, rows, testId, className = "list" }: { columns: string[]; rows: string[][]; testId?: string; className?: string }) {
  return (
    <table className={className} data-testid={testId}>
      <thead>
        <tr>
          {columns.map((c) => (
            <th key={c} scope="col">
              {c}
            </th>
          ))}
        </tr>
      </thead>
      <tbody>
        {rows.map((r, i) => (
          <tr key={i}>
            {r.map((cell, j) => (
              <td key={j}>{cell}</td>
            ))}
          </tr>
        ))}
      </tbody>
    </table>
  );
}
