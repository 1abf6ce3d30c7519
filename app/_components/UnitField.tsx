"use client";
import { Controller, type Control, type FieldValues } from "react-hook-form";
import type { Quantity } from "@/lib/units";
import { UnitInput } from "./UnitInput";
import { FieldMessage, errorId } from "./ResultParts";

/**
 * A number field of a react-hook-form form, in the person's units, with its help and its message tied to it
 * (aria-describedby) rather than announced. `name` is the field's path in the form's values.
 */
export function UnitField<T extends FieldValues>({ control, name, id, label, quantity, nullable, help }: { control: Control<T>; name: string; id: string; label: string; quantity: Quantity; nullable?: boolean; help?: string }) {
  return (
    <div className="field">
      <label htmlFor={id}>{label}</label>
      <Controller
        control={control}
        name={name as never}
        render={({ field, fieldState }) => (
          <>
            <UnitInput
              id={id}
              quantity={quantity}
              nullable={nullable}
              value={field.value as number | null}
              onChange={field.onChange}
              invalid={!!fieldState.error}
              describedBy={[help ? `${id}-help` : null, fieldState.error ? errorId(id) : null].filter(Boolean).join(" ") || undefined}
            />
            {help ? (
              <p className="help" id={`${id}-help`}>
                {help}
              </p>
            ) : null}
            <FieldMessage id={errorId(id)} msg={fieldState.error?.message} />
          </>
        )}
      />
    </div>
  );
}
