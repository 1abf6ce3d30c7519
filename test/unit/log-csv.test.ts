import { describe, it, expect } from "vitest";
import { parseLogCsv, describeLogProblems, parseLogDateTime } from "../../lib/calibration/log-csv";
import type { LogFormatInput } from "../../lib/schemas/calibrate";

const iso: LogFormatInput = { time: { kind: "datetime", column: "Time", order: "iso" }, channels: [{ column: "Air", role: "inside_air" }, { column: "Probe", role: "product" }] };
const ok = (text: string, f: LogFormatInput) => {
  const r = parseLogCsv(text, f);
  if (!r.ok) throw new Error(describeLogProblems(r.problems).join("\n"));
  return r.log;
};
const bad = (text: string, f: LogFormatInput) => {
  const r = parseLogCsv(text, f);
  expect(r.ok).toBe(false);
  return r.ok ? [] : r.problems;
};

describe("log CSV: forms that read", () => {
  it("ISO date-times, comma-separated, °C, two channels", () => {
    const log = ok("Time,Air,Probe\n2026-07-14T09:00:00,5.0,3.1\n2026-07-14T09:05:00,5.5,3.2\n2026-07-14T09:10:30,6.0,3.3\n", iso);
    expect(log.t_s).toEqual([0, 300, 630]);
    expect(log.series.map((s) => s.channel.role)).toEqual(["inside_air", "product"]);
    expect(log.series[1].T_C).toEqual([3.1, 3.2, 3.3]);
    expect(log.start).toBe("2026-07-14T09:00:00.000Z");
    expect(log.rows).toEqual([2, 3, 4]);
  });

  it("ISO with offsets across a change of offset keeps real elapsed time", () => {
    const log = ok("Time,Air,Probe\n2026-10-25T01:30:00+02:00,5,3\n2026-10-25T01:30:00+01:00,5,3\n", iso);
    expect(log.t_s).toEqual([0, 3600]);
  });

  it("day-first and month-first read the same clock times as the stated choice says", () => {
    const dayFirst = "Date/time;Air;Probe\n01/02/2026 23:50;5,0;3,0\n02/02/2026 00:10;5,5;3,1\n";
    const d = ok(dayFirst, { delimiter: ";", decimal: ",", time: { kind: "datetime", column: "Date/time", order: "day_first" }, channels: [{ column: "Air", role: "inside_air" }, { column: "Probe", role: "product" }] });
    expect(d.t_s).toEqual([0, 1200]);
    expect(d.start).toBe("2026-02-01T23:50:00.000Z");
    expect(d.series[0].T_C).toEqual([5, 5.5]);
    const monthFirst = "Date/time,Air,Probe\n02/01/2026 11:50:00 PM,41,37.4\n02/02/2026 12:10:00 AM,42,37.6\n";
    const m = ok(monthFirst, { unit: "F", time: { kind: "datetime", column: "Date/time", order: "month_first" }, channels: [{ column: "Air", role: "inside_air" }, { column: "Probe", role: "product" }] });
    expect(m.t_s).toEqual([0, 1200]);
    expect(m.start).toBe("2026-02-01T23:50:00.000Z");
    // °F to °C: 41 °F = 5 °C, 37.4 °F = 3 °C (definition of the Fahrenheit scale).
    expect(m.series[0].T_C[0]).toBeCloseTo(5, 10);
    expect(m.series[1].T_C[0]).toBeCloseTo(3, 10);
  });

  it("the same text read day-first and month-first gives different dates", () => {
    expect(parseLogDateTime("03/04/2026 10:00", "day_first")).toBe(Date.UTC(2026, 3, 3, 10));
    expect(parseLogDateTime("03/04/2026 10:00", "month_first")).toBe(Date.UTC(2026, 2, 4, 10));
    expect(parseLogDateTime("13/04/2026 10:00", "month_first")).toBeNull();
    expect(parseLogDateTime("14.07.26 9:05", "day_first")).toBe(Date.UTC(2026, 6, 14, 9, 5));
  });

  it("elapsed seconds, minutes and h:mm:ss; a logger preamble; columns by position; blank cells left out", () => {
    const min = ok("Logger X-1\nSerial 42\nmin;T1;T2\n0;4;2\n1,5;4,5;\n3;5;2,5\n", {
      delimiter: "auto",
      decimal: ",",
      skipRows: 2,
      time: { kind: "elapsed", column: 0, unit: "min" },
      channels: [{ column: 1, role: "inside_air" }, { column: "T2", role: "pack" }],
    });
    expect(min.t_s).toEqual([0, 90, 180]);
    expect(min.series[1].T_C).toEqual([2, null, 2.5]);
    expect(min.warnings.join(" ")).toMatch(/empty cell/);
    const hms = ok("t,T\n0:00:00,4\n0:10:00,5\n1:00:30,6\n", { time: { kind: "elapsed", column: "t", unit: "s" }, channels: [{ column: "T", role: "inside_air" }] });
    expect(hms.t_s).toEqual([0, 600, 3630]);
    const sec = ok("t,T\n0,4\n60,5\n", { time: { kind: "elapsed", column: "t", unit: "s" }, channels: [{ column: "T", role: "inside_air" }] });
    expect(sec.t_s).toEqual([0, 60]);
  });
});

describe("log CSV: malformed files are refused with row and column", () => {
  it("wrong delimiter", () => {
    const p = bad("Time;Air;Probe\n2026-07-14T09:00:00;5;3\n2026-07-14T09:05:00;5;3\n", { ...iso, delimiter: "," });
    expect(p[0].row).toBe(1);
    expect(p[0].message).toMatch(/semicolon/);
  });

  it("text in a number column", () => {
    const p = bad("Time,Air,Probe\n2026-07-14T09:00:00,5,3\n2026-07-14T09:05:00,5,err\n2026-07-14T09:10:00,5,3\n", iso);
    expect(p).toHaveLength(1);
    expect(p[0]).toMatchObject({ row: 3, column: "Probe" });
    expect(describeLogProblems(p)[0]).toBe('row 3, "Probe": "err" is not a number');
  });

  it("a decimal comma in a comma-free number column is named as such", () => {
    const p = bad("Time;Air;Probe\n2026-07-14T09:00:00;5,5;3\n2026-07-14T09:05:00;5;3\n", { ...iso, delimiter: ";" });
    expect(p[0]).toMatchObject({ row: 2, column: "Air" });
    expect(p[0].message).toMatch(/decimal comma/);
  });

  it("time going backwards, and time standing still", () => {
    const p = bad("Time,Air,Probe\n2026-07-14T09:00:00,5,3\n2026-07-14T09:05:00,5,3\n2026-07-14T09:04:00,5,3\n2026-07-14T09:05:00,5,3\n", iso);
    expect(p[0]).toMatchObject({ row: 4, column: "Time" });
    expect(p[0].message).toMatch(/backwards/);
    const q = bad("Time,Air,Probe\n2026-07-14T09:00:00,5,3\n2026-07-14T09:00:00,5,3\n", iso);
    expect(q[0]).toMatchObject({ row: 3, column: "Time" });
    expect(q[0].message).toMatch(/does not move on/);
  });

  it("a single row", () => {
    const p = bad("Time,Air,Probe\n2026-07-14T09:00:00,5,3\n", iso);
    expect(p[0].row).toBe(2);
    expect(p[0].message).toMatch(/single reading/);
  });

  it("a date in the wrong form, a missing column, a short row", () => {
    const p = bad("Time,Air,Probe\n14/07/2026 09:00,5,3\n2026-07-14T09:05:00,5,3\n", iso);
    expect(p[0]).toMatchObject({ row: 2, column: "Time" });
    expect(p[0].message).toMatch(/ISO/);
    const q = bad("Time,Air\n2026-07-14T09:00:00,5\n2026-07-14T09:05:00,5\n", iso);
    expect(q[0]).toMatchObject({ row: 1, column: '"Probe"' });
    const r = bad("Time,Air,Probe\n2026-07-14T09:00:00,5,3\n2026-07-14T09:05:00,5\n", iso);
    expect(r[0]).toMatchObject({ row: 3, column: null });
  });

  it("an impossible reading and a mapping that names no column", () => {
    const p = bad("Time,Air,Probe\n2026-07-14T09:00:00,5,3\n2026-07-14T09:05:00,5,999\n", iso);
    expect(p[0]).toMatchObject({ row: 3, column: "Probe" });
    const q = parseLogCsv("Time,Air\n", { time: { kind: "datetime", column: "Time", order: "iso" }, channels: [] });
    expect(q.ok).toBe(false);
  });
});
