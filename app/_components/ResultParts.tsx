"use client";
import type { Material } from "@/lib/schemas/templates";
import type { ComplianceLine } from "@/lib/physics/compliance";

/** The banner shown instead of a result while the inputs have problems. */
export function NoResult({ fieldErrors, testId }: { fieldErrors: Record<string, string[]>; testId?: string }) {
  return (
    <div className="banner error" role="alert" data-testid={testId}>
      <p>No result until these are fixed:</p>
      <ul>
        {Object.entries(fieldErrors).map(([k, v]) => (
          <li key={k}>{v.join("; ")}</li>
        ))}
      </ul>
    </div>
  );
}

/** A headed list of assumptions or warnings (nothing when empty). */
export function FactList({ title, items, warn = false, testId }: { title: string; items: string[]; warn?: boolean; testId?: string }) {
  if (!items.length) return null;
  return (
    <>
      <h3>{title}</h3>
      <ul className={warn ? "facts warnings" : "facts"} data-testid={testId}>
        {items.map((a) => (
          <li key={a}>{a}</li>
        ))}
      </ul>
    </>
  );
}

/** Rule-set lines under a result: green when the estimate meets the rule, amber to check locally, red otherwise. */
export function ComplianceList({ lines, title, testId = "compliance" }: { lines: ComplianceLine[]; title?: string; testId?: string }) {
  if (!lines.length) return null;
  const cls = (s: ComplianceLine["status"]) => (s === "meets" ? "ok" : s === "check locally" ? "check" : "bad");
  return (
    <>
      {title ? <h3>{title}</h3> : null}
      <ul className="compliance" data-testid={testId}>
        {lines.map((c) => (
          <li key={c.rule} className={cls(c.status)}>
            <strong>{c.status}</strong> — {c.rule}: {c.detail}
          </li>
        ))}
      </ul>
    </>
  );
}

/** A select over named templates that hands back the whole template. */
export function NamedSelect<T extends { name: string } | Material>(props: { id: string; items: T[]; value: string | undefined; onChange: (item: T) => void }) {
  return (
    <select
      id={props.id}
      value={props.value}
      onChange={(ev) => {
        const found = props.items.find((x) => x.name === ev.target.value);
        if (found) props.onChange(found);
      }}
    >
      {props.items.map((x) => (
        <option key={x.name}>{x.name}</option>
      ))}
    </select>
  );
}

/**
 * A field's error message, beside the field. Give it an `id` and point the input's `aria-describedby` at
 * it: a screen reader reads it with the field, and it is not announced on every keystroke (no live region).
 */
export function FieldMessage({ msg, id }: { msg?: string; id?: string }) {
  return msg ? (
    <p className="field-error" id={id}>
      {msg}
    </p>
  ) : null;
}

/** "Saved — open the saved plan" after a plan was stored. */
export function SavedNotice({ id }: { id: number | null }) {
  return id ? (
    <span role="status">
      Saved — <a href={`/plans/${id}`}>open the saved plan</a>
    </span>
  ) : null;
}
