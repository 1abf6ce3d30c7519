import { resolveTemplateRefs } from "@/lib/db/resolve";
import type { Db } from "@/lib/db/client";
import { warmupInputSchema } from "@/lib/schemas/warmup";
import { runWarmup } from "@/lib/physics/warmup";
import { calculationRoute } from "../_lib";

/** POST /api/v1/warmup — the warm-up / cool-down check. `product` and `ruleSet` may be template names. */
export const POST = calculationRoute((db: Db, body: unknown) => resolveTemplateRefs(db, body, { product: "products", ruleSet: "rulesets" }), warmupInputSchema, runWarmup);
