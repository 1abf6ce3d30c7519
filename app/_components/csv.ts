import Papa from "papaparse";

/** Offers rows as a CSV download in the browser (papaparse writes the CSV). */
export function downloadCsv(filename: string, rows: Record<string, string | number | null>[]): void {
  const csv = Papa.unparse(rows);
  const blob = new Blob([csv], { type: "text/csv;charset=utf-8" });
  const url = URL.createObjectURL(blob);
  const a = document.createElement("a");
  a.href = url;
  a.download = filename;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}
