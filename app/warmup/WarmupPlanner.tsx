"use client";
import { useDeferredValue, useMemo, useState } from "react";
import { Controller, useForm, useWatch } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { warmupInputSchema, LIMIT_KINDS, LIMIT_LABELS, type WarmupInput } from "@/lib/schemas/warmup";
import type { Product, RuleSet } from "@/lib/schemas/templates";
import { runValidated } from "@/lib/schemas/run";
import { runWarmup, type WarmupResult } from "@/lib/physics/warmup";
import { formatQuantity, roundForDisplay, toDisplay, unitLabel } from "@/lib/units";
import { formatDuration } from "@/lib/format";
import { UnitInput } from "@/app/_components/UnitInput";
import { useUnits } from "@/app/_components/units-context";
import { useMounted } from "@/app/_components/useMounted";
import { CautionBlock } from "@/app/_components/CautionBlock";
import { NoResult, FactList, NamedSelect, FieldMessage, SavedNotice, ComplianceList } from "@/app/_components/ResultParts";
import { TemperatureChart } from "@/app/_components/TemperatureChart";
import { savePlanAction } from "@/app/plans/actions";


export function WarmupPlanner({ products, ruleSets, defaultRuleSet }: { products: Product[]; ruleSets: RuleSet[]; defaultRuleSet: string }) {
  const units = useUnits();
  const first = products.find((p) => /chicken/i.test(p.name)) ?? products[0];
  const form = useForm<WarmupInput>({
    resolver: zodResolver(warmupInputSchema) as never,
    mode: "onChange",
    defaultValues: {
      product: first,
      start_C: 4,
      surroundings: { medium: "air", T_C: 25, speed_m_s: 0, emissivity: 0.9, h_W_m2K: null },
      ruleSet: ruleSets.find((r) => r.name === defaultRuleSet) ?? ruleSets[0],
      limit: "chilledMax",
      horizon_s: 8 * 3600,
      method: "auto",
    },
  });
  const { control, register, setValue, formState } = form;
  const values = useWatch({ control }) as WarmupInput;
  const deferred = useDeferredValue(values);
  const key = JSON.stringify(deferred);
  const mounted = useMounted();
  const outcome = useMemo(() => {
    if (!mounted) return null;
    try {
      return runValidated(warmupInputSchema, JSON.parse(key), (input) => runWarmup(input));
    } catch (e) {
      return { ok: false as const, fieldErrors: { "": [(e as Error).message] } };
    }
  }, [key, mounted]);
  const [saved, setSaved] = useState<{ id: number } | null>(null);
  const [planName, setPlanName] = useState("");
  const e = formState.errors;
  const tUnit = unitLabel("temperature", units);

  return (
    <div className="planner">
      <form className="template-form planner-inputs" onSubmit={(ev) => ev.preventDefault()} noValidate>
        <div className="field">
          <label htmlFor="product">Product</label>
          <select
            id="product"
            value={values.product?.name}
            onChange={(ev) => {
              const p = products.find((x) => x.name === ev.target.value);
              if (p) setValue("product", p, { shouldValidate: true });
              setSaved(null);
            }}
          >
            {products.map((p) => (
              <option key={p.name}>{p.name}</option>
            ))}
          </select>
        </div>
        <div className="field">
          <label htmlFor="start_C">Starting temperature</label>
          <Controller control={control} name="start_C" render={({ field }) => <UnitInput id="start_C" quantity="temperature" value={field.value as number} onChange={field.onChange} invalid={!!e.start_C} />} />
          <FieldMessage msg={e.start_C?.message} />
        </div>
        <fieldset className="group">
          <legend>Surroundings</legend>
          <div className="grid">
            <div className="field">
              <label htmlFor="medium">In</label>
              <select id="medium" {...register("surroundings.medium")}>
                <option value="air">air</option>
                <option value="water">water</option>
              </select>
            </div>
            <div className="field">
              <label htmlFor="sur_T">Temperature</label>
              <Controller control={control} name="surroundings.T_C" render={({ field }) => <UnitInput id="sur_T" quantity="temperature" value={field.value as number} onChange={field.onChange} invalid={!!e.surroundings?.T_C} />} />
              <FieldMessage msg={e.surroundings?.T_C?.message} />
            </div>
            <div className="field">
              <label htmlFor="sur_speed">Air or water speed</label>
              <Controller control={control} name="surroundings.speed_m_s" render={({ field }) => <UnitInput id="sur_speed" quantity="speed" value={field.value as number} onChange={field.onChange} invalid={!!e.surroundings?.speed_m_s} />} />
              <FieldMessage msg={e.surroundings?.speed_m_s?.message} />
            </div>
            <div className="field">
              <label htmlFor="sur_eps">Surface emissivity</label>
              <Controller control={control} name="surroundings.emissivity" render={({ field }) => <UnitInput id="sur_eps" quantity="ratio" value={field.value as number} onChange={field.onChange} invalid={!!e.surroundings?.emissivity} />} />
              <FieldMessage msg={e.surroundings?.emissivity?.message} />
            </div>
            <div className="field">
              <label htmlFor="sur_h">Surface coefficient h (optional)</label>
              <Controller control={control} name="surroundings.h_W_m2K" render={({ field }) => <UnitInput id="sur_h" quantity="count" nullable value={field.value as number | null} onChange={field.onChange} invalid={!!e.surroundings?.h_W_m2K} />} />
              <p className="help">W/(m²·K). Leave empty to compute it from the correlations.</p>
              <FieldMessage msg={e.surroundings?.h_W_m2K?.message} />
            </div>
          </div>
        </fieldset>
        <div className="grid">
          <div className="field">
            <label htmlFor="ruleset">Rule set</label>
            <select
              id="ruleset"
              value={values.ruleSet?.name}
              onChange={(ev) => {
                const r = ruleSets.find((x) => x.name === ev.target.value);
                if (r) setValue("ruleSet", r, { shouldValidate: true });
              }}
            >
              {ruleSets.map((r) => (
                <option key={r.name}>{r.name}</option>
              ))}
            </select>
          </div>
          <div className="field">
            <label htmlFor="limit">Which limit</label>
            <select id="limit" {...register("limit")}>
              {LIMIT_KINDS.map((k) => (
                <option key={k} value={k}>
                  {LIMIT_LABELS[k]}
                </option>
              ))}
            </select>
          </div>
          <div className="field">
            <label htmlFor="horizon">Look ahead</label>
            <Controller control={control} name="horizon_s" render={({ field }) => <UnitInput id="horizon" quantity="duration" value={field.value as number} onChange={field.onChange} invalid={!!e.horizon_s} />} />
            <FieldMessage msg={e.horizon_s?.message} />
          </div>
          <div className="field">
            <label htmlFor="method">Method</label>
            <select id="method" {...register("method")}>
              <option value="auto">choose for me</option>
              <option value="lumped">lumped capacitance</option>
              <option value="series">exact series</option>
              <option value="numerical">numerical (with phase change)</option>
            </select>
          </div>
        </div>
      </form>

      <section className="planner-results" aria-live="polite" data-testid="warmup-results">
        {outcome?.ok ? (
          <Results result={outcome.result} tUnit={tUnit} />
        ) : !outcome ? (
          <p className="muted">Working it out…</p>
          ) : (
          <NoResult fieldErrors={outcome.fieldErrors} />
        )}
        {outcome?.ok ? (
          <div className="save-row">
            <label htmlFor="plan-name">Save as a plan</label>
            <input id="plan-name" value={planName} placeholder={`${values.product?.name ?? ""} from ${values.start_C} °C`} onChange={(ev) => setPlanName(ev.target.value)} />
            <button
              type="button"
              onClick={async () => {
                const input = JSON.parse(key);
                const r = outcome.result;
                const res = await savePlanAction({
                  kind: "warmup",
                  name: planName.trim() || `${input.product.name} from ${input.start_C} °C`,
                  input,
                  result: { method: r.method, limit_C: r.limit_C, timeToLimit_s: r.timeToLimit_s, biot: r.biotLumped, h_W_m2K: r.h_W_m2K, compliance: r.compliance, warnings: r.warnings, assumptions: r.assumptions },
                });
                if (res.ok) setSaved({ id: res.id });
              }}
            >
              Save plan
            </button>
            <SavedNotice id={saved?.id ?? null} />
          </div>
        ) : null}
        <CautionBlock />
      </section>
    </div>
  );

  function Results({ result: r, tUnit }: { result: WarmupResult; tUnit: string }) {
    const data = r.series.map((p) => ({
      t_h: p.t_s / 3600,
      center: roundForDisplay(toDisplay("temperature", p.center_C, units), 5),
      surface: roundForDisplay(toDisplay("temperature", p.surface_C, units), 5),
      midFace: roundForDisplay(toDisplay("temperature", p.midFace_C, units), 5),
      mean: roundForDisplay(toDisplay("temperature", p.mean_C, units), 5),
    }));
    const limitShown = roundForDisplay(toDisplay("temperature", r.limit_C, units), 4);
    const word = r.direction === "warming" ? "rises above" : "falls below";
    return (
      <>
        <h2>Estimated time until the food {word} {formatQuantity("temperature", r.limit_C, units)}</h2>
        <table className="list summary" data-testid="time-to-limit">
          <tbody>
            <tr>
              <th>Surface{r.surfacePoint === "corner" ? " (corner, first to cross)" : r.surfacePoint === "edge" ? " (rim, first to cross)" : r.surfacePoint === "mid-face" ? " (middle of the largest face)" : ""}</th>
              <td data-testid="ttl-surface">{r.timeToLimit_s.surface === null ? "not within the time looked at" : formatDuration(r.timeToLimit_s.surface)}</td>
            </tr>
            {r.surfacePoint === "corner" ? (
              <tr>
                <th>Edge</th>
                <td data-testid="ttl-edge">{r.timeToLimit_s.edge === null ? "not within the time looked at" : formatDuration(r.timeToLimit_s.edge)}</td>
              </tr>
            ) : null}
            {r.surfacePoint === "corner" || r.surfacePoint === "edge" ? (
              <tr>
                <th>Middle of the face</th>
                <td data-testid="ttl-midface">{r.timeToLimit_s.midFace === null ? "not within the time looked at" : formatDuration(r.timeToLimit_s.midFace)}</td>
              </tr>
            ) : null}
            <tr>
              <th>Centre</th>
              <td data-testid="ttl-center">{r.timeToLimit_s.center === null ? "not within the time looked at" : formatDuration(r.timeToLimit_s.center)}</td>
            </tr>
            <tr>
              <th>Mass average</th>
              <td data-testid="ttl-mean">{r.timeToLimit_s.mean === null ? "not within the time looked at" : formatDuration(r.timeToLimit_s.mean)}</td>
            </tr>
          </tbody>
        </table>
        <TemperatureChart
          data={data}
          unit={tUnit}
          limits={[{ y: limitShown, label: `limit ${limitShown} ${tUnit}` }]}
          lines={[
            { key: "surface", label: r.surfacePoint === "corner" ? "surface (corner)" : r.surfacePoint === "edge" ? "surface (rim)" : "surface", color: "#b4641e" },
            ...(r.surfacePoint === "corner" || r.surfacePoint === "edge" ? [{ key: "midFace", label: "middle of the face", color: "#c9a27a", dashed: true }] : []),
            { key: "center", label: "centre", color: "#235a6b" },
            { key: "mean", label: "mass average", color: "#6b7378", dashed: true },
          ]}
        />
        <ComplianceList lines={r.compliance} title="Against the rule set" />
        <h3>How this was worked out</h3>
        <p data-testid="method">
          <strong>Method: {r.method === "lumped" ? "lumped capacitance" : r.method === "series" ? "exact series" : "numerical enthalpy solver"}.</strong> {r.methodReason}.
        </p>
        <ul className="facts">
          <li>
            Biot number {r.biotLumped.toFixed(3)} on V/A; {r.biot.toFixed(3)} on the half-thickness {formatQuantity("length", r.biotLength_m, units)}. Fourier number at the end: {r.fourierAtHorizon.toFixed(2)}.
          </li>
          <li>
            Surface coefficient {r.h_W_m2K.toFixed(1)} W/(m²·K) (convection {r.hConvective_W_m2K.toFixed(1)}, radiation {r.hRadiative_W_m2K.toFixed(1)}).
          </li>
          <li>
            Properties: ρ {r.properties.rho_kg_m3.toFixed(0)} kg/m³, k {r.properties.k_W_mK.toFixed(3)} W/(m·K), c {(r.properties.c_J_kgK / 1000).toFixed(2)} kJ/(kg·K), initial freezing point {formatQuantity("temperature", r.properties.Tf_C, units, 3)}.
          </li>
          {r.estimates ? (
            <li>
              Closed-form thaw estimates (second opinion): Plank {formatDuration(r.estimates.plank_s)}, Pham {formatDuration(r.estimates.pham_s)}.
            </li>
          ) : null}
          {r.energyBalanceError !== null ? <li>Energy balance closes to {r.energyBalanceError.toExponential(1)} of the heat stored.</li> : null}
        </ul>
        <h3>Assumptions</h3>
        <ul className="facts" data-testid="assumptions">
          {r.assumptions.map((a) => (
            <li key={a}>{a}</li>
          ))}
          <li>The limit {limitShown} {tUnit} comes from the rule set &ldquo;{values.ruleSet?.name}&rdquo;, which you can edit in the library.</li>
        </ul>
        <FactList title="Warnings" items={r.warnings} warn testId="warnings" />
      </>
    );
  }
}
