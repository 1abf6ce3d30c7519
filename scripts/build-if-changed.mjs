// `npm start` runs this first: `next build` only when the app's sources (app/, lib/, public/, the
// Prisma schema, the configs and the lock file) changed since the last build that this script made.
// Delete .next/ (or run `npm run build`) to force a build.
import { spawnSync } from "node:child_process";
import { existsSync, readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { sourceStamp, APP_SOURCES } from "./source-stamp.mjs";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const stampFile = path.join(root, ".next", "holdline-sources.stamp");
const built = existsSync(stampFile) ? readFileSync(stampFile, "utf8").trim() : "";

if (existsSync(path.join(root, ".next", "BUILD_ID")) && built === sourceStamp(root, APP_SOURCES)) {
  console.error("holdline: the build in .next/ matches the sources; starting it without rebuilding");
} else {
  console.error(built ? "holdline: sources changed since the last build; rebuilding" : "holdline: no build yet; building");
  const r = spawnSync(process.platform === "win32" ? "npm.cmd" : "npm", ["run", "build"], { cwd: root, stdio: "inherit" });
  if (r.status !== 0) process.exit(r.status ?? 1);
  // Stamped after the build: prebuild regenerates the Prisma client, which is part of the sources.
  writeFileSync(stampFile, sourceStamp(root, APP_SOURCES) + "\n");
}
