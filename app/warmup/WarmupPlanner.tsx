"use client";
import { UnitField } from "@/app/_components/UnitField";
import { ReopenedBanner, withSnapshot } from "@/app/_components/reopen";
import { useForm, useWatch } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { warmupInputSchema, LIMIT_KINDS, LIMIT_LABELS, type WarmupInput, type WarmupParsed } from "@/lib/schemas/warmup";
import type { Product, RuleSet } from "@/lib/schemas/templates";
import { warmupPlanner } from "@/lib/planners/warmup";
import { NamedSelect } from "@/app/_components/ResultParts";
import { usePlanner } from "@/app/_components/usePlanner";
import { PlannerOutcome } from "@/app/_components/PlannerOutcome";
import { PlanActions } from "@/app/_components/PlanActions";


const METHOD_CHOICES = [
  ["auto", "choose for me"],
  ["lumped", "lumped capacitance"],
  ["series", "exact series"],
  ["numerical", "numerical (with phase change)"],
] as const;

export interface WarmupPlannerProps {
  products: Product[];
  ruleSets: RuleSet[];
  defaultRuleSet: string;
  initial?: WarmupInput;
  reopened?: string;
}

export function WarmupPlanner(props: WarmupPlannerProps) {
  const init = props.initial;
  // A reopened plan brings its own templates: offer them in the pickers even if the library changed.
  const products = withSnapshot(props.products, [init?.product as Product | undefined]);
  const ruleSets = withSnapshot(props.ruleSets, [init?.ruleSet as RuleSet | undefined]);
  const first = products.find((p) => /chicken/i.test(p.name)) ?? products[0];
  const form = useForm<WarmupInput>({
    resolver: zodResolver(warmupInputSchema) as never,
    mode: "onChange",
    defaultValues: init ?? {
      product: first,
      start_C: 4,
      surroundings: { medium: "air", T_C: 25, speed_m_s: 0, emissivity: 0.9, h_W_m2K: null },
      ruleSet: ruleSets.find((r) => r.name === props.defaultRuleSet) ?? ruleSets[0],
      limit: "chilledMax",
      horizon_s: 8 * 3600,
      method: "auto",
    },
  });
  const { control, register, setValue } = form;
  const values = useWatch({ control }) as WarmupInput;
  const outcome = usePlanner("warmup", values);

  return (
    <div className="planner warmup">
      <ReopenedBanner name={props.reopened} />
      <form className="template-form planner-inputs no-print" onSubmit={(ev) => ev.preventDefault()} noValidate>
        <div className="field">
          <label htmlFor="product">Product</label>
          <NamedSelect id="product" items={products} value={values.product?.name} onChange={(x) => setValue("product", x, { shouldValidate: true })} />
        </div>
        <UnitField control={control} name="start_C" id="start_C" label="Starting temperature" quantity="temperature" />
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
            <UnitField control={control} name="surroundings.T_C" id="sur_T" label="Temperature" quantity="temperature" />
            <UnitField control={control} name="surroundings.speed_m_s" id="sur_speed" label="Air or water speed" quantity="speed" />
            <UnitField control={control} name="surroundings.emissivity" id="sur_eps" label="Surface emissivity" quantity="ratio" help="Between 0 and 1; used in air only." />
            <UnitField control={control} name="surroundings.h_W_m2K" id="sur_h" label="Surface coefficient h (optional)" quantity="conductance" nullable help="Leave empty to work it out from the air or water and the item's shape." />
          </div>
        </fieldset>
        <div className="grid">
          <div className="field">
            <label htmlFor="ruleset">Rule set</label>
            <NamedSelect id="ruleset" items={ruleSets} value={values.ruleSet?.name} onChange={(x) => setValue("ruleSet", x, { shouldValidate: true })} />
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
          <UnitField control={control} name="horizon_s" id="horizon" label="Look ahead" quantity="duration" />
          <div className="field">
            <label htmlFor="method">Method</label>
            <select id="method" {...register("method")}>
              {METHOD_CHOICES.map(([v, label]) => (
                <option key={v} value={v}>
                  {label}
                </option>
              ))}
            </select>
          </div>
        </div>
      </form>

      <section className="planner-results" aria-live="polite" aria-atomic="false" data-testid="warmup-results">
        <PlannerOutcome state={outcome} testId="warmup-errors" />
        {outcome.status === "ready" ? <PlanActions kind="warmup" updating={outcome.stale} input={outcome.parsed} csv={outcome.csv} defaultName={warmupPlanner.defaultName(outcome.parsed as WarmupParsed)} csvName="holdline-warmup-curves.csv" /> : null}
      </section>
    </div>
  );
}
