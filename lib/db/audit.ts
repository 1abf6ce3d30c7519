/**
 * Who changed what: the rule-set history (every create, update, delete and import of a
 * rule set, the food-safety limits, with who and when and the rule set as saved) and the
 * actor recorded on saved plans. Without accounts (a single-user install) the actor is
 * null and the history says "single user".
 */
import type { Db } from "./client";

export const ROLES = ["editor", "planner"] as const;
export type Role = (typeof ROLES)[number];

/** The signed-in person, or null in a single-user install. */
export type Actor = { id: number; name: string; role: Role } | null;

export const SINGLE_USER = "single user";

export type RuleSetAction = "created" | "updated" | "deleted" | "imported";

export async function recordRuleSetChange(
  tx: Db,
  change: { ruleSetId: number; ruleSetName: string; action: RuleSetAction; version: number; snapshot: unknown; actor: Actor },
): Promise<void> {
  await tx.ruleSetChange.create({
    data: {
      ruleSetId: change.ruleSetId,
      ruleSetName: change.ruleSetName,
      action: change.action,
      version: change.version,
      snapshot: JSON.stringify(change.snapshot),
      byAccountId: change.actor?.id ?? null,
      byName: change.actor?.name ?? SINGLE_USER,
    },
  });
}

export interface RuleSetChangeEntry {
  id: number;
  ruleSetId: number;
  ruleSetName: string;
  action: RuleSetAction;
  version: number;
  snapshot: unknown;
  byAccountId: number | null;
  byName: string;
  at: Date;
}

/** A rule set's history, newest first (also after it was deleted: its id keeps the rows). */
export async function ruleSetHistory(db: Db, ruleSetId: number): Promise<RuleSetChangeEntry[]> {
  if (!Number.isInteger(ruleSetId) || ruleSetId <= 0) return [];
  const rows = await db.ruleSetChange.findMany({ where: { ruleSetId }, orderBy: [{ at: "desc" }, { id: "desc" }] });
  return rows.map((r) => ({ ...r, action: r.action as RuleSetAction, snapshot: JSON.parse(r.snapshot) }));
}
