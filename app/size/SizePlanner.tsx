"use client";
import { ReopenedBanner, withSnapshot } from "@/app/_components/reopen";
import { useEffect, useMemo, useRef, useState } from "react";
import { Controller, useFieldArray, useForm, useWatch, type FieldErrors, type FieldValues } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { CartesianGrid, ResponsiveContainer, Scatter, ScatterChart, Tooltip, XAxis, YAxis, ZAxis, Legend } from "recharts";
import { sizeInputSchema, type SizeInput, type SizeParsed } from "@/lib/schemas/size";
import { PLACEMENTS } from "@/lib/schemas/hold";
import { PACK_KIND_LABELS, type Material, type Pack, type Product, type Route, type RuleSet, type Shipper } from "@/lib/schemas/templates";
import { planSizing, runSizing, type SizingPlan, type SizingResult, type CandidateRow } from "@/lib/physics/sizing";
import { makePool, type FromWorker } from "@/lib/physics/sizing-worker";
import { sizePlanner, boxLabel, candidateHold, candidateHoldText, litres, type CandidateHandoff } from "@/lib/planners/size";
import { PLACEMENT_LABELS } from "@/lib/planners/hold";
import { encodeHandoff } from "@/lib/planners/handoff";
import { kit } from "@/lib/planners/view-kit";
import { localizeText, roundForDisplay, toDisplay, unitLabel } from "@/lib/units";
import { UnitInput } from "@/app/_components/UnitInput";
import { useUnits } from "@/app/_components/units-context";
import { CautionBlock } from "@/app/_components/CautionBlock";
import { NamedSelect, FieldMessage } from "@/app/_components/ResultParts";
import { PlanView } from "@/app/_components/PlanView";
import { PlanActions } from "@/app/_components/PlanActions";
import { UnitListInput } from "./UnitListInput";

type SortKey = "mass_kg" | "cost" | "outerVolume_m3" | "hold_s";

export interface SizePlannerProps {
  products: Product[];
  shippers: Shipper[];
  packs: Pack[];
  routes: Route[];
  ruleSets: RuleSet[];
  materials: Material[];
  defaultRuleSet: string;
  /** A saved sizing reopened (`/size?plan=ID`): its inputs, and the result the server stored, if readable. */
  initial?: SizeParsed;
  initialResult?: SizingResult;
  reopened?: string;
}

/** The first message anywhere inside a field's errors (a list's item errors included). */
function firstMessage(e: unknown): string | undefined {
  if (!e || typeof e !== "object") return undefined;
  const m = (e as { message?: unknown }).message;
  if (typeof m === "string" && m) return m;
  for (const v of Object.values(e as Record<string, unknown>)) {
    if (v && typeof v === "object" && v !== (e as { ref?: unknown }).ref) {
      const x = firstMessage(v);
      if (x) return x;
    }
  }
  return undefined;
}

/** Every message in the form's errors, for the summary shown once when "Find pack-outs" is pressed. */
function allMessages(e: FieldErrors<FieldValues>, out: string[] = []): string[] {
  for (const [k, v] of Object.entries(e)) {
    if (k === "ref" || !v || typeof v !== "object") continue;
    const m = (v as { message?: unknown }).message;
    if (typeof m === "string" && m && !out.includes(m)) out.push(m);
    allMessages(v as FieldErrors<FieldValues>, out);
  }
  return out;
}

/** An address that carries a candidate to the hold planner or its sheet, made once the row is shown. */
function HandoffLink({ to, carried, children, className }: { to: "/hold" | "/size/sheet"; carried: () => CandidateHandoff; children: React.ReactNode; className?: string }) {
  const [href, setHref] = useState<string | null>(null);
  const make = useRef(carried);
  useEffect(() => {
    let live = true;
    void encodeHandoff(make.current()).then((from) => live && setHref(`${to}?from=${from}`));
    return () => {
      live = false;
    };
  }, [to]);
  return href ? (
    <a className={className} href={href}>
      {children}
    </a>
  ) : (
    <span className={className} aria-disabled="true">
      {children}
    </span>
  );
}

export function SizePlanner(props: SizePlannerProps) {
  const units = useUnits();
  const k = kit(units);
  // A reopened sizing brings its own templates: offer them in the pickers even if the library changed.
  const init = props.initial;
  const products = withSnapshot(props.products, init?.products.map((l) => l.product) ?? []);
  const shippers = withSnapshot(props.shippers, init?.boxes.map((b) => b.shipper) ?? []);
  const packs = withSnapshot(props.packs, init?.packs.map((p) => p.pack) ?? []);
  const routes = withSnapshot(props.routes, [init?.route]);
  const ruleSets = withSnapshot(props.ruleSets, [init?.ruleSet]);
  const materials = withSnapshot(props.materials, init?.materials ?? []);
  const packLine = (p: Pack): SizeInput["packs"][number] => ({ pack: p, minCount: 0, maxCount: 6, conditioning_C: [p.conditioning_C], placement: "around", touchesLoad: true, unitCost: 0 });
  const form = useForm<SizeInput, unknown, SizeParsed>({
    resolver: zodResolver(sizeInputSchema),
    // Messages appear once a field is left, then follow each change; none is announced while typing.
    mode: "onTouched",
    defaultValues: (init as SizeInput | undefined) ?? {
      products: products.length ? [{ product: products.find((p) => /chicken/i.test(p.name)) ?? products[0], count: 1, start_C: 2 }] : [],
      route: routes.find((r) => /overnight/i.test(r.name)) ?? routes[0],
      ruleSet: ruleSets.find((r) => r.name === props.defaultRuleSet) ?? ruleSets[0],
      materials,
      boxes: shippers.map((s) => ({ shipper: s, thicknessVariants_m: [], extraInsulationCost_per_m3: null })),
      // Dry ice is offered but not tried unless asked for: it needs ventilation and UN 1845 marking.
      packs: packs.filter((p) => p.kind !== "dry_ice").map(packLine),
      margin: { kind: "percent", value: 20 },
      judgeBy: "low",
      boxStart_C: null,
    },
  });
  const { control, register, setValue, getValues, handleSubmit, formState } = form;
  const e = formState.errors;
  const productLines = useFieldArray({ control, name: "products" });
  const boxLines = useFieldArray({ control, name: "boxes" });
  const packLines = useFieldArray({ control, name: "packs" });
  const values = useWatch({ control }) as SizeInput;
  const [running, setRunning] = useState<{ done: number; total: number } | null>(null);
  const [result, setResult] = useState<{ r: SizingResult; inp: SizeParsed; plan: SizingPlan; ranWith: string } | null>(() => {
    if (!init || !props.initialResult) return null;
    try {
      return { r: props.initialResult, inp: init, plan: planSizing(init), ranWith: JSON.stringify(init) };
    } catch {
      return null;
    }
  });
  const [problem, setProblem] = useState<{ message: string; list: string[] } | null>(null);
  const [sort, setSort] = useState<SortKey>("mass_kg");
  const [showAll, setShowAll] = useState(false);
  const stopRef = useRef<(() => void) | null>(null);

  /** A line's message, named by its template: "Gel pack, 600 g: Most must be at least Fewest". */
  const named = (who: string | undefined, msg: string | undefined) => (msg ? `${who ? `${who}: ` : ""}${localizeText(msg, units)}` : undefined);
  const described = (id: string, msg: string | undefined) => ({ "aria-invalid": msg ? true : undefined, "aria-describedby": msg ? id : undefined });

  async function start(inp: SizeParsed) {
    setProblem(null);
    setResult(null);
    const ranWith = JSON.stringify(getValues());
    let plan: SizingPlan;
    try {
      plan = planSizing(inp);
    } catch (err) {
      setProblem({ message: localizeText((err as Error).message, units), list: [] });
      return;
    }
    const n = Math.max(1, Math.min(2, navigator.hardwareConcurrency || 2));
    const workers = Array.from({ length: n }, () => new Worker(new URL("./size.worker.ts", import.meta.url), { type: "module" }));
    let base = 0;
    let live = 0;
    setRunning({ done: 0, total: plan.candidates.length });
    const evaluate = makePool(
      workers.map((w) => ({ post: (m) => w.postMessage(m), onMessage: (f: (m: FromWorker) => void) => w.addEventListener("message", (ev: MessageEvent<FromWorker>) => f(ev.data)) })),
      inp,
      (c) => {
        live += c;
        setRunning({ done: Math.min(plan.candidates.length, base + live), total: plan.candidates.length });
      },
    );
    const signal = { aborted: false };
    stopRef.current = () => {
      signal.aborted = true;
      workers.forEach((w) => w.terminate());
      evaluate.cancel();
    };
    try {
      const r = await runSizing(inp, (idx) => evaluate(idx), {
        signal,
        onProgress: (d, t) => {
          base = d;
          live = 0;
          setRunning({ done: d, total: t });
        },
      });
      setResult({ r, inp, plan, ranWith });
    } catch (err) {
      setProblem({ message: (err as Error).message === "cancelled" ? "Stopped. Nothing was changed." : localizeText((err as Error).message, units), list: [] });
    } finally {
      workers.forEach((w) => w.terminate());
      stopRef.current = null;
      setRunning(null);
    }
  }

  const rows = useMemo(() => {
    if (!result) return [];
    const holding = result.r.candidates.filter((c) => c.holds);
    const key = (c: CandidateRow) => (sort === "hold_s" ? -(c.pruned ? Infinity : (c.hold_s ?? Infinity)) : c[sort]);
    return [...holding].sort((a, b) => {
      const pa = result.r.pareto.includes(a.index) ? 0 : 1;
      const pb = result.r.pareto.includes(b.index) ? 0 : 1;
      return pa - pb || key(a) - key(b) || a.index - b.index;
    });
  }, [result, sort]);
  const view = useMemo(() => (result ? sizePlanner.view(result.inp, result.r, units) : null), [result, units]);
  const csv = useMemo(() => (result ? sizePlanner.csv(result.inp, result.r, units) : []), [result, units]);
  const stale = !!result && JSON.stringify(values) !== result.ranWith;

  return (
    <div className="planner size">
      <ReopenedBanner name={props.reopened} what="sizing" />
      <form
        className="template-form planner-inputs no-print"
        noValidate
        onSubmit={(ev) =>
          void handleSubmit(
            (inp) => start(inp),
            (errs) => setProblem({ message: "Some inputs need attention; see the messages beside them.", list: allMessages(errs).map((m) => localizeText(m, units)) }),
          )(ev)
        }
      >
        <fieldset className="group">
          <legend>Load</legend>
          {productLines.fields.map((f, i) => {
            const who = values.products?.[i]?.product?.name;
            const mc = named(who, e.products?.[i]?.count?.message);
            const mt = named(who, e.products?.[i]?.start_C?.message);
            return (
              <div key={f.id} className="line" data-testid={`product-line-${i}`}>
                <div className="field">
                  <label htmlFor={`sp-${i}`}>Product {i + 1}</label>
                  <NamedSelect id={`sp-${i}`} items={products} value={who} onChange={(x) => setValue(`products.${i}.product`, x, { shouldValidate: true })} />
                </div>
                <div className="inline">
                  <div className="field">
                    <label htmlFor={`spc-${i}`}>How many</label>
                    <input id={`spc-${i}`} type="number" min={1} step={1} {...register(`products.${i}.count`, { valueAsNumber: true })} {...described(`spc-${i}-msg`, mc)} />
                    <FieldMessage id={`spc-${i}-msg`} msg={mc} />
                  </div>
                  <div className="field">
                    <label htmlFor={`spt-${i}`}>Packed at</label>
                    <Controller
                      control={control}
                      name={`products.${i}.start_C`}
                      render={({ field }) => <UnitInput id={`spt-${i}`} quantity="temperature" value={field.value as number} onChange={field.onChange} onBlur={field.onBlur} invalid={!!mt} describedBy={mt ? `spt-${i}-msg` : undefined} />}
                    />
                    <FieldMessage id={`spt-${i}-msg`} msg={mt} />
                  </div>
                  <button type="button" className="secondary" onClick={() => productLines.remove(i)} aria-label={`Remove product ${i + 1}${who ? ` (${who})` : ""}`}>
                    Remove
                  </button>
                </div>
              </div>
            );
          })}
          <button type="button" className="secondary" onClick={() => productLines.append({ product: products[0], count: 1, start_C: 3 })}>
            Add a product
          </button>
          <FieldMessage id="products-msg" msg={e.products?.message ?? e.products?.root?.message} />
        </fieldset>
        <div className="field">
          <label htmlFor="s-route">Route</label>
          <NamedSelect id="s-route" items={routes} value={values.route?.name} onChange={(x) => setValue("route", x, { shouldValidate: true })} />
        </div>
        <div className="field">
          <label htmlFor="s-rules">Rule set</label>
          <NamedSelect id="s-rules" items={ruleSets} value={values.ruleSet?.name} onChange={(x) => setValue("ruleSet", x, { shouldValidate: true })} />
        </div>
        <div className="inline">
          <div className="field">
            <label htmlFor="s-margin">Margin</label>
            <input id="s-margin" type="number" min={0} step="any" {...register("margin.value", { valueAsNumber: true })} {...described("s-margin-msg", e.margin?.value?.message)} />
            <FieldMessage id="s-margin-msg" msg={e.margin?.value?.message} />
          </div>
          <div className="field">
            <label htmlFor="s-mkind">as</label>
            <select id="s-mkind" {...register("margin.kind")}>
              <option value="percent">% of the route</option>
              <option value="hours">hours</option>
            </select>
          </div>
        </div>
        <div className="field">
          <label htmlFor="s-judge">Judge by</label>
          <select id="s-judge" {...register("judgeBy")}>
            <option value="low">the low end of the uncertainty band (more cautious)</option>
            <option value="central">the central estimate</option>
          </select>
        </div>
        <fieldset className="group">
          <legend>Candidate boxes</legend>
          {boxLines.fields.map((f, i) => {
            const who = values.boxes?.[i]?.shipper?.name;
            const mv = named(who, firstMessage(e.boxes?.[i]?.thicknessVariants_m));
            return (
              <div key={f.id} className="line" data-testid={`box-line-${i}`}>
                <div className="field">
                  <label htmlFor={`bx-${i}`}>Box {i + 1}</label>
                  <NamedSelect id={`bx-${i}`} items={shippers} value={who} onChange={(x) => setValue(`boxes.${i}.shipper`, x, { shouldValidate: true })} />
                </div>
                <div className="inline">
                  <div className="field">
                    <label htmlFor={`bv-${i}`}>Also try insulation thicknesses</label>
                    <Controller
                      control={control}
                      name={`boxes.${i}.thicknessVariants_m`}
                      render={({ field }) => (
                        <UnitListInput id={`bv-${i}`} quantity="length" placeholder="none; e.g. 30, 50" value={field.value} onChange={field.onChange} onBlur={field.onBlur} invalid={!!mv} describedBy={mv ? `bv-${i}-msg` : undefined} />
                      )}
                    />
                    <FieldMessage id={`bv-${i}-msg`} msg={mv} />
                  </div>
                  <button type="button" className="secondary" onClick={() => boxLines.remove(i)} aria-label={`Remove box ${i + 1}${who ? ` (${who})` : ""}`}>
                    Remove
                  </button>
                </div>
              </div>
            );
          })}
          <button
            type="button"
            className="secondary"
            onClick={() => boxLines.append({ shipper: shippers.find((s) => !values.boxes?.some((b) => b?.shipper?.name === s.name)) ?? shippers[0], thicknessVariants_m: [], extraInsulationCost_per_m3: null })}
          >
            Add a box
          </button>
          <FieldMessage id="boxes-msg" msg={e.boxes?.message ?? e.boxes?.root?.message} />
        </fieldset>
        <fieldset className="group">
          <legend>Candidate packs</legend>
          {packLines.fields.map((f, i) => {
            const line = values.packs?.[i];
            const who = line?.pack?.name;
            const dry = line?.pack?.kind === "dry_ice";
            const pe = e.packs?.[i];
            const mMin = named(who, pe?.minCount?.message);
            const mMax = named(who, pe?.maxCount?.message);
            const mCond = named(who, firstMessage(pe?.conditioning_C));
            const mCost = named(who, pe?.unitCost?.message);
            return (
              <div key={f.id} className="line" data-testid={`pack-line-${i}`}>
                <div className="field">
                  <label htmlFor={`pk-${i}`}>Pack {i + 1}</label>
                  <NamedSelect
                    id={`pk-${i}`}
                    items={packs}
                    value={who}
                    onChange={(p) => {
                      setValue(`packs.${i}.pack`, p, { shouldValidate: true });
                      setValue(`packs.${i}.conditioning_C`, [p.conditioning_C], { shouldValidate: true });
                    }}
                  />
                  {line?.pack?.kind ? <p className="muted">{PACK_KIND_LABELS[line.pack.kind]}</p> : null}
                </div>
                <div className="inline">
                  <div className="field">
                    <label htmlFor={`pmin-${i}`}>Fewest</label>
                    <input id={`pmin-${i}`} type="number" min={0} step={1} {...register(`packs.${i}.minCount`, { valueAsNumber: true, deps: [`packs.${i}.maxCount`] })} {...described(`pmin-${i}-msg`, mMin)} />
                    <FieldMessage id={`pmin-${i}-msg`} msg={mMin} />
                  </div>
                  <div className="field">
                    <label htmlFor={`pmax-${i}`}>Most</label>
                    <input id={`pmax-${i}`} type="number" min={0} step={1} {...register(`packs.${i}.maxCount`, { valueAsNumber: true })} {...described(`pmax-${i}-msg`, mMax)} />
                    <FieldMessage id={`pmax-${i}-msg`} msg={mMax} />
                  </div>
                  <div className="field">
                    {dry ? <span className="muted">Conditioned: as delivered</span> : <label htmlFor={`pcond-${i}`}>Conditioned at</label>}
                    {dry ? null : (
                      <Controller
                        control={control}
                        name={`packs.${i}.conditioning_C`}
                        render={({ field }) => (
                          <UnitListInput id={`pcond-${i}`} quantity="temperature" value={field.value} onChange={field.onChange} onBlur={field.onBlur} invalid={!!mCond} describedBy={mCond ? `pcond-${i}-msg` : undefined} />
                        )}
                      />
                    )}
                    <FieldMessage id={`pcond-${i}-msg`} msg={mCond} />
                  </div>
                  <div className="field">
                    <label htmlFor={`pcost-${i}`}>Cost each</label>
                    <input id={`pcost-${i}`} type="number" min={0} step="any" {...register(`packs.${i}.unitCost`, { valueAsNumber: true })} {...described(`pcost-${i}-msg`, mCost)} />
                    <FieldMessage id={`pcost-${i}-msg`} msg={mCost} />
                  </div>
                </div>
                <div className="inline">
                  <div className="field">
                    <label htmlFor={`ppl-${i}`}>Placed</label>
                    <select id={`ppl-${i}`} {...register(`packs.${i}.placement`)}>
                      {PLACEMENTS.map((p) => (
                        <option key={p} value={p}>
                          {PLACEMENT_LABELS[p]}
                        </option>
                      ))}
                    </select>
                  </div>
                  <label className="checkbox">
                    <input type="checkbox" {...register(`packs.${i}.touchesLoad`)} /> touching the load
                  </label>
                  <button type="button" className="secondary" onClick={() => packLines.remove(i)} aria-label={`Remove pack ${i + 1}${who ? ` (${who})` : ""}`}>
                    Remove
                  </button>
                </div>
              </div>
            );
          })}
          <button type="button" className="secondary" onClick={() => packLines.append(packLine(packs.find((p) => !values.packs?.some((l) => l?.pack?.name === p.name)) ?? packs[0]))}>
            Add a pack
          </button>
          <FieldMessage id="packs-msg" msg={e.packs?.message ?? e.packs?.root?.message} />
        </fieldset>
        <div className="form-actions">
          <button type="submit" disabled={!!running}>
            Find pack-outs
          </button>
          {running ? (
            <button type="button" className="danger" onClick={() => stopRef.current?.()}>
              Stop
            </button>
          ) : null}
        </div>
      </form>

      <section className="planner-results" data-testid="size-results">
        {running ? (
          <div data-testid="size-progress" role="status" aria-live="polite">
            <p>
              Working: {running.done} of {running.total} candidates
            </p>
            <progress value={running.done} max={running.total} style={{ width: "100%" }} aria-label="Candidates worked out" />
          </div>
        ) : null}
        {problem ? (
          <div className="banner error" role="alert" data-testid="size-errors">
            <p>{problem.message}</p>
            {problem.list.length ? (
              <ul>
                {problem.list.map((m) => (
                  <li key={m}>{m}</li>
                ))}
              </ul>
            ) : null}
          </div>
        ) : null}
        {result && view ? (
          <>
            {stale ? (
              <p className="banner conflict no-print" role="status">
                The inputs changed since this search: press &ldquo;Find pack-outs&rdquo; to search again. Saving keeps the search shown.
              </p>
            ) : null}
            <PlanView view={view} stale={stale} />
            {candidates()}
            <PlanActions kind="size" input={result.inp} csv={csv} defaultName={sizePlanner.defaultName(result.inp)} csvName="holdline-pack-out-candidates.csv" csvLabel="Download candidates (CSV)" />
          </>
        ) : !running ? (
          <>
            <p className="muted">Choose the load, the route and the candidates, then find the pack-outs that hold.</p>
            <CautionBlock />
          </>
        ) : null}
      </section>
    </div>
  );

  /** The interactive part: the trade-off chart and every candidate that holds, each with its two ways on. */
  function candidates() {
    const { r, inp, plan } = result!;
    const holding = r.candidates.filter((c) => c.holds);
    if (!holding.length) return null;
    const front = holding.filter((c) => r.pareto.includes(c.index));
    const point = (c: CandidateRow) => ({ mass: roundForDisplay(toDisplay("mass", c.mass_kg, units), 4), cost: c.cost, vol: Math.round(c.outerVolume_m3 * 1000) });
    const carried = (c: CandidateRow) => (): CandidateHandoff => ({ input: candidateHold(inp, plan.candidates[c.index]) });
    return (
      <section className="no-print">
        <h3>Trade-offs</h3>
        <div style={{ width: "100%", height: 260 }} data-testid="pareto-chart" role="img" aria-label={`Packed mass against cost of the ${holding.length} candidates that hold; ${front.length} are best trade-offs`}>
          <ResponsiveContainer>
            <ScatterChart margin={{ top: 10, right: 20, bottom: 24, left: 8 }}>
              <CartesianGrid stroke="#e3e6e8" />
              <XAxis dataKey="mass" type="number" name="packed mass" unit={` ${unitLabel("mass", units)}`} domain={["auto", "auto"]} />
              <YAxis dataKey="cost" type="number" name="cost" domain={["auto", "auto"]} />
              <ZAxis dataKey="vol" range={[30, 200]} name="outer volume (L)" />
              <Tooltip />
              <Legend verticalAlign="top" height={24} />
              <Scatter name="holds" data={holding.filter((c) => !r.pareto.includes(c.index)).slice(0, 400).map(point)} fill="#b9c2c7" isAnimationActive={false} />
              <Scatter name="best trade-offs" data={front.map(point)} fill="#235a6b" isAnimationActive={false} />
            </ScatterChart>
          </ResponsiveContainer>
        </div>
        <h3>Candidates that hold</h3>
        <table className="list" data-testid="size-table">
          <thead>
            <tr>
              <th scope="col">
                <span className="visually-hidden">Best trade-off</span>
              </th>
              <th scope="col">Box</th>
              <th scope="col">Packs</th>
              {(
                [
                  ["mass_kg", "Packed mass"],
                  ["cost", "Cost"],
                  ["outerVolume_m3", "Outer volume"],
                  ["hold_s", "Hold"],
                ] as [SortKey, string][]
              ).map(([key, label]) => (
                <th key={key} scope="col" aria-sort={sort === key ? (key === "hold_s" ? "descending" : "ascending") : undefined}>
                  <button type="button" className="link" onClick={() => setSort(key)} aria-pressed={sort === key}>
                    {label}
                    {sort === key ? " ▲" : ""}
                  </button>
                </th>
              ))}
              <th scope="col">
                <span className="visually-hidden">Open</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {rows.slice(0, showAll ? 500 : 25).map((c) => (
              <tr key={c.index} data-pareto={r.pareto.includes(c.index) || undefined}>
                <td title={r.pareto.includes(c.index) ? "a best trade-off" : ""}>{r.pareto.includes(c.index) ? "★" : ""}</td>
                <td>{boxLabel(c.boxName, k)}</td>
                <td>{c.packs.map((p) => `${p.count} × ${p.name} at ${k.temp(p.conditioning_C)}`).join("; ")}</td>
                <td>{k.mass(c.mass_kg)}</td>
                <td>{c.cost.toFixed(2)}</td>
                <td>{litres(c.outerVolume_m3)}</td>
                <td>{candidateHoldText(c, r.required_s, k)}</td>
                <td className="row-actions">
                  <HandoffLink to="/hold" carried={carried(c)} className="button">
                    Open in the hold planner
                  </HandoffLink>{" "}
                  <HandoffLink to="/size/sheet" carried={carried(c)} className="button secondary">
                    Pack-out sheet
                  </HandoffLink>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
        {rows.length > 25 ? (
          <p className="muted">
            Showing {showAll ? Math.min(500, rows.length) : 25} of {rows.length} that hold, best trade-offs first.{" "}
            <button type="button" className="link" onClick={() => setShowAll(!showAll)}>
              {showAll ? "Show fewer" : "Show more"}
            </button>
          </p>
        ) : null}
        <p className="muted">Opening a candidate saves nothing: save it from the hold planner, or save this sizing below.</p>
      </section>
    );
  }
}
