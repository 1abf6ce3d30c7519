"use client";
import { useState, useTransition } from "react";
import { useRouter } from "next/navigation";
import { deletePlanAction, renamePlanAction } from "./actions";

/** Rename and delete a saved plan; after deleting from its own page, go back to the list. */
export function PlanRowActions({ id, name, after = "refresh" }: { id: number; name: string; after?: "refresh" | "list" }) {
  const router = useRouter();
  const [pending, start] = useTransition();
  const [editing, setEditing] = useState(false);
  const [value, setValue] = useState(name);
  const [message, setMessage] = useState<string | null>(null);
  const msgId = `plan-${id}-message`;
  return (
    <span className="row-actions">
      {editing ? (
        <form
          className="inline"
          onSubmit={(ev) => {
            ev.preventDefault();
            start(async () => {
              const r = await renamePlanAction(id, value);
              if (!r.ok) setMessage(Object.values(r.fieldErrors).flat().join("; "));
              else {
                setMessage(null);
                setEditing(false);
                router.refresh();
              }
            });
          }}
        >
          <label htmlFor={`rename-${id}`} className="visually-hidden">
            New name for {name}
          </label>
          <input id={`rename-${id}`} value={value} onChange={(ev) => setValue(ev.target.value)} aria-invalid={!!message} aria-describedby={message ? msgId : undefined} />
          <button type="submit" disabled={pending}>
            Save name
          </button>
          <button type="button" className="secondary" onClick={() => setEditing(false)}>
            Cancel
          </button>
        </form>
      ) : (
        <button type="button" className="secondary" onClick={() => setEditing(true)} aria-label={`Rename ${name}`}>
          Rename
        </button>
      )}
      <button
        type="button"
        className="danger"
        disabled={pending}
        aria-label={`Delete ${name}`}
        onClick={() => {
          if (!window.confirm(`Delete the saved plan "${name}"?`)) return;
          start(async () => {
            const r = await deletePlanAction(id);
            if (!r.ok) setMessage(Object.values(r.fieldErrors).flat().join("; "));
            else if (after === "list") router.push("/plans");
            else router.refresh();
          });
        }}
      >
        Delete
      </button>
      {message ? (
        <span className="field-error" id={msgId}>
          {message}
        </span>
      ) : null}
    </span>
  );
}
