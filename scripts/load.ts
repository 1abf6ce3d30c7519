/**
 * `npm run load`: 500 requests at concurrency 20 on loopback, half `POST /api/v1/hold` and half the product
 * list (`GET /api/v1/products`), while a heavy pack-out sizing runs in the server's worker pool. Prints the
 * errors and p50/p95/p99 of each kind. Goal: 0 errors, and the list's p99 under 300 ms during the sizing.
 *
 *   npm run load                       # builds nothing: run `npm run build` first; serves on 127.0.0.1:3105
 *   npm run load -- --url http://127.0.0.1:3000   # against a running server (it must allow loopback)
 *   npm run load -- --requests 1000 --concurrency 40 --port 3106
 */
import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { parseArgs } from "node:util";
import { startNextServer, type RunningServer } from "./next-server";

const { values } = parseArgs({
  options: {
    url: { type: "string" },
    port: { type: "string", default: "3105" },
    requests: { type: "string", default: "500" },
    concurrency: { type: "string", default: "20" },
  },
});
const N = Number(values.requests);
const C = Number(values.concurrency);

const HOLD = {
  products: [{ product: "Roast chicken thighs, half tray", count: 2, start_C: 3 }],
  shipper: "Quillfield thin foam cooler",
  packs: [{ pack: "Gel pack, 600 g", count: 4, conditioning_C: -18 }],
  route: "Summer lunch run, Harbour Street",
};
/** A heavy search: every count of two packs at three conditioning temperatures over four box variants, no pruning. */
const HEAVY_SIZING = {
  products: [{ product: "Roast chicken thighs, half tray", count: 2, start_C: 3 }],
  route: "Overnight courier, Millbrook depot",
  boxes: [{ shipper: "Quillfield thick catering box", thicknessVariants_m: [0.03, 0.05, 0.07] }],
  packs: [
    { pack: "Gel pack, 600 g", maxCount: 20, conditioning_C: [-25, -18, -10] },
    { pack: "Water ice brick, 1 kg", maxCount: 12, conditioning_C: [-18] },
  ],
  prune: false,
};

const pct = (xs: number[], p: number) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length ? s[Math.min(s.length - 1, Math.ceil((p / 100) * s.length) - 1)] : NaN;
};

async function main() {
  let server: RunningServer | null = null;
  let tmp: string | null = null;
  let base = values.url;
  if (!base) {
    tmp = mkdtempSync(path.join(os.tmpdir(), "holdline-load-"));
    server = await startNextServer({ port: Number(values.port), dbPath: path.join(tmp, "load.db") });
    base = server.baseUrl;
  }
  const origin = new URL(base).origin;
  const headers = { "content-type": "application/json", origin };
  try {
    // Warm-up (first requests load each route's code and start the pool), then the list's quiet baseline.
    for (let i = 0; i < 3; i++) {
      await (await fetch(base + "/api/v1/hold", { method: "POST", headers, body: JSON.stringify(HOLD) })).arrayBuffer();
      await (await fetch(base + "/api/v1/products", { headers: { origin } })).arrayBuffer();
    }
    const quiet: number[] = [];
    for (let i = 0; i < 20; i++) {
      const t = performance.now();
      await (await fetch(base + "/api/v1/products", { headers: { origin } })).arrayBuffer();
      quiet.push(performance.now() - t);
    }
    console.log(`quiet list (nothing else running): p50 ${pct(quiet, 50).toFixed(0)} ms  max ${Math.max(...quiet).toFixed(0)} ms`);
    const sizingStart = performance.now();
    let sizingEnd = 0;
    const sizing = fetch(base + "/api/v1/size", { method: "POST", headers, body: JSON.stringify(HEAVY_SIZING) }).then(async (r) => {
      sizingEnd = performance.now();
      const b = await r.json().catch(() => ({}));
      return { status: r.status, s: (sizingEnd - sizingStart) / 1000, evaluated: b.evaluated as number | undefined, error: b.error as string | undefined };
    });
    await new Promise((r) => setTimeout(r, 500)); // let the sizing get going

    const lat: Record<string, number[]> = { hold: [], list: [], listDuringSizing: [] };
    const errors: string[] = [];
    let next = 0;
    const t0 = performance.now();
    const one = async (i: number) => {
      const kind = i % 2 === 0 ? "hold" : "list";
      const start = performance.now();
      try {
        const r =
          kind === "hold"
            ? await fetch(base + "/api/v1/hold", { method: "POST", headers, body: JSON.stringify(HOLD) })
            : await fetch(base + "/api/v1/products", { headers: { origin } });
        await r.arrayBuffer();
        if (r.status !== 200) errors.push(`${kind}: HTTP ${r.status}`);
      } catch (e) {
        errors.push(`${kind}: ${(e as Error).message}`);
      }
      const end = performance.now();
      lat[kind].push(end - start);
      if (kind === "list" && (sizingEnd === 0 || end < sizingEnd)) lat.listDuringSizing.push(end - start);
    };
    await Promise.all(
      Array.from({ length: C }, async () => {
        while (next < N) await one(next++);
      }),
    );
    const wall = (performance.now() - t0) / 1000;
    const sz = await sizing;
    console.log(`load: ${N} requests at concurrency ${C} against ${base} in ${wall.toFixed(1)} s (${(N / wall).toFixed(0)} req/s)`);
    console.log(`heavy sizing: HTTP ${sz.status} after ${sz.s.toFixed(1)} s${sz.evaluated !== undefined ? `, ${sz.evaluated} candidates run` : ""}${sz.error ? ` (${sz.error})` : ""}`);
    for (const [k, xs] of Object.entries(lat)) {
      if (!xs.length) continue;
      console.log(`${k.padEnd(17)} n=${String(xs.length).padStart(4)}  p50 ${pct(xs, 50).toFixed(0)} ms  p95 ${pct(xs, 95).toFixed(0)} ms  p99 ${pct(xs, 99).toFixed(0)} ms  max ${Math.max(...xs).toFixed(0)} ms`);
    }
    const counted = new Map<string, number>();
    for (const e of errors) counted.set(e, (counted.get(e) ?? 0) + 1);
    console.log(`errors: ${errors.length}${errors.length ? " — " + [...counted].map(([e, n]) => `${n} × ${e}`).join("; ") : ""}`);
    const listP99 = pct(lat.listDuringSizing.length ? lat.listDuringSizing : lat.list, 99);
    const ok = errors.length === 0 && listP99 < 300;
    console.log(ok ? "goal met: 0 errors, list p99 under 300 ms" : `goal missed: ${errors.length} errors, list p99 ${listP99.toFixed(0)} ms`);
    process.exitCode = ok ? 0 : 1;
  } finally {
    await server?.stop();
    if (tmp) rmSync(tmp, { recursive: true, force: true });
  }
}

main().catch((e) => {
  console.error(e instanceof Error ? e.message : e);
  process.exit(1);
});
