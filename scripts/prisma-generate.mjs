// Runs `prisma generate` on machines that cannot download Prisma's schema engine.
// The CLI only checks that an engine binary exists before generating; where no real
// engine is present we point it at a stand-in that exits 1. A machine that has the
// real engine (or sets PRISMA_SCHEMA_ENGINE_BINARY itself) is left alone.
import { spawnSync } from "node:child_process";
import { existsSync, mkdirSync, writeFileSync, chmodSync, readdirSync } from "node:fs";
import path from "node:path";
import os from "node:os";

const env = { ...process.env };
const engineDir = path.resolve("node_modules", "@prisma", "engines");
const hasRealEngine = existsSync(engineDir) && readdirSync(engineDir).some((f) => f.startsWith("schema-engine"));
if (!env.PRISMA_SCHEMA_ENGINE_BINARY && !hasRealEngine) {
  const dir = path.join(os.tmpdir(), "holdline-prisma");
  mkdirSync(dir, { recursive: true });
  const stub = path.join(dir, "no-schema-engine.sh");
  writeFileSync(stub, "#!/bin/sh\nexit 1\n");
  chmodSync(stub, 0o755);
  env.PRISMA_SCHEMA_ENGINE_BINARY = stub;
}
env.PRISMA_HIDE_UPDATE_MESSAGE = "1";
const bin = path.resolve("node_modules", ".bin", process.platform === "win32" ? "prisma.cmd" : "prisma");
// The SQLite client from prisma/schema.prisma, then the PostgreSQL client from its generated copy.
const pgCopy = spawnSync(process.execPath, [path.resolve("scripts", "pg-schema.mjs")], { stdio: "inherit", env });
if (pgCopy.status !== 0) process.exit(pgCopy.status ?? 1);
for (const args of [["generate", "--schema", "prisma/schema.prisma"], ["generate", "--schema", "prisma/postgresql/schema.prisma"]]) {
  const r = spawnSync(bin, args, { stdio: "inherit", env });
  if (r.status !== 0) process.exit(r.status ?? 1);
}
