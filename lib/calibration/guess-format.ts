/**
 * A first guess of how to read a logger's CSV, for the command line's `--plan --log` form and the page's
 * starting point: the header row (after any preamble), the delimiter, the time column (the first) and its
 * kind, and the remaining columns mapped in order to the usual channels of the plan. Every guess can be
 * overridden; the file is then read (and refused, with row and column) by parseLogCsv.
 */
import Papa from "papaparse";
import { CHANNEL_ROLES, type ChannelRole, type LogFormatInput } from "../schemas/calibrate";

/** The channels the columns after the time column stand for, in order, when none are named. */
export const DEFAULT_CHANNELS: Record<"hold" | "thaw", { role: ChannelRole; line?: number; point?: "centre" | "surface" }[]> = {
  hold: [{ role: "inside_air" }, { role: "product", point: "centre" }, { role: "pack" }, { role: "outside_air" }],
  thaw: [{ role: "product", point: "centre" }, { role: "product", point: "surface" }],
};

export type TimeChoice = "s" | "min" | "h" | "iso" | "day_first" | "month_first";
export const TIME_CHOICES: TimeChoice[] = ["s", "min", "h", "iso", "day_first", "month_first"];

export interface GuessOptions {
  delimiter?: "auto" | "," | ";" | "\t";
  decimal?: "." | ",";
  unit?: "C" | "F";
  time?: TimeChoice;
  /**
   * The columns after the time column, in order: "inside_air", "product[:line][:surface]", "pack[:line]",
   * "outside_air", or "-" to leave a column out. Default: DEFAULT_CHANNELS of the planner.
   */
  columns?: string[];
}

export type GuessResult = { ok: true; format: LogFormatInput; header: string[] } | { ok: false; message: string; header?: string[]; skipRows?: number };

/** Parses one "--columns" entry: "product:1:surface" → role product, line 1, surface. */
export function parseChannelSpec(spec: string): { role: ChannelRole; line: number; point: "centre" | "surface" } | null | "skip" {
  const [role, ...rest] = spec.trim().split(":");
  if (role === "-" || role === "") return "skip";
  if (!(CHANNEL_ROLES as readonly string[]).includes(role)) return null;
  let line = 0;
  let point: "centre" | "surface" = "centre";
  for (const r of rest) {
    if (/^\d{1,2}$/.test(r)) line = Number(r);
    else if (r === "surface" || r === "centre" || r === "center") point = r === "surface" ? "surface" : "centre";
    else return null;
  }
  return { role: role as ChannelRole, line, point };
}

export function guessLogFormat(text: string, planner: "hold" | "thaw", opts: GuessOptions = {}): GuessResult {
  const body = text.replace(/^\uFEFF/, "");
  const head = body.split(/\r?\n/).slice(0, 60).join("\n");
  const delimiter = opts.delimiter ?? "auto";
  const rows = Papa.parse<string[]>(head, { delimiter: delimiter === "auto" ? "" : delimiter, skipEmptyLines: true }).data;
  // The header: the first row of two or more fields that the next row matches in count (a preamble has fewer).
  const h = rows.findIndex((r, i) => r.length >= 2 && rows[i + 1]?.length === r.length);
  if (h < 0) return { ok: false, message: "No header row with a time column and at least one temperature column was found (is the delimiter right?)" };
  // Lines before the header in the file itself (blank lines are skipped by the reader too).
  const lines = body.split(/\r?\n/);
  let skipRows = 0;
  for (let seen = 0; skipRows < lines.length && seen < h; skipRows++) if (lines[skipRows].trim() !== "") seen++;
  while (skipRows < lines.length && lines[skipRows].trim() === "") skipRows++;
  const header = rows[h].map((c) => c.trim());
  const first = (rows[h + 1]?.[0] ?? "").trim();
  let time = opts.time;
  if (!time) {
    if (/^\d+(?:[.,]\d+)?$/.test(first) || /^\d+:\d{2}(:\d{2})?$/.test(first)) time = /min/i.test(header[0]) ? "min" : /(^|[^a-z])(h|hr|hours?)([^a-z]|$)/i.test(header[0]) ? "h" : "s";
    else if (/^\d{4}-\d{2}-\d{2}/.test(first)) time = "iso";
    else
      return {
        ok: false,
        header,
        skipRows,
        message: `The time column "${header[0]}" starts with "${first}": say how it is written (--time day_first or month_first for dates such as 14/07/2026, or s, min or h for elapsed time)`,
      };
  }
  const specs = opts.columns ?? DEFAULT_CHANNELS[planner].map((c) => `${c.role}${c.line ? `:${c.line}` : ""}${c.point === "surface" ? ":surface" : ""}`);
  const channels: NonNullable<LogFormatInput["channels"]> = [];
  for (let i = 0; i < specs.length && i + 1 < header.length; i++) {
    const c = parseChannelSpec(specs[i]);
    if (c === null) return { ok: false, message: `Column mapping "${specs[i]}": use inside_air, product[:line][:surface], pack[:line], outside_air or - (leave out)` };
    if (c !== "skip") channels.push({ column: header[i + 1] || i + 1, ...c });
  }
  if (!channels.length) return { ok: false, message: "No temperature column is mapped to a channel" };
  const timeSpec = time === "s" || time === "min" || time === "h" ? { kind: "elapsed" as const, column: header[0] || 0, unit: time } : { kind: "datetime" as const, column: header[0] || 0, order: time };
  return { ok: true, header, format: { delimiter, decimal: opts.decimal ?? ".", unit: opts.unit ?? "C", skipRows, time: timeSpec, channels } };
}
