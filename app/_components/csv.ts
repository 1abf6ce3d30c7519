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
  // Released a minute later: a browser that is slow to start the download still finds the file.
  setTimeout(() => URL.revokeObjectURL(url), 60_000);
}
