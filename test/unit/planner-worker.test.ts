// The browser planner worker's protocol, with the real registry: the quick first answer where a planner has
// one, the full answer after; one model run where it has none; an older request dropped for a newer one.
import { describe, it, expect, vi } from "vitest";
import { readFileSync } from "node:fs";
import path from "node:path";
import { plannerWorkerHandler, type FromPlannerWorker } from "../../lib/planners/worker-protocol";
import { PLANNERS } from "../../lib/planners/registry";
import { DEMO_SCENARIO as D } from "../../lib/db/demo-scenario";
import { DEFAULT_UNIT_PREFS } from "../../lib/units";
import { SharedBoard } from "../../lib/planners/shared-board";

const warmupInput = { product: D.products.find((p) => p.name.startsWith("Steamed rice"))!, start_C: 80, surroundings: { medium: "air", T_C: 22, speed_m_s: 0.3 }, ruleSet: D.rulesets[0], limit: "hotHoldMin", horizon_s: 14400 };
const thin = D.shippers.find((s) => s.name.startsWith("Quillfield thin"))!;
const holdInput = { products: [{ product: D.products.find((p) => p.name.startsWith("Roast chicken"))!, count: 1, start_C: 2 }], shipper: thin, materials: D.materials, packs: [{ pack: D.packs.find((p) => p.name.startsWith("Gel"))!, count: 2, conditioning_C: -18 }], route: D.routes[0], ruleSet: D.rulesets[1] };

function collect() {
  const out: FromPlannerWorker[] = [];
  return { out, handle: plannerWorkerHandler((m) => out.push(m)) };
}

describe("planner worker protocol", () => {
  it("runs a planner without a quick answer once, and posts one full result", async () => {
    const spy = vi.spyOn(PLANNERS.warmup, "run");
    const { out, handle } = collect();
    await handle({ type: "run", id: 1, kind: "warmup", input: warmupInput, units: DEFAULT_UNIT_PREFS });
    expect(spy).toHaveBeenCalledTimes(1);
    expect(out.map((m) => m.type === "result" && m.stage)).toEqual(["full"]);
    spy.mockRestore();
  });

  it("hold: the central run first (band pending), then the full answer with its band", async () => {
    const { out, handle } = collect();
    await handle({ type: "run", id: 1, kind: "hold", input: holdInput, units: DEFAULT_UNIT_PREFS });
    expect(out.map((m) => (m.type === "result" ? m.stage : m.type))).toEqual(["quick", "full"]);
    const [q, f] = out as Extract<FromPlannerWorker, { type: "result" }>[];
    expect(q.view.pending).toMatch(/uncertainty/);
    expect(q.view.facts.find((x) => x.testId === "hold-band")!.value).toMatch(/being worked out/);
    expect(f.view.pending).toBeUndefined();
    expect(f.view.facts.find((x) => x.testId === "hold-band")!.value).not.toMatch(/being worked out/);
    expect(f.csv.length).toBeGreaterThan(10);
  });

  // The page's two workers (app/_components/usePlanner.ts) on one board, here on one thread: the helper's
  // handler first (it takes every piece), then the lead's, which finds them all in.
  const banded = { ...holdInput, uncertainty: { outerH_frac: 0.3, insulationK_frac: 0.1, conditioning_K: 2 } };
  const fullOf = (out: FromPlannerWorker[]) => out.find((m): m is Extract<FromPlannerWorker, { type: "result" }> => m.type === "result" && m.stage === "full")!;
  it("hold with a helper worker on a shared board: the helper takes the band's corners, the full answer is the one worker's to the last digit", async () => {
    const alone = collect();
    await alone.handle({ type: "run", id: 1, kind: "hold", input: banded, units: DEFAULT_UNIT_PREFS });
    const board = SharedBoard.create();
    const helper = collect();
    await helper.handle({ type: "help", id: 1, kind: "hold", input: banded, board: board.buffer });
    expect(helper.out).toEqual([{ type: "helped", id: 1 }]);
    const corners = Array.from({ length: 8 }, (_, i) => i + 1);
    expect(corners.map((at) => [board.ownerOf(at), board.isIn(at)])).toEqual(corners.map(() => [1, true]));
    const lead = collect();
    await lead.handle({ type: "run", id: 1, kind: "hold", input: banded, units: DEFAULT_UNIT_PREFS, board: board.buffer });
    expect(lead.out.map((m) => (m.type === "result" ? m.stage : m.type))).toEqual(["quick", "full"]);
    // The lead's quick answer comes from its own central run (PlannerPieces.quick), not from a run apart:
    // the same answer and view as the quick stage one worker runs on its own.
    const quickOf = (out: FromPlannerWorker[]) => out.find((m): m is Extract<FromPlannerWorker, { type: "result" }> => m.type === "result" && m.stage === "quick")!;
    expect(quickOf(lead.out).result).toEqual(quickOf(alone.out).result);
    expect(quickOf(lead.out).view).toEqual(quickOf(alone.out).view);
    expect(quickOf(lead.out).parsed).toEqual(quickOf(alone.out).parsed);
    expect(fullOf(lead.out).result).toEqual(fullOf(alone.out).result);
    expect(fullOf(lead.out).view).toEqual(fullOf(alone.out).view);
    expect(fullOf(lead.out).csv).toEqual(fullOf(alone.out).csv);
    // Without a band there is no quick answer either way: the full one only.
    const noBand = { ...holdInput, uncertainty: { outerH_frac: 0, insulationK_frac: 0, conditioning_K: 0 } };
    const plain = collect();
    await plain.handle({ type: "run", id: 2, kind: "hold", input: noBand, units: DEFAULT_UNIT_PREFS, board: SharedBoard.create().buffer });
    const plainAlone = collect();
    await plainAlone.handle({ type: "run", id: 2, kind: "hold", input: noBand, units: DEFAULT_UNIT_PREFS });
    expect(plain.out.map((m) => (m.type === "result" ? m.stage : m.type))).toEqual(["full"]);
    expect(fullOf(plain.out).result).toEqual(fullOf(plainAlone.out).result);
  });

  it("a board withdrawn before its request is worked on: the helper takes nothing and says so, the lead posts nothing", async () => {
    const board = SharedBoard.create();
    board.withdraw();
    const helper = collect();
    await helper.handle({ type: "help", id: 1, kind: "hold", input: banded, board: board.buffer });
    expect(helper.out).toEqual([{ type: "helped", id: 1 }]);
    const lead = collect();
    await lead.handle({ type: "run", id: 1, kind: "hold", input: banded, units: DEFAULT_UNIT_PREFS, board: board.buffer });
    expect(lead.out).toEqual([]);
    for (let at = 1; at < 9; at++) expect([board.isIn(at), board.ownerOf(at)]).toEqual([false, 0]);
  });

  it("a board withdrawn once the quick answer is out (the page sent a newer request): the lead stops without running the corners", async () => {
    const board = SharedBoard.create();
    const out: FromPlannerWorker[] = [];
    const handle = plannerWorkerHandler((m) => {
      out.push(m);
      if (m.type === "result" && m.stage === "quick") board.withdraw();
    });
    await handle({ type: "run", id: 1, kind: "hold", input: banded, units: DEFAULT_UNIT_PREFS, board: board.buffer });
    expect(out.map((m) => (m.type === "result" ? m.stage : m.type))).toEqual(["quick"]);
    // No corner was taken, let alone put in.
    for (let at = 1; at < 9; at++) expect(board.isIn(at)).toBe(false);
  });

  it("a helper with input the lead will reject, a planner without pieces or an unknown one takes nothing and says so", async () => {
    const board = SharedBoard.create();
    const helper = collect();
    await helper.handle({ type: "help", id: 3, kind: "hold", input: { ...banded, products: "none" }, board: board.buffer });
    await helper.handle({ type: "help", id: 4, kind: "warmup", input: warmupInput, board: board.buffer });
    await helper.handle({ type: "help", id: 5, kind: "hold", input: banded, board: "not shared" as never });
    await helper.handle({ type: "help", id: 6, kind: "nonsense" as never, input: banded, board: board.buffer });
    expect(helper.out).toEqual([3, 4, 5, 6].map((id) => ({ type: "helped", id })));
    expect(board.isIn(1)).toBe(false);
  });

  it("without shared memory (a page that is not cross-origin isolated has no SharedArrayBuffer) the worker runs the plan whole", async () => {
    const alone = collect();
    await alone.handle({ type: "run", id: 1, kind: "hold", input: banded, units: DEFAULT_UNIT_PREFS });
    vi.stubGlobal("SharedArrayBuffer", undefined);
    try {
      const w = collect();
      await w.handle({ type: "run", id: 1, kind: "hold", input: banded, units: DEFAULT_UNIT_PREFS, board: {} as SharedArrayBuffer });
      await w.handle({ type: "help", id: 2, kind: "hold", input: banded, board: {} as SharedArrayBuffer });
      expect(w.out.map((m) => (m.type === "result" ? m.stage : m.type))).toEqual(["quick", "full", "helped"]);
      expect(fullOf(w.out).result).toEqual(fullOf(alone.out).result);
    } finally {
      vi.unstubAllGlobals();
    }
  });

  it("drops an older request when a newer one is already waiting", async () => {
    const { out, handle } = collect();
    const a = handle({ type: "run", id: 1, kind: "warmup", input: warmupInput, units: DEFAULT_UNIT_PREFS });
    const b = handle({ type: "run", id: 2, kind: "warmup", input: { ...warmupInput, start_C: 70 }, units: DEFAULT_UNIT_PREFS });
    await Promise.all([a, b]);
    expect(out.every((m) => m.id === 2)).toBe(true);
    expect(out.length).toBe(1);
  });

  it("answers field errors for a bad input, and nothing for an unknown planner", async () => {
    const { out, handle } = collect();
    await handle({ type: "run", id: 1, kind: "warmup", input: { ...warmupInput, start_C: "hot" }, units: DEFAULT_UNIT_PREFS });
    await handle({ type: "run", id: 2, kind: "nonsense" as never, input: {}, units: DEFAULT_UNIT_PREFS });
    expect(out.length).toBe(1);
    expect(out[0].type).toBe("invalid");
  });

  it("every planner in the registry has an example input that its schema reads (public/examples)", () => {
    for (const kind of Object.keys(PLANNERS)) {
      const file = path.join(process.cwd(), "public/examples", `${kind}.json`);
      expect(() => readFileSync(file, "utf8"), kind).not.toThrow();
    }
  });
});
