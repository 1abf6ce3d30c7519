"use client";
import { useState } from "react";
import { fromDisplay, roundForDisplay, toDisplay, unitLabel, type Quantity } from "@/lib/units";
import { useUnits } from "./units-context";

/**
 * A number box that shows a value in the user's units while the form keeps SI.
 * Empty means null when `nullable`, otherwise NaN (which the schema reports).
 */
export function UnitInput(props: {
  id: string;
  value: number | null | undefined;
  onChange: (si: number | null) => void;
  onBlur?: () => void;
  quantity: Quantity;
  nullable?: boolean;
  invalid?: boolean;
  describedBy?: string;
}) {
  const prefs = useUnits();
  const shown = (v: number | null | undefined) =>
    v === null || v === undefined || Number.isNaN(v) ? "" : String(roundForDisplay(toDisplay(props.quantity, v, prefs), 6));
  const [text, setText] = useState(shown(props.value));
  // Follow the form when it changes the value from outside (reset, duplicate): adjust the text while
  // rendering when the value differs from the one last seen, as React recommends instead of an effect.
  const [seen, setSeen] = useState(props.value);
  // Object.is: an emptied box is NaN, and NaN !== NaN would set the state on every render (React error 301).
  if (!Object.is(props.value, seen)) {
    setSeen(props.value);
    const current = text.trim() === "" ? null : fromDisplay(props.quantity, Number(text), prefs);
    const v = props.value ?? null;
    if (v === null ? current !== null && !Number.isNaN(current) : current === null || Math.abs(current - v) > 1e-9 * Math.max(1, Math.abs(v))) {
      setText(shown(props.value));
    }
  }
  const unit = unitLabel(props.quantity, prefs);
  return (
    <span className="unit-input">
      <input
        id={props.id}
        inputMode="decimal"
        value={text}
        aria-invalid={props.invalid || undefined}
        aria-describedby={props.describedBy}
        onBlur={props.onBlur}
        onChange={(e) => {
          const t = e.target.value;
          setText(t);
          if (t.trim() === "") props.onChange(props.nullable ? null : Number.NaN);
          else {
            const n = Number(t.replace(",", "."));
            props.onChange(Number.isFinite(n) ? fromDisplay(props.quantity, n, prefs) : Number.NaN);
          }
        }}
      />
      {unit ? <span className="unit">{unit}</span> : null}
    </span>
  );
}
