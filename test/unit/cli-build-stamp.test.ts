/**
 * The fingerprint that decides when `npm start` rebuilds the app and when the holdline bin rebuilds
 * its bundle (scripts/source-stamp.mjs): unchanged sources give the same stamp; an edit, a new file
 * or a removed one change it; build output and node_modules do not count.
 */
import { describe, it, expect } from "vitest";
import { mkdirSync, mkdtempSync, rmSync, utimesSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { sourceStamp, APP_SOURCES, CLI_SOURCES, cliBundleIsStale } from "../../scripts/source-stamp.mjs";

function tree() {
  const root = mkdtempSync(path.join(os.tmpdir(), "holdline-stamp-"));
  for (const d of ["app", "lib", "cli", "public", "node_modules/x", ".next", "dist/cli", "prisma"]) mkdirSync(path.join(root, d), { recursive: true });
  writeFileSync(path.join(root, "app", "page.tsx"), "export default 1;\n");
  writeFileSync(path.join(root, "lib", "a.ts"), "export const a = 1;\n");
  writeFileSync(path.join(root, "cli", "holdline.ts"), "export {};\n");
  writeFileSync(path.join(root, "package.json"), "{}\n");
  writeFileSync(path.join(root, "prisma", "schema.prisma"), "// schema\n");
  return root;
}

describe("source stamp", () => {
  it("is stable while nothing changes, and ignores node_modules, .next and dist", () => {
    const root = tree();
    const s = sourceStamp(root, APP_SOURCES);
    expect(sourceStamp(root, APP_SOURCES)).toBe(s);
    writeFileSync(path.join(root, "node_modules", "x", "index.js"), "1");
    writeFileSync(path.join(root, ".next", "BUILD_ID"), "1");
    writeFileSync(path.join(root, "dist", "cli", "holdline.mjs"), "1");
    expect(sourceStamp(root, APP_SOURCES)).toBe(s);
  });

  it("changes on an edit, a touch and a new file; removing it again gives the earlier stamp", () => {
    const root = tree();
    const stamps = new Set([sourceStamp(root, APP_SOURCES)]);
    writeFileSync(path.join(root, "lib", "a.ts"), "export const a = 22;\n");
    stamps.add(sourceStamp(root, APP_SOURCES));
    utimesSync(path.join(root, "app", "page.tsx"), new Date(2020, 1, 1), new Date(2020, 1, 1));
    const beforeNew = sourceStamp(root, APP_SOURCES);
    stamps.add(beforeNew);
    writeFileSync(path.join(root, "public", "new.json"), "{}");
    stamps.add(sourceStamp(root, APP_SOURCES));
    expect(stamps.size).toBe(4);
    rmSync(path.join(root, "public", "new.json"));
    expect(sourceStamp(root, APP_SOURCES)).toBe(beforeNew);
  });

  it("the CLI bundle is stale until its stamp matches cli/ and lib/, and again after an edit there", () => {
    const root = tree();
    expect(cliBundleIsStale(root)).toBe(true);
    writeFileSync(path.join(root, "dist", "cli", "holdline.mjs"), "// bundle");
    writeFileSync(path.join(root, "dist", "cli.stamp"), sourceStamp(root, CLI_SOURCES) + "\n");
    expect(cliBundleIsStale(root)).toBe(false);
    writeFileSync(path.join(root, "app", "page.tsx"), "export default 2;\n"); // not a CLI source
    expect(cliBundleIsStale(root)).toBe(false);
    writeFileSync(path.join(root, "cli", "holdline.ts"), "export const x = 1;\n");
    expect(cliBundleIsStale(root)).toBe(true);
  });
});
