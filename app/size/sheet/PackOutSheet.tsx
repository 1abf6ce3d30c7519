"use client";
import { TextTable } from "@/app/_components/PlanView";
import { useEffect, useState } from "react";
import type { HoldParsed } from "@/lib/schemas/hold";
import type { HoldResult } from "@/lib/physics/hold";
import { packOutSheet } from "@/lib/planners/pack-out-sheet";
import { carriedLabel } from "@/lib/planners/size";
import { kit } from "@/lib/planners/view-kit";
import { usePlanner } from "@/app/_components/usePlanner";
import { useUnits } from "@/app/_components/units-context";
import { LayerDiagram } from "@/app/_components/LayerDiagram";
import { CautionBlock } from "@/app/_components/CautionBlock";
import { NoResult } from "@/app/_components/ResultParts";
import { PrintButton } from "@/app/_components/PrintButton";

/** Conditioning times of the pack lines, worked out in a browser worker (null while it works). */
function useConditioningTimes(packs: HoldParsed["packs"]): (number | null)[] | null | "failed" {
  const key = JSON.stringify(packs);
  const [answer, setAnswer] = useState<{ key: string; times: (number | null)[] | "failed" } | null>(null);
  useEffect(() => {
    const w = new Worker(new URL("./conditioning.worker.ts", import.meta.url), { type: "module" });
    w.onmessage = (e: MessageEvent<{ id: number; times: (number | null)[] | "failed" }>) => setAnswer({ key, times: e.data.times });
    w.postMessage({ id: 1, packs: JSON.parse(key) });
    return () => w.terminate();
  }, [key]);
  return answer && answer.key === key ? answer.times : null;
}

/**
 * One printable page for the packer, from a hold input (a sizer candidate carried in the address, or a
 * saved hold plan): the hold and the conditioning times are computed in browser workers; nothing is saved.
 */
export function PackOutSheet({ name, input, saved }: { name?: string; input: HoldParsed; saved: boolean }) {
  // A saved plan is called by its name; a carried candidate by what it is, in the reader's units.
  const units = useUnits();
  const title = name ?? carriedLabel(input, kit(units));
  const hold = usePlanner("hold", input);
  const times = useConditioningTimes(input.packs);
  const ready = hold.status === "ready" ? hold : null;
  const sheet = packOutSheet(input, ready ? (ready.result as HoldResult) : null, !!ready && ready.stage === "full" && !ready.view.pending, times, units);
  const s = input.shipper;
  return (
    <article className="sheet">
      <header className="sheet-head">
        <h1>Pack-out sheet</h1>
        <PrintButton />
      </header>
      <p>
        <strong data-testid="sheet-name">{title}</strong> — {sheet.route}.
      </p>
      {!saved ? (
        <p className="muted no-print" data-testid="sheet-unsaved">
          This sheet is worked out from the candidate and is not saved. To keep it, open the candidate in the hold planner and save it there.
        </p>
      ) : null}
      <section>
        <h2>Box</h2>
        <p data-testid="sheet-box">{sheet.box}</p>
      </section>
      <section>
        <h2>Coolant packs</h2>
        <TextTable className="list sheet-table" testId="sheet-packs" columns={sheet.packColumns} rows={sheet.packRows} />
        <p className="muted">{sheet.conditioningNote}</p>
      </section>
      <section>
        <h2>Loading order (side view)</h2>
        <LayerDiagram
          inner={{ L: s.innerLength_m, H: s.innerHeight_m }}
          wall_m={s.wallLayers.reduce((a, l) => a + l.thickness_m, 0)}
          lid_m={(s.lidLayers ?? s.wallLayers).reduce((a, l) => a + l.thickness_m, 0)}
          wallsLabel={sheet.wallsLabel}
          packs={input.packs.map((p) => ({ name: p.pack.name, count: p.count, thickness_m: p.pack.thickness_m, placement: p.placement, touchesLoad: p.contactWith !== "none" }))}
          productLabel={sheet.loadLabel}
        />
      </section>
      <section>
        <h2>Expected hold</h2>
        {hold.status === "invalid" || hold.status === "error" ? (
          <NoResult fieldErrors={hold.status === "invalid" ? hold.fieldErrors : { "": [hold.message] }} testId="sheet-errors" />
        ) : (
          <p data-testid="sheet-hold" aria-busy={!sheet.hold || sheet.holdPending}>
            {sheet.hold ?? "Working out the hold…"}
            {sheet.holdPending ? <span className="muted no-print"> Working out the range…</span> : null}
          </p>
        )}
        <p data-testid="sheet-limits">
          {sheet.limits} {sheet.reminder}
        </p>
      </section>
      <CautionBlock dryIce={sheet.dryIce} extra={sheet.cautions} />
      <section className="blanks">
        <h2>Packing record</h2>
        {sheet.signOff.map((l) => (
          <p key={l}>{l}</p>
        ))}
      </section>
    </article>
  );
}
