"use client";
import { useState } from "react";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { settingsSchema, type Settings } from "@/lib/schemas/templates";
import { saveSettingsAction } from "./actions";

export function SettingsForm({ initial }: { initial: Settings }) {
  const router = useRouter();
  const [status, setStatus] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState } = useForm<Settings>({ resolver: zodResolver(settingsSchema), defaultValues: initial });
  return (
    <form
      className="template-form"
      onSubmit={handleSubmit(async (d) => {
        const r = await saveSettingsAction(d);
        if (r.ok) {
          setStatus("Saved. Every page now shows these units.");
          router.refresh();
        } else {
          for (const [k, m] of Object.entries(r.fieldErrors)) setError(k as keyof Settings, { message: m.join("; ") });
        }
      })}
    >
      <div className="field">
        <label htmlFor="temperatureUnit">Temperature</label>
        <select id="temperatureUnit" {...register("temperatureUnit")}>
          <option value="C">°C</option>
          <option value="F">°F</option>
        </select>
        {formState.errors.temperatureUnit ? <p className="field-error">{formState.errors.temperatureUnit.message}</p> : null}
      </div>
      <div className="field">
        <label htmlFor="massUnit">Mass</label>
        <select id="massUnit" {...register("massUnit")}>
          <option value="kg">kg</option>
          <option value="lb">lb</option>
        </select>
      </div>
      <div className="field">
        <label htmlFor="lengthUnit">Length</label>
        <select id="lengthUnit" {...register("lengthUnit")}>
          <option value="mm">mm</option>
          <option value="in">in</option>
        </select>
      </div>
      <div className="form-actions">
        <button type="submit">Use these units</button>
      </div>
      {status ? (
        <p className="banner ok" role="status">
          {status}
        </p>
      ) : null}
    </form>
  );
}
