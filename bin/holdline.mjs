#!/usr/bin/env node
// Runs the TypeScript CLI through tsx, so no separate build step is needed.
import { register } from "tsx/esm/api";

register();
await import("../cli/holdline.ts");
