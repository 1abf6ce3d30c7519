"use client";
import { useState } from "react";
import type { CsvRow } from "@/lib/planners/types";
import type { PlannerKind } from "@/lib/planners/registry";
import { savePlanAction } from "@/app/plans/actions";
import { downloadCsv } from "./csv";
import { SavedNotice } from "./ResultParts";

/**
 * Save as a named plan (the server computes what it stores), download the curves as CSV, print the record.
 * `updating`: the result on screen is for inputs that have since changed; saving or downloading waits for
 * the new one (it would store or give the old inputs' answer).
 */
export function PlanActions({ kind, input, csv, defaultName, csvName, csvLabel = "Download curves (CSV)", updating = false }: { kind: PlannerKind; input: unknown; csv: CsvRow[]; defaultName: string; csvName?: string; csvLabel?: string; updating?: boolean }) {
  const [name, setName] = useState("");
  const [saved, setSaved] = useState<number | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const [saving, setSaving] = useState(false);
  return (
    <div className="save-row no-print">
      <label htmlFor="plan-name">Save as a plan</label>
      <input id="plan-name" value={name} placeholder={defaultName} onChange={(ev) => setName(ev.target.value)} aria-describedby={problem ? "plan-save-problem" : undefined} />
      <button
        type="button"
        disabled={saving || updating}
        onClick={async () => {
          setSaving(true);
          setProblem(null);
          try {
            const r = await savePlanAction({ kind, name: name.trim() || defaultName, input });
            if (r.ok) setSaved(r.id);
            else setProblem(Object.values(r.fieldErrors).flat().join("; ") || "The plan could not be saved");
          } catch {
            setProblem("The plan could not be saved: the server did not answer. Check the connection and try again.");
          } finally {
            setSaving(false);
          }
        }}
      >
        {saving ? "Saving…" : "Save plan"}
      </button>
      <button type="button" className="secondary" disabled={!csv.length || updating} onClick={() => downloadCsv(csvName ?? `holdline-${kind}.csv`, csv)}>
        {csvLabel}
      </button>
      <button type="button" className="secondary" onClick={() => window.print()}>
        Print plan record
      </button>
      <SavedNotice id={saved} />
      {problem ? (
        <p className="field-error" id="plan-save-problem" role="alert">
          {problem}
        </p>
      ) : null}
    </div>
  );
}
