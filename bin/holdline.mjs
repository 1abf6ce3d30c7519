#!/usr/bin/env node
// The holdline command. Runs the prebuilt bundle (dist/cli/holdline.mjs, made by `npm install`
// through scripts/bundle.mjs). In a git checkout it rebuilds the bundle first when cli/ or lib/
// changed since it was built, so `npx holdline` never runs stale code; where that fails (no esbuild)
// it runs the bundle it has. An installed package (no .git) runs its bundle as it is.
import { existsSync } from "node:fs";
import { fileURLToPath } from "node:url";
import path from "node:path";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const entry = path.join(root, "dist", "cli", "holdline.mjs");

async function rebuildIfStale() {
  if (!existsSync(path.join(root, ".git")) && existsSync(entry)) return;
  const { cliBundleIsStale } = await import("../scripts/source-stamp.mjs");
  if (!cliBundleIsStale(root)) return;
  try {
    const { bundle } = await import("../scripts/bundle.mjs");
    await bundle({ quiet: true });
  } catch (e) {
    if (!existsSync(entry)) {
      process.stderr.write(`holdline: the command is not built and cannot be built here (${e instanceof Error ? e.message.split("\n")[0] : e}); run "npm install" in ${root}\n`);
      process.exit(1);
    }
  }
}

await rebuildIfStale();
await import(entry);
