import { resolveHoldRefs } from "@/lib/db/resolve";
import { holdInputSchema } from "@/lib/schemas/hold";
import { runHoldParsed } from "@/lib/physics/hold";
import { calculationRoute } from "../_lib";

/** POST /api/v1/hold — the hold planner. Templates may be given by name. */
export const POST = calculationRoute(resolveHoldRefs, holdInputSchema, runHoldParsed);
