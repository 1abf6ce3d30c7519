import { resolveThawRefs } from "@/lib/db/resolve";
import { calculationRoute } from "../_lib";

/** POST /api/v1/thaw — the thaw planner (in the worker pool). `product`, `ruleSet` and a tray's material may be names. */
export const POST = calculationRoute("thaw", resolveThawRefs);
