"use client";
import { useState } from "react";
import { useRouter } from "next/navigation";
import { Controller, useFieldArray, useForm, type Control, type FieldErrors as RhfErrors, type UseFormRegister } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { templateSchemas, SHAPE_DIMENSIONS, TEMPLATE_LABELS, type TemplateKind, type ProductShape } from "@/lib/schemas/templates";
import { TEMPLATE_FIELDS, SEGMENT_FIELDS, type FieldSpec } from "./template-fields";
import { UnitInput } from "./UnitInput";
import { saveTemplateAction } from "@/app/library/actions";
import type { SaveResult } from "@/lib/schemas/errors";

type Values = Record<string, unknown>;
type MaterialOption = { name: string; category: string };

function errorAt(errors: RhfErrors<Values>, path: string): string | undefined {
  const e = path.split(".").reduce<unknown>((o, k) => (o && typeof o === "object" ? (o as Record<string, unknown>)[k] : undefined), errors);
  if (!e || typeof e !== "object") return undefined;
  const m = (e as { message?: unknown; root?: { message?: unknown } }).message ?? (e as { root?: { message?: unknown } }).root?.message;
  return typeof m === "string" ? m : undefined;
}

function FieldError({ id, message }: { id: string; message?: string }) {
  return message ? (
    <p className="field-error" id={id} role="alert">
      {message}
    </p>
  ) : null;
}

function fieldId(path: string) {
  return "f-" + path.replace(/\./g, "-");
}

interface FieldProps {
  spec: FieldSpec;
  path: string;
  control: Control<Values>;
  register: UseFormRegister<Values>;
  errors: RhfErrors<Values>;
  materials: MaterialOption[];
  labelOverride?: string;
}

function Field({ spec, path, control, register, errors, materials, labelOverride }: FieldProps) {
  const id = fieldId(path);
  const err = errorAt(errors, path);
  const label = labelOverride ?? spec.label;
  const help = "help" in spec && spec.help ? <p className="help">{spec.help}</p> : null;
  switch (spec.kind) {
    case "text":
      return (
        <div className="field">
          <label htmlFor={id}>{label}</label>
          {spec.multiline ? <textarea id={id} rows={3} {...register(path)} /> : <input id={id} {...register(path)} aria-invalid={!!err || undefined} />}
          {help}
          <FieldError id={id + "-err"} message={err} />
        </div>
      );
    case "number":
      return (
        <div className="field">
          <label htmlFor={id}>{label}</label>
          <Controller
            control={control}
            name={path}
            render={({ field }) => (
              <UnitInput
                id={id}
                value={field.value as number | null}
                onChange={field.onChange}
                onBlur={field.onBlur}
                quantity={spec.quantity}
                nullable={spec.nullable}
                invalid={!!err}
                describedBy={err ? id + "-err" : undefined}
              />
            )}
          />
          {help}
          <FieldError id={id + "-err"} message={err} />
        </div>
      );
    case "select":
      return (
        <div className="field">
          <label htmlFor={id}>{label}</label>
          <select id={id} {...register(path)}>
            {spec.options.map((o) => (
              <option key={o.value} value={o.value}>
                {o.label}
              </option>
            ))}
          </select>
          {help}
          <FieldError id={id + "-err"} message={err} />
        </div>
      );
    case "materialSelect": {
      const opts = materials.filter((m) => !spec.category || m.category === spec.category);
      return (
        <div className="field">
          <label htmlFor={id}>{label}</label>
          <select id={id} {...register(path)}>
            <option value="">— choose —</option>
            {opts.map((m) => (
              <option key={m.name} value={m.name}>
                {m.name}
              </option>
            ))}
          </select>
          {help}
          <FieldError id={id + "-err"} message={err} />
        </div>
      );
    }
    case "checkbox":
      return (
        <div className="field checkbox">
          <label>
            <input type="checkbox" id={id} {...register(path)} /> {label}
          </label>
          <FieldError id={id + "-err"} message={err} />
        </div>
      );
    default:
      return null;
  }
}

function LayersEditor({ path, control, register, errors, materials, nullable, label, help }: Omit<FieldProps, "spec"> & { nullable?: boolean; label: string; help?: string }) {
  const { fields, append, remove, move, replace } = useFieldArray({ control, name: path as never });
  const [enabled, setEnabled] = useState(!nullable || fields.length > 0);
  const groupErr = errorAt(errors, path);
  const layerMaterials = materials.filter((m) => m.category !== "finish");
  return (
    <fieldset className="array-editor" id={fieldId(path)}>
      <legend>{label}</legend>
      {help ? <p className="help">{help}</p> : null}
      {nullable ? (
        <label className="checkbox">
          <input
            type="checkbox"
            checked={enabled}
            onChange={(e) => {
              setEnabled(e.target.checked);
              if (!e.target.checked) replace([]);
              else if (fields.length === 0) append({ material: layerMaterials[0]?.name ?? "", thickness_m: 0.02 } as never);
            }}
          />{" "}
          Lid is built differently
        </label>
      ) : null}
      {enabled ? (
        <>
          <table className="rows">
            <thead>
              <tr>
                <th>#</th>
                <th>Material</th>
                <th>Thickness</th>
                <th />
              </tr>
            </thead>
            <tbody>
              {fields.map((f, i) => (
                <tr key={f.id}>
                  <td>{i + 1}</td>
                  <td>
                    <Field
                      spec={{ kind: "materialSelect", name: "material", label: "Material" }}
                      path={`${path}.${i}.material`}
                      {...{ control, register, errors }}
                      materials={layerMaterials}
                      labelOverride={`Layer ${i + 1} material`}
                    />
                  </td>
                  <td>
                    <Field
                      spec={{ kind: "number", name: "thickness_m", label: "Thickness", quantity: "length" }}
                      path={`${path}.${i}.thickness_m`}
                      {...{ control, register, errors, materials }}
                      labelOverride={`Layer ${i + 1} thickness`}
                    />
                  </td>
                  <td className="row-actions">
                    <button type="button" onClick={() => i > 0 && move(i, i - 1)} disabled={i === 0} aria-label={`Move layer ${i + 1} outward`}>
                      ↑
                    </button>
                    <button type="button" onClick={() => i < fields.length - 1 && move(i, i + 1)} disabled={i === fields.length - 1} aria-label={`Move layer ${i + 1} inward`}>
                      ↓
                    </button>
                    <button type="button" onClick={() => remove(i)} aria-label={`Remove layer ${i + 1}`}>
                      Remove
                    </button>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
          <button type="button" className="secondary" onClick={() => append({ material: layerMaterials[0]?.name ?? "", thickness_m: 0.02 } as never)}>
            Add a layer
          </button>
        </>
      ) : null}
      <FieldError id={fieldId(path) + "-err"} message={groupErr} />
    </fieldset>
  );
}

function SegmentsEditor({ path, control, register, errors, materials, label }: Omit<FieldProps, "spec"> & { label: string }) {
  const { fields, append, remove, move, insert } = useFieldArray({ control, name: path as never });
  const groupErr = errorAt(errors, path);
  const blank = { label: "", duration_s: 1800, airTemp_C: 20, airSpeed_m_s: 0.5, sun_W_m2: 0, lidOpenings: 0, lidOpenDuration_s: 0 };
  return (
    <fieldset className="array-editor" id={fieldId(path)}>
      <legend>{label}</legend>
      <ol className="segments">
        {fields.map((f, i) => (
          <li key={f.id} className="segment" data-testid={`segment-${i}`}>
            <div className="segment-head">
              <strong>Segment {i + 1}</strong>
              <span className="row-actions">
                <button type="button" onClick={() => move(i, i - 1)} disabled={i === 0} aria-label={`Move segment ${i + 1} earlier`}>
                  ↑
                </button>
                <button type="button" onClick={() => move(i, i + 1)} disabled={i === fields.length - 1} aria-label={`Move segment ${i + 1} later`}>
                  ↓
                </button>
                <button type="button" onClick={() => insert(i + 1, { ...blank } as never)} aria-label={`Insert a segment after ${i + 1}`}>
                  Insert after
                </button>
                <button type="button" onClick={() => remove(i)} aria-label={`Remove segment ${i + 1}`}>
                  Remove
                </button>
              </span>
            </div>
            <div className="grid">
              {SEGMENT_FIELDS.map((s) => (
                <Field key={s.name} spec={s} path={`${path}.${i}.${s.name}`} {...{ control, register, errors, materials }} />
              ))}
            </div>
          </li>
        ))}
      </ol>
      <button type="button" className="secondary" onClick={() => append({ ...blank } as never)}>
        Add a segment
      </button>
      <FieldError id={fieldId(path) + "-err"} message={groupErr} />
    </fieldset>
  );
}

export function TemplateForm(props: {
  kind: TemplateKind;
  id: number | null;
  version: number | null;
  initial: Values;
  materials: MaterialOption[];
}) {
  const { kind } = props;
  const router = useRouter();
  const [version, setVersion] = useState(props.version);
  const [banner, setBanner] = useState<{ tone: "error" | "conflict"; text: string; latest?: number | null } | null>(null);
  const [saving, setSaving] = useState(false);
  const form = useForm<Values>({
    // One schema for the form, the server action, the API and the CLI.
    resolver: zodResolver(templateSchemas[kind] as never) as never,
    defaultValues: props.initial,
    mode: "onBlur",
  });
  const { control, register, handleSubmit, formState, setError, watch } = form;
  const shape = kind === "products" ? (watch("shape") as ProductShape) : undefined;

  async function submit(data: Values, useVersion = version) {
    setSaving(true);
    setBanner(null);
    let r: SaveResult;
    try {
      r = await saveTemplateAction(kind, props.id, useVersion, data);
    } catch {
      setSaving(false);
      setBanner({ tone: "error", text: "The server could not be reached. Your edits are still here; try again." });
      return;
    }
    setSaving(false);
    if (r.ok) {
      setVersion(r.version);
      router.push(`/library/${kind}?saved=${r.id}`);
      router.refresh();
      return;
    }
    if (r.reason === "invalid") {
      for (const [path, msgs] of Object.entries(r.fieldErrors)) setError((path || "root") as never, { type: "server", message: msgs.join("; ") });
      setBanner({ tone: "error", text: r.fieldErrors[""]?.join("; ") ?? "Some values need attention; see the messages beside the fields." });
    } else if (r.reason === "conflict") {
      setBanner({ tone: "conflict", text: r.message, latest: r.currentVersion });
    } else {
      setBanner({ tone: "error", text: r.message });
    }
  }

  const label = TEMPLATE_LABELS[kind].one;
  return (
    <form
      className="template-form"
      noValidate
      onSubmit={handleSubmit((d) => submit(d), () => setBanner({ tone: "error", text: "Some values need attention; see the messages beside the fields." }))}
    >
      {banner ? (
        <div className={`banner ${banner.tone}`} role="alert" data-testid="form-banner">
          <p>{banner.text}</p>
          {banner.tone === "conflict" ? (
            <p className="banner-actions">
              <button type="button" onClick={handleSubmit((d) => submit(d, banner.latest ?? null))}>
                Save my version over theirs
              </button>{" "}
              <a href={`/library/${kind}/${props.id}`} target="_blank" rel="noreferrer">
                Open the saved version in a new tab
              </a>
            </p>
          ) : null}
        </div>
      ) : null}
      {TEMPLATE_FIELDS[kind].map((spec) => {
        const common = { control, register, errors: formState.errors, materials: props.materials };
        if (spec.kind === "group") {
          const groupErr = spec.name ? errorAt(formState.errors, spec.name) : undefined;
          return (
            <fieldset key={spec.label} className="group" id={spec.name ? fieldId(spec.name) : undefined}>
              <legend>{spec.label}</legend>
              <div className="grid">
                {spec.fields.map((f) => (
                  <Field key={f.name} spec={f} path={spec.name ? `${spec.name}.${f.name}` : f.name} {...common} />
                ))}
              </div>
              <FieldError id={fieldId(spec.name || "group") + "-err"} message={groupErr} />
            </fieldset>
          );
        }
        if (spec.kind === "layers") return <LayersEditor key={spec.name} path={spec.name} label={spec.label} nullable={spec.nullable} help={spec.help} {...common} />;
        if (spec.kind === "segments") return <SegmentsEditor key={spec.name} path={spec.name} label={spec.label} {...common} />;
        if (shape && spec.kind === "number" && /^dim[ABC]_m$/.test(spec.name)) {
          const n = "ABC".indexOf(spec.name[3]);
          const dimLabel = SHAPE_DIMENSIONS[shape]?.[n];
          if (!dimLabel) return null;
          return <Field key={spec.name} spec={spec} path={spec.name} labelOverride={dimLabel} {...common} />;
        }
        return <Field key={spec.name} spec={spec} path={spec.name} {...common} />;
      })}
      <div className="form-actions">
        <button type="submit" disabled={saving}>
          {saving ? "Saving…" : props.id ? `Save this ${label}` : `Add this ${label}`}
        </button>{" "}
        <a href={`/library/${kind}`}>Cancel</a>
      </div>
    </form>
  );
}
