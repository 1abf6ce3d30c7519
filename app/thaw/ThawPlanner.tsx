"use client";
import { useDeferredValue, useMemo, useState } from "react";
import { Controller, useForm, useWatch, type Control } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { thawInputSchema, THAW_METHODS, THAW_METHOD_LABELS, type ThawInput, type ThawMethodKind } from "@/lib/schemas/thaw";
import type { Material, Product, RuleSet } from "@/lib/schemas/templates";
import { runValidated } from "@/lib/schemas/run";
import { runThawParsed, defaultMethod, DEFAULT_TRAY, type ThawMethodResult, type ThawResult } from "@/lib/physics/thaw";
import { formatQuantity, roundForDisplay, toDisplay, unitLabel, type Quantity } from "@/lib/units";
import { formatDuration } from "@/lib/format";
import { UnitInput } from "@/app/_components/UnitInput";
import { useUnits } from "@/app/_components/units-context";
import { useMounted } from "@/app/_components/useMounted";
import { CautionBlock } from "@/app/_components/CautionBlock";
import { NoResult, FactList, NamedSelect, SavedNotice, ComplianceList } from "@/app/_components/ResultParts";
import { TemperatureChart } from "@/app/_components/TemperatureChart";
import { savePlanAction } from "@/app/plans/actions";

function Num({ control, name, id, label, quantity, nullable }: { control: Control<ThawInput>; name: string; id: string; label: string; quantity: Quantity; nullable?: boolean }) {
  return (
    <div className="field">
      <label htmlFor={id}>{label}</label>
      <Controller control={control} name={name as never} render={({ field, fieldState }) => (
        <>
          <UnitInput id={id} quantity={quantity} nullable={nullable} value={field.value as number | null} onChange={field.onChange} invalid={!!fieldState.error} />
          {fieldState.error ? <p className="field-error" role="alert">{fieldState.error.message}</p> : null}
        </>
      )} />
    </div>
  );
}

const when = (iso: string | null) => (iso ? new Date(iso).toLocaleString(undefined, { weekday: "short", day: "numeric", month: "short", hour: "2-digit", minute: "2-digit" }) : "—");

export function ThawPlanner({ products, ruleSets, trays, defaultRuleSet }: { products: Product[]; ruleSets: RuleSet[]; trays: Material[]; defaultRuleSet: string }) {
  const units = useUnits();
  const first = products.find((p) => /turkey|bird/i.test(p.name)) ?? products[0];
  const trayChoices = trays.length ? trays : [DEFAULT_TRAY];
  const defaultTray = trayChoices.find((t) => /aluminium/i.test(t.name)) ?? trayChoices[0];
  const form = useForm<ThawInput>({
    resolver: zodResolver(thawInputSchema) as never,
    mode: "onChange",
    defaultValues: {
      product: first,
      start_C: -18,
      endMargin_K: 0.5,
      endPoint_C: null,
      ruleSet: ruleSets.find((r) => r.name === defaultRuleSet) ?? ruleSets[0],
      method: defaultMethod("fridge_air", null)!,
      compare: true,
      readyBy: null,
    },
  });
  const { control, register, setValue } = form;
  const values = useWatch({ control }) as ThawInput;
  const key = JSON.stringify(useDeferredValue(values));
  const mounted = useMounted();
  const outcome = useMemo(() => {
    if (!mounted) return null;
    try {
      return runValidated(thawInputSchema, JSON.parse(key), (input) => runThawParsed(input));
    } catch (e) {
      return { ok: false as const, fieldErrors: { "": [(e as Error).message] } };
    }
  }, [key, mounted]);
  const [saved, setSaved] = useState<number | null>(null);
  const kind = values.method?.kind as ThawMethodKind;
  const [readyText, setReadyText] = useState("");

  return (
    <div className="planner thaw">
      <form className="template-form planner-inputs" onSubmit={(ev) => ev.preventDefault()} noValidate>
        <div className="field">
          <label htmlFor="product">Frozen item</label>
          <NamedSelect id="product" items={products} value={values.product?.name} onChange={(x) => setValue("product", x, { shouldValidate: true })} />
        </div>
        <Num control={control} name="start_C" id="start_C" label="Starting temperature" quantity="temperature" />
        <div className="field">
          <label htmlFor="method">Method</label>
          <select
            id="method"
            value={kind}
            onChange={(ev) => {
              const k = ev.target.value as ThawMethodKind;
              setValue("method", defaultMethod(k, k === "tray" ? defaultTray : null)!, { shouldValidate: true });
            }}
          >
            {THAW_METHODS.map((k) => (
              <option key={k} value={k}>
                {THAW_METHOD_LABELS[k]}
              </option>
            ))}
          </select>
          {kind === "room_air" ? <p className="help">Room-air thawing is not an approved method under most food codes; it is shown for comparison.</p> : null}
          <p className="help">Microwave thawing and thawing as part of cooking are outside this model.</p>
        </div>
        <fieldset className="group">
          <legend>{THAW_METHOD_LABELS[kind] ?? "Settings"}</legend>
          {kind === "fridge_air" || kind === "room_air" || kind === "tray" ? (
            <>
              <Num control={control} name="method.air_C" id="air_C" label="Air temperature" quantity="temperature" />
              <Num control={control} name="method.speed_m_s" id="air_speed" label="Air speed" quantity="speed" />
            </>
          ) : null}
          {kind === "tray" ? (
            <>
              <div className="field">
                <label htmlFor="tray">Tray material</label>
                <select
                  id="tray"
                  value={(values.method as { tray?: Material }).tray?.name}
                  onChange={(ev) => setValue("method.tray" as never, trayChoices.find((t) => t.name === ev.target.value) as never, { shouldValidate: true })}
                >
                  {trayChoices.map((t) => (
                    <option key={t.name}>{t.name}</option>
                  ))}
                </select>
              </div>
              <Num control={control} name="method.trayThickness_m" id="tray_t" label="Tray thickness" quantity="length" />
              <Num control={control} name="method.trayLength_m" id="tray_l" label="Tray length" quantity="length" />
              <Num control={control} name="method.trayWidth_m" id="tray_w" label="Tray width" quantity="length" />
              <Num control={control} name="method.contact_W_m2K" id="contact" label="Contact conductance" quantity="conductance" />
              <div className="field checkbox">
                <label>
                  <input type="checkbox" {...register("method.undersideExposed" as never)} /> Tray on a rack (underside in the air)
                </label>
              </div>
            </>
          ) : null}
          {kind === "running_water" || kind === "still_water" ? <Num control={control} name="method.water_C" id="water_C" label="Water temperature" quantity="temperature" /> : null}
          {kind === "running_water" ? <Num control={control} name="method.speed_m_s" id="water_speed" label="Water speed" quantity="speed" /> : null}
          {kind === "still_water" ? (
            <>
              <Num control={control} name="method.bath_m3" id="bath" label="Water in the sink or tub" quantity="volume" />
              <Num control={control} name="method.changeEvery_s" id="change" label="Change the water every" quantity="shortDuration" />
              <Num control={control} name="method.room_C" id="room" label="Room air" quantity="temperature" />
            </>
          ) : null}
        </fieldset>
        <div className="field">
          <label htmlFor="ruleset">Rule set</label>
          <NamedSelect id="ruleset" items={ruleSets} value={values.ruleSet?.name} onChange={(x) => setValue("ruleSet", x, { shouldValidate: true })} />
        </div>
        <div className="field">
          <label htmlFor="margin">Thawed when the centre is this far above its freezing point</label>
          <input id="margin" type="number" step="0.1" min="0" {...register("endMargin_K", { valueAsNumber: true })} />
          <p className="help">K (kelvin)</p>
        </div>
        <div className="field">
          <label htmlFor="ready">Ready by</label>
          <input
            id="ready"
            type="datetime-local"
            value={readyText}
            onChange={(ev) => {
              setReadyText(ev.target.value);
              setValue("readyBy", ev.target.value ? new Date(ev.target.value).toISOString() : null, { shouldValidate: true });
            }}
          />
        </div>
      </form>

      <section className="planner-results" aria-live="polite" data-testid="thaw-results">
        {outcome?.ok ? (
          <ThawResults r={outcome.result} />
        ) : !outcome ? (
          <p className="muted">Working it out…</p>
          ) : (
          <NoResult fieldErrors={outcome.fieldErrors} testId="thaw-errors" />
        )}
        {outcome?.ok ? (
          <div className="save-row">
            <button
              type="button"
              onClick={async () => {
                const r = outcome.result;
                const res = await savePlanAction({
                  kind: "thaw",
                  name: `${values.product?.name}: ${THAW_METHOD_LABELS[kind]}`,
                  input: JSON.parse(key),
                  result: { thawTime_s: r.thawTime_s, surfaceAboveLimit_s: r.surfaceAboveLimit_s, maxSurface_C: r.maxSurface_C, compliance: r.compliance, estimates: r.estimates, startBy: r.startBy, warnings: r.warnings },
                });
                if (res.ok) setSaved(res.id);
              }}
            >
              Save plan
            </button>
            <SavedNotice id={saved} />
          </div>
        ) : null}
        <CautionBlock extra={outcome?.ok ? outcome.result.advice : []} />
      </section>
    </div>
  );

  function ThawResults({ r }: { r: ThawResult }) {
    const tUnit = unitLabel("temperature", units);
    const T = (x: number) => roundForDisplay(toDisplay("temperature", x, units), 5);
    const data = r.series.map((p) => ({ t_h: p.t_s / 3600, center: T(p.center_C), surface: T(p.surface_C) }));
    return (
      <>
        <h2 data-testid="thaw-headline">
          {r.thawTime_s === null ? "Not thawed within the time looked at" : `Estimated thaw time: ${formatDuration(r.thawTime_s)}`} — {r.label.toLowerCase()}
        </h2>
        <table className="list summary">
          <tbody>
            <tr>
              <th>Thaw time</th>
              <td data-testid="thaw-time">{formatDuration(r.thawTime_s)} (centre to {formatQuantity("temperature", r.endPoint_C, units, 3)})</td>
            </tr>
            <tr>
              <th>Surface above {formatQuantity("temperature", r.chillLimit_C, units, 3)}</th>
              <td data-testid="surface-above">{formatDuration(r.surfaceAboveLimit_s)}</td>
            </tr>
            <tr>
              <th>Warmest surface</th>
              <td>{formatQuantity("temperature", r.maxSurface_C, units, 3)}</td>
            </tr>
            {r.startBy ? (
              <tr>
                <th>Start by</th>
                <td data-testid="start-by">{when(r.startBy)}</td>
              </tr>
            ) : null}
            <tr>
              <th>Second opinion</th>
              <td>
                Plank {formatDuration(r.estimates.plank_s)}, Pham {formatDuration(r.estimates.pham_s)}{" "}
                <span className="muted" data-testid="estimate-inputs">
                  (closed-form, with the model&rsquo;s latent heat {(r.estimates.inputs.latent_J_kg / 1000).toFixed(0)} kJ/kg and sensible specific heats {(r.estimates.inputs.cFrozen_J_kgK / 1000).toFixed(2)} frozen, {(r.estimates.inputs.cUnfrozen_J_kgK / 1000).toFixed(2)} thawed kJ/(kg·K); why they differ is under Assumptions)
                </span>
              </td>
            </tr>
          </tbody>
        </table>
        <ComplianceList lines={r.compliance} />
        <TemperatureChart
          data={data}
          unit={tUnit}
          limits={[{ y: T(r.chillLimit_C), label: `chill limit ${T(r.chillLimit_C)} ${tUnit}` }]}
          lines={[
            { key: "surface", label: "surface", color: "#b4641e" },
            { key: "center", label: "centre", color: "#235a6b" },
          ]}
        />
        {r.comparison ? (
          <>
            <h3>Methods side by side</h3>
            <table className="list" data-testid="thaw-compare">
              <thead>
                <tr>
                  <th>Method</th>
                  <th>Thaw time</th>
                  <th>Surface above limit</th>
                  <th>Compliance</th>
                  <th>Start by</th>
                  <th>Fridge space × time</th>
                </tr>
              </thead>
              <tbody>
                {r.comparison.map((m: ThawMethodResult) => (
                  <tr key={m.kind} data-kind={m.kind}>
                    <td>
                      {m.label}
                      {m.kind === "tray" ? <div className="muted">{(m.settings as { tray: Material }).tray.name}</div> : null}
                    </td>
                    <td className="thaw-h">{formatDuration(m.thawTime_s)}</td>
                    <td>{formatDuration(m.surfaceAboveLimit_s)}</td>
                    <td>{m.compliance.every((c) => c.status === "meets") ? "meets the rule set" : m.compliance.filter((c) => c.status !== "meets").map((c) => c.status).join(", ")}</td>
                    <td>{when(m.startBy)}</td>
                    <td>{m.fridgeSpaceTime_m3h === null ? "—" : `${(m.fridgeSpaceTime_m3h * 1000).toFixed(0)} L·h`}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </>
        ) : null}
        {r.notes.length ? (
          <ul className="facts">
            {r.notes.map((n) => (
              <li key={n}>{n}</li>
            ))}
          </ul>
        ) : null}
        <h3>Assumptions</h3>
        <ul className="facts">
          {r.assumptions.map((a) => (
            <li key={a}>{a}</li>
          ))}
          <li>Energy balance closes to {r.energyBalanceError.toExponential(1)} of the heat stored.</li>
        </ul>
        <FactList title="Warnings" items={r.warnings} warn />
      </>
    );
  }
}
