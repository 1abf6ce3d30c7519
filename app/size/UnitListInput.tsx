"use client";
import { useState } from "react";
import { fromDisplay, roundForDisplay, toDisplay, unitLabel, type Quantity } from "@/lib/units";
import { useUnits } from "@/app/_components/units-context";

/**
 * A comma-separated list of numbers shown in the user's units while the form keeps SI (the sizer's
 * conditioning temperatures and wall thicknesses). Anything that is not a number becomes NaN, which the
 * schema reports beside the field.
 */
export function UnitListInput(props: { id: string; value: number[] | undefined; onChange: (si: number[]) => void; onBlur?: () => void; quantity: Quantity; invalid?: boolean; describedBy?: string; placeholder?: string }) {
  const prefs = useUnits();
  const shown = (v: number[] | undefined) => (v ?? []).map((x) => (Number.isNaN(x) ? "?" : String(roundForDisplay(toDisplay(props.quantity, x, prefs), 6)))).join(", ");
  const [text, setText] = useState(shown(props.value));
  // Follow the form when it sets the list from outside (a new pack chosen, a reset).
  const [seen, setSeen] = useState(props.value);
  const parse = (t: string) =>
    t
      .split(/[,;]|\s+/)
      .map((x) => x.trim())
      .filter(Boolean)
      .map((x) => {
        const n = Number(x.replace("−", "-"));
        return Number.isFinite(n) ? fromDisplay(props.quantity, n, prefs) : Number.NaN;
      });
  if (props.value !== seen) {
    setSeen(props.value);
    const now = parse(text);
    const v = props.value ?? [];
    const same = (a: number, b: number) => (Number.isNaN(a) && Number.isNaN(b)) || Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(b));
    if (now.length !== v.length || now.some((x, i) => !same(x, v[i]))) setText(shown(props.value));
  }
  const unit = unitLabel(props.quantity, prefs);
  return (
    <span className="unit-input">
      <input
        id={props.id}
        inputMode="decimal"
        value={text}
        placeholder={props.placeholder}
        aria-invalid={props.invalid || undefined}
        aria-describedby={props.describedBy}
        onBlur={props.onBlur}
        onChange={(e) => {
          setText(e.target.value);
          props.onChange(parse(e.target.value));
        }}
      />
      {unit ? <span className="unit">{unit}</span> : null}
    </span>
  );
}
