/**
 * The server's pieces board (app/_server/calc-pieces.ts): its layout and rules on one thread, then a hold
 * plan with its band on a real two-thread pool of the freshly bundled worker, as `next start` runs it:
 * the answer is the one-thread answer to the last digit, the helper really takes pieces, and a piece whose
 * helper has gone without its number is run by the lead.
 */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { execFileSync } from "node:child_process";
import { Piscina } from "piscina";
import { runWhole } from "../../app/_server/calc-pieces";
import { SharedBoard } from "../../lib/planners/shared-board";
import type { CalcAnswer, CalcJob, HelperAnswer } from "../../app/_server/calc-worker";
import { runHoldParsed } from "../../lib/physics/hold";
import { holdInput } from "../../scripts/bench-cases";

describe("pieces board on one thread", () => {
  it("keeps every piece's number apart from the states and owners, and says who took what", () => {
    const board = SharedBoard.create(10);
    expect(board.capacity).toBe(10);
    const h1 = new SharedBoard(board.buffer, 1);
    for (let k = 1; k < 10; k++) expect(h1.take()).toBe(k);
    for (let k = 1; k < 10; k++) h1.put(k, k === 5 ? Infinity : -k * 1.5);
    board.helperSettled(1, true);
    const got = board.collect(10);
    for (let k = 1; k < 10; k++) {
      expect(got[k]).toBe(k === 5 ? Infinity : -k * 1.5);
      expect(board.ownerOf(k)).toBe(1);
      expect(board.isIn(k)).toBe(true);
    }
    expect(board.take()).toBe(10); // past the end: nothing left
  });
  it("a piece whose helper has settled without its number comes back NaN (the lead runs it); closing is seen by every thread", () => {
    const board = SharedBoard.create();
    const h1 = new SharedBoard(board.buffer, 1);
    const h2 = new SharedBoard(board.buffer, 2);
    expect(h1.take()).toBe(1);
    h1.put(1, 7);
    expect(h2.take()).toBe(2); // helper 2 takes piece 2 and is gone without putting it
    expect(board.take()).toBe(3);
    board.put(3, 9);
    board.close();
    expect(h1.isClosed() && h2.isClosed()).toBe(true);
    board.helperSettled(2, false); // helper 1 still running: piece 1 is in, so no wait on it
    const got = board.collect(4);
    expect([got[1], Number.isNaN(got[2]), got[3]]).toEqual([7, true, 9]);
    expect([board.ownerOf(1), board.ownerOf(2), board.ownerOf(3)]).toEqual([1, 2, 0]);
  });
});

describe("a banded hold plan in pieces on a real two-thread pool", () => {
  let dir = "";
  let pool: Piscina<CalcJob, CalcAnswer | HelperAnswer>;
  const inp = holdInput(true);
  const whole = JSON.parse(JSON.stringify(runHoldParsed(inp)));
  beforeAll(() => {
    dir = mkdtempSync(path.join(os.tmpdir(), "holdline-pieces-"));
    execFileSync(process.execPath, ["scripts/bundle.mjs", "--out-dir", dir], { cwd: path.resolve(__dirname, "../.."), stdio: "pipe" });
    // execArgv []: plain node threads, as under next start.
    pool = new Piscina({ filename: path.join(dir, "calc-worker.mjs"), minThreads: 2, maxThreads: 2, execArgv: [] });
  }, 60_000);
  afterAll(async () => {
    await pool?.destroy();
    if (dir) rmSync(dir, { recursive: true, force: true });
  });
  const parse = (a: CalcAnswer) => {
    if (!a.ok) throw new Error(a.message);
    return JSON.parse(a.json);
  };

  it("answers exactly the one-thread answer; the helper takes pieces; every piece is in", async () => {
    let byHelper = 0;
    for (let i = 0; i < 6; i++) {
      const board = SharedBoard.create();
      expect(parse(await runWhole("hold", inp, 2, (job) => pool.run(job), board))).toEqual(whole);
      for (let at = 1; at < 9; at++) {
        expect(board.isIn(at)).toBe(true);
        if (board.ownerOf(at) === 1) byHelper++;
      }
      expect(board.isIn(9)).toBe(false);
    }
    // On two free threads the helper takes its share while the lead runs the central run (not asserted per
    // run: a busy machine may start the helper's thread late, and the lead then takes the rest itself).
    expect(byHelper).toBeGreaterThan(0);
    // One free thread: the plan runs whole, with the same answer.
    expect(parse(await runWhole("hold", inp, 1, (job) => pool.run(job)))).toEqual(whole);
  }, 60_000);

  it("a piece taken by a helper whose thread is gone is run by the lead once that helper's job has settled", async () => {
    const board = SharedBoard.create();
    expect(new SharedBoard(board.buffer, 1).take()).toBe(1); // taken by helper 1, never put
    const answer = pool.run({ kind: "hold", input: inp, pieces: { board: board.buffer, helper: 0 } });
    setTimeout(() => board.helperSettled(1, true), 30);
    expect(parse((await answer) as CalcAnswer)).toEqual(whole);
    expect(board.isIn(1)).toBe(false); // the lead ran it itself, without writing to the helper's slot
  }, 60_000);

  it("a helper that starts after the lead has taken the last piece does nothing", async () => {
    const board = SharedBoard.create();
    expect(parse((await pool.run({ kind: "hold", input: inp, pieces: { board: board.buffer, helper: 0 } })) as CalcAnswer)).toEqual(whole);
    const before = board.take();
    expect(await pool.run({ kind: "hold", input: inp, pieces: { board: board.buffer, helper: 1 } })).toEqual({ ok: true, helped: true });
    expect(board.take()).toBe(before + 1); // it took nothing
  }, 60_000);
});
