"use client";
import { useMemo, useRef, useState } from "react";
import { useRouter } from "next/navigation";
import { Controller, useFieldArray, useForm, useWatch } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { CartesianGrid, ResponsiveContainer, Scatter, ScatterChart, Tooltip, XAxis, YAxis, ZAxis, Legend } from "recharts";
import { sizeInputSchema, type SizeInput, type SizeParsed } from "@/lib/schemas/size";
import type { Material, Pack, Product, Route, RuleSet, Shipper } from "@/lib/schemas/templates";
import { planSizing, runSizing, candidateHoldInput, type SizingPlan, type SizingResult, type CandidateRow } from "@/lib/physics/sizing";
import { makePool, type FromWorker } from "@/lib/physics/sizing-worker";
import { fromDisplay, formatQuantity, roundForDisplay, toDisplay, unitLabel } from "@/lib/units";
import { formatDuration } from "@/lib/format";
import { UnitInput } from "@/app/_components/UnitInput";
import { useUnits } from "@/app/_components/units-context";
import { CautionBlock } from "@/app/_components/CautionBlock";
import { NamedSelect } from "@/app/_components/ResultParts";
import { savePlanAction } from "@/app/plans/actions";

type SortKey = "mass_kg" | "cost" | "outerVolume_m3" | "hold_s";

export function SizePlanner(props: { products: Product[]; shippers: Shipper[]; packs: Pack[]; routes: Route[]; ruleSets: RuleSet[]; materials: Material[]; defaultRuleSet: string }) {
  const units = useUnits();
  const router = useRouter();
  const { products, shippers, packs, routes, ruleSets, materials } = props;
  const tUnit = unitLabel("temperature", units);
  const lUnit = unitLabel("length", units);
  // Candidate boxes and packs: which are in, and their ranges, as the person types them.
  const [boxSel, setBoxSel] = useState<Record<string, { on: boolean; variants: string }>>(() => Object.fromEntries(shippers.map((s) => [s.name, { on: true, variants: "" }])));
  const [packSel, setPackSel] = useState<Record<string, { on: boolean; min: string; max: string; cond: string; cost: string }>>(() =>
    Object.fromEntries(
      packs.map((p) => [p.name, { on: p.kind !== "dry_ice", min: "0", max: "6", cond: String(roundForDisplay(toDisplay("temperature", p.conditioning_C, units), 4)), cost: "0" }]),
    ),
  );
  const form = useForm<SizeInput>({
    resolver: zodResolver(sizeInputSchema) as never,
    defaultValues: {
      products: [{ product: products.find((p) => /chicken/i.test(p.name)) ?? products[0], count: 1, start_C: 2 }],
      route: routes.find((r) => /overnight/i.test(r.name)) ?? routes[0],
      ruleSet: ruleSets.find((r) => r.name === props.defaultRuleSet) ?? ruleSets[0],
      materials,
      boxes: [],
      packs: [],
      margin: { kind: "percent", value: 20 },
      judgeBy: "low",
    },
  });
  const { control, register, setValue, handleSubmit, formState } = form;
  const lines = useFieldArray({ control, name: "products" });
  const values = useWatch({ control }) as SizeInput;
  const [running, setRunning] = useState<{ done: number; total: number } | null>(null);
  const [result, setResult] = useState<{ r: SizingResult; inp: SizeParsed; plan: SizingPlan } | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [sort, setSort] = useState<SortKey>("mass_kg");
  const [showAll, setShowAll] = useState(false);
  const stopRef = useRef<(() => void) | null>(null);

  const derived = () => {
    const boxes = shippers
      .filter((s) => boxSel[s.name]?.on)
      .map((s) => ({
        shipper: s,
        thicknessVariants_m: boxSel[s.name].variants
          .split(/[,;\s]+/)
          .filter(Boolean)
          .map((x) => fromDisplay("length", Number(x), units)),
      }));
    const ps = packs
      .filter((p) => packSel[p.name]?.on)
      .map((p) => {
        const s = packSel[p.name];
        return {
          pack: p,
          minCount: Number(s.min),
          maxCount: Number(s.max),
          conditioning_C: s.cond
            .split(/[,;\s]+/)
            .filter(Boolean)
            .map((x) => fromDisplay("temperature", Number(x), units)),
          placement: "around" as const,
          unitCost: Number(s.cost || 0),
        };
      });
    return { boxes, packs: ps };
  };

  async function start(inp: SizeParsed) {
    setError(null);
    setResult(null);
    let plan: SizingPlan;
    try {
      plan = planSizing(inp);
    } catch (e) {
      setError((e as Error).message);
      return;
    }
    const n = Math.max(1, Math.min(2, navigator.hardwareConcurrency || 2));
    const workers = Array.from({ length: n }, () => new Worker(new URL("./size.worker.ts", import.meta.url), { type: "module" }));
    let base = 0;
    let live = 0;
    setRunning({ done: 0, total: plan.candidates.length });
    const evaluate = makePool(
      workers.map((w) => ({ post: (m) => w.postMessage(m), onMessage: (f: (m: FromWorker) => void) => w.addEventListener("message", (e: MessageEvent<FromWorker>) => f(e.data)) })),
      inp,
      (k) => {
        live += k;
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
      setResult({ r, inp, plan });
    } catch (e) {
      setError((e as Error).message === "cancelled" ? "Stopped. Nothing was changed." : (e as Error).message);
    } finally {
      workers.forEach((w) => w.terminate());
      stopRef.current = null;
      setRunning(null);
    }
  }

  async function openAs(row: CandidateRow, where: "plan" | "sheet") {
    if (!result) return;
    const c = result.plan.candidates[row.index];
    const hold = { ...candidateHoldInput(result.inp, c, 0.5), uncertainty: result.inp.uncertainty };
    const name = `${row.boxName} + ${row.packs.map((p) => `${p.count} × ${p.name}`).join(", ")}`;
    const res = await savePlanAction({ kind: "hold", name, input: hold, result: { from: "pack-out sizer", hold_s: row.hold_s, mass_kg: row.mass_kg, cost: row.cost, outerVolume_m3: row.outerVolume_m3 } });
    if (res.ok) router.push(where === "plan" ? `/hold?plan=${res.id}` : `/size/sheet/${res.id}`);
  }

  const rows = useMemo(() => {
    if (!result) return [];
    const holding = result.r.candidates.filter((c) => c.holds);
    const key = (c: CandidateRow) => (sort === "hold_s" ? -(c.hold_s ?? Infinity) : c[sort]);
    return [...holding].sort((a, b) => {
      const pa = result.r.pareto.includes(a.index) ? 0 : 1;
      const pb = result.r.pareto.includes(b.index) ? 0 : 1;
      return pa - pb || key(a) - key(b);
    });
  }, [result, sort]);

  return (
    <div className="planner size">
      <form
        className="template-form planner-inputs"
        noValidate
        onSubmit={(ev) => {
          ev.preventDefault();
          const d = derived();
          setValue("boxes", d.boxes as never);
          setValue("packs", d.packs as never);
          void handleSubmit((inp) => start(inp as SizeParsed), () => setError("Some inputs need attention; see the messages beside them."))();
        }}
      >
        <fieldset className="group">
          <legend>Load</legend>
          {lines.fields.map((f, i) => (
            <div key={f.id} className="line">
              <div className="field">
                <label htmlFor={`sp-${i}`}>Product {i + 1}</label>
                <NamedSelect id={`sp-${i}`} items={products} value={values.products?.[i]?.product?.name} onChange={(x) => setValue(`products.${i}.product`, x)} />
              </div>
              <div className="inline">
                <div className="field">
                  <label htmlFor={`spc-${i}`}>How many</label>
                  <input id={`spc-${i}`} type="number" min={1} {...register(`products.${i}.count`, { valueAsNumber: true })} />
                </div>
                <div className="field">
                  <label htmlFor={`spt-${i}`}>Packed at</label>
                  <Controller control={control} name={`products.${i}.start_C`} render={({ field }) => <UnitInput id={`spt-${i}`} quantity="temperature" value={field.value as number} onChange={field.onChange} />} />
                </div>
                <button type="button" className="secondary" onClick={() => lines.remove(i)} aria-label={`Remove product ${i + 1}`}>
                  Remove
                </button>
              </div>
            </div>
          ))}
          <button type="button" className="secondary" onClick={() => lines.append({ product: products[0], count: 1, start_C: 3 })}>
            Add a product
          </button>
          {formState.errors.products?.message ? <p className="field-error">{formState.errors.products.message}</p> : null}
        </fieldset>
        <div className="field">
          <label htmlFor="s-route">Route</label>
          <NamedSelect id="s-route" items={routes} value={values.route?.name} onChange={(x) => setValue("route", x)} />
        </div>
        <div className="field">
          <label htmlFor="s-rules">Rule set</label>
          <NamedSelect id="s-rules" items={ruleSets} value={values.ruleSet?.name} onChange={(x) => setValue("ruleSet", x)} />
        </div>
        <div className="inline">
          <div className="field">
            <label htmlFor="s-margin">Margin</label>
            <input id="s-margin" type="number" min={0} step="any" {...register("margin.value", { valueAsNumber: true })} />
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
          {shippers.map((s) => (
            <div key={s.name} className="line">
              <label className="checkbox">
                <input type="checkbox" checked={boxSel[s.name]?.on ?? false} onChange={(e) => setBoxSel({ ...boxSel, [s.name]: { ...boxSel[s.name], on: e.target.checked } })} /> {s.name}
              </label>
              <div className="field">
                <label htmlFor={`bv-${s.name}`}>Also try insulation thicknesses ({lUnit}, comma-separated)</label>
                <input id={`bv-${s.name}`} value={boxSel[s.name]?.variants ?? ""} onChange={(e) => setBoxSel({ ...boxSel, [s.name]: { ...boxSel[s.name], variants: e.target.value } })} />
              </div>
            </div>
          ))}
        </fieldset>
        <fieldset className="group">
          <legend>Candidate packs</legend>
          {packs.map((p) => {
            const s = packSel[p.name];
            const set = (k: keyof typeof s, v: string | boolean) => setPackSel({ ...packSel, [p.name]: { ...s, [k]: v } });
            return (
              <div key={p.name} className="line">
                <label className="checkbox">
                  <input type="checkbox" checked={s.on} onChange={(e) => set("on", e.target.checked)} /> {p.name}
                </label>
                <div className="inline">
                  <div className="field">
                    <label htmlFor={`pmin-${p.name}`}>Fewest</label>
                    <input id={`pmin-${p.name}`} type="number" min={0} value={s.min} onChange={(e) => set("min", e.target.value)} />
                  </div>
                  <div className="field">
                    <label htmlFor={`pmax-${p.name}`}>Most</label>
                    <input id={`pmax-${p.name}`} type="number" min={0} value={s.max} onChange={(e) => set("max", e.target.value)} />
                  </div>
                  <div className="field">
                    <label htmlFor={`pcond-${p.name}`}>Conditioned at ({tUnit})</label>
                    <input id={`pcond-${p.name}`} value={s.cond} onChange={(e) => set("cond", e.target.value)} />
                  </div>
                  <div className="field">
                    <label htmlFor={`pcost-${p.name}`}>Cost each</label>
                    <input id={`pcost-${p.name}`} type="number" min={0} step="any" value={s.cost} onChange={(e) => set("cost", e.target.value)} />
                  </div>
                </div>
              </div>
            );
          })}
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

      <section className="planner-results" aria-live="polite" data-testid="size-results">
        {running ? (
          <div data-testid="size-progress">
            <p>
              Working: {running.done} of {running.total} candidates
            </p>
            <progress value={running.done} max={running.total} style={{ width: "100%" }} />
          </div>
        ) : null}
        {error ? (
          <div className="banner error" role="alert">
            <p>{error}</p>
            {formState.errors.boxes || formState.errors.packs ? (
              <ul>
                {[formState.errors.boxes?.message, formState.errors.packs?.message, ...(Array.isArray(formState.errors.packs) ? formState.errors.packs.map((e) => e?.maxCount?.message ?? e?.conditioning_C?.message) : [])]
                  .filter(Boolean)
                  .map((m) => (
                    <li key={m}>{m}</li>
                  ))}
              </ul>
            ) : null}
          </div>
        ) : null}
        {result ? <Results /> : !running ? <p className="muted">Choose the load, the route and the candidates, then find the pack-outs that hold.</p> : null}
        <CautionBlock dryIce={!!result?.inp.packs.some((p) => p.pack.kind === "dry_ice")} />
      </section>
    </div>
  );

  function Results() {
    const { r } = result!;
    const holding = r.candidates.filter((c) => c.holds);
    const front = holding.filter((c) => r.pareto.includes(c.index));
    return (
      <>
        <h2 data-testid="size-headline">
          {holding.length} of {r.candidates.length} candidates hold for {formatDuration(r.required_s)} ({formatDuration(r.routeLength_s)} route + margin)
        </h2>
        <p className="muted">
          {r.evaluated} run through the hold model, {r.pruned} decided by monotonicity (more of the same pack never shortens the hold), {r.doesNotFit} did not fit.
        </p>
        {r.message ? (
          <p className="banner conflict" role="status">
            {r.message}
          </p>
        ) : null}
        {holding.length ? (
          <>
            <div style={{ width: "100%", height: 260 }} data-testid="pareto-chart">
              <ResponsiveContainer>
                <ScatterChart margin={{ top: 10, right: 20, bottom: 24, left: 8 }}>
                  <CartesianGrid stroke="#e3e6e8" />
                  <XAxis dataKey="mass" type="number" name="packed mass" unit={` ${unitLabel("mass", units)}`} domain={["auto", "auto"]} />
                  <YAxis dataKey="cost" type="number" name="cost" domain={["auto", "auto"]} />
                  <ZAxis dataKey="vol" range={[30, 200]} name="outer volume (L)" />
                  <Tooltip />
                  <Legend verticalAlign="top" height={24} />
                  <Scatter name="holds" data={holding.filter((c) => !r.pareto.includes(c.index)).slice(0, 400).map((c) => ({ mass: roundForDisplay(toDisplay("mass", c.mass_kg, units), 4), cost: c.cost, vol: Math.round(c.outerVolume_m3 * 1000) }))} fill="#b9c2c7" isAnimationActive={false} />
                  <Scatter name="best trade-offs (Pareto front)" data={front.map((c) => ({ mass: roundForDisplay(toDisplay("mass", c.mass_kg, units), 4), cost: c.cost, vol: Math.round(c.outerVolume_m3 * 1000) }))} fill="#235a6b" isAnimationActive={false} />
                </ScatterChart>
              </ResponsiveContainer>
            </div>
            <table className="list" data-testid="size-table">
              <thead>
                <tr>
                  <th />
                  <th>Box</th>
                  <th>Packs</th>
                  {(
                    [
                      ["mass_kg", "Packed mass"],
                      ["cost", "Cost"],
                      ["outerVolume_m3", "Outer volume"],
                      ["hold_s", "Hold"],
                    ] as [SortKey, string][]
                  ).map(([k, label]) => (
                    <th key={k}>
                      <button type="button" className="link" onClick={() => setSort(k)} aria-pressed={sort === k}>
                        {label}
                        {sort === k ? " ▲" : ""}
                      </button>
                    </th>
                  ))}
                  <th />
                </tr>
              </thead>
              <tbody>
                {rows.slice(0, showAll ? 500 : 25).map((c) => (
                  <tr key={c.index} data-pareto={r.pareto.includes(c.index) || undefined}>
                    <td title={r.pareto.includes(c.index) ? "on the Pareto front" : ""}>{r.pareto.includes(c.index) ? "★" : ""}</td>
                    <td>{c.boxName}</td>
                    <td>{c.packs.map((p) => `${p.count} × ${p.name} at ${formatQuantity("temperature", p.conditioning_C, units, 3)}`).join("; ")}</td>
                    <td>{formatQuantity("mass", c.mass_kg, units, 3)}</td>
                    <td>{c.cost.toFixed(2)}</td>
                    <td>{(c.outerVolume_m3 * 1000).toFixed(1)} L</td>
                    <td>{c.pruned ? "holds (not run)" : c.hold_s === null ? `> ${formatDuration(r.required_s)}` : `${c.holdIsUpperBound ? "at most " : ""}${formatDuration(c.hold_s)}`}</td>
                    <td className="row-actions">
                      <button type="button" onClick={() => openAs(c, "plan")}>
                        Open as plan
                      </button>
                      <button type="button" className="secondary" onClick={() => openAs(c, "sheet")}>
                        Pack-out sheet
                      </button>
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
          </>
        ) : null}
        {r.nearMisses.length ? (
          <>
            <h3>Near misses</h3>
            <ul className="facts" data-testid="near-misses">
              {r.nearMisses.map((n) => {
                const c = r.candidates.find((x) => x.index === n.index)!;
                return (
                  <li key={n.index}>
                    {c.boxName} with {c.packs.map((p) => `${p.count} × ${p.name}`).join(", ")}: holds {formatDuration(n.hold_s)} — {n.reason}
                  </li>
                );
              })}
            </ul>
          </>
        ) : null}
        <h3>How it was judged</h3>
        <ul className="facts">
          <li>
            Every candidate is run through the hold model at the {result!.inp.judgeBy === "low" ? "low end of the uncertainty band: the shortest hold over the central run and every corner of the outer coefficient, insulation conductivity and conditioning spreads, the same runs as the hold planner's range (with sun no single corner is always the worst; only the conditioning side that provably cannot fail first is skipped)" : "central estimate"}.
          </li>
          <li>A candidate already short of three quarters of the required hold is not run at its remaining corners: its hold shows as &ldquo;at most&rdquo;.</li>
          <li>The Pareto front keeps each candidate that no other beats on packed mass, cost and outer volume at once.</li>
          <li>A wall-thickness variant adds (or saves) its insulation&rsquo;s mass, and its cost at the box&rsquo;s own insulation cost per m³ where given, else at the box&rsquo;s price spread over its shell volume (as if the price were all insulation).</li>
          <li>Packs are placed as each line says (&ldquo;around&rdquo; shares them over top, underneath and sides) and touch the load, as in the hold planner.</li>
          <li>Open a candidate as a plan to see its full curves and uncertainty band.</li>
        </ul>
      </>
    );
  }
}
