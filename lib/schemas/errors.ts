import type { z } from "zod";

/** Field errors keyed by dotted path ("composition", "segments.2.duration_s"); "" holds whole-form errors. */
export type FieldErrors = Record<string, string[]>;

export function fieldErrorsOf(error: z.ZodError): FieldErrors {
  const out: FieldErrors = {};
  for (const issue of error.issues) {
    const key = issue.path.map(String).join(".");
    (out[key] ??= []).push(issue.message);
  }
  return out;
}

/** One line per problem, for the CLI: "products[2].composition: …". */
export function describeIssues(error: z.ZodError, prefix = ""): string[] {
  return error.issues.map((i) => {
    const path = i.path.map((p, n) => (typeof p === "number" ? `[${p}]` : n === 0 ? String(p) : `.${String(p)}`)).join("");
    const where = prefix ? (path ? `${prefix}.${path}` : prefix) : path || "(whole file)";
    return `${where}: ${i.message}`;
  });
}

/** What saving a template answers: the forms, the API and the CLI all read this. */
export type SaveResult =
  | { ok: true; id: number; version: number }
  | { ok: false; reason: "invalid"; fieldErrors: FieldErrors }
  | { ok: false; reason: "conflict"; message: string; currentVersion: number | null }
  | { ok: false; reason: "not_found"; message: string };
