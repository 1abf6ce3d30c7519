"use client";
import { useState, useTransition } from "react";
import { useRouter } from "next/navigation";
import { deleteTemplateAction, duplicateTemplateAction } from "@/app/library/actions";

export function RowActions({ kind, id, name }: { kind: string; id: number; name: string }) {
  const router = useRouter();
  const [pending, start] = useTransition();
  const [message, setMessage] = useState<string | null>(null);
  return (
    <span className="row-actions">
      <a href={`/library/${kind}/${id}`} aria-label={`Edit ${name}`}>
        Edit
      </a>
      <button
        type="button"
        disabled={pending}
        aria-label={`Duplicate ${name}`}
        onClick={() =>
          start(async () => {
            const r = await duplicateTemplateAction(kind, id);
            if (!r.ok) setMessage("message" in r ? r.message : "Could not duplicate");
            router.refresh();
          })
        }
      >
        Duplicate
      </button>
      <button
        type="button"
        className="danger"
        disabled={pending}
        aria-label={`Delete ${name}`}
        onClick={() => {
          if (!window.confirm(`Delete "${name}"? Saved plans keep their own copy.`)) return;
          start(async () => {
            const r = await deleteTemplateAction(kind, id);
            if (!r.ok) setMessage(r.message ?? "Could not delete");
            router.refresh();
          });
        }}
      >
        Delete
      </button>
      {message ? (
        <span className="field-error" role="alert">
          {message}
        </span>
      ) : null}
    </span>
  );
}
