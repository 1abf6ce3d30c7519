/** Durations for people: "3 h 05 min", "12 min", "45 s". */
export function formatDuration(t_s: number | null | undefined): string {
  if (t_s === null || t_s === undefined || !Number.isFinite(t_s)) return "—";
  if (t_s < 60) return `${Math.round(t_s)} s`;
  const min = Math.round(t_s / 60);
  if (min < 60) return `${min} min`;
  const h = Math.floor(min / 60);
  const m = min % 60;
  if (h < 48) return `${h} h ${String(m).padStart(2, "0")} min`;
  return `${(t_s / 86400).toFixed(1)} days`;
}
