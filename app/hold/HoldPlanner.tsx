"use client";
import { ReopenedBanner, withSnapshot } from "@/app/_components/reopen";
import { Controller, useFieldArray, useForm, useWatch } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { DEFAULT_CONTACT_W_M2K, holdInputSchema, PLACEMENTS, type HoldInput, type HoldParsed } from "@/lib/schemas/hold";
import type { Material, Pack, Product, Route, RuleSet, Shipper } from "@/lib/schemas/templates";
import { holdPlanner } from "@/lib/planners/hold";
import { UnitInput } from "@/app/_components/UnitInput";
import { NamedSelect, FieldMessage, errorId } from "@/app/_components/ResultParts";
import { usePlanner } from "@/app/_components/usePlanner";
import { PlannerOutcome } from "@/app/_components/PlannerOutcome";
import { PlanActions } from "@/app/_components/PlanActions";

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
  // A reopened plan brings its own templates: offer them in the pickers even if the library changed.
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
      packs: packs.length ? [{ pack: pick(packs, /gel/i), count: 4, conditioning_C: pick(packs, /gel/i).conditioning_C, placement: "around", contactWith: null, contact_W_m2K: DEFAULT_CONTACT_W_M2K }] : [],
      route: routes[0],
      ruleSet: ruleSets.find((r) => r.name === props.defaultRuleSet) ?? ruleSets[0],
      boxStart_C: null,
    },
  });
  const { control, register, setValue, formState } = form;
  const productLines = useFieldArray({ control, name: "products" });
  const packLines = useFieldArray({ control, name: "packs" });
  const values = useWatch({ control }) as HoldInput;
  const outcome = usePlanner("hold", values);
  const e = formState.errors;

  return (
    <div className="planner hold">
      <ReopenedBanner name={props.reopened} />
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
                  <input id={`pc-${i}`} type="number" min={1} step={1} aria-invalid={!!e.products?.[i]?.count || undefined} aria-describedby={e.products?.[i]?.count ? errorId(`pc-${i}`) : undefined} {...register(`products.${i}.count`, { valueAsNumber: true })} />
                  <FieldMessage id={errorId(`pc-${i}`)} msg={e.products?.[i]?.count?.message} />
                </div>
                <div className="field">
                  <label htmlFor={`pt-${i}`}>Packed at</label>
                  <Controller control={control} name={`products.${i}.start_C`} render={({ field }) => <UnitInput id={`pt-${i}`} quantity="temperature" value={field.value as number} onChange={field.onChange} invalid={!!e.products?.[i]?.start_C} describedBy={e.products?.[i]?.start_C ? errorId(`pt-${i}`) : undefined} />} />
                  <FieldMessage id={errorId(`pt-${i}`)} msg={e.products?.[i]?.start_C?.message} />
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
                  <input id={`kc-${i}`} type="number" min={1} step={1} aria-invalid={!!e.packs?.[i]?.count || undefined} aria-describedby={e.packs?.[i]?.count ? errorId(`kc-${i}`) : undefined} {...register(`packs.${i}.count`, { valueAsNumber: true })} />
                  <FieldMessage id={errorId(`kc-${i}`)} msg={e.packs?.[i]?.count?.message} />
                </div>
                <div className="field">
                  <label htmlFor={`kt-${i}`}>Conditioned at</label>
                  <Controller control={control} name={`packs.${i}.conditioning_C`} render={({ field }) => <UnitInput id={`kt-${i}`} quantity="temperature" value={field.value as number} onChange={field.onChange} invalid={!!e.packs?.[i]?.conditioning_C} describedBy={e.packs?.[i]?.conditioning_C ? errorId(`kt-${i}`) : undefined} />} />
                  <FieldMessage id={errorId(`kt-${i}`)} msg={e.packs?.[i]?.conditioning_C?.message} />
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
          <button type="button" className="secondary" onClick={() => packLines.append({ pack: packs[0], count: 1, conditioning_C: packs[0].conditioning_C, placement: "around", contactWith: null, contact_W_m2K: DEFAULT_CONTACT_W_M2K })}>
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

      <section className="planner-results" aria-live="polite" aria-atomic="false" data-testid="hold-results">
        <PlannerOutcome state={outcome} testId="hold-errors" />
        {outcome.status === "ready" ? <PlanActions kind="hold" updating={outcome.stale} input={outcome.parsed} csv={outcome.csv} defaultName={holdPlanner.defaultName(outcome.parsed as HoldParsed)} csvName="holdline-hold-curves.csv" /> : null}
      </section>
    </div>
  );
}
