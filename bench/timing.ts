// What the across-site and priced-view benchmarks share: a median, and the wall and process CPU
// time of one call (the CPU figure is less inflated when other jobs share the machine).

/** The median of some numbers. */
export function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/** Wall and CPU (user + system) time of one call, ms. */
export function measure(f: () => unknown): { wall: number; cpu: number } {
  const c = process.cpuUsage();
  const t = performance.now();
  f();
  const wall = performance.now() - t;
  const d = process.cpuUsage(c);
  return { wall, cpu: (d.user + d.system) / 1000 };
}

/** "12.3 ms wall, 10.1 ms CPU (median of 30)" for a set of measured calls. */
export function timingSummary(runs: { wall: number; cpu: number }[], digits: number): string {
  const w = median(runs.map((r) => r.wall)).toFixed(digits);
  const c = median(runs.map((r) => r.cpu)).toFixed(digits);
  return `${w} ms wall, ${c} ms CPU (median of ${runs.length})`;
}
