/**
 * Starts the built app (`next start`) on a free loopback port with a fresh temporary
 * database, and Debian's Chromium through playwright-core. Never downloads a browser.
 */
import { spawn, type ChildProcess } from "node:child_process";
import { existsSync, mkdtempSync, rmSync } from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import { after, before } from "node:test";
import { chromium, type BrowserContext, type Page } from "playwright-core";

export interface Harness {
  baseUrl: string;
  context: BrowserContext;
  stop: () => Promise<void>;
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.once("error", reject);
    srv.listen(0, "127.0.0.1", () => {
      const port = (srv.address() as net.AddressInfo).port;
      srv.close(() => resolve(port));
    });
  });
}

async function waitForServer(url: string, proc: ChildProcess, timeoutMs = 60000): Promise<void> {
  const start = Date.now();
  while (Date.now() - start < timeoutMs) {
    if (proc.exitCode !== null) throw new Error(`next start exited with code ${proc.exitCode}`);
    try {
      const r = await fetch(url);
      if (r.ok) return;
    } catch {
      // not up yet
    }
    await new Promise((r) => setTimeout(r, 300));
  }
  throw new Error(`Server at ${url} did not answer within ${timeoutMs} ms`);
}

export function chromiumPath(): string {
  const candidates = [process.env.CHROMIUM_PATH, "/usr/bin/chromium", "/usr/bin/chromium-browser"].filter(Boolean) as string[];
  const found = candidates.find((c) => existsSync(c));
  if (!found) throw new Error("Chromium not found. Install Debian's package: apt-get install -y chromium (or set CHROMIUM_PATH).");
  return found;
}

export async function startHarness(): Promise<Harness> {
  const tmp = mkdtempSync(path.join(os.tmpdir(), "holdline-e2e-"));
  const port = await freePort();
  const baseUrl = `http://127.0.0.1:${port}`;
  const nextBin = path.resolve("node_modules", ".bin", "next");
  const server = spawn(nextBin, ["start", "-H", "127.0.0.1", "-p", String(port)], {
    env: { ...process.env, DATABASE_URL: path.join(tmp, "e2e.db"), NEXT_TELEMETRY_DISABLED: "1" },
    stdio: ["ignore", "pipe", "pipe"],
    detached: true,
  });
  let serverLog = "";
  server.stdout?.on("data", (d) => (serverLog += d));
  server.stderr?.on("data", (d) => (serverLog += d));
  try {
    await waitForServer(baseUrl + "/api/v1/settings", server);
  } catch (e) {
    try {
      process.kill(-server.pid!, "SIGTERM");
    } catch {}
    throw new Error(`${(e as Error).message}\n${serverLog}`);
  }
  const context = await chromium.launchPersistentContext(path.join(tmp, "profile"), {
    executablePath: (() => {
      try {
        return chromiumPath();
      } catch (e) {
        // Do not leave the server running when there is no browser.
        try {
          process.kill(-server.pid!, "SIGTERM");
        } catch {}
        throw e;
      }
    })(),
    headless: true,
    args: ["--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
    viewport: { width: 1280, height: 900 },
    // page.request calls the API as a script would; changing requests must name the server's origin (proxy.ts).
    extraHTTPHeaders: { origin: baseUrl },
  });
  return {
    baseUrl,
    context,
    stop: async () => {
      await context.close().catch(() => {});
      try {
        process.kill(-server.pid!, "SIGTERM");
      } catch {}
      await new Promise((r) => setTimeout(r, 300));
      rmSync(tmp, { recursive: true, force: true });
    },
  };
}

/** Registers before/after hooks that start the app and a browser page for one test file. */
export function browserSuite(): { readonly h: Harness; readonly page: Page } {
  const state = {} as { h: Harness; page: Page };
  before(async () => {
    state.h = await startHarness();
    state.page = await state.h.context.newPage();
    state.page.setDefaultTimeout(15000);
  });
  after(async () => {
    await state.h?.stop();
  });
  return state;
}
