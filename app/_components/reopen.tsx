"use client";
/**
 * Reopening a saved plan on its planner page: the plan brings its own templates (offered in the pickers
 * even if the library has changed or lost them since), and the page says what was reopened.
 */

/** The library's templates plus those of a reopened plan that the library no longer has by that name. */
export function withSnapshot<T extends { name: string }>(library: T[], fromPlan: (T | undefined | null)[]): T[] {
  return [...library, ...fromPlan.filter((x): x is T => !!x && !library.some((y) => y.name === x.name))];
}

export function ReopenedBanner({ name, what = "plan" }: { name: string | undefined; what?: string }) {
  return name ? (
    <p className="banner ok no-print" role="status" style={{ gridColumn: "1 / -1" }}>
      Reopened the saved {what} &ldquo;{name}&rdquo; with the templates as they were when it was saved.
    </p>
  ) : null;
}
