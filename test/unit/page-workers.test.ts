/**
 * The page's two planner workers (app/_components/usePlanner.ts) on real threads: the planner worker's
 * protocol (lib/planners/worker-protocol.ts) in two worker_threads (scripts/page-worker-host.ts, bundled
 * fresh), a lead and a helper on one board, as the page drives them. The full answer for the 48 h bench plan
 * with its band is the one worker's to the last digit, the helper really takes corners, a board withdrawn
 * mid-run for a newer request stops the older one without changing the newer answer, and a helper stopped
 * mid-run does not keep the lead waiting.
 */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { Worker } from "node:worker_threads";
import * as esbuild from "esbuild";
import { SharedBoard } from "../../lib/planners/shared-board";
import { plannerWorkerHandler, type FromPlannerWorker } from "../../lib/planners/worker-protocol";
import { DEFAULT_UNIT_PREFS } from "../../lib/units";
import { holdInput } from "../../scripts/bench-cases";

type Full = Extract<FromPlannerWorker, { type: "result" }>;
const input = JSON.parse(JSON.stringify(holdInput(true))) as unknown;

describe("the page's lead and helper workers on real threads", () => {
  let dir = "";
  let host = "";
  let alone: Full;
  beforeAll(async () => {
    dir = mkdtempSync(path.join(os.tmpdir(), "holdline-page-workers-"));
    host = path.join(dir, "page-worker.mjs");
    await esbuild.build({ entryPoints: [path.resolve(__dirname, "../../scripts/page-worker-host.ts")], bundle: true, platform: "node", format: "esm", outfile: host, logLevel: "warning" });
    const out: FromPlannerWorker[] = [];
    await plannerWorkerHandler((m) => out.push(m))({ type: "run", id: 1, kind: "hold", input, units: DEFAULT_UNIT_PREFS });
    alone = out.find((m): m is Full => m.type === "result" && m.stage === "full")!;
  }, 60_000);
  afterAll(() => {
    if (dir) rmSync(dir, { recursive: true, force: true });
  });

  /** One request as the page sends it; `meddle` runs once both messages are posted. Resolves with the lead's full answer. */
  function request(lead: Worker, helper: Worker, id: number, board: SharedBoard, meddle: () => void = () => {}): Promise<Full> {
    return new Promise((resolve, reject) => {
      const onLead = (m: FromPlannerWorker) => {
        if (m.id !== id || (m.type === "result" && m.stage === "quick")) return;
        lead.off("message", onLead);
        if (m.type === "result") resolve(m);
        else reject(new Error(JSON.stringify(m)));
      };
      lead.on("message", onLead);
      helper.postMessage({ type: "help", id, kind: "hold", input, board: board.buffer });
      lead.postMessage({ type: "run", id, kind: "hold", input, units: DEFAULT_UNIT_PREFS, board: board.buffer });
      meddle();
    });
  }
  const settleOnHelped = (helper: Worker, board: SharedBoard, id: number) =>
    helper.on("message", (m: FromPlannerWorker) => {
      if (m.type === "helped" && m.id === id) board.helperSettled(1, true);
    });

  /** A fresh lead and helper worker for `fn`, stopped after it. */
  async function withWorkers(fn: (lead: Worker, helper: Worker) => Promise<void>): Promise<void> {
    const lead = new Worker(host);
    const helper = new Worker(host);
    try {
      await fn(lead, helper);
    } finally {
      await lead.terminate();
      await helper.terminate();
    }
  }

  it("gives the one worker's full answer to the last digit, and the helper takes corners", () =>
    withWorkers(async (lead, helper) => {
      let byHelper = 0;
      for (let id = 1; id <= 6; id++) {
        const board = SharedBoard.create();
        settleOnHelped(helper, board, id);
        const full = await request(lead, helper, id, board);
        expect(full.result).toEqual(alone.result);
        expect(full.view).toEqual(alone.view);
        for (let at = 1; at < 9; at++) if (board.ownerOf(at) === 1 && board.isIn(at)) byHelper++;
      }
      // The helper starts on the corners while the lead works out the quick answer (not asserted per run: a
      // busy machine may start the helper's thread late, and the lead then takes the rest itself).
      expect(byHelper).toBeGreaterThan(0);
    }), 120_000);

  it("a board withdrawn mid-run for a newer request: the newer one gets the right answer, the older one none or the right one", () =>
    withWorkers(async (lead, helper) => {
      for (const delay_ms of [0, 3, 8]) {
        const b1 = SharedBoard.create();
        const b2 = SharedBoard.create();
        settleOnHelped(helper, b1, 10 + delay_ms);
        settleOnHelped(helper, b2, 20 + delay_ms);
        let older: Full | null = null;
        void request(lead, helper, 10 + delay_ms, b1).then((r) => (older = r));
        await new Promise((r) => setTimeout(r, delay_ms));
        // As the page does: the older board is withdrawn as the newer request goes out.
        b1.withdraw();
        expect((await request(lead, helper, 20 + delay_ms, b2)).result).toEqual(alone.result);
        // The lead takes requests in turn: by now the older one has given its full answer or stopped.
        if (older !== null) expect((older as Full).result).toEqual(alone.result);
      }
    }), 120_000);

  it("a helper stopped mid-run and then settled leaves the answer as it was", () =>
    withWorkers(async (lead, helper) => {
      const b2 = SharedBoard.create();
      const stopped = request(lead, helper, 2, b2, () =>
        setTimeout(() => {
          void helper.terminate().then(() => b2.helperSettled(1, true));
        }, 3),
      );
      expect((await stopped).result).toEqual(alone.result);
    }), 120_000);
});
