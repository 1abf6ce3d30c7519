"use client";
import { ReopenedBanner, withSnapshot } from "@/app/_components/reopen";
import type { ReactNode } from "react";
import { Controller, get, useForm, useWatch } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import {
  coolInputSchema,
  coolMethodSchema,
  COOL_METHODS,
  COOL_METHOD_LABELS,
  GASTRONORM_DEPTHS_M,
  GASTRONORM_SIZES,
  GASTRONORM_SIZE_NAMES,
  PAN_MATERIALS,
  PAN_MATERIAL_NAMES,
  SUPPORTS,
  type CoolInput,
  type CoolMethodKind,
  type CoolParsed,
} from "@/lib/schemas/cool";
import type { Product, RuleSet } from "@/lib/schemas/templates";
import type { Quantity } from "@/lib/units";
import { coolPlanner } from "@/lib/planners/cool";
import { kit } from "@/lib/planners/view-kit";
import { UnitInput } from "@/app/_components/UnitInput";
import { useUnits } from "@/app/_components/units-context";
import { NamedSelect, FieldMessage } from "@/app/_components/ResultParts";
import { usePlanner } from "@/app/_components/usePlanner";
import { PlannerOutcome } from "@/app/_components/PlannerOutcome";
import { PlanActions } from "@/app/_components/PlanActions";

export interface CoolPlannerProps {
  products: Product[];
  ruleSets: RuleSet[];
  defaultRuleSet: string;
  initial?: CoolInput;
  reopened?: string;
}

const SUPPORT_LABELS: Record<(typeof SUPPORTS)[number], string> = { rack: "Wire rack (air under the pan)", shelf: "Solid shelf" };
const SETUP_LABELS = { pan: "A layer in a pan", piece: "A whole piece (as the library describes it)" } as const;
const DEFAULT_HEIGHT_M = 0.065;

/** A pan for this product: its library thickness as the layer when it is a slab that fits the usual pan. */
function panFor(p: Product | undefined): Extract<CoolInput["setup"], { kind: "pan" }> {
  const depth = p && p.shape === "slab" && p.dimA_m <= DEFAULT_HEIGHT_M ? p.dimA_m : 0.05;
  return { kind: "pan", size: "1/1", height_m: DEFAULT_HEIGHT_M, depth_m: depth, material: "stainless", wall_m: null, lid: false, contact_W_m2K: 1000 };
}

export function CoolPlanner(props: CoolPlannerProps) {
  const units = useUnits();
  const k = kit(units);
  // A reopened plan brings its own templates: offer them in the pickers even if the library changed.
  const init = props.initial;
  const products = withSnapshot(props.products, [init?.product as Product | undefined]);
  const ruleSets = withSnapshot(props.ruleSets, [init?.ruleSet as RuleSet | undefined]);
  const first = products.find((p) => /rice/i.test(p.name)) ?? products[0];
  const form = useForm<CoolInput>({
    resolver: zodResolver(coolInputSchema) as never,
    mode: "onChange",
    defaultValues: init ?? {
      product: first,
      start_C: 74,
      setup: panFor(first),
      method: coolMethodSchema.parse({ kind: "walk_in" }),
      ruleSet: ruleSets.find((r) => r.name === props.defaultRuleSet) ?? ruleSets[0],
      emissivity: 0.9,
      horizon_s: 10 * 3600,
      searchDepth: true,
      compare: true,
    },
  });
  const { control, register, setValue, formState } = form;
  const values = useWatch({ control }) as CoolInput;
  const outcome = usePlanner("cool", values);
  const err = (path: string): string | undefined => (get(formState.errors, path) as { message?: string } | undefined)?.message;
  const setup = values.setup;
  const method = values.method;

  /** A number in the person's units with its message beside it (a render function, not a component, so typing keeps focus). */
  const num = (o: { name: string; id: string; label: string; quantity: Quantity; nullable?: boolean; help?: ReactNode }) => {
    const msg = err(o.name);
    const msgId = `${o.id}-msg`;
    const helpId = o.help ? `${o.id}-help` : undefined;
    return (
      <div className="field" key={o.id}>
        <label htmlFor={o.id}>{o.label}</label>
        <Controller
          control={control}
          name={o.name as never}
          render={({ field }) => (
            <UnitInput
              id={o.id}
              quantity={o.quantity}
              nullable={o.nullable}
              value={field.value as number | null}
              onChange={field.onChange}
              onBlur={field.onBlur}
              invalid={!!msg}
              describedBy={[msg ? msgId : null, helpId].filter(Boolean).join(" ") || undefined}
            />
          )}
        />
        {o.help ? (
          <p className="help" id={helpId}>
            {o.help}
          </p>
        ) : null}
        <FieldMessage id={msgId} msg={msg} />
      </div>
    );
  };
  /** A select, a checkbox or another control with its message beside it. */
  const described = (path: string, id: string) => (err(path) ? { "aria-describedby": `${id}-msg`, "aria-invalid": true as const } : {});
  const msgOf = (path: string, id: string) => <FieldMessage id={`${id}-msg`} msg={err(path)} />;

  const heights = [...new Set([...GASTRONORM_DEPTHS_M, ...(setup?.kind === "pan" && setup.height_m ? [setup.height_m] : [])])].sort((a, b) => a - b);
  const airOver = method?.kind === "ice_bath" || method?.kind === "cold_plate" ? "Room air" : "Air";

  return (
    <div className="planner cool">
      <ReopenedBanner name={props.reopened} />
      <form className="template-form planner-inputs no-print" onSubmit={(ev) => ev.preventDefault()} noValidate>
        <div className="field">
          <label htmlFor="product">Food</label>
          <NamedSelect
            id="product"
            items={products}
            value={values.product?.name}
            onChange={(p) => {
              setValue("product", p, { shouldValidate: true });
              if (setup?.kind === "pan") setValue("setup.depth_m", panFor(p).depth_m, { shouldValidate: true });
            }}
          />
        </div>
        {num({ name: "start_C", id: "start", label: "Starting temperature (as it goes into the cooling)", quantity: "temperature" })}

        <fieldset className="group">
          <legend>How it sits</legend>
          <div className="field">
            <label htmlFor="setup-kind">Set out as</label>
            <select
              id="setup-kind"
              value={setup?.kind}
              onChange={(ev) => setValue("setup", ev.target.value === "piece" ? { kind: "piece" } : panFor(values.product as Product), { shouldValidate: true })}
              {...described("setup.kind", "setup-kind")}
            >
              {(Object.keys(SETUP_LABELS) as (keyof typeof SETUP_LABELS)[]).map((x) => (
                <option key={x} value={x}>
                  {SETUP_LABELS[x]}
                </option>
              ))}
            </select>
            {msgOf("setup.kind", "setup-kind")}
          </div>
          {setup?.kind === "pan" ? (
            <>
              <div className="inline">
                <div className="field">
                  <label htmlFor="pan-size">Pan size (gastronorm)</label>
                  <select id="pan-size" {...register("setup.size")} {...described("setup.size", "pan-size")}>
                    {GASTRONORM_SIZE_NAMES.map((s) => (
                      <option key={s} value={s}>
                        {s} ({k.length(GASTRONORM_SIZES[s][0])} × {k.length(GASTRONORM_SIZES[s][1])})
                      </option>
                    ))}
                  </select>
                  {msgOf("setup.size", "pan-size")}
                </div>
                <div className="field">
                  <label htmlFor="pan-height">Pan depth</label>
                  <select id="pan-height" value={String(setup.height_m)} onChange={(ev) => setValue("setup.height_m", Number(ev.target.value), { shouldValidate: true })} {...described("setup.height_m", "pan-height")}>
                    {heights.map((h) => (
                      <option key={h} value={String(h)}>
                        {k.length(h)}
                      </option>
                    ))}
                  </select>
                  {msgOf("setup.height_m", "pan-height")}
                </div>
                {num({ name: "setup.depth_m", id: "depth", label: "Food depth in the pan", quantity: "length" })}
              </div>
              <div className="inline">
                <div className="field">
                  <label htmlFor="pan-material">Pan material</label>
                  <select id="pan-material" {...register("setup.material")}>
                    {PAN_MATERIAL_NAMES.map((m) => (
                      <option key={m} value={m}>
                        {PAN_MATERIALS[m].label}
                      </option>
                    ))}
                  </select>
                </div>
                <div className="field checkbox">
                  <label>
                    <input type="checkbox" {...register("setup.lid")} /> Lid on
                  </label>
                </div>
              </div>
              <details>
                <summary>Pan details</summary>
                {num({ name: "setup.wall_m", id: "wall", label: "Wall thickness", quantity: "length", nullable: true, help: "Empty: the material's usual wall." })}
                {num({ name: "setup.contact_W_m2K", id: "contact", label: "Food-to-pan contact conductance", quantity: "conductance", help: "Moist cooked food wets the pan; 1000 W/(m²·K) is our assumption." })}
              </details>
            </>
          ) : null}
        </fieldset>

        <fieldset className="group">
          <legend>Cooled by</legend>
          <div className="field">
            <label htmlFor="method-kind">Method</label>
            <select
              id="method-kind"
              value={method?.kind}
              onChange={(ev) => setValue("method", coolMethodSchema.parse({ kind: ev.target.value as CoolMethodKind }) as CoolInput["method"], { shouldValidate: true })}
              {...described("method.kind", "method-kind")}
            >
              {COOL_METHODS.map((m) => (
                <option key={m} value={m}>
                  {COOL_METHOD_LABELS[m]}
                </option>
              ))}
            </select>
            {msgOf("method.kind", "method-kind")}
          </div>
          {method?.kind === "ice_bath" ? (
            <div className="inline">
              {num({ name: "method.water_C", id: "water", label: "Bath water", quantity: "temperature" })}
              {num({ name: "method.level_m", id: "level", label: "Water level against the pan", quantity: "length", nullable: true, help: "From the pan's base. Empty: level with the food." })}
            </div>
          ) : null}
          {method?.kind === "cold_plate" ? (
            <div className="inline">
              {num({ name: "method.plate_C", id: "plate", label: "Plate temperature", quantity: "temperature" })}
              {num({ name: "method.contact_W_m2K", id: "plate-contact", label: "Pan-to-plate contact conductance", quantity: "conductance" })}
            </div>
          ) : null}
          {method && method.kind !== "ice_paddle" ? (
            <div className="inline">
              {num({ name: "method.air_C", id: "air", label: `${airOver} temperature`, quantity: "temperature" })}
              {num({ name: "method.speed_m_s", id: "speed", label: `${airOver} speed`, quantity: "speed" })}
              {num({ name: "method.relativeHumidity", id: "rh", label: `${airOver} relative humidity`, quantity: "ratio", help: "A fraction: 0.85 for 85 %." })}
              {method.kind === "walk_in" || method.kind === "blast_chiller" ? (
                <div className="field">
                  <label htmlFor="support">Pan stands on</label>
                  <select id="support" {...register("method.support")}>
                    {SUPPORTS.map((s) => (
                      <option key={s} value={s}>
                        {SUPPORT_LABELS[s]}
                      </option>
                    ))}
                  </select>
                </div>
              ) : null}
            </div>
          ) : null}
        </fieldset>

        <div className="field">
          <label htmlFor="ruleset">Rule set</label>
          <NamedSelect id="ruleset" items={ruleSets} value={values.ruleSet?.name} onChange={(x) => setValue("ruleSet", x, { shouldValidate: true })} />
        </div>
        <details>
          <summary>More settings</summary>
          <div className="inline">
            {num({ name: "horizon_s", id: "horizon", label: "Look ahead", quantity: "duration" })}
            {num({ name: "emissivity", id: "emissivity", label: "Emissivity of the food's surface", quantity: "ratio" })}
          </div>
          <div className="field checkbox">
            <label>
              <input type="checkbox" {...register("searchDepth")} /> Find the deepest layer that meets both stages
            </label>
          </div>
          <div className="field checkbox">
            <label>
              <input type="checkbox" {...register("compare")} /> Compare the other methods
            </label>
          </div>
        </details>
      </form>

      <section className="planner-results" aria-live="polite" aria-atomic="false" data-testid="cool-results">
        <PlannerOutcome state={outcome} testId="cool-errors" />
        {outcome.status === "ready" ? <PlanActions kind="cool" updating={outcome.stale} input={outcome.parsed} csv={outcome.csv} defaultName={coolPlanner.defaultName(outcome.parsed as CoolParsed)} csvName="holdline-cool-curves.csv" /> : null}
      </section>
    </div>
  );
}
