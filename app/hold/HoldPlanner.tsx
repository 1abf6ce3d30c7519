"use client";
import { useDeferredValue, useMemo, useState } from "react";
import { Controller, useFieldArray, useForm, useWatch } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { holdInputSchema, PLACEMENTS, type HoldInput, type HoldParsed } from "@/lib/schemas/hold";
import type { Material, Pack, Product, Route, RuleSet, Shipper } from "@/lib/schemas/templates";
import { runValidated } from "@/lib/schemas/run";
import { runHoldParsed, type HoldResult } from "@/lib/physics/hold";
import { formatQuantity, roundForDisplay, toDisplay, unitLabel } from "@/lib/units";
import { formatDuration } from "@/lib/format";
import { UnitInput } from "@/app/_components/UnitInput";
import { useUnits } from "@/app/_components/units-context";
import { useMounted } from "@/app/_components/useMounted";
import { CautionBlock } from "@/app/_components/CautionBlock";
import { NoResult, FactList, NamedSelect, FieldMessage, SavedNotice, ComplianceList } from "@/app/_components/ResultParts";
import { TemperatureChart } from "@/app/_components/TemperatureChart";
import { downloadCsv } from "@/app/_components/csv";
import { savePlanAction } from "@/app/plans/actions";

const PALETTE = ["#235a6b", "#b4641e", "#5a7d2a", "#7b4b94", "#9a3b3b", "#2f6fb0"];
const WH = 3600;


export interface HoldPlannerProps {
  products: Product[];
  shippers: Shipper[];
  packs: Pack[];
  routes: Route[];
  ruleSets: RuleSet[];
  materials: Material[];
  defaultRuleSet: string;
  initial?: HoldInput;
  reopened?: string;
}

export function HoldPlanner(props: HoldPlannerProps) {
  const units = useUnits();
  // A reopened plan brings its own templates: offer them in the pickers even if the library changed.
  const withSnapshot = <T extends { name: string }>(xs: T[], extra: (T | undefined)[]) => [...xs, ...extra.filter((x): x is T => !!x && !xs.some((y) => y.name === x.name))];
  const init = props.initial;
  const products = withSnapshot(props.products, init?.products?.map((l) => l.product as Product) ?? []);
  const shippers = withSnapshot(props.shippers, [init?.shipper as Shipper | undefined]);
  const packs = withSnapshot(props.packs, init?.packs?.map((l) => l.pack as Pack) ?? []);
  const routes = withSnapshot(props.routes, [init?.route as Route | undefined]);
  const ruleSets = withSnapshot(props.ruleSets, [init?.ruleSet as RuleSet | undefined]);
  const materials = withSnapshot(props.materials, (init?.materials as Material[] | undefined) ?? []);
  const pick = <T extends { name: string }>(xs: T[], re: RegExp) => xs.find((x) => re.test(x.name)) ?? xs[0];
  const form = useForm<HoldInput>({
    resolver: zodResolver(holdInputSchema) as never,
    mode: "onChange",
    defaultValues: props.initial ?? {
      products: products.length ? [{ product: pick(products, /chicken/i), count: 1, start_C: 2 }] : [],
      shipper: pick(shippers, /thick/i),
      materials,
      packs: packs.length ? [{ pack: pick(packs, /gel/i), count: 4, conditioning_C: pick(packs, /gel/i).conditioning_C, placement: "around", contactWith: null, contact_W_m2K: 50 }] : [],
      route: routes[0],
      ruleSet: ruleSets.find((r) => r.name === props.defaultRuleSet) ?? ruleSets[0],
      boxStart_C: null,
    },
  });
  const { control, register, setValue, formState } = form;
  const productLines = useFieldArray({ control, name: "products" });
  const packLines = useFieldArray({ control, name: "packs" });
  const values = useWatch({ control }) as HoldInput;
  const key = JSON.stringify(useDeferredValue(values));
  const mounted = useMounted();
  const outcome = useMemo(() => {
    if (!mounted) return null;
    try {
      return runValidated(holdInputSchema, JSON.parse(key), (input) => ({ r: runHoldParsed(input), input }));
    } catch (e) {
      return { ok: false as const, fieldErrors: { "": [(e as Error).message] } };
    }
  }, [key, mounted]);
  const [saved, setSaved] = useState<number | null>(null);
  const [planName, setPlanName] = useState("");
  const e = formState.errors;
  const tUnit = unitLabel("temperature", units);

  return (
    <div className="planner hold">
      {props.reopened ? (
        <p className="banner ok no-print" role="status" style={{ gridColumn: "1 / -1" }}>
          Reopened the saved plan &ldquo;{props.reopened}&rdquo; with the templates as they were when it was saved.
        </p>
      ) : null}
      <form className="template-form planner-inputs no-print" onSubmit={(ev) => ev.preventDefault()} noValidate>
        <fieldset className="group">
          <legend>Load</legend>
          {productLines.fields.map((f, i) => (
            <div key={f.id} className="line" data-testid={`product-line-${i}`}>
              <div className="field">
                <label htmlFor={`p-${i}`}>Product {i + 1}</label>
                <NamedSelect id={`p-${i}`} items={products} value={values.products?.[i]?.product?.name} onChange={(x) => setValue(`products.${i}.product`, x, { shouldValidate: true })} />
              </div>
              <div className="inline">
                <div className="field">
                  <label htmlFor={`pc-${i}`}>How many</label>
                  <input id={`pc-${i}`} type="number" min={1} step={1} {...register(`products.${i}.count`, { valueAsNumber: true })} />
                  <FieldMessage msg={e.products?.[i]?.count?.message} />
                </div>
                <div className="field">
                  <label htmlFor={`pt-${i}`}>Packed at</label>
                  <Controller control={control} name={`products.${i}.start_C`} render={({ field }) => <UnitInput id={`pt-${i}`} quantity="temperature" value={field.value as number} onChange={field.onChange} invalid={!!e.products?.[i]?.start_C} />} />
                  <FieldMessage msg={e.products?.[i]?.start_C?.message} />
                </div>
                <button type="button" className="secondary" onClick={() => productLines.remove(i)} aria-label={`Remove product ${i + 1}`}>
                  Remove
                </button>
              </div>
            </div>
          ))}
          <button type="button" className="secondary" onClick={() => productLines.append({ product: products[0], count: 1, start_C: 3 })}>
            Add a product
          </button>
        </fieldset>
        <div className="field">
          <label htmlFor="shipper">Box</label>
          <NamedSelect id="shipper" items={shippers} value={values.shipper?.name} onChange={(x) => setValue("shipper", x, { shouldValidate: true })} />
        </div>
        <div className="field">
          <label htmlFor="boxStart">Box temperature when packed (empty = first segment&apos;s air)</label>
          <Controller control={control} name="boxStart_C" render={({ field }) => <UnitInput id="boxStart" quantity="temperature" nullable value={field.value as number | null} onChange={field.onChange} />} />
        </div>
        <fieldset className="group">
          <legend>Coolant packs</legend>
          {packLines.fields.map((f, i) => (
            <div key={f.id} className="line" data-testid={`pack-line-${i}`}>
              <div className="field">
                <label htmlFor={`k-${i}`}>Pack {i + 1}</label>
                <select
                  id={`k-${i}`}
                  value={values.packs?.[i]?.pack?.name}
                  onChange={(ev) => {
                    const p = packs.find((x) => x.name === ev.target.value)!;
                    setValue(`packs.${i}.pack`, p, { shouldValidate: true });
                    setValue(`packs.${i}.conditioning_C`, p.conditioning_C, { shouldValidate: true });
                  }}
                >
                  {packs.map((p) => (
                    <option key={p.name}>{p.name}</option>
                  ))}
                </select>
              </div>
              <div className="inline">
                <div className="field">
                  <label htmlFor={`kc-${i}`}>How many</label>
                  <input id={`kc-${i}`} type="number" min={1} step={1} {...register(`packs.${i}.count`, { valueAsNumber: true })} />
                  <FieldMessage msg={e.packs?.[i]?.count?.message} />
                </div>
                <div className="field">
                  <label htmlFor={`kt-${i}`}>Conditioned at</label>
                  <Controller control={control} name={`packs.${i}.conditioning_C`} render={({ field }) => <UnitInput id={`kt-${i}`} quantity="temperature" value={field.value as number} onChange={field.onChange} />} />
                  <FieldMessage msg={e.packs?.[i]?.conditioning_C?.message} />
                </div>
              </div>
              <div className="inline">
                <div className="field">
                  <label htmlFor={`kp-${i}`}>Placed</label>
                  <select id={`kp-${i}`} {...register(`packs.${i}.placement`)}>
                    {PLACEMENTS.map((p) => (
                      <option key={p}>{p}</option>
                    ))}
                  </select>
                </div>
                <div className="field">
                  <label htmlFor={`kx-${i}`}>Touching</label>
                  <select
                    id={`kx-${i}`}
                    value={values.packs?.[i]?.contactWith ?? ""}
                    onChange={(ev) => setValue(`packs.${i}.contactWith`, ev.target.value === "" ? null : ev.target.value === "none" ? "none" : Number(ev.target.value), { shouldValidate: true })}
                  >
                    <option value="">the whole load</option>
                    <option value="none">nothing (kept apart from the load)</option>
                    {(values.products ?? []).map((p, j) => (
                      <option key={j} value={j}>
                        product {j + 1}
                      </option>
                    ))}
                  </select>
                </div>
                <button type="button" className="secondary" onClick={() => packLines.remove(i)} aria-label={`Remove pack ${i + 1}`}>
                  Remove
                </button>
              </div>
            </div>
          ))}
          <button type="button" className="secondary" onClick={() => packLines.append({ pack: packs[0], count: 1, conditioning_C: packs[0].conditioning_C, placement: "around", contactWith: null, contact_W_m2K: 50 })}>
            Add a pack
          </button>
        </fieldset>
        <div className="field">
          <label htmlFor="route">Route</label>
          <NamedSelect id="route" items={routes} value={values.route?.name} onChange={(x) => setValue("route", x, { shouldValidate: true })} />
        </div>
        <div className="field">
          <label htmlFor="ruleset">Rule set</label>
          <NamedSelect id="ruleset" items={ruleSets} value={values.ruleSet?.name} onChange={(x) => setValue("ruleSet", x, { shouldValidate: true })} />
        </div>
      </form>

      <section className="planner-results" aria-live="polite" data-testid="hold-results">
        {outcome?.ok ? (
          <HoldResults r={outcome.result.r} input={outcome.result.input} tUnit={tUnit} />
        ) : !outcome ? (
          <p className="muted">Working it out…</p>
          ) : (
          <NoResult fieldErrors={outcome.fieldErrors} testId="hold-errors" />
        )}
        {outcome?.ok ? (
          <div className="save-row no-print">
            <label htmlFor="plan-name">Save as a plan</label>
            <input id="plan-name" value={planName} placeholder={`${values.shipper?.name} on ${values.route?.name}`} onChange={(ev) => setPlanName(ev.target.value)} />
            <button
              type="button"
              onClick={async () => {
                const r = outcome.result.r;
                const res = await savePlanAction({
                  kind: "hold",
                  name: planName.trim() || `${values.shipper?.name} on ${values.route?.name}`,
                  input: JSON.parse(key),
                  result: { holdTime_s: r.holdTime_s, margin_s: r.margin_s, failsFirst: r.failsFirst, band: r.band, heatGain_J: r.heatGain_J, energyBalanceError: r.energyBalanceError, compliance: r.compliance, warnings: r.warnings },
                });
                if (res.ok) setSaved(res.id);
              }}
            >
              Save plan
            </button>
            <button type="button" className="secondary" onClick={() => downloadCsv("holdline-hold-curves.csv", csvRows(outcome.result.r, outcome.result.input))}>
              Download curves (CSV)
            </button>
            <button type="button" className="secondary" onClick={() => window.print()}>
              Print plan record
            </button>
            <SavedNotice id={saved} />
          </div>
        ) : null}
        <CautionBlock dryIce={outcome?.ok === true && outcome.result.r.hasDryIce} extra={outcome?.ok === true && outcome.result.r.hasDryIce ? ["Carbon dioxide from dry ice builds up in closed vans and cold rooms: open the load space before reaching in."] : []} />
        <div className="print-only sign-off">
          <h2>Packing record</h2>
          <p>Packed by: ____________________ &nbsp; Date and time: ____________________</p>
          <p>Probe readings when packed (product, °C or °F): ____________________________________________</p>
          <p>Probe readings on arrival: _____________________________________________________________</p>
        </div>
      </section>
    </div>
  );

  function HoldResults({ r, input, tUnit }: { r: HoldResult; input: HoldParsed; tUnit: string }) {
    const T = (x: number) => roundForDisplay(toDisplay("temperature", x, units), 5);
    const data = r.series.map((p) => {
      const row: Record<string, number> = { t_h: p.t_s / 3600, air: T(p.air_C), airLo: T(p.airLower_C), airUp: T(p.airUpper_C) };
      p.products.forEach((q, j) => {
        row[`c${j}`] = T(q.center_C);
        row[`s${j}`] = T(q.surface_C);
      });
      p.packs.forEach((k, j) => {
        row[`k${j}`] = T(k.T_C);
        row[`l${j}`] = Math.round(k.latentLeft * 1000) / 10;
      });
      return row;
    });
    const lines = [
      { key: "airLo", label: "inside air, lower half", color: "#6b7378", dashed: true },
      { key: "airUp", label: "inside air, upper half", color: "#a0a6aa", dashed: true },
      ...input.products.flatMap((p, j) => [
        { key: `c${j}`, label: `${p.product.name} — centre`, color: PALETTE[j % PALETTE.length] },
        { key: `s${j}`, label: `${p.product.name} — surface`, color: PALETTE[j % PALETTE.length], dashed: true },
      ]),
    ];
    const limits: { y: number; label: string }[] = [];
    r.bands.forEach((b) => {
      if (b.upper_C !== null && !limits.some((l) => l.y === T(b.upper_C!))) limits.push({ y: T(b.upper_C), label: `upper ${T(b.upper_C)} ${tUnit}` });
      if (b.lower_C !== null && !limits.some((l) => l.y === T(b.lower_C!))) limits.push({ y: T(b.lower_C), label: `lower ${T(b.lower_C)} ${tUnit}` });
    });
    const b0 = r.bands[0];
    const band = b0 ? { y1: T(b0.lower_C ?? Math.min(...data.map((d) => Math.min(...lines.map((l) => d[l.key] ?? 0)))) - 1), y2: T(b0.upper_C ?? Math.max(...data.map((d) => d.c0 ?? 0)) + 1) } : null;
    const markers = [
      ...r.segments.slice(1).map((s) => ({ x: s.start_s / 3600, label: s.label, kind: "segment" as const })),
      { x: r.routeLength_s / 3600, label: "route ends", kind: "segment" as const },
      ...r.openings_s.map((t) => ({ x: t / 3600, label: "", kind: "stop" as const })),
    ];
    const gains = r.heatGain_J;
    const total = gains.sides + gains.base + gains.lid + gains.edgesAndCorners + gains.lidOpenings;
    const ff = r.failsFirst;
    return (
      <>
        <div className="print-only">
          <h1>Holdline plan record</h1>
          <p>
            Box: {input.shipper.name}. Route: {input.route.name} ({formatDuration(r.routeLength_s)}). Rule set: {input.ruleSet.name}.
          </p>
          <p>Load: {input.products.map((p) => `${p.count} × ${p.product.name} packed at ${formatQuantity("temperature", p.start_C, units)}`).join("; ") || "none"}.</p>
          <p>Packs: {input.packs.map((k) => `${k.count} × ${k.pack.name} conditioned at ${formatQuantity("temperature", k.conditioning_C, units)}, ${k.placement}`).join("; ") || "none"}.</p>
        </div>
        <h2 data-testid="hold-headline">
          {r.holdTime_s === null
            ? `Estimated to stay inside its band for the whole route (${formatDuration(r.routeLength_s)})`
            : `Estimated to leave its band after ${formatDuration(r.holdTime_s)} of a ${formatDuration(r.routeLength_s)} route`}
        </h2>
        <table className="list summary" data-testid="hold-summary">
          <tbody>
            <tr>
              <th>Hold time</th>
              <td data-testid="hold-time">{r.band.central === null ? `more than ${formatDuration(r.routeLength_s + (r.margin_s ?? 0))}` : formatDuration(r.band.central)}</td>
            </tr>
            <tr>
              <th>Margin on the route</th>
              <td data-testid="hold-margin">
                {r.margin_s === null ? "—" : `${r.margin_s < 0 ? "short by " : r.marginIsLowerBound ? "at least " : ""}${formatDuration(Math.abs(r.margin_s))}`}
              </td>
            </tr>
            <tr>
              <th>Range (uncertainty)</th>
              <td data-testid="hold-band">
                {r.band.low === null ? "beyond the time simulated" : formatDuration(r.band.low)} – {r.band.high === null ? "beyond the time simulated" : formatDuration(r.band.high)}
              </td>
            </tr>
            <tr>
              <th>Fails first</th>
              <td>{ff ? `${ff.product}, ${ff.point}, crossing the ${ff.limit} limit ${formatQuantity("temperature", ff.limit_C, units)}` : "nothing within the time simulated"}</td>
            </tr>
          </tbody>
        </table>
        <TemperatureChart data={data} unit={tUnit} lines={lines} limits={limits} band={band} markers={markers} />
        {input.packs.length ? (
          <>
            <h3>Coolant left</h3>
            <TemperatureChart
              testId="pack-chart"
              height={200}
              data={data}
              unit="% latent left"
              limits={[]}
              lines={input.packs.map((k, j) => ({ key: `l${j}`, label: `${k.pack.name} × ${k.count}`, color: PALETTE[(j + 2) % PALETTE.length] }))}
            />
            {r.hasDryIce ? (
              <p>
                Dry ice left at the end: {formatQuantity("mass", r.series.at(-1)!.packs.reduce((a, p, j) => a + (input.packs[j].pack.kind === "dry_ice" ? p.massLeft_kg : 0), 0), units)}; CO₂ gas given off: about {r.co2Released_m3.toFixed(2)} m³.
              </p>
            ) : null}
          </>
        ) : null}
        <h3>Where the heat came in during the route</h3>
        <table className="list" data-testid="heat-gain">
          <thead>
            <tr>
              <th>Path</th>
              <th>Wh</th>
            </tr>
          </thead>
          <tbody>
            {(
              [
                ["Side walls", gains.sides],
                ["Base", gains.base],
                ["Lid", gains.lid],
                ["Edges and corners", gains.edgesAndCorners],
                ["Lid openings", gains.lidOpenings],
                ["Total", total],
              ] as const
            ).map(([k, v]) => (
              <tr key={k}>
                <td>{k}</td>
                <td>{(v / WH).toFixed(1)}</td>
              </tr>
            ))}
          </tbody>
        </table>
        <p className="muted">
          Each face&rsquo;s figure is the net heat through it from outside: air, sun and sky together (negative where the face lost heat).
        </p>
        <p className="muted">
          Energy balance:{" "}
          {r.energyBalanceError === null
            ? `not meaningful — almost no heat moved (less than would change the contents by a thousandth of a kelvin; absolute difference ${Math.abs(r.energyBalanceError_J).toExponential(1)} J).`
            : `stored heat equals heat in to ${r.energyBalanceError.toExponential(1)} (relative).`} Box UA ≈ {r.ua.total_W_K.toFixed(2)} W/K (walls {r.ua.walls_W_K.toFixed(2)}, lid {r.ua.lid_W_K.toFixed(2)}, edges and corners {r.ua.edges_W_K.toFixed(2)}) with an outer coefficient of {r.outerH_W_m2K[0].toFixed(1)} and an inner one of {r.innerH_W_m2K.toFixed(1)} W/(m²·K).
        </p>
        <h3>Bands used</h3>
        <ul className="facts">
          {input.products.map((p, j) => {
            const b = r.bands[j];
            return (
              <li key={j}>
                {p.product.name} ({b.mode}): {b.lower_C !== null ? `not below ${formatQuantity("temperature", b.lower_C, units)} (${b.lowerReason})` : ""}
                {b.lower_C !== null && b.upper_C !== null ? ", " : ""}
                {b.upper_C !== null ? `not above ${formatQuantity("temperature", b.upper_C, units)}` : ""} — from &ldquo;{input.ruleSet.name}&rdquo;
              </li>
            );
          })}
        </ul>
        <ComplianceList lines={r.compliance} title="Out of its band: against the rule set" />
        <FactList title="Assumptions" items={r.assumptions} testId="assumptions" />
        <FactList title="Warnings" items={r.warnings} warn />
      </>
    );
  }
}

function csvRows(r: HoldResult, input: HoldParsed): Record<string, number | string | null>[] {
  return r.series.map((p) => {
    const row: Record<string, number | string | null> = { t_s: Math.round(p.t_s), inside_air_C: round3(p.air_C), inside_air_lower_C: round3(p.airLower_C), inside_air_upper_C: round3(p.airUpper_C) };
    p.products.forEach((q, j) => {
      const n = input.products[j].product.name;
      row[`${n} center_C`] = round3(q.center_C);
      row[`${n} surface_C`] = round3(q.surface_C);
    });
    p.packs.forEach((k, j) => {
      const n = input.packs[j].pack.name;
      row[`${n} T_C`] = round3(k.T_C);
      row[`${n} latent_left`] = round3(k.latentLeft);
      if (input.packs[j].pack.kind === "dry_ice") row[`${n} mass_left_kg`] = round3(k.massLeft_kg);
    });
    return row;
  });
}

const round3 = (x: number) => Math.round(x * 1000) / 1000;
