"use client";
import { UnitField } from "@/app/_components/UnitField";
import { ReopenedBanner, withSnapshot } from "@/app/_components/reopen";
import { useState } from "react";
import { useForm, useWatch } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { format } from "date-fns";
import { thawInputSchema, THAW_METHODS, THAW_METHOD_LABELS, type ThawInput, type ThawMethodKind, type ThawParsed } from "@/lib/schemas/thaw";
import type { Material, Product, RuleSet } from "@/lib/schemas/templates";
import { defaultMethod, DEFAULT_TRAY } from "@/lib/physics/thaw";
import { thawPlanner } from "@/lib/planners/thaw";
import { useMounted } from "@/app/_components/useMounted";
import { NamedSelect, FieldMessage, errorId } from "@/app/_components/ResultParts";
import { usePlanner } from "@/app/_components/usePlanner";
import { PlannerOutcome } from "@/app/_components/PlannerOutcome";
import { PlanActions } from "@/app/_components/PlanActions";


/** An ISO date-time as the value of a datetime-local box, in the browser's zone. */
const localInput = (iso: string | null | undefined) => (iso ? format(new Date(iso), "yyyy-MM-dd'T'HH:mm") : "");

export interface ThawPlannerProps {
  products: Product[];
  ruleSets: RuleSet[];
  trays: Material[];
  defaultRuleSet: string;
  initial?: ThawInput;
  reopened?: string;
}

export function ThawPlanner(props: ThawPlannerProps) {
  const init = props.initial;
  // A reopened plan brings its own templates: offer them in the pickers even if the library changed.
  const products = withSnapshot(props.products, [init?.product as Product | undefined]);
  const ruleSets = withSnapshot(props.ruleSets, [init?.ruleSet as RuleSet | undefined]);
  const savedTray = init?.method && init.method.kind === "tray" ? (init.method.tray as Material) : undefined;
  const trayChoices = withSnapshot(props.trays.length ? props.trays : [DEFAULT_TRAY], [savedTray]);
  const defaultTray = trayChoices.find((t) => /aluminium/i.test(t.name)) ?? trayChoices[0];
  const first = products.find((p) => /turkey|bird/i.test(p.name)) ?? products[0];
  const form = useForm<ThawInput>({
    resolver: zodResolver(thawInputSchema) as never,
    mode: "onChange",
    defaultValues: init ?? {
      product: first,
      start_C: -18,
      endMargin_K: 0.5,
      endPoint_C: null,
      ruleSet: ruleSets.find((r) => r.name === props.defaultRuleSet) ?? ruleSets[0],
      method: defaultMethod("fridge_air", null)!,
      compare: true,
      readyBy: null,
    },
  });
  const { control, register, setValue, formState } = form;
  const values = useWatch({ control }) as ThawInput;
  const outcome = usePlanner("thaw", values);
  const kind = values.method?.kind as ThawMethodKind;
  // The box shows what was typed; until then (and after a reopen) the form's value in this browser's zone.
  const mounted = useMounted();
  const [readyText, setReadyText] = useState<string | null>(null);
  const e = formState.errors;

  return (
    <div className="planner thaw">
      <ReopenedBanner name={props.reopened} />
      <form className="template-form planner-inputs no-print" onSubmit={(ev) => ev.preventDefault()} noValidate>
        <div className="field">
          <label htmlFor="product">Frozen item</label>
          <NamedSelect id="product" items={products} value={values.product?.name} onChange={(x) => setValue("product", x, { shouldValidate: true })} />
        </div>
        <UnitField control={control} name="start_C" id="start_C" label="Starting temperature" quantity="temperature" />
        <div className="field">
          <label htmlFor="method">Method</label>
          <select
            id="method"
            value={kind}
            aria-describedby="method-help"
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
          <p className="help" id="method-help">
            {kind === "room_air" ? "Room-air thawing is not an approved method under most food codes; it is shown for comparison. " : null}
            Microwave thawing and thawing as part of cooking are outside this model.
          </p>
        </div>
        <fieldset className="group">
          <legend>{THAW_METHOD_LABELS[kind] ?? "Settings"}</legend>
          {kind === "fridge_air" || kind === "room_air" || kind === "tray" ? (
            <>
              <UnitField control={control} name="method.air_C" id="air_C" label="Air temperature" quantity="temperature" />
              <UnitField control={control} name="method.speed_m_s" id="air_speed" label="Air speed" quantity="speed" />
            </>
          ) : null}
          {kind === "tray" ? (
            <>
              <div className="field">
                <label htmlFor="tray">Tray material</label>
                <NamedSelect id="tray" items={trayChoices} value={(values.method as { tray?: Material }).tray?.name} onChange={(t) => setValue("method.tray" as never, t as never, { shouldValidate: true })} />
              </div>
              <UnitField control={control} name="method.trayThickness_m" id="tray_t" label="Tray thickness" quantity="length" />
              <UnitField control={control} name="method.trayLength_m" id="tray_l" label="Tray length" quantity="length" />
              <UnitField control={control} name="method.trayWidth_m" id="tray_w" label="Tray width" quantity="length" />
              <UnitField control={control} name="method.contact_W_m2K" id="contact" label="Contact conductance between item and tray" quantity="conductance" />
              <div className="field checkbox">
                <label>
                  <input type="checkbox" {...register("method.undersideExposed" as never)} /> Tray on a rack (underside in the air)
                </label>
              </div>
            </>
          ) : null}
          {kind === "running_water" || kind === "still_water" ? <UnitField control={control} name="method.water_C" id="water_C" label="Water temperature" quantity="temperature" /> : null}
          {kind === "running_water" ? <UnitField control={control} name="method.speed_m_s" id="water_speed" label="Water speed" quantity="speed" /> : null}
          {kind === "still_water" ? (
            <>
              <UnitField control={control} name="method.bath_m3" id="bath" label="Water in the sink or tub" quantity="volume" />
              <UnitField control={control} name="method.changeEvery_s" id="change" label="Change the water every" quantity="shortDuration" />
              <UnitField control={control} name="method.room_C" id="room" label="Room air" quantity="temperature" />
            </>
          ) : null}
        </fieldset>
        <div className="field">
          <label htmlFor="ruleset">Rule set</label>
          <NamedSelect id="ruleset" items={ruleSets} value={values.ruleSet?.name} onChange={(x) => setValue("ruleSet", x, { shouldValidate: true })} />
        </div>
        <UnitField control={control} name="endMargin_K" id="margin" label="Thawed when the centre is this far above its freezing point" quantity="temperatureDifference" />
        <div className="field checkbox">
          <label>
            <input type="checkbox" {...register("compare")} /> Compare every method side by side
          </label>
        </div>
        <div className="field">
          <label htmlFor="ready">Ready by</label>
          <input
            id="ready"
            type="datetime-local"
            value={readyText ?? (mounted ? localInput(values.readyBy) : "")}
            aria-invalid={!!e.readyBy || undefined}
            aria-describedby={e.readyBy ? errorId("ready") : undefined}
            onChange={(ev) => {
              setReadyText(ev.target.value);
              setValue("readyBy", ev.target.value ? new Date(ev.target.value).toISOString() : null, { shouldValidate: true });
            }}
          />
          <FieldMessage id={errorId("ready")} msg={e.readyBy?.message} />
        </div>
      </form>

      <section className="planner-results" aria-live="polite" aria-atomic="false" data-testid="thaw-results">
        <PlannerOutcome state={outcome} testId="thaw-errors" />
        {outcome.status === "ready" ? <PlanActions kind="thaw" updating={outcome.stale} input={outcome.parsed} csv={outcome.csv} defaultName={thawPlanner.defaultName(outcome.parsed as ThawParsed)} csvName="holdline-thaw-curves.csv" /> : null}
      </section>
    </div>
  );
}
