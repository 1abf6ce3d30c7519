// Architectural rules: client components never reach the database, and lib/ physics stays pure.
import { describe, it, expect } from "vitest";
import { readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";

function walk(dir: string): string[] {
  return readdirSync(dir).flatMap((f) => {
    const p = path.join(dir, f);
    if (f === "generated" || f === "node_modules") return [];
    return statSync(p).isDirectory() ? walk(p) : /\.(ts|tsx)$/.test(f) ? [p] : [];
  });
}

describe("module boundaries", () => {
  it("no client component imports the database, Prisma or server-only modules", () => {
    const offenders = walk("app")
      .filter((f) => /^\s*["']use client["']/.test(readFileSync(f, "utf8")))
      .filter((f) => /from\s+["'](@\/lib\/db\/(client|templates|library|plans|settings|seed|prepare|migrate)|@\/app\/_server\/|@prisma\/|better-sqlite3)/.test(readFileSync(f, "utf8")));
    expect(offenders).toEqual([]);
  });

  it("lib/ outside lib/db never imports Prisma, React or Next, and does no I/O", () => {
    const files = walk("lib").filter((f) => !f.startsWith(path.join("lib", "db")));
    expect(files.length).toBeGreaterThan(0);
    const offenders = files.filter((f) => /from\s+["'](@prisma\/|react|next|node:fs|better-sqlite3|\.\.?\/db\/|@\/lib\/db\/)/.test(readFileSync(f, "utf8")));
    expect(offenders).toEqual([]);
  });
});
