// Node worker thread for the pack-out sizer: loads the TypeScript model through tsx.
import { register } from "tsx/esm/api";

register();
await import("./size-worker-main.ts");
