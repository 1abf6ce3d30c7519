import { resolveHoldRefs } from "@/lib/db/resolve";
import { calculationRoute } from "../_lib";

/** POST /api/v1/hold — the hold planner (in the worker pool). Templates may be given by name. */
export const POST = calculationRoute("hold", resolveHoldRefs);
