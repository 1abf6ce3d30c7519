/** Runs shell commands the way a user types them, and reads the README's command-line section. */
import { spawnSync } from "node:child_process";
import { readFileSync } from "node:fs";
import path from "node:path";

export const ROOT = path.resolve(import.meta.dirname, "..", "..");

export interface Ran {
  command: string;
  status: number | null;
  stdout: string;
  stderr: string;
}

export function sh(command: string, opts: { cwd: string; env?: Record<string, string | undefined>; timeout_ms?: number }): Ran {
  const r = spawnSync("sh", ["-c", command], {
    cwd: opts.cwd,
    env: { ...process.env, NO_UPDATE_NOTIFIER: "1", npm_config_update_notifier: "false", ...opts.env },
    encoding: "utf8",
    timeout: opts.timeout_ms ?? 120_000,
    maxBuffer: 64 * 1024 * 1024,
  });
  return { command, status: r.status, stdout: r.stdout ?? "", stderr: r.stderr ?? "" };
}

/** The text of one `## heading` section of the README. */
export function readmeSection(heading: string): string {
  const readme = readFileSync(path.join(ROOT, "README.md"), "utf8");
  const start = readme.indexOf(`## ${heading}\n`);
  if (start < 0) throw new Error(`README has no "## ${heading}" section`);
  const next = readme.indexOf("\n## ", start + 3);
  return readme.slice(start, next < 0 ? undefined : next);
}

/** The fenced code blocks of a text, with their language tag. */
export function codeBlocks(text: string): { lang: string; body: string }[] {
  return [...text.matchAll(/```(\w*)\n([\s\S]*?)```/g)].map((m) => ({ lang: m[1], body: m[2] }));
}

/** The commands of a shell block: one per line, without the trailing `# comment`. */
export function commandsOf(block: string): string[] {
  return block
    .split("\n")
    .map((l) => l.replace(/\s+#\s.*$/, "").trim())
    .filter((l) => l && !l.startsWith("#"));
}

/** A stack trace in output: "    at fn (file:line:col)". */
export const STACK_TRACE = /^\s+at .+[:(].*\d+:\d+\)?$/m;
