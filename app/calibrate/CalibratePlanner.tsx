"use client";
import { useEffect, useMemo, useRef, useState } from "react";
import { calibrateInputSchema, CHANNEL_ROLES, CHANNEL_ROLE_LABELS, FACTOR_LABELS, HOLD_FACTORS, THAW_FACTORS, type LogFormatInput } from "@/lib/schemas/calibrate";
import { describeLogProblems, parseLogCsv } from "@/lib/calibration/log-csv";
import { compareHoldWithLog, compareThawWithLog, type LogComparison } from "@/lib/calibration/align";
import { DEFAULT_CHANNELS, guessLogFormat, parseChannelSpec, TIME_CHOICES, type TimeChoice } from "@/lib/calibration/guess-format";
import { EXAMPLE_LOG_NAME } from "@/lib/calibration/example";
import { logChart, diffText } from "@/lib/planners/calibrate";
import type { HoldParsed } from "@/lib/schemas/hold";
import type { HoldResult } from "@/lib/physics/hold";
import type { ThawResult } from "@/lib/physics/thaw";
import { fieldErrorsOf } from "@/lib/schemas/errors";
import { formatDuration } from "@/lib/format";
import { usePlanner } from "@/app/_components/usePlanner";
import { PlannerOutcome } from "@/app/_components/PlannerOutcome";
import { PlanActions } from "@/app/_components/PlanActions";
import { ChartFromSpec } from "@/app/_components/PlanView";
import { useUnits } from "@/app/_components/units-context";
import { saveCalibratedBoxAction } from "./actions";

export interface PlanChoice {
  id: string;
  kind: "hold" | "thaw";
  label: string;
  input: unknown;
}

const TIME_LABELS: Record<TimeChoice, string> = {
  s: "elapsed seconds (or h:mm:ss)",
  min: "elapsed minutes",
  h: "elapsed hours",
  iso: "date-time, ISO (2026-07-14T09:30)",
  day_first: "date-time, day first (14/07/2026 09:30)",
  month_first: "date-time, month first (07/14/2026 09:30)",
};
type Delim = "auto" | "," | ";" | "\t";
const DELIM_LABELS: Record<Delim, string> = { auto: "detect", ",": "comma", ";": "semicolon", "\t": "tab" };
/** One column's mapping: "-" (not used) or a channel spec "product:0:surface" (lib/calibration/guess-format.ts). */
type Mapping = string;

export function CalibratePlanner({ choices, initial, initialLog }: { choices: PlanChoice[]; initial: string; initialLog?: { name: string; text: string } }) {
  const units = useUnits();
  const diff = (k: number | null) => diffText(k, units);
  const [choiceId, setChoiceId] = useState(initial);
  const choice = choices.find((c) => c.id === choiceId) ?? choices[0];
  const kind = choice.kind;
  const [logName, setLogName] = useState("");
  const [logText, setLogText] = useState("");
  const [delimiter, setDelimiter] = useState<Delim>("auto");
  const [decimal, setDecimal] = useState<"." | ",">(".");
  const [unit, setUnit] = useState<"C" | "F">(units.temperatureUnit);
  const [time, setTime] = useState<TimeChoice>("min");
  const [skipRows, setSkipRows] = useState(0);
  const [header, setHeader] = useState<string[]>([]);
  const [mapping, setMapping] = useState<Mapping[]>([]);
  const [guessProblem, setGuessProblem] = useState<string | null>(null);
  const [dateHint, setDateHint] = useState<string | null>(null);
  const [fit, setFit] = useState<string[]>([...HOLD_FACTORS]);
  const [useOutside, setUseOutside] = useState(true);
  const [fitInput, setFitInput] = useState<unknown>(null);
  const [boxName, setBoxName] = useState("");
  const [saved, setSaved] = useState<{ shipperName: string; planId: number } | null>(null);
  const [saveProblem, setSaveProblem] = useState<string | null>(null);
  const [saving, setSaving] = useState(false);

  /** A new file: guess its layout (the header, the time column's form, the columns in the usual order). */
  const loadText = (name: string, text: string, k = kind) => {
    setLogName(name);
    setLogText(text);
    setFitInput(null);
    setSaved(null);
    const g = guessLogFormat(text, k, { delimiter, decimal });
    if (!g.ok) {
      // A date the file does not say the order of: keep the header, and ask for the order.
      setGuessProblem(g.header ? null : g.message);
      setHeader(g.header ?? []);
      setSkipRows(g.skipRows ?? 0);
      setMapping((g.header ?? []).slice(1).map((_, i) => defaultMapping(k, i)));
      if (g.header && (time === "s" || time === "min" || time === "h")) setTime("day_first");
      setDateHint(g.header ? g.message : null);
      return;
    }
    setDateHint(null);
    setGuessProblem(null);
    const f = g.format;
    setHeader(g.header);
    setSkipRows(f.skipRows ?? 0);
    setTime(f.time.kind === "elapsed" ? f.time.unit : f.time.order);
    setMapping(g.header.slice(1).map((_, i) => {
      const ch = f.channels.find((c) => c.column === g.header[i + 1]);
      return ch ? `${ch.role}${ch.line ? `:${ch.line}` : ""}${ch.point === "surface" ? ":surface" : ""}` : "-";
    }));
  };

  // A reopened calibration: read its log once, as if it had just been loaded.
  const reopenedLog = useRef(initialLog);
  useEffect(() => {
    const log = reopenedLog.current;
    if (!log) return;
    const t = setTimeout(() => {
      reopenedLog.current = undefined;
      loadText(log.name, log.text);
    });
    return () => clearTimeout(t);
  });

  const format: LogFormatInput | null = header.length
    ? {
        delimiter,
        decimal,
        unit,
        skipRows,
        time: time === "s" || time === "min" || time === "h" ? { kind: "elapsed", column: header[0] || 0, unit: time } : { kind: "datetime", column: header[0] || 0, order: time },
        channels: mapping.flatMap((m, i) => {
          const c = parseChannelSpec(m);
          return c && c !== "skip" ? [{ column: header[i + 1] || i + 1, ...c }] : [];
        }),
      }
    : null;
  const parsedLog = useParsedLog(logText, JSON.stringify(format));
  const logProblems = parsedLog && !parsedLog.ok ? describeLogProblems(parsedLog.problems) : [];

  // Plan against log, before any fit: the plan as it stands (in the browser worker), the log beside it.
  const planState = usePlanner(kind, choice.input);
  const before = useMemo((): LogComparison | string | null => {
    if (!parsedLog?.ok || planState.status !== "ready" || planState.stale) return null;
    try {
      return kind === "hold" ? compareHoldWithLog(planState.parsed as HoldParsed, planState.result as HoldResult, parsedLog.log, 0) : compareThawWithLog(planState.result as ThawResult, parsedLog.log, 0);
    } catch (e) {
      return (e as Error).message;
    }
  }, [parsedLog, planState, kind]);

  const factorsOfKind: readonly string[] = kind === "hold" ? HOLD_FACTORS : THAW_FACTORS;
  const chosenFit = fit.filter((f) => factorsOfKind.includes(f));
  const candidate = format && logText ? { planner: kind, plan: choice.input, log: { name: logName || "log.csv", text: logText }, format, fit: chosenFit.length ? chosenFit : undefined, useLoggedOutsideAir: kind === "hold" ? useOutside : false } : null;
  const checked = candidate ? calibrateInputSchema.safeParse(candidate) : null;
  const inputErrors = checked && !checked.success ? Object.entries(fieldErrorsOf(checked.error)).map(([k, v]) => `${k}: ${v.join("; ")}`) : [];
  const calState = usePlanner("calibrate", fitInput ?? { planner: kind });
  const calReady = fitInput !== null && calState.status === "ready" && !calState.stale;

  return (
    <div className="planner calibrate">
      <form className="template-form planner-inputs no-print" onSubmit={(ev) => ev.preventDefault()} noValidate>
        <div className="field">
          <label htmlFor="cal-plan">Plan</label>
          <select
            id="cal-plan"
            value={choice.id}
            onChange={(ev) => {
              const c = choices.find((x) => x.id === ev.target.value) ?? choices[0];
              setChoiceId(c.id);
              setFitInput(null);
              setSaved(null);
              setFit(c.kind === "hold" ? [...HOLD_FACTORS] : [...THAW_FACTORS]);
              if (logText) loadText(logName, logText, c.kind);
            }}
          >
            {choices.map((c) => (
              <option key={c.id} value={c.id}>
                {c.label}
              </option>
            ))}
          </select>
        </div>
        <fieldset className="group">
          <legend>Logger file</legend>
          <div className="field">
            <label htmlFor="cal-file">Open a CSV file</label>
            <input
              id="cal-file"
              type="file"
              accept=".csv,.txt,text/csv,text/plain"
              onChange={async (ev) => {
                const f = ev.target.files?.[0];
                if (f) loadText(f.name, await f.text());
              }}
            />
          </div>
          <div className="field">
            <label htmlFor="cal-text">or paste its text</label>
            <textarea id="cal-text" rows={6} value={logText} onChange={(ev) => loadText(logName || "pasted.csv", ev.target.value)} aria-describedby={logProblems.length || guessProblem ? "cal-log-problems" : undefined} spellCheck={false} />
          </div>
          <button
            type="button"
            className="secondary"
            onClick={async () => {
              const r = await fetch(`/examples/${EXAMPLE_LOG_NAME}`);
              loadText(EXAMPLE_LOG_NAME, await r.text());
            }}
          >
            Use the demo log (invented data)
          </button>
          {guessProblem || logProblems.length ? (
            <div id="cal-log-problems" className="banner error" role="alert" data-testid="cal-log-problems">
              <p>The file cannot be read as set:</p>
              <ul>
                {(guessProblem ? [guessProblem] : logProblems).map((p) => (
                  <li key={p}>{p}</li>
                ))}
              </ul>
            </div>
          ) : null}
        </fieldset>
        <fieldset className="group">
          <legend>How the file is written</legend>
          <div className="inline">
            <div className="field">
              <label htmlFor="cal-delim">Delimiter</label>
              <select id="cal-delim" value={delimiter} onChange={(ev) => setDelimiter(ev.target.value as Delim)}>
                {(Object.keys(DELIM_LABELS) as Delim[]).map((d) => (
                  <option key={d} value={d}>
                    {DELIM_LABELS[d]}
                  </option>
                ))}
              </select>
            </div>
            <div className="field">
              <label htmlFor="cal-decimal">Decimal mark</label>
              <select id="cal-decimal" value={decimal} onChange={(ev) => setDecimal(ev.target.value as "." | ",")}>
                <option value=".">point (12.5)</option>
                <option value=",">comma (12,5)</option>
              </select>
            </div>
            <div className="field">
              <label htmlFor="cal-unit">Temperatures in</label>
              <select id="cal-unit" value={unit} onChange={(ev) => setUnit(ev.target.value as "C" | "F")}>
                <option value="C">°C</option>
                <option value="F">°F</option>
              </select>
            </div>
          </div>
          <div className="inline">
            <div className="field">
              <label htmlFor="cal-time">Time column{header[0] ? ` ("${header[0]}")` : ""}</label>
              <select id="cal-time" value={time} onChange={(ev) => setTime(ev.target.value as TimeChoice)}>
                {TIME_CHOICES.map((t) => (
                  <option key={t} value={t}>
                    {TIME_LABELS[t]}
                  </option>
                ))}
              </select>
            </div>
            <div className="field">
              <label htmlFor="cal-skip">Lines before the header</label>
              <input id="cal-skip" type="number" min={0} max={100} step={1} value={skipRows} onChange={(ev) => setSkipRows(Math.max(0, Math.min(100, Math.round(Number(ev.target.value) || 0))))} />
            </div>
          </div>
          {dateHint ? (
            <p className="banner warn" role="status" data-testid="cal-date-hint">
              {dateHint.replace(/\(--time[^)]*\)/, "")}: choose day first or month first above.
            </p>
          ) : null}
          <button type="button" className="secondary" disabled={!logText} onClick={() => loadText(logName, logText)}>
            Read the header again
          </button>
        </fieldset>
        {header.length > 1 ? (
          <fieldset className="group" data-testid="cal-columns">
            <legend>What each column measured</legend>
            {header.slice(1).map((h, i) => (
              <ColumnRow key={`${h}-${i}`} index={i} header={h || `column ${i + 2}`} value={mapping[i] ?? "-"} kind={kind} onChange={(v) => setMapping((m) => m.map((x, j) => (j === i ? v : x)))} />
            ))}
          </fieldset>
        ) : null}
        <fieldset className="group">
          <legend>Factors to fit</legend>
          {factorsOfKind.map((f) => (
            <label key={f} className="check">
              <input type="checkbox" checked={fit.includes(f)} onChange={(ev) => setFit((xs) => (ev.target.checked ? [...xs, f] : xs.filter((x) => x !== f)))} /> {FACTOR_LABELS[f as keyof typeof FACTOR_LABELS]}
            </label>
          ))}
          {kind === "hold" ? (
            <label className="check">
              <input type="checkbox" checked={useOutside} onChange={(ev) => setUseOutside(ev.target.checked)} /> A logged outside-air column replaces the route&apos;s air temperatures
            </label>
          ) : null}
        </fieldset>
        {inputErrors.length && !logProblems.length ? (
          <ul id="cal-input-problems" className="field-error" role="alert">
            {inputErrors.map((p) => (
              <li key={p}>{p}</li>
            ))}
          </ul>
        ) : null}
        <button
          type="button"
          data-testid="cal-fit"
          disabled={!checked?.success || logProblems.length > 0}
          aria-describedby={inputErrors.length ? "cal-input-problems" : undefined}
          onClick={() => {
            setSaved(null);
            setSaveProblem(null);
            setFitInput(candidate);
          }}
        >
          Fit the factors to the log
        </button>
      </form>

      <div className="planner-result">
        <section aria-labelledby="cal-before-title">
          <h2 id="cal-before-title">The log on the plan&apos;s chart</h2>
          {!logText ? (
            <p className="muted">Open or paste a logger file to see it beside the plan.</p>
          ) : typeof before === "string" ? (
            <p className="banner error" role="alert">
              {before}
            </p>
          ) : before ? (
            <>
              <ChartFromSpec spec={logChart("plan-log-chart", "Logged readings against the plan as it stands", [{ key: "plan", label: "plan", cmp: before, dashed: true }], units)} />
              <table className="facts-table" data-testid="plan-log-facts">
                <tbody>
                  <tr>
                    <th scope="row">Residual (logged − plan), RMS</th>
                    <td data-testid="plan-log-rms">{diff(before.rms_K)}</td>
                  </tr>
                  <tr>
                    <th scope="row">Largest gap</th>
                    <td data-testid="plan-log-max">
                      {diff(before.maxResidual_K)}
                      {before.maxResidualAt ? ` (${before.maxResidualAt.label}, ${formatDuration(before.maxResidualAt.t_s)} after the start)` : ""}
                    </td>
                  </tr>
                </tbody>
              </table>
              {before.warnings.length ? (
                <ul className="facts warnings">
                  {before.warnings.map((w) => (
                    <li key={w}>{w}</li>
                  ))}
                </ul>
              ) : null}
            </>
          ) : planState.status === "invalid" || planState.status === "error" ? (
            <PlannerOutcome state={planState} testId="cal-plan-errors" />
          ) : (
            <p className="muted" role="status">
              Working out the plan…
            </p>
          )}
        </section>
        {fitInput !== null ? (
          <section aria-labelledby="cal-fit-title" data-testid="cal-result">
            <h2 id="cal-fit-title">The fit</h2>
            <PlannerOutcome state={calState} testId="cal-errors" />
            {calReady ? (
              <>
                <PlanActions kind="calibrate" input={calState.parsed} csv={calState.csv} defaultName={`Calibration from ${logName}`} csvName="calibration.csv" />
                {kind === "hold" ? (
                  <div className="save-row no-print">
                    <label htmlFor="cal-box-name">Save the calibrated box as</label>
                    <input id="cal-box-name" value={boxName} placeholder="(box) — calibrated (log) (date)" maxLength={120} onChange={(ev) => setBoxName(ev.target.value)} aria-describedby={saveProblem ? "cal-save-problem" : undefined} />
                    <button
                      type="button"
                      data-testid="cal-save-box"
                      disabled={saving}
                      onClick={async () => {
                        setSaving(true);
                        setSaveProblem(null);
                        try {
                          const r = await saveCalibratedBoxAction({ input: fitInput, name: boxName.trim() || undefined });
                          if (r.ok) setSaved({ shipperName: r.shipperName, planId: r.planId });
                          else setSaveProblem(Object.values(r.fieldErrors).flat().join("; ") || "The box could not be saved");
                        } finally {
                          setSaving(false);
                        }
                      }}
                    >
                      {saving ? "Fitting and saving…" : "Save the calibrated box"}
                    </button>
                    {saveProblem ? (
                      <p id="cal-save-problem" className="field-error" role="alert">
                        {saveProblem}
                      </p>
                    ) : null}
                    {saved ? (
                      <p role="status" data-testid="cal-saved">
                        Saved the box &ldquo;{saved.shipperName}&rdquo; to the library. <a href={`/hold?plan=${saved.planId}`}>Plan with it</a>
                      </p>
                    ) : null}
                  </div>
                ) : (
                  <p className="muted no-print">
                    A thaw method is not a library template: the result&apos;s <code>calibration</code> object goes into a thaw input (its <code>calibration</code> field) to plan with the fitted surface factor.
                  </p>
                )}
              </>
            ) : null}
          </section>
        ) : null}
      </div>
    </div>
  );
}

/** The log read with the format (its JSON text): again only when either changes. */
function useParsedLog(text: string, formatKey: string) {
  return useMemo(() => (formatKey !== "null" && text ? parseLogCsv(text, JSON.parse(formatKey) as LogFormatInput) : null), [text, formatKey]);
}

/** The usual channel of the i-th column after the time column (lib/calibration/guess-format.ts DEFAULT_CHANNELS). */
function defaultMapping(kind: "hold" | "thaw", i: number): Mapping {
  const c = DEFAULT_CHANNELS[kind][i];
  return c ? `${c.role}${c.line ? `:${c.line}` : ""}${c.point === "surface" ? ":surface" : ""}` : "-";
}

function ColumnRow({ index, header, value, kind, onChange }: { index: number; header: string; value: Mapping; kind: "hold" | "thaw"; onChange: (v: Mapping) => void }) {
  const c = parseChannelSpec(value);
  const role = c && c !== "skip" ? c.role : "-";
  const line = c && c !== "skip" ? c.line : 0;
  const point = c && c !== "skip" ? c.point : "centre";
  const make = (r: string, l: number, p: string) => (r === "-" ? "-" : `${r}${l ? `:${l}` : ""}${p === "surface" ? ":surface" : ""}`);
  const roles = CHANNEL_ROLES.filter((r) => kind === "hold" || r === "product");
  return (
    <div className="inline" data-testid={`cal-column-${index}`}>
      <div className="field">
        <label htmlFor={`cal-col-${index}`}>&ldquo;{header}&rdquo;</label>
        <select id={`cal-col-${index}`} value={role} onChange={(ev) => onChange(make(ev.target.value, line, point))}>
          <option value="-">not used</option>
          {roles.map((r) => (
            <option key={r} value={r}>
              {CHANNEL_ROLE_LABELS[r]}
            </option>
          ))}
        </select>
      </div>
      {role === "product" || role === "pack" ? (
        <div className="field">
          <label htmlFor={`cal-line-${index}`}>{role === "product" ? "Product line" : "Pack line"}</label>
          <input id={`cal-line-${index}`} type="number" min={1} max={12} step={1} value={line + 1} onChange={(ev) => onChange(make(role, Math.max(0, Math.min(11, Math.round(Number(ev.target.value) || 1) - 1)), point))} />
        </div>
      ) : null}
      {role === "product" ? (
        <div className="field">
          <label htmlFor={`cal-point-${index}`}>Probe at</label>
          <select id={`cal-point-${index}`} value={point} onChange={(ev) => onChange(make(role, line, ev.target.value))}>
            <option value="centre">the centre</option>
            <option value="surface">the surface</option>
          </select>
        </div>
      ) : null}
    </div>
  );
}
