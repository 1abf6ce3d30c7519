// Prebuilt JavaScript for code that runs outside Next's bundler: worker threads and the like load these
// files directly, without a TypeScript loader. Run by `postinstall` and `prebuild` (and `npm run bundle`).
// One entry a line: { in: source, out: bundle under dist/ }.
// `--out-dir DIR` writes every bundle into DIR instead (the tests bundle the current sources that way).
import { build } from "esbuild";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { parseArgs } from "node:util";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");

const ENTRIES = [
  { in: "app/_server/calc-worker.ts", out: "dist/calc-worker.mjs" }, // the server's calculation pool (app/_server/calc-pool.ts)
];

const { values } = parseArgs({ options: { "out-dir": { type: "string" } } });
const outDir = values["out-dir"] ? path.resolve(values["out-dir"]) : null;

for (const e of ENTRIES) {
  const outfile = outDir ? path.join(outDir, path.basename(e.out)) : e.out;
  await build({
    absWorkingDir: root,
    entryPoints: [e.in],
    outfile,
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
  if (!outDir) console.log(`bundled ${e.in} -> ${e.out}`);
}
