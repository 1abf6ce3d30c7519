// Bundles the code that runs outside Next's bundler into plain JavaScript under dist/, so it starts
// without compiling TypeScript: the holdline command, its sizer threads, and the server's calculation
// worker pool (app/_server/calc-pool.ts). Run by `postinstall`, `prebuild`, `prepack` and `npm run
// bundle`; the bin rebuilds by itself when the sources are newer (bin/holdline.mjs).
// One entry a line: { in: source, out: bundle under dist/, split: code splitting into the out folder }.
// `--out-dir DIR` writes every bundle into DIR instead (the API tests bundle the current sources that way).
//
// Only better-sqlite3 (a compiled addon) stays external and resolves from node_modules at run time.
// The Prisma client generated into lib/db/generated/ is bundled with its runtime and the adapter
// (loading them as separate ES modules from node_modules cost about a fifth more CPU per library
// command). Code splitting keeps the database layer in its own chunks, loaded only when a command
// needs the library.
import * as esbuild from "esbuild";
import { existsSync, mkdirSync, renameSync, rmSync, writeFileSync } from "node:fs";
import path from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";
import { parseArgs } from "node:util";
import { sourceStamp, CLI_SOURCES } from "./source-stamp.mjs";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");

const entries = [
  { in: "cli/entry.ts", out: "dist/cli/holdline.mjs", split: true },
  { in: "cli/size-worker-main.ts", out: "dist/cli/size-worker.mjs", split: true },
  { in: "app/_server/calc-worker.ts", out: "dist/calc-worker.mjs", split: false }, // the server's calculation pool
];

/**
 * zod re-exports all of its ~60 message translations as `z.locales`; Holdline speaks English only and
 * never reads `z.locales`, so the bundle carries just the English one (zod installs it by default).
 * This halves the zod code that every command has to load.
 */
const englishOnlyZod = {
  name: "zod-english-only",
  setup(build) {
    build.onResolve({ filter: /^\.\.\/locales\/index\.js$/ }, (args) =>
      /[\\/]zod[\\/]/.test(args.importer) ? { path: "zod-locales-en", namespace: "holdline" } : undefined,
    );
    build.onLoad({ filter: /^zod-locales-en$/, namespace: "holdline" }, () => ({
      contents: 'export { default as en } from "zod/v4/locales/en.js";',
      resolveDir: root,
      loader: "js",
    }));
  },
};

const external = ["better-sqlite3"];

/** Builds every entry; returns the output paths. Throws on a build error (esbuild prints it). */
export async function bundle({ quiet = false, outDir = null } = {}) {
  const final = (e) => (outDir ? path.join(outDir, path.basename(e.out)) : path.join(root, e.out));
  // Split bundles are built into a fresh sibling folder and swapped in at the end (chunk names carry a
  // hash, so the folder must hold only this build): a holdline command started meanwhile (a test, a
  // second terminal) never finds its folder half written or gone.
  const splitDirs = outDir ? [] : [...new Set(entries.filter((e) => e.split).map((e) => path.dirname(final(e))))];
  const staging = new Map(splitDirs.map((d) => [d, `${d}.new-${process.pid}`]));
  for (const d of staging.values()) rmSync(d, { recursive: true, force: true });
  const outOf = (e) => {
    const f = final(e);
    const st = staging.get(path.dirname(f));
    return st ? path.join(st, path.basename(f)) : f;
  };
  for (const e of entries) {
    const out = outOf(e);
    await esbuild.build({
      absWorkingDir: root,
      entryPoints: [e.in],
      outdir: path.dirname(out),
      entryNames: path.basename(out, path.extname(out)),
      outExtension: { ".js": ".mjs" },
      chunkNames: "[name]-[hash]",
      bundle: true,
      splitting: e.split,
      format: "esm",
      platform: "node",
      target: "node20",
      external,
      plugins: [englishOnlyZod],
      alias: { "@": root },
      minify: true,
      // CommonJS dependencies bundled into ESM call require() for node built-ins.
      banner: { js: 'import { createRequire as __holdlineCreateRequire } from "node:module"; const require = __holdlineCreateRequire(import.meta.url);' },
      sourcemap: false,
      legalComments: "none",
      logLevel: quiet ? "error" : "warning",
    });
  }
  if (outDir) return entries.map(outOf);
  for (const [dir, st] of staging) {
    const old = `${dir}.old-${process.pid}`;
    if (existsSync(dir)) renameSync(dir, old);
    renameSync(st, dir);
    rmSync(old, { recursive: true, force: true });
  }
  mkdirSync(path.join(root, "dist"), { recursive: true });
  writeFileSync(path.join(root, "dist", "cli.stamp"), sourceStamp(root, CLI_SOURCES) + "\n");
  if (!quiet) console.error(`holdline: bundled ${entries.map((e) => e.out).join(", ")}`);
  return entries.map((e) => path.join(root, e.out));
}

if (process.argv[1] && import.meta.url === pathToFileURL(path.resolve(process.argv[1])).href) {
  const { values } = parseArgs({ options: { "out-dir": { type: "string" } } });
  await bundle({ outDir: values["out-dir"] ? path.resolve(values["out-dir"]) : null });
}
