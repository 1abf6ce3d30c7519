/**
 * Reads a data logger's CSV export (pure: takes the file's text). A time column — date-times in ISO,
 * day-first or month-first form, or elapsed seconds, minutes or hours — and one or more temperature
 * columns in °C or °F, comma-, semicolon- or tab-separated, parsed with papaparse and date-fns.
 * A file that cannot be read is refused whole with every problem found, each naming its row (the
 * file's line number, 1 = the first line) and column.
 */
import Papa from "papaparse";
import { isValid, parse as parseDate, parseISO } from "date-fns";
import { logFormatSchema, type DateOrder, type LogChannel, type LogColumn, type LogFormat, type LogFormatInput } from "../schemas/calibrate";
import { DEFAULT_UNIT_PREFS, fromDisplay } from "../units";

export interface LogProblem {
  /** Line of the file (1 = first line); null for a problem with the whole file. */
  row: number | null;
  /** Header text of the column (or its position when it has none); null for a problem with a whole row. */
  column: string | null;
  message: string;
}

export interface LogSeries {
  channel: LogChannel;
  /** Header text of the column. */
  label: string;
  /** °C at each reading; null where the cell is empty. */
  T_C: (number | null)[];
}

export interface ParsedLog {
  /** Seconds since the first reading. */
  t_s: number[];
  /** Date-time of the first reading (ISO; a logger's wall clock without an offset is written as if UTC), null for elapsed-time logs. */
  start: string | null;
  /** Milliseconds of the first reading on the log's clock (null for elapsed-time logs). */
  start_ms: number | null;
  series: LogSeries[];
  /** The file's line of each reading. */
  rows: number[];
  warnings: string[];
}

export type LogParseResult = { ok: true; log: ParsedLog } | { ok: false; problems: LogProblem[] };

/** More problems than this are summarised: a file this wrong is wrong throughout. */
const MAX_PROBLEMS = 20;

const DELIMS: Record<string, string> = { ",": "comma", ";": "semicolon", "\t": "tab" };

/**
 * Date-time forms tried for a day-first or month-first file (date-fns patterns; "d" and "M" also read
 * two digits, "H" two-digit hours). Separators "/", "." and "-"; seconds and fractions optional; a
 * 12-hour clock with AM/PM.
 */
function dateFormats(order: Exclude<DateOrder, "iso">): string[] {
  const out: string[] = [];
  for (const sep of ["/", ".", "-"]) {
    const date = order === "day_first" ? `d${sep}M${sep}yyyy` : `M${sep}d${sep}yyyy`;
    const date2 = order === "day_first" ? `d${sep}M${sep}yy` : `M${sep}d${sep}yy`;
    for (const d of [date, date2]) {
      for (const sp of [" ", "'T'", ", "]) {
        out.push(`${d}${sp}H:mm:ss.SSS`, `${d}${sp}H:mm:ss`, `${d}${sp}H:mm`, `${d}${sp}h:mm:ss a`, `${d}${sp}h:mm a`);
      }
      out.push(d);
    }
  }
  return out;
}
const FORMATS = { day_first: dateFormats("day_first"), month_first: dateFormats("month_first") };

/** A date-time cell → ms on the log's clock (a time without an offset is read as UTC wall-clock time), or null. */
export function parseLogDateTime(cell: string, order: DateOrder): number | null {
  const s = cell.trim();
  if (!s) return null;
  if (order === "iso") {
    // ISO 8601 only: a date, 'T' or a space, a time; an offset or Z optional.
    if (!/^\d{4}-\d{2}-\d{2}([T ]\d{2}:\d{2}(:\d{2}(\.\d+)?)?)?(Z|[+-]\d{2}(:?\d{2})?)?$/.test(s)) return null;
    const hasOffset = /(Z|[+-]\d{2}(:?\d{2})?)$/.test(s) && /[T ]\d{2}:\d{2}/.test(s);
    const d = parseISO(s.replace(" ", "T"));
    if (!isValid(d)) return null;
    return hasOffset ? d.getTime() : wallClock(d);
  }
  // Two-digit years and four-digit ones: a four-digit year must not be read by a "yy" pattern.
  const fourDigit = /\d{4}/.test(s);
  for (const f of FORMATS[order]) {
    if (f.includes("yyyy") !== fourDigit) continue;
    const d = parseDate(s, f, new Date(2000, 0, 1));
    if (isValid(d)) return wallClock(d);
  }
  return null;
}

/** A date read in the machine's zone → the same wall-clock reading as UTC ms (no daylight-saving jumps). */
function wallClock(d: Date): number {
  return Date.UTC(d.getFullYear(), d.getMonth(), d.getDate(), d.getHours(), d.getMinutes(), d.getSeconds(), d.getMilliseconds());
}

/** An elapsed-time cell → seconds: a number in the given unit, or h:mm:ss / h:mm. Null if neither. */
export function parseElapsed(cell: string, unit: "s" | "min" | "h", decimal: "." | ","): number | null {
  const s = cell.trim();
  const hms = /^(\d+):([0-5]\d)(?::([0-5]\d(?:[.,]\d+)?))?$/.exec(s);
  if (hms) return Number(hms[1]) * 3600 + Number(hms[2]) * 60 + (hms[3] ? Number(hms[3].replace(",", ".")) : 0);
  const x = parseNumber(s, decimal);
  if (x === null) return null;
  return unit === "s" ? x : unit === "min" ? x * 60 : x * 3600;
}

/** A number cell with the file's decimal mark; null when it is not a plain number. */
export function parseNumber(cell: string, decimal: "." | ","): number | null {
  let s = cell.trim().replace(/^\+/, "");
  if (decimal === ",") s = s.replace(",", ".");
  // Units some loggers write beside the value.
  s = s.replace(/\s*°?\s*[CF]$/i, "");
  if (!/^-?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(s)) return null;
  const x = Number(s);
  return Number.isFinite(x) ? x : null;
}

function describeColumn(c: LogColumn): string {
  return typeof c === "number" ? `column ${c + 1}` : `"${c}"`;
}

/** Reads a log with the given format. Never throws on a bad file: the problems come back with row and column. */
export function parseLogCsv(text: string, formatInput: LogFormatInput | LogFormat): LogParseResult {
  const fmt = logFormatSchema.safeParse(formatInput);
  if (!fmt.success) return { ok: false, problems: fmt.error.issues.map((i) => ({ row: null, column: null, message: `${i.path.join(".")}: ${i.message}` })) };
  const f = fmt.data;
  const body = text.replace(/^\uFEFF/, "");
  const parsed = Papa.parse<string[]>(body, { delimiter: f.delimiter === "auto" ? "" : f.delimiter, skipEmptyLines: false });
  // Papaparse's own errors (an unclosed quote); a delimiter it could not guess is handled below.
  const problems: LogProblem[] = [];
  for (const e of parsed.errors) {
    if (e.code === "UndetectableDelimiter") continue;
    problems.push({ row: e.row !== undefined ? e.row + 1 : null, column: null, message: e.message });
  }
  const rows = parsed.data;
  const headerIndex = f.skipRows;
  while (rows.length > headerIndex && rows[headerIndex].every((c) => c.trim() === "") && headerIndex < rows.length) rows.splice(headerIndex, 1);
  if (rows.length <= headerIndex) return { ok: false, problems: [{ row: null, column: null, message: "The file has no header row" }] };
  const header = rows[headerIndex].map((h) => h.trim());
  const used = parsed.meta.delimiter;

  // A file written with another delimiter than the one chosen reads as one column per line.
  if (header.length === 1) {
    const other = Object.keys(DELIMS).find((d) => d !== used && header[0].includes(d));
    const hint = other ? `: it seems to be ${DELIMS[other]}-separated — choose "${other === "\t" ? "tab" : other}" as the delimiter` : "";
    return { ok: false, problems: [{ row: headerIndex + 1, column: null, message: `The header row has one column only with the ${DELIMS[used] ?? "chosen"} delimiter${hint}` }] };
  }

  const find = (c: LogColumn): number | null => {
    if (typeof c === "number") return c < header.length ? c : null;
    const i = header.findIndex((h) => h === c);
    if (i >= 0) return i;
    const j = header.findIndex((h) => h.toLowerCase() === c.toLowerCase());
    return j >= 0 ? j : null;
  };
  const nameOf = (i: number) => header[i] || `column ${i + 1}`;
  const timeCol = find(f.time.column);
  if (timeCol === null) problems.push({ row: headerIndex + 1, column: describeColumn(f.time.column), message: `The time column ${describeColumn(f.time.column)} is not in the header (${header.map((h) => `"${h}"`).join(", ")})` });
  const chanCols = f.channels.map((ch) => {
    const i = find(ch.column);
    if (i === null) problems.push({ row: headerIndex + 1, column: describeColumn(ch.column), message: `The column ${describeColumn(ch.column)} is not in the header (${header.map((h) => `"${h}"`).join(", ")})` });
    else if (i === timeCol) problems.push({ row: headerIndex + 1, column: nameOf(i), message: "The same column is mapped as time and as a temperature" });
    return i;
  });
  if (problems.length) return { ok: false, problems };

  const prefs = { ...DEFAULT_UNIT_PREFS, temperatureUnit: f.unit };
  const tCol = timeCol!;
  const times: number[] = [];
  const lines: number[] = [];
  const temps: (number | null)[][] = f.channels.map(() => []);
  const warnings: string[] = [];
  let blankCells = 0;
  const add = (p: LogProblem) => {
    if (problems.length < MAX_PROBLEMS) problems.push(p);
    else if (problems.length === MAX_PROBLEMS) problems.push({ row: null, column: null, message: "More problems follow; fix these first" });
  };
  for (let r = headerIndex + 1; r < rows.length; r++) {
    const row = rows[r];
    const line = r + 1;
    if (row.every((c) => c.trim() === "")) continue;
    if (row.length !== header.length) {
      add({ row: line, column: null, message: `This row has ${row.length} field${row.length === 1 ? "" : "s"} where the header has ${header.length}${row.length === 1 ? " (a different delimiter?)" : ""}` });
      continue;
    }
    const cell = row[tCol] ?? "";
    const t_ms =
      f.time.kind === "datetime" ? parseLogDateTime(cell, f.time.order) : (() => {
        const s = parseElapsed(cell, f.time.unit, f.decimal);
        return s === null ? null : s * 1000;
      })();
    if (t_ms === null) {
      const form =
        f.time.kind === "elapsed"
          ? `elapsed time in ${f.time.unit} (or h:mm:ss)`
          : f.time.order === "iso"
            ? "an ISO date-time (e.g. 2026-07-14T09:30:00)"
            : f.time.order === "day_first"
              ? "a day-first date-time (e.g. 14/07/2026 09:30)"
              : "a month-first date-time (e.g. 07/14/2026 09:30)";
      add({ row: line, column: nameOf(tCol), message: `"${cell}" is not ${form}` });
      continue;
    }
    if (times.length && t_ms <= times[times.length - 1]) {
      add({ row: line, column: nameOf(tCol), message: t_ms < times[times.length - 1] ? `Time goes backwards here ("${cell}" is before the row above)` : `Time does not move on from the row above ("${cell}" again)` });
      continue;
    }
    let bad = false;
    const values = f.channels.map((_, k) => {
      const c = row[chanCols[k]!] ?? "";
      if (c.trim() === "") {
        blankCells++;
        return null;
      }
      const x = parseNumber(c, f.decimal);
      if (x === null) {
        bad = true;
        add({ row: line, column: nameOf(chanCols[k]!), message: `"${c}" is not a number${f.decimal === "." && /^-?\d+,\d+$/.test(c.trim()) ? " (a decimal comma? choose \",\" as the decimal mark)" : ""}` });
        return null;
      }
      const T = fromDisplay("temperature", x, prefs);
      if (T < -100 || T > 200) {
        bad = true;
        add({ row: line, column: nameOf(chanCols[k]!), message: `${c} °${f.unit} is outside what a food logger reads (−100 to 200 °C)` });
        return null;
      }
      return T;
    });
    if (bad) continue;
    times.push(t_ms);
    lines.push(line);
    values.forEach((v, k) => temps[k].push(v));
  }
  if (problems.length) return { ok: false, problems };
  if (times.length < 2) {
    return { ok: false, problems: [{ row: lines[0] ?? headerIndex + 2, column: null, message: times.length === 0 ? "The file has no readings under its header" : "The file has a single reading: a log needs at least two" }] };
  }
  f.channels.forEach((ch, k) => {
    const n = temps[k].filter((x) => x !== null).length;
    if (n < 2) problems.push({ row: null, column: nameOf(chanCols[k]!), message: `The column has ${n === 0 ? "no readings" : "a single reading"}` });
  });
  if (problems.length) return { ok: false, problems };
  if (blankCells) warnings.push(`${blankCells} empty cell${blankCells === 1 ? "" : "s"} in the temperature columns: those readings are left out`);
  const t0 = times[0];
  const start_ms = f.time.kind === "datetime" ? t0 : null;
  return {
    ok: true,
    log: {
      t_s: times.map((t) => (t - t0) / 1000),
      start: start_ms === null ? null : new Date(start_ms).toISOString(),
      start_ms,
      series: f.channels.map((ch, k) => ({ channel: ch, label: nameOf(chanCols[k]!), T_C: temps[k] })),
      rows: lines,
      warnings,
    },
  };
}

/** One line per problem, for the CLI and the page: "row 5, "Probe 1": "abc" is not a number". */
export function describeLogProblems(problems: LogProblem[]): string[] {
  return problems.map((p) => {
    const where = [p.row !== null ? `row ${p.row}` : null, p.column !== null ? (p.column.startsWith('"') || p.column.startsWith("column ") ? p.column : `"${p.column}"`) : null].filter(Boolean).join(", ");
    return where ? `${where}: ${p.message}` : p.message;
  });
}
