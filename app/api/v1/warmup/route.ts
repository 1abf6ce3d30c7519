import { resolveWarmupRefs } from "@/lib/db/resolve";
import { calculationRoute } from "../_lib";

/** POST /api/v1/warmup — the warm-up / cool-down check (in the worker pool). `product` and `ruleSet` may be template names. */
export const POST = calculationRoute("warmup", resolveWarmupRefs);
