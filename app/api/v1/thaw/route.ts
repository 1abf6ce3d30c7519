import { resolveThawRefs } from "@/lib/db/resolve";
import { thawInputSchema } from "@/lib/schemas/thaw";
import { runThawParsed } from "@/lib/physics/thaw";
import { calculationRoute } from "../_lib";

/** POST /api/v1/thaw — the thaw planner. `product`, `ruleSet` and a tray's material may be names. */
export const POST = calculationRoute(resolveThawRefs, thawInputSchema, runThawParsed);
