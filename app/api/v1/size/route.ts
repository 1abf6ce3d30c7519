import { resolveSizeRefs } from "@/lib/db/resolve";
import { calculationRoute } from "../_lib";

/** POST /api/v1/size — the pack-out sizer (one worker of the server's pool; the CLI and the page use both cores). */
export const POST = calculationRoute("size", resolveSizeRefs);
