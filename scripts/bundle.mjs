// Prebuilt JavaScript for code that runs outside Next's bundler: worker threads and the like load these
// files directly, without a TypeScript loader. Run by `postinstall` and `prebuild` (and `npm run bundle`).
// One entry a line: { in: source, out: bundle under dist/ }.
import { build } from "esbuild";
import path from "node:path";
import { fileURLToPath } from "node:url";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");

const ENTRIES = [
  { in: "app/_server/calc-worker.ts", out: "dist/calc-worker.mjs" }, // the server's calculation pool (app/_server/calc-pool.ts)
];

for (const e of ENTRIES) {
  await build({
    absWorkingDir: root,
    entryPoints: [e.in],
    outfile: e.out,
    bundle: true,
    platform: "node",
    format: "esm",
    target: "node20",
    sourcemap: "linked",
    logLevel: "warning",
    alias: { "@": root },
    // CommonJS dependencies bundled into ESM still call require() for node built-ins.
    banner: { js: "import { createRequire as __holdlineCreateRequire } from 'node:module'; const require = __holdlineCreateRequire(import.meta.url);" },
  });
  console.log(`bundled ${e.in} -> ${e.out}`);
}
