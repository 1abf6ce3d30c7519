/** Timing helpers shared by the bench scripts (`npm run bench`, scripts/bench-cool.ts). Wall time, ms. */
export function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

/** Runs fn `warm` times untimed, then `runs` times timed; returns each timed run's milliseconds. */
export function time(fn: () => unknown, runs: number, warm = 5): number[] {
  for (let i = 0; i < warm; i++) fn();
  const out: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t = performance.now();
    fn();
    out.push(performance.now() - t);
  }
  return out;
}
