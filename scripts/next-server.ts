/**
 * Starts the built app (`next start`, after `npm run build`) on a loopback port with the given database,
 * for the load script and the crash test. The caller stops it (SIGTERM) or kills it (SIGKILL, the crash test).
 */
import { spawn, type ChildProcess } from "node:child_process";
import path from "node:path";
import { prepareDatabase } from "../lib/db/prepare";

export interface RunningServer {
  baseUrl: string;
  proc: ChildProcess;
  log: () => string;
  stop: () => Promise<void>;
  kill9: () => Promise<void>;
}

export async function startNextServer(opts: { port: number; dbPath: string; env?: Record<string, string>; seed?: boolean }): Promise<RunningServer> {
  await prepareDatabase(opts.dbPath, { seed: opts.seed ?? true, quiet: true });
  const baseUrl = `http://127.0.0.1:${opts.port}`;
  const proc = spawn(path.resolve("node_modules", ".bin", "next"), ["start", "-H", "127.0.0.1", "-p", String(opts.port)], {
    env: { ...process.env, DATABASE_URL: opts.dbPath, NEXT_TELEMETRY_DISABLED: "1", ...opts.env },
    stdio: ["ignore", "pipe", "pipe"],
    detached: true,
  });
  let log = "";
  proc.stdout?.on("data", (d) => (log += d));
  proc.stderr?.on("data", (d) => (log += d));
  const exited = new Promise<void>((r) => proc.once("exit", () => r()));
  const signal = async (sig: NodeJS.Signals) => {
    if (proc.exitCode !== null || proc.signalCode !== null) return;
    try {
      process.kill(-proc.pid!, sig);
    } catch {
      // already gone
    }
    await exited;
  };
  const server = { baseUrl, proc, log: () => log, stop: () => signal("SIGTERM"), kill9: () => signal("SIGKILL") };
  const start = Date.now();
  for (;;) {
    if (proc.exitCode !== null) throw new Error(`next start exited with code ${proc.exitCode}\n${log}`);
    try {
      const r = await fetch(baseUrl + "/api/v1/settings");
      if (r.status < 500) return server; // up (a passphrase-protected server answers 401)
    } catch {
      // not up yet
    }
    if (Date.now() - start > 60_000) {
      await server.stop();
      throw new Error(`the server at ${baseUrl} did not answer within 60 s (run \`npm run build\` first)\n${log}`);
    }
    await new Promise((r) => setTimeout(r, 250));
  }
}
