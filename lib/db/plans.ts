import type { Db } from "./client";
import { z } from "zod";
import type { Actor } from "./audit";
import { parseId } from "../schemas/id";
import { PLANNER_KINDS } from "../planners/registry";

/** Every planner in the registry keeps plans. */
export const PLAN_KINDS = PLANNER_KINDS;

export const planNameSchema = z.string({ error: "Name: enter a name" }).trim().min(1, { error: "Name: enter a name" }).max(200, { error: "Name: at most 200 characters" });

/**
 * A saved plan keeps a full copy of its inputs, so editing or deleting a template never changes it, and
 * the result the server computed from them (never one sent by the client).
 */
export const planSchema = z.object({
  kind: z.enum(PLAN_KINDS, { error: `Plan kind: ${PLAN_KINDS.join(", ")}` }),
  name: planNameSchema,
  input: z.unknown(),
  result: z.unknown(),
});
/** What a client sends to save a plan: the planner, a name and the input (templates by name or spelled out). */
export const planRequestSchema = planSchema.pick({ kind: true, name: true, input: true });
export type PlanInput = z.input<typeof planSchema>;

export interface StoredPlan {
  id: number;
  kind: string;
  name: string;
  input: unknown;
  result: unknown;
  createdAt: Date;
  /** Who saved it (accounts mode); null in a single-user install. */
  createdByName: string | null;
}

export async function savePlan(db: Db, plan: PlanInput, actor: Actor = null): Promise<number> {
  const p = planSchema.parse(plan);
  const row = await db.plan.create({
    data: {
      kind: p.kind,
      name: p.name,
      input: JSON.stringify(p.input ?? null),
      result: JSON.stringify(p.result ?? null),
      createdById: actor?.id ?? null,
      createdByName: actor?.name ?? null,
    },
  });
  return row.id;
}

function toPlan(r: { id: number; kind: string; name: string; input: string; result: string; createdAt: Date; createdByName: string | null }): StoredPlan {
  return { id: r.id, kind: r.kind, name: r.name, input: JSON.parse(r.input), result: JSON.parse(r.result), createdAt: r.createdAt, createdByName: r.createdByName };
}

export async function listPlans(db: Db): Promise<StoredPlan[]> {
  return (await db.plan.findMany({ orderBy: { createdAt: "desc" } })).map(toPlan);
}

/** `id` may be the text from a URL; anything but a plain positive whole number in range finds nothing. */
export async function getPlan(db: Db, rawId: number | string): Promise<StoredPlan | null> {
  const id = parseId(rawId);
  if (id === null) return null;
  const r = await db.plan.findUnique({ where: { id } });
  return r ? toPlan(r) : null;
}

export async function deletePlan(db: Db, rawId: number | string): Promise<boolean> {
  const id = parseId(rawId);
  if (id === null) return false;
  const r = await db.plan.deleteMany({ where: { id } });
  return r.count === 1;
}

/** Renames a plan; false when there is no such plan. The name is checked with planNameSchema first. */
export async function renamePlan(db: Db, rawId: number | string, name: string): Promise<boolean> {
  const id = parseId(rawId);
  if (id === null) return false;
  const r = await db.plan.updateMany({ where: { id }, data: { name: planNameSchema.parse(name) } });
  return r.count === 1;
}
