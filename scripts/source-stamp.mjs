// A cheap fingerprint of source trees: sha256 over every file's relative path, size and
// modification time (no file is read). Used to decide whether a build is stale: the CLI bundle
// (bin/holdline.mjs, scripts/bundle.mjs) and the Next build (scripts/build-if-changed.mjs).
import { createHash } from "node:crypto";
import { existsSync, readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";

/** What the CLI bundle is built from. */
export const CLI_SOURCES = ["cli", "lib", "prisma/schema.prisma", "package.json"];
/** What `next build` reads. */
export const APP_SOURCES = ["app", "lib", "public", "prisma/schema.prisma", "next.config.js", "tsconfig.json", "package.json", "package-lock.json"];

const SKIP = new Set(["node_modules", ".next", "dist", ".git"]);

function walk(abs, rel, out) {
  let st;
  try {
    st = statSync(abs);
  } catch {
    return;
  }
  if (st.isDirectory()) {
    for (const name of readdirSync(abs).sort()) if (!SKIP.has(name)) walk(path.join(abs, name), rel ? `${rel}/${name}` : name, out);
  } else if (st.isFile()) {
    out.push(`${rel}\t${st.size}\t${Math.trunc(st.mtimeMs)}`);
  }
}

/** The stamp of the given files and folders (relative to root); missing ones count as absent. */
export function sourceStamp(root, items) {
  const lines = [];
  for (const item of items) {
    const abs = path.join(root, item);
    if (existsSync(abs)) walk(abs, item, lines);
    else lines.push(`${item}\tabsent`);
  }
  return createHash("sha256").update(lines.join("\n")).digest("hex");
}

/** True when the CLI bundle under root/dist is missing or was built from other sources than those now present. */
export function cliBundleIsStale(root) {
  const stampFile = path.join(root, "dist", "cli.stamp");
  if (!existsSync(path.join(root, "dist", "cli", "holdline.mjs")) || !existsSync(stampFile)) return true;
  return readFileSync(stampFile, "utf8").trim() !== sourceStamp(root, CLI_SOURCES);
}
