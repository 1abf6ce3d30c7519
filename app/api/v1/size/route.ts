import { resolveSizeRefs } from "@/lib/db/resolve";
import { sizeInputSchema } from "@/lib/schemas/size";
import { runSizing, evaluateHere } from "@/lib/physics/sizing";
import { calculationRoute } from "../_lib";

/** POST /api/v1/size — the pack-out sizer (in this server process; the CLI and the page use both cores). */
export const POST = calculationRoute(resolveSizeRefs, sizeInputSchema, (input) => runSizing(input, evaluateHere(input)));
