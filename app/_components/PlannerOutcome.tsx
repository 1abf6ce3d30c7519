"use client";
import type { PlannerState } from "./usePlanner";
import { PlanView } from "./PlanView";
import { NoResult } from "./ResultParts";
import { CautionBlock } from "./CautionBlock";

/** What a planner page shows of its worker's answer: the result, the problems to fix, or that it is working. */
export function PlannerOutcome({ state, testId }: { state: PlannerState; testId?: string }) {
  if (state.status === "ready") return <PlanView view={state.view} stale={state.stale} />;
  return (
    <>
      {state.status === "working" ? (
        <p className="muted" role="status">
          Working it out…
        </p>
      ) : state.status === "invalid" ? (
        <NoResult fieldErrors={state.fieldErrors} testId={testId} />
      ) : (
        <NoResult fieldErrors={{ "": [state.message] }} testId={testId} />
      )}
      <CautionBlock />
    </>
  );
}
